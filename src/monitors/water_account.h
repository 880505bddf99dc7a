#pragma once

// Private to src/monitors: the discharge of every pumped line and the water balance
// of every step (steps.csv), the volumes per stage and the balance (results.toml).
#include "settlewell/monitors/monitor.h"

#include <map>

namespace settlewell::monitors {

class WaterAccount : public Monitor {
public:
  explicit WaterAccount(const RunContext& run);
  void visit_state(StateArchive& a) override;
  std::vector<std::string> step_columns() const override;
  std::vector<double> after_step(const RunView& view) override;
  void finish(const RunView& view, toml::table& results) override;

private:
  std::vector<model::PumpedLine> pumped_;
  double tolerance_;
  std::map<std::string, double> volume_, final_discharge_;  ///< m^3; m^3/s
  std::map<std::string, std::vector<double>> stage_volume_; ///< m^3 per stage
  double worst_balance_ = 0.0;
  double largest_moved_ = 0.0; ///< water moved in the largest step so far, m^3
  std::size_t steps_off_ = 0;  ///< steps whose balance error exceeds the tolerance
};

} // namespace settlewell::monitors
