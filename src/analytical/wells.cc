#include "settlewell/analytical/wells.h"

#include "settlewell/core/units.h"

#include <cmath>

namespace settlewell::analytical {

namespace {
constexpr double pi = units::pi;
} // namespace

double theis_well_function(double u) {
  return -std::expint(-u);
}

double theis_drawdown(double Q, double T, double S, double r, double t) {
  const double u = r * r * S / (4.0 * T * t);
  return Q / (4.0 * pi * T) * theis_well_function(u);
}

double thiem_drawdown_difference(double Q, double T, double r1, double r2) {
  return Q / (2.0 * pi * T) * std::log(r2 / r1);
}

double well_row_convergence_loss(double Q, double T, double spacing, double radius) {
  return Q / (2.0 * pi * T) * std::log(spacing / (2.0 * pi * radius));
}

} // namespace settlewell::analytical
