#include "settlewell/verification/analytical.h"

#include "settlewell/core/units.h"

#include <cmath>
#include <stdexcept>

namespace settlewell::analytical {

namespace {

constexpr double pi = units::pi;

/// Enough terms that exp(-M^2 T) of the last one is below 1e-17.
unsigned int terms_for(double T) {
  const double m_max = std::sqrt(40.0 / std::max(T, 1e-12)) / pi + 10.0;
  return static_cast<unsigned int>(std::min(m_max, 2.0e6));
}

double mode(unsigned int m) {
  return pi * (2.0 * m + 1.0) / 2.0;
}

} // namespace

double terzaghi_average_degree(double Tv) {
  if (Tv <= 0.0)
    return 0.0;
  double sum = 0.0;
  for (unsigned int m = 0, n = terms_for(Tv); m < n; ++m) {
    const double M = mode(m);
    sum += 2.0 / (M * M) * std::exp(-M * M * Tv);
  }
  return 1.0 - sum;
}

double terzaghi_excess_ratio(double Z, double Tv) {
  if (Tv <= 0.0)
    return 1.0;
  double sum = 0.0;
  for (unsigned int m = 0, n = terms_for(Tv); m < n; ++m) {
    const double M = mode(m);
    sum += 2.0 / M * std::sin(M * Z) * std::exp(-M * M * Tv);
  }
  return sum;
}

double terzaghi_excess_ratio_backward_euler(double Z, double dT, unsigned int n_steps) {
  // Terms fall as M^-(1 + 2n); stop when they are negligible.
  double sum = 0.0;
  for (unsigned int m = 0; m < 2000000; ++m) {
    const double M = mode(m);
    const double term = 2.0 / M * std::pow(1.0 + M * M * dT, -double(n_steps));
    sum += term * std::sin(M * Z);
    if (m > 10 && term < 1e-16)
      break;
  }
  return sum;
}

double terzaghi_time_factor(double U) {
  if (!(U > 0.0 && U < 1.0))
    throw std::domain_error("U must lie in (0, 1)");
  double lo = 1e-12, hi = 10.0;
  for (int i = 0; i < 200; ++i) {
    const double mid = std::sqrt(lo * hi);
    (terzaghi_average_degree(mid) < U ? lo : hi) = mid;
  }
  return std::sqrt(lo * hi);
}

// Closed forms of the algebraic tails, so that only fast-decaying terms are summed:
// sum 1/M^4 = 1/6 and sum 2 sin(M Z)/M^3 = Z - Z^2/2 (the steady profile of a
// unit source with a drained face at Z = 0 and a sealed one at Z = 1).
double olson_average_degree(double T, double Tc) {
  if (T <= 0.0)
    return 0.0;
  double sum = 0.0; // of the exponential parts
  if (T <= Tc) {
    for (unsigned int m = 0, n = terms_for(T); m < n; ++m) {
      const double M2 = mode(m) * mode(m);
      sum += std::exp(-M2 * T) / (M2 * M2);
    }
    return T / Tc * (1.0 - 2.0 / T * (1.0 / 6.0 - sum));
  }
  for (unsigned int m = 0, n = terms_for(T - Tc); m < n; ++m) {
    const double M2 = mode(m) * mode(m);
    sum += (std::exp(-M2 * (T - Tc)) - std::exp(-M2 * T)) / (M2 * M2);
  }
  return 1.0 - 2.0 / Tc * sum;
}

double olson_excess_ratio(double Z, double T, double Tc) {
  if (T <= 0.0)
    return 0.0;
  double sum = 0.0;
  if (T <= Tc) {
    for (unsigned int m = 0, n = terms_for(T); m < n; ++m) {
      const double M = mode(m);
      sum += 2.0 / (M * M * M) * std::sin(M * Z) * std::exp(-M * M * T);
    }
    return (Z - 0.5 * Z * Z - sum) / Tc;
  }
  for (unsigned int m = 0, n = terms_for(T - Tc); m < n; ++m) {
    const double M = mode(m), M2 = M * M;
    sum +=
        2.0 / (M2 * M) * std::sin(M * Z) * (std::exp(-M2 * (T - Tc)) - std::exp(-M2 * T));
  }
  return sum / Tc;
}

MandelSolution::MandelSolution(double nu, double nu_u, unsigned int n_terms)
    : nu_(nu)
    , nu_u_(nu_u) {
  // Roots of tan(a) = c a with c = (1 - nu)/(nu_u - nu), one in each interval
  // ((n-1) pi, (n - 1/2) pi); bisection on g(a) = sin a - c a cos a.
  const double c = (1.0 - nu) / (nu_u - nu);
  for (unsigned int n = 1; n <= n_terms; ++n) {
    double lo = (n - 1) * pi + 1e-12, hi = (n - 0.5) * pi;
    auto g = [c](double a) { return std::sin(a) - c * a * std::cos(a); };
    const double g_lo = g(lo);
    for (int i = 0; i < 200; ++i) {
      const double mid = 0.5 * (lo + hi);
      ((g(mid) < 0.0) == (g_lo < 0.0) ? lo : hi) = mid;
    }
    roots_.push_back(0.5 * (lo + hi));
  }
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
