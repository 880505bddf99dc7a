#pragma once

#include "settlewell/scenario/scenario.h"

#include <mpi.h>

#include <iosfwd>
#include <map>
#include <memory>
#include <optional>
#include <string>

namespace settlewell {

struct RunOptions {
  std::string run_directory;
  bool overwrite = false;
  bool show_progress = true;
  bool progress_in_place = false; ///< true on a terminal
};

/// The headline numbers of a run (maxima over all steps).
struct RunSummary {
  std::size_t cells = 0, dofs = 0, steps = 0;
  double wall_seconds = 0.0;
  std::optional<double> settlement_inside;  ///< m, at the pit surface
  std::optional<double> settlement_outside; ///< m, at the ground surface outside the wall
  double settlement_anywhere = 0.0;         ///< m, largest over the whole model
  std::optional<double> drawdown_outside;   ///< m, outside the wall, any depth
  double drawdown_anywhere = 0.0;           ///< m
  /// Pumped volume per pumped line (m^3; per metre run in plane strain).
  std::map<std::string, double> pumped_volume;
  /// The same per stage, in stage order.
  std::map<std::string, std::vector<double>> stage_volume;
  /// Discharge of each pumped line at the last step, m^3/s.
  std::map<std::string, double> final_discharge;
  /// Largest relative water-balance error of a step, and its tolerance.
  double mass_balance = 0.0, mass_balance_tolerance = 0.0;
  std::string run_directory;
};

/// A scenario turned into a model: mesh, initial state, stage schedule, Biot core
/// and outputs. Everything that can fail on input fails in the constructor,
/// before anything is written.
class Simulation {
public:
  Simulation(scenario::Scenario scenario, MPI_Comm comm);
  ~Simulation();

  /// Runs every stage, writing the run folder. Collective.
  RunSummary run(const RunOptions& options);

private:
  struct Impl;
  std::unique_ptr<Impl> impl_;
};

/// Writes the summary lines of a finished run.
void print_summary(std::ostream& out,
                   const RunSummary& summary,
                   const scenario::Scenario& scenario);

/// Checks a scenario against its mesh without creating the Biot problem and
/// prints what `settlewell check` shows. Collective.
void check_scenario(const scenario::Scenario& scenario, MPI_Comm comm, std::ostream& out);

/// Writes the mesh of a scenario (.msh) and a VTU of its cells (region ids, with
/// the names as field data) and of its lines. Collective.
void write_scenario_mesh(const scenario::Scenario& scenario,
                         const std::string& directory,
                         MPI_Comm comm);

} // namespace settlewell
