#include "clay_yield.h"

namespace settlewell::monitors {

void ClayYield::finish(const RunView& view, toml::table& results) {
  toml::array rows;
  for (const auto& y : view.run.problem.clay_yield()) {
    toml::table t{{"region", y.region},
                  {"points", int64_t(y.points)},
                  {"yielded_points", int64_t(y.yielded)},
                  {"yielded_share", y.points > 0 ? double(y.yielded) / y.points : 0.0}};
    if (y.yielded > 0) {
      t.insert("x_from_m", y.x_from);
      t.insert("x_to_m", y.x_to);
      t.insert("elevation_from_m", y.y_from);
      t.insert("elevation_to_m", y.y_to);
      t.insert("largest_change_of_yield_size_kpa", y.largest_change);
    }
    rows.push_back(t);
  }
  results.insert("clay_yield", rows);
}

} // namespace settlewell::monitors
