#pragma once

// Private to src/monitors: the 1D hand estimate at each column beside the 2D
// settlement there (one_d/<column>.csv and results.toml [[columns]]).
#include "column_stack.h"

#include "settlewell/checks/one_d.h"
#include "settlewell/monitors/monitor.h"
#include "settlewell/output/samples.h"

namespace settlewell::monitors {

/// The 1D estimate at a column beside the 2D settlement there.
struct ColumnComparison {
  std::string name;
  double x = 0.0;
  checks::OneDEstimate design; ///< head falls the scenario sets (wells' and boundaries')
  checks::OneDEstimate computed; ///< head falls the 2D model computed at this column
  bool design_known = false;
  bool surface_drained = false;   ///< the boundary at the column's top holds a head
  std::vector<StackLayer> layers; ///< the regions the column crosses, top down
  /// Per layer: a Cam Clay layer's oedometer description (its e-log estimate).
  std::vector<std::optional<checks::ColumnLayer::Oedometer>> oedometers;
  double ramp = 0.0;                        ///< s, of the stage that lowers the heads
  std::vector<double> times, settlement_2d; ///< every step
  std::vector<std::string> notes;
};

class Columns : public Monitor {
public:
  /// Throws InputError when a column misses the mesh. Collective.
  explicit Columns(const RunContext& run);
  void visit_state(StateArchive& a) override;
  void start(const RunView& view) override;
  std::vector<double> after_step(const RunView& view) override;
  void finish(const RunView& view, toml::table& results) override;

private:
  void record(const RunView& view);
  std::vector<checks::ColumnLayer> column_layers(const ColumnComparison& c) const;
  void design_falls(const RunContext& run);
  void compare(std::size_t c, const RunView& view);

  const scenario::Scenario& scenario_;
  const std::map<std::string, PoroelasticMaterial>& materials_; ///< by region
  std::vector<SamplePoints> tops_, layer_levels_;
  std::vector<ColumnComparison> columns_;
  std::map<std::string, double> design_fall_; ///< by region, m
};

} // namespace settlewell::monitors
