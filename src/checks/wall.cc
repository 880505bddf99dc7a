#include "settlewell/checks/wall.h"

namespace settlewell::checks {

WallSection wall_section(const std::vector<double>& offsets,
                         const std::vector<double>& weights,
                         const std::vector<double>& sigma_yy,
                         const std::vector<double>& ux) {
  WallSection s;
  double thickness = 0.0;
  for (std::size_t q = 0; q < offsets.size(); ++q) {
    s.moment += weights[q] * sigma_yy[q] * offsets[q];
    s.mean_displacement += weights[q] * ux[q];
    thickness += weights[q];
  }
  s.mean_displacement /= thickness;
  return s;
}

} // namespace settlewell::checks
