#pragma once

// Private to src/monitors: the wall's deflection and bending moment against depth at
// every output time (checks/wall.csv), and their largest values, overall and per
// stage (results.toml).
#include "settlewell/monitors/monitor.h"
#include "settlewell/output/csv_file.h"
#include "settlewell/output/samples.h"

#include <optional>

namespace settlewell::monitors {

class WallProfile : public Monitor {
public:
  /// A section scenario with a wall (make_monitors asks).
  explicit WallProfile(const RunContext& run);
  void visit_state(StateArchive& a) override;
  void start(const RunView& view) override;
  void at_output_time(const RunView& view) override;
  void finish(const RunView& view, toml::table& results) override;

private:
  struct Side {
    std::string name;     ///< "right" or "left"
    double inward = -1.0; ///< the sign of x towards the pit
    double centre = 0.0;  ///< x of the wall's centre line, m
    SamplePoints across;  ///< Gauss points across the thickness at every depth
  };
  /// Per depth: deflection towards the pit (m) and bending moment (kNm/m,
  /// positive with the pit-side face in tension).
  struct Profile {
    std::vector<double> deflection, moment;
  };
  Profile evaluate(const Side& side, const RunView& view) const;

  const scenario::Scenario& scenario_;
  std::vector<double> depths_;            ///< elevations of the samples, m
  std::vector<double> gauss_x_, gauss_w_; ///< on [-1, 1]
  std::vector<Side> sides_;
  struct Extreme {
    double value = 0.0, y = 0.0, time = 0.0;
    friend void visit(StateArchive& a, Extreme& e) { a& e.value& e.y& e.time; }
  };
  /// Per side: the largest deflection and |moment|, overall and per stage.
  std::vector<std::optional<Extreme>> deflection_, moment_;
  std::vector<std::vector<std::optional<Extreme>>> stage_deflection_, stage_moment_;
  std::optional<CsvFile> table_;
};

} // namespace settlewell::monitors
