#pragma once

#include "settlewell/scenario/scenario.h"

#include <mpi.h>

#include <map>
#include <memory>
#include <optional>
#include <string>
#include <vector>

namespace settlewell {

struct RunOptions {
  std::string run_directory;
  bool overwrite = false;
  bool show_progress = true;
  bool progress_in_place = false; ///< true on a terminal
  /// Checkpoints are written at output times, on a stop by signal, and after any
  /// step that ends this many minutes (wall time) after the last one; 0: only at
  /// output times and stops.
  double checkpoint_minutes = 30.0;
};

/// The headline numbers of a run (maxima over all steps), read from its results.
struct RunSummary {
  std::size_t cells = 0, dofs = 0, steps = 0;
  /// Set when SIGINT or SIGTERM stopped the run after `steps` of `steps_planned`
  /// steps, at `stopped_at` (s): the signal's number.
  int stopped_by = 0;
  std::size_t steps_planned = 0;
  double stopped_at = 0.0;
  double wall_seconds = 0.0;
  std::optional<double> settlement_inside;  ///< m, at the pit surface (until dug)
  std::optional<double> floor_heave;        ///< m, of the ground left in a dug pit
  std::optional<double> settlement_outside; ///< m, at the ground surface outside the wall
  double settlement_anywhere = 0.0;         ///< m, largest over the whole model
  std::optional<double> drawdown_outside;   ///< m, outside the wall, any depth
  double drawdown_anywhere = 0.0;           ///< m
  /// Where and when each of the values above was reached, by its results.toml
  /// name ("settlement_outside": "at x 37.3 m, y 6.00 m (upper_sand), day 365").
  std::map<std::string, std::string> where;
  /// Whether the model is the half of a symmetric section (its volumes are half
  /// the whole pit's).
  bool modelled_half = false;
  /// The skeleton was held rigid (coupling = "flow_only"): no movement computed.
  bool flow_only = false;
  /// Pumped volume per pumped line (m^3; per metre run in plane strain).
  std::map<std::string, double> pumped_volume;
  /// The same per stage, in stage order.
  std::map<std::string, std::vector<double>> stage_volume;
  /// Discharge of each pumped line at the last step, m^3/s.
  std::map<std::string, double> final_discharge;
  /// The water level in a well of each row with a spacing, at the end, and the
  /// row's average head there (m).
  struct WellLevel {
    std::string well;
    double level = 0.0, row_head = 0.0;
  };
  std::vector<WellLevel> well_levels;
  /// Where the pumped water came from: each source's share of the pumped volume.
  std::vector<std::pair<std::string, double>> water_sources;
  /// m^3 (per metre run or per well): drained from the pores of soils with a
  /// retention curve; unset without one.
  std::optional<double> drained_from_pores;
  /// Largest relative water-balance error of a step, and its tolerance.
  double mass_balance = 0.0, mass_balance_tolerance = 0.0;
  std::size_t mass_balance_steps_off = 0; ///< steps over the tolerance
  /// Steps whose one-way lines had not settled which points drain.
  std::size_t one_way_unsettled_steps = 0;
  /// Steps in which one-way points kept held took in more than a hundredth of what
  /// the lines let out, and the largest share.
  std::size_t held_feeding_steps = 0;
  double held_inflow_share = 0.0;
  /// Largest displacement of any step and its plausible limit (m), and the steps
  /// beyond it.
  double largest_movement = 0.0, movement_limit = 0.0;
  std::size_t movement_steps_over = 0;
  /// Largest suction the saturated model held in soil (kPa), and the steps with
  /// soil beyond its air-entry suction (where: RunSummary::where["suction_largest"]).
  double suction_largest = 0.0;
  std::size_t suction_steps_over = 0;
  /// The largest rise of a head in permeable soil in a stage that only lowers
  /// heads, m, and the steps in which it was over checks.head_rise_limit (where:
  /// RunSummary::where["head_rise"]).
  double head_rise_largest = 0.0, head_rise_limit = 0.0;
  std::size_t head_rise_steps_over = 0;
  /// Pumped lines that put water into the ground, stood stopped because they
  /// would have, or ran dry, and in how many steps; recharge wells are marked.
  struct LineNotes {
    bool recharge = false;
    std::size_t injecting = 0, stopped = 0, dry = 0;
  };
  std::map<std::string, LineNotes> line_notes;
  std::string run_directory;
};

/// A scenario turned into a model: mesh, initial state, stage schedule, Biot core
/// and the monitors that write what the run shows. Everything that can fail on
/// input fails in the constructor, before anything is written.
class Simulation {
public:
  Simulation(scenario::Scenario scenario, MPI_Comm comm);
  /// A simulation to resume from `checkpoint` (checkpoint_to_resume): the scenario
  /// must be the run's (resumed_scenario); the mesh is loaded with the run's
  /// partition and state. Throws InputError if the checkpoint does not fit it.
  Simulation(scenario::Scenario scenario, MPI_Comm comm, const std::string& checkpoint);
  ~Simulation();

  /// Runs every stage, writing the run folder (fields, histories, profiles, checks,
  /// steps.csv, results.toml, manifest.json). Collective. After catch_stop_signals(),
  /// SIGINT or SIGTERM ends the run after its current step with the folder written
  /// for the steps done and marked stopped (RunSummary::stopped_by).
  RunSummary run(const RunOptions& options);
  /// Continues the run whose folder is options.run_directory from the checkpoint
  /// this simulation was built with, to the same results as a run never
  /// interrupted. `overwrite` is ignored. Collective.
  RunSummary resume(const RunOptions& options);

private:
  struct Impl;
  std::unique_ptr<Impl> impl_;
};

/// Writes the summary lines of a finished run.
void print_summary(std::ostream& out,
                   const RunSummary& summary,
                   const scenario::Scenario& scenario);

} // namespace settlewell
