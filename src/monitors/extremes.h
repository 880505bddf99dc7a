#pragma once

// Private to src/monitors: the largest settlement and drawdown of the run, inside
// and outside the wall and anywhere (results.toml [summary]), and the largest
// settlement outside the wall in each stage. When the pit is dug, the settlement of
// the pit surface counts until the first lift and the heave of the ground left
// inside the wall after it.
#include "settlewell/monitors/monitor.h"

namespace settlewell::monitors {

class Extremes : public Monitor {
public:
  explicit Extremes(const RunContext& run);
  void visit_state(StateArchive& a) override;
  std::vector<double> after_step(const RunView& view) override;
  void finish(const RunView& view, toml::table& results) override;

private:
  using Dofs = std::vector<dealii::types::global_dof_index>;
  /// The largest of factor * solution over the owned `dofs` of every process.
  static double largest(const BiotProblem& problem, const Dofs& dofs, double factor);
  /// The largest upward displacement of the ground still in the model inside the
  /// wall, over every process.
  double floor_heave_now(const BiotProblem& problem) const;

  bool has_wall_zone_ = false;
  double inner_ = 0.0;       ///< half the pit's width, m
  double first_dig_ = -1.0;  ///< s; negative: the pit is not dug
  double floor_heave_ = 0.0; ///< m, largest after the first lift
  Dofs pit_surface_uy_, outside_surface_uy_, all_uy_, outside_p_, all_p_;
  double pit_ = 0, outside_ = 0, anywhere_ = 0, drawdown_outside_ = 0, drawdown_ = 0;
  std::vector<double> stage_outside_; ///< per stage, m
};

} // namespace settlewell::monitors
