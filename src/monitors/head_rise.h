#pragma once

// Private to src/monitors: heads that rise in a stage that only lowers them
// (results.toml's [head_rise]).
#include "extremes.h"

#include <cstdint>
#include <vector>

namespace settlewell::monitors {

/// Whether each stage only lowers heads: it lowers a held head or the pit's water
/// or pumps more, and raises no held head, pumps no less, digs nothing and adds or
/// changes no load. A stage that changes nothing lowers nothing.
std::vector<bool> stages_that_lower(const scenario::Scenario& s);

/// In a stage that only lowers heads, a head in permeable soil (more permeable than
/// checks.low_permeability) that rises above its value at the stage's start by more
/// than checks.head_rise_limit is warned of once, and the steps are counted per
/// stage: water comes from somewhere the stage does not mean (a boundary that
/// feeds it, a recharge, a load). Low-permeability layers are not watched: they
/// answer the changes of stress undrained, and their heads rise where the ground
/// beside them compresses (the Mandel-Cryer and Noordbergen effects; Verruijt
/// 1969, from memory), with no water from anywhere.
class HeadRise : public Monitor {
public:
  explicit HeadRise(const RunContext& run);
  void start(const RunView& view) override;
  std::vector<double> after_step(const RunView& view) override;
  void finish(const RunView& view, toml::table& results) override;
  /// After a resume the rises of the stage then running are measured from the
  /// resumed state (the stage's start is not kept in a checkpoint).
  void visit_state(StateArchive& a) override;

private:
  /// The owned pressure dofs of the soil (a section's wall is no soil), their
  /// support points and regions.
  std::vector<dealii::types::global_dof_index> dofs_;
  std::vector<dealii::Point<2>> points_;
  std::vector<std::string> regions_;
  /// Excess pore pressure at dofs_ after the last step and at the stage's start,
  /// kPa; empty until known.
  std::vector<double> last_, stage_start_;
  std::size_t stage_ = 0;
  std::vector<bool> lowers_;
  std::vector<std::string> names_; ///< of the stages
  double limit_ = 0.0;             ///< m
  double gamma_w_ = 0.0;
  std::vector<Located> largest_;          ///< per stage, m
  std::vector<std::uint64_t> steps_over_; ///< per stage
};

} // namespace settlewell::monitors
