#pragma once

// Private to src/monitors: the factors of safety of the excavation base at every
// output time (checks/base_stability.csv) and their histories (results.toml).
#include "settlewell/monitors/monitor.h"
#include "settlewell/output/csv_file.h"
#include "settlewell/output/samples.h"

#include <optional>

namespace settlewell::monitors {

/// Base stability at one time (a section only).
struct BaseState {
  double time = 0.0;          ///< s
  double exit_gradient = 0.0; ///< largest upward gradient below the base
  double exit_x = 0.0;        ///< where, m
  double critical_gradient = 0.0;
  double piping_factor = 0.0;
  struct Heave {
    std::string side;              ///< "right" or "left"
    double depth = 0.0;            ///< embedment below the excavation level, m
    double mean_excess_head = 0.0; ///< m
    double factor = 0.0;
  };
  std::vector<Heave> heave;
  struct Uplift {
    std::string layer;
    double underside = 0.0;     ///< elevation, m
    double overburden = 0.0;    ///< kPa, from the excavation level down
    double pore_pressure = 0.0; ///< kPa, largest along the underside in the pit
    double factor = 0.0;
  };
  std::vector<Uplift> uplift;
};

class BaseStability : public Monitor {
public:
  /// A section scenario only (make_monitors asks).
  explicit BaseStability(const RunContext& run);
  void start(const RunView& view) override;
  void at_output_time(const RunView& view) override;
  void finish(const RunView& view, toml::table& results) override;

private:
  BaseState evaluate(const RunView& view) const;

  const scenario::Scenario& scenario_;
  const scenario::Section& section_;
  std::optional<SamplePoints> exit_points_;
  std::vector<std::pair<std::string, std::pair<SamplePoints, SamplePoints>>> prisms_;
  std::vector<std::pair<scenario::Layer, SamplePoints>> uplift_lines_;
  std::vector<BaseState> history_;
  std::string folder_;
  std::optional<CsvFile> table_;
};

} // namespace settlewell::monitors
