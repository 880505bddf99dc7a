#include "settlewell/analytical/mandel.h"

#include "settlewell/analytical/roots.h"
#include "settlewell/core/units.h"

#include <cmath>

namespace settlewell::analytical {

namespace {
constexpr double pi = units::pi;
} // namespace

MandelSolution::MandelSolution(double nu, double nu_u, unsigned int n_terms)
    : nu_(nu)
    , nu_u_(nu_u) {
  // Roots of tan(a) = c a with c = (1 - nu)/(nu_u - nu), one in each interval
  // ((n-1) pi, (n - 1/2) pi), where g(a) = sin a - c a cos a changes sign.
  const double c = (1.0 - nu) / (nu_u - nu);
  auto g = [c](double a) { return std::sin(a) - c * a * std::cos(a); };
  for (unsigned int n = 1; n <= n_terms; ++n)
    roots_.push_back(bracketed_root(g, (n - 1) * pi + 1e-12, (n - 0.5) * pi));
}

double MandelSolution::pressure_ratio(double x_over_a, double t_star) const {
  double sum = 0.0;
  for (const double a : roots_) {
    const double D = a - std::sin(a) * std::cos(a);
    sum += std::sin(a) / D * (std::cos(a * x_over_a) - std::cos(a)) *
           std::exp(-a * a * t_star);
  }
  return 2.0 * sum;
}

double MandelSolution::sum_sin_cos(double t_star) const {
  double sum = 0.0;
  for (const double a : roots_) {
    const double D = a - std::sin(a) * std::cos(a);
    sum += std::sin(a) * std::cos(a) / D * std::exp(-a * a * t_star);
  }
  return sum;
}

double MandelSolution::plate_displacement_ratio(double t_star) const {
  return -(1.0 - nu_) + 2.0 * (1.0 - nu_u_) * sum_sin_cos(t_star);
}

double MandelSolution::side_displacement_ratio(double t_star) const {
  // nu - 2 nu_u S + 2 S, with S the sum of sin cos / D terms.
  return nu_ + 2.0 * (1.0 - nu_u_) * sum_sin_cos(t_star);
}

} // namespace settlewell::analytical
