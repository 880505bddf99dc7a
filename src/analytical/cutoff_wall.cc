#include "settlewell/analytical/cutoff_wall.h"

#include "settlewell/core/units.h"

#include <cmath>

namespace settlewell::analytical {

namespace {
constexpr double pi = units::pi;
} // namespace

double harr_discharge_ratio(double d_over_T) {
  const double l = std::sin(pi * d_over_T / 2.0);
  const double l_complement = std::cos(pi * d_over_T / 2.0);
  return std::comp_ellint_1(l_complement) / (2.0 * std::comp_ellint_1(l));
}

double harr_exit_gradient_ratio(double d_over_T) {
  const double l = std::sin(pi * d_over_T / 2.0);
  return pi / (4.0 * l * std::comp_ellint_1(l));
}

} // namespace settlewell::analytical
