#pragma once

// Private to src/monitors: the largest settlement and drawdown of the run, inside
// and outside the wall and anywhere (results.toml [summary]), and the largest
// settlement outside the wall in each stage.
#include "settlewell/monitors/monitor.h"

namespace settlewell::monitors {

class Extremes : public Monitor {
public:
  explicit Extremes(const RunContext& run);
  std::vector<double> after_step(const RunView& view) override;
  void finish(const RunView& view, toml::table& results) override;

private:
  using Dofs = std::vector<dealii::types::global_dof_index>;
  /// The largest of factor * solution over the owned `dofs` of every process.
  static double largest(const BiotProblem& problem, const Dofs& dofs, double factor);

  bool has_wall_zone_ = false;
  Dofs pit_surface_uy_, outside_surface_uy_, all_uy_, outside_p_, all_p_;
  double pit_ = 0, outside_ = 0, anywhere_ = 0, drawdown_outside_ = 0, drawdown_ = 0;
  std::vector<double> stage_outside_; ///< per stage, m
};

} // namespace settlewell::monitors
