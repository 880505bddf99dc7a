#pragma once

// Private to src/simulation: the largest settlement and drawdown seen in a run.
#include "settlewell/model/schedule.h"
#include "settlewell/physics/biot_problem.h"
#include "settlewell/scenario/scenario.h"
#include "settlewell/simulation/simulation.h"

#include <vector>

namespace settlewell {

class RunExtremes {
public:
  RunExtremes(const BiotProblem& problem, const scenario::Scenario& scenario);
  /// Takes the maxima of the current state into account. Collective.
  void update(const BiotProblem& problem);
  void fill(RunSummary& summary) const;

private:
  using Dofs = std::vector<dealii::types::global_dof_index>;
  double largest(const BiotProblem& problem, const Dofs& dofs, double factor) const;

  bool has_wall_zone_ = false;
  Dofs pit_surface_uy_, outside_surface_uy_, all_uy_, outside_p_, all_p_;
  double pit_ = 0, outside_ = 0, anywhere_ = 0, drawdown_outside_ = 0, drawdown_ = 0;
};

/// Writes manifest.json (inputs, program, stages, steps, wall time). Rank 0 writes.
void write_manifest(const std::string& path,
                    const scenario::Scenario& scenario,
                    const model::Schedule& schedule,
                    const RunSummary& summary,
                    const std::string& started,
                    MPI_Comm comm);

/// The summary `settlewell check` prints.
void describe_scenario(const scenario::Scenario& s,
                       const Mesh& mesh,
                       const model::Schedule& schedule,
                       std::ostream& out);

} // namespace settlewell
