#pragma once

// Private to src/monitors: whether the results stay within what the model assumes,
// checked after every step and counted (results.toml's [plausibility]).
#include "settlewell/monitors/monitor.h"

#include <deal.II/base/index_set.h>

namespace settlewell::monitors {

/// Small strains are the model's premise: a movement of a twentieth of the model's
/// height says the stiffnesses (or the loads) are far from real ground. The first
/// step beyond it is warned of on one line; the count goes into the run's last
/// lines and the report.
class Plausibility : public Monitor {
public:
  explicit Plausibility(const RunContext& run);
  std::vector<double> after_step(const RunView& view) override;
  void finish(const RunView& view, toml::table& results) override;
  void visit_state(StateArchive& a) override;

private:
  std::vector<dealii::types::global_dof_index> displacement_dofs_; ///< owned
  double height_ = 0.0, limit_ = 0.0;                              ///< m
  double largest_ = 0.0; ///< m, over the steps so far
  std::size_t steps_over_ = 0;
};

} // namespace settlewell::monitors
