#include "settlewell/analytical/consolidation.h"

#include "settlewell/analytical/roots.h"
#include "settlewell/core/units.h"

#include <cmath>
#include <stdexcept>
#include <utility>

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

double terzaghi_excess_ratio_stepped(double Z,
                                     double dT,
                                     unsigned int n_steps,
                                     unsigned int euler_steps) {
  if (n_steps == 0)
    return 1.0;
  // Under BDF2 a fast mode's amplitude oscillates as it falls: stop after a run of
  // negligible terms, not at the first.
  double sum = 0.0;
  unsigned int negligible = 0;
  for (unsigned int m = 0; m < 2000000 && negligible < 20; ++m) {
    const double M = mode(m), lambda = M * M * dT;
    double before = 1.0, now = 1.0 / (1.0 + lambda);
    for (unsigned int k = 1; k < n_steps; ++k)
      before = std::exchange(now, k < euler_steps
                                      ? now / (1.0 + lambda)
                                      : (4.0 * now - before) / (3.0 + 2.0 * lambda));
    const double term = 2.0 / M * now;
    sum += term * std::sin(M * Z);
    const bool small = std::abs(term) < 1e-16 && 2.0 / M * std::abs(before) < 1e-16;
    negligible = m > 10 && small ? negligible + 1 : 0;
  }
  return sum;
}

double terzaghi_time_factor(double U) {
  if (!(U > 0.0 && U < 1.0))
    throw std::domain_error("U must lie in (0, 1)");
  return bracketed_root([U](double T) { return terzaghi_average_degree(T) - U; }, 1e-12,
                        10.0);
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

} // namespace settlewell::analytical
