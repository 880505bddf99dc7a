#pragma once

// Private to src/monitors: the discharge of every pumped line, the water that
// enters through every other line that holds a head or a flux, and the water
// balance of every step (steps.csv); the volumes per stage, the water budget (where
// the pumped water comes from) and the balance (results.toml).
#include "settlewell/monitors/monitor.h"

#include <map>
#include <set>
#include <string>
#include <vector>

namespace settlewell::monitors {

class WaterAccount : public Monitor {
public:
  explicit WaterAccount(const RunContext& run);
  void visit_state(StateArchive& a) override;
  std::vector<std::string> step_columns() const override;
  std::vector<double> after_step(const RunView& view) override;
  void finish(const RunView& view, toml::table& results) override;

private:
  void write_budget(const RunView& view, toml::table& results) const;

  std::vector<model::PumpedLine> pumped_;
  std::vector<std::string> sources_; ///< lines, not pumped, that hold a head or a flux
  std::set<std::string> far_;        ///< those of them that are the model's lateral edges
  std::map<std::string, double> inflow_volume_, final_inflow_; ///< m^3; m^3/s
  double storage_release_ = 0.0, final_storage_release_ = 0.0; ///< m^3; m^3/s
  double tolerance_;
  std::map<std::string, double> volume_, final_discharge_;  ///< m^3; m^3/s
  std::map<std::string, std::vector<double>> stage_volume_; ///< m^3 per stage
  double worst_balance_ = 0.0;
  double largest_moved_ = 0.0; ///< water moved in the largest step so far, m^3
  std::size_t steps_off_ = 0;  ///< steps whose balance error exceeds the tolerance
  /// Steps whose one-way lines' active set had not settled at the round limit.
  std::uint64_t unsettled_steps_ = 0;
  /// Steps whose one-way points kept held to the step's end took in more than
  /// held_inflow_limit of the water the lines let out, and the largest share.
  std::uint64_t held_inflow_steps_ = 0;
  double largest_held_inflow_ = 0.0;
  /// Steps in which a pumped line put water into the ground, stood stopped (it
  /// would have put water in), or ran dry (its target below it), by label.
  struct LineSteps {
    std::uint64_t injecting = 0, stopped = 0, dry = 0;
  };
  std::map<std::string, LineSteps> line_steps_;
  void note_injection(const RunView& view, const model::PumpedLine& line, double q);
  void note_one_way(const RunView& view, const model::PumpedLine& line);
};

} // namespace settlewell::monitors
