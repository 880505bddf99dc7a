#pragma once

#include "settlewell/core/state_archive.h"
#include "settlewell/model/initial_state.h"
#include "settlewell/model/model_builder.h"
#include "settlewell/model/schedule.h"
#include "settlewell/output/derived.h"
#include "settlewell/physics/biot_problem.h"
#include "settlewell/scenario/scenario.h"

#include <toml++/toml.h>

#include <memory>
#include <string>
#include <vector>

/// The monitors of a run: each watches the run and writes what it sees (fields,
/// histories, profiles, discharges, the engineering checks). The run loop calls
/// them; they read the solution through the output module, never the solver.
namespace settlewell::monitors {

/// What a run is made of (all owned by the run loop), for building monitors.
struct RunContext {
  const scenario::Scenario& scenario;
  const model::Schedule& schedule;
  const model::Model& model;
  const model::InitialState& initial;
  const BiotProblem& problem;
  const Derivation& derivation;
};

/// The run at one moment: at the start (step 0, an empty step report) or after a
/// step.
struct RunView {
  const RunContext& run;
  const std::string& folder; ///< the run folder
  const StepReport& step;
  std::size_t step_number = 0;

  double time() const { return run.problem.time(); }
  /// The index of the stage the current time belongs to (0 at the start).
  std::size_t stage() const { return run.schedule.stage_at(time()); }
  MPI_Comm comm() const { return run.problem.communicator(); }
};

/// One watcher of a run. A monitor is built with the simulation, so that whatever
/// in the scenario it cannot use (a point outside the mesh) fails before anything
/// is written; it opens its files in start(). Every call is collective: rank 0
/// writes the files.
class Monitor {
public:
  virtual ~Monitor() = default;
  /// The columns it adds to steps.csv (units in the names), fixed for the run.
  virtual std::vector<std::string> step_columns() const { return {}; }
  /// At t = 0, before the first step: opens its files in view.folder.
  virtual void start(const RunView&) {}
  /// After every step: the values of its step columns, in their order.
  virtual std::vector<double> after_step(const RunView&) { return {}; }
  /// At t = 0 and at every output time, after start() or after_step().
  virtual void at_output_time(const RunView&) {}
  /// After the last step: its last files, and its part of results.toml.
  virtual void finish(const RunView&, toml::table& results) { (void)results; }
  /// Saves or loads (a checkpoint) what it has gathered since start() and its open
  /// files; loading stands in for start() when a run resumes. Rank 0's state is
  /// saved and loaded on every rank: a monitor keeps the same state on each.
  virtual void visit_state(StateArchive&) {}
};

/// The monitors a scenario asks for, in the order they are called: fields, point
/// histories and profiles, discharges and water balance, the extremes, base
/// stability, neighbouring buildings and the 1D comparison at columns. Collective.
std::vector<std::unique_ptr<Monitor>> make_monitors(const RunContext& run);

} // namespace settlewell::monitors
