#pragma once

// Private to src/monitors: the force in every prop at every output time
// (checks/props.csv), and each prop's largest force, overall and per stage
// (results.toml).
#include "settlewell/monitors/monitor.h"
#include "settlewell/output/csv_file.h"

#include <optional>

namespace settlewell::monitors {

class PropForces : public Monitor {
public:
  /// A section scenario with props only (make_monitors asks).
  explicit PropForces(const RunContext& run);
  void visit_state(StateArchive& a) override;
  void start(const RunView& view) override;
  void at_output_time(const RunView& view) override;
  void finish(const RunView& view, toml::table& results) override;

private:
  /// A spring's force in the units reported: kN per metre run in plane strain, the
  /// ring's hoop force (kN) in a shaft.
  double reported(double spring_force) const;

  const scenario::Scenario& scenario_;
  std::vector<double> times_;
  std::vector<std::vector<std::optional<double>>> forces_; ///< per time, per spring
  std::optional<CsvFile> table_;
};

} // namespace settlewell::monitors
