// A step with a clay whose Newton iteration or material update fails is taken
// again in two halves (and those in halves, down to a limit): everything the
// failed attempt changed is put back first, so that the halves start from the
// last accepted state.
#include "biot_problem_impl.h"

#include "settlewell/core/errors.h"
#include "settlewell/core/units.h"

#include <sstream>

namespace settlewell {

namespace {
/// The report of a step taken as `first` then `second`.
StepReport joined(const StepReport& first, const StepReport& second) {
  StepReport r = second;
  r.dt = first.dt + second.dt;
  r.new_matrix = first.new_matrix || second.new_matrix;
  r.iterations += first.iterations;
  r.drain_rounds += first.drain_rounds;
  r.drains_settled = first.drains_settled && second.drains_settled;
  r.held_inflow_share = std::max(first.held_inflow_share, second.held_inflow_share);
  r.assembly_seconds += first.assembly_seconds;
  r.factorisation_seconds += first.factorisation_seconds;
  r.solve_seconds += first.solve_seconds;
  r.newton_iterations += first.newton_iterations;
  r.factorisations += first.factorisations;
  r.line_search_cuts += first.line_search_cuts;
  r.newton_residuals.insert(r.newton_residuals.begin(), first.newton_residuals.begin(),
                            first.newton_residuals.end());
  r.sub_steps += first.sub_steps;
  return r;
}
} // namespace

BiotProblem::Impl::StepHistory BiotProblem::Impl::kept_history() const {
  StepHistory kept;
  kept.solution = owned_solution;
  kept.previous_solution = previous_solution;
  kept.previous_dt = previous_dt;
  kept.euler_steps_left = euler_steps_left;
  kept.draining = draining;
  kept.one_way_open = one_way_open;
  kept.pumped_stopped = pumped_stopped;
  return kept;
}

void BiotProblem::Impl::restore(const StepHistory& kept) {
  owned_solution = kept.solution;
  solution = owned_solution;
  previous_solution = kept.previous_solution;
  previous_dt = kept.previous_dt;
  euler_steps_left = kept.euler_steps_left;
  draining = kept.draining;
  one_way_open = kept.one_way_open;
  pumped_stopped = kept.pumped_stopped;
  reset_clay_trials();
}

StepReport BiotProblem::Impl::take_clay_step(double t_new, unsigned int halvings) {
  const StepHistory kept = kept_history();
  try {
    return take_step(t_new);
  } catch (const SolverError& failure) {
    restore(kept);
    if (halvings == setup.newton.max_halvings) {
      std::ostringstream os;
      os << failure.what();
      if (halvings > 0)
        os << " (the step was halved " << halvings << " times, to "
           << units::to_days(t_new - time) << " days)";
      os << "; the results stay at the last accepted step, day " << units::to_days(time);
      throw SolverError(os.str());
    }
  }
  // Outside the handler: a failure in a half leaves the state at its own start.
  const double t_mid = time + 0.5 * (t_new - time);
  const StepReport first = take_clay_step(t_mid, halvings + 1);
  return joined(first, take_clay_step(t_new, halvings + 1));
}

} // namespace settlewell
