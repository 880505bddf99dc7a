#pragma once

// Private to src/monitors: the 1D hand estimate at each column beside the 2D
// settlement there (one_d/<column>.csv and results.toml [[columns]]).
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
  double ramp = 0.0;                        ///< s, of the stage that lowers the heads
  std::vector<double> times, settlement_2d; ///< every step
  std::vector<std::string> notes;
};

class Columns : public Monitor {
public:
  /// A section or box scenario only (make_monitors asks).
  explicit Columns(const RunContext& run);
  void visit_state(StateArchive& a) override;
  void start(const RunView& view) override;
  std::vector<double> after_step(const RunView& view) override;
  void finish(const RunView& view, toml::table& results) override;

private:
  void record(const RunView& view);
  std::vector<checks::ColumnLayer> column_layers() const;
  void design_falls(const RunContext& run);
  void compare(std::size_t c, const RunView& view);

  const scenario::Scenario& scenario_;
  const std::vector<scenario::Layer>& layers_;
  std::vector<SamplePoints> tops_, layer_mids_;
  std::vector<ColumnComparison> columns_;
  std::vector<double> design_fall_; ///< per layer of the stack, m (NaN: none set)
};

} // namespace settlewell::monitors
