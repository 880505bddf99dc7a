#include "settlewell/checks/damage.h"

#include "settlewell/core/errors.h"

#include <algorithm>
#include <cmath>

namespace settlewell::checks {

Distortion distortion(const FoundationMovement& m) {
  const std::size_t n = m.x.size();
  if (n < 2 || m.settlement.size() != n || m.ux.size() != n)
    throw InternalError("a foundation needs at least two sample points");
  Distortion d;
  d.length = m.x.back() - m.x.front();
  const auto [lo, hi] = std::minmax_element(m.settlement.begin(), m.settlement.end());
  d.max_settlement = *hi;
  d.differential = *hi - *lo;
  d.tilt = (m.settlement.back() - m.settlement.front()) / d.length;
  double largest_deviation = 0.0;
  for (std::size_t i = 0; i < n; ++i) {
    if (i + 1 < n) {
      const double slope =
          (m.settlement[i + 1] - m.settlement[i]) / (m.x[i + 1] - m.x[i]);
      d.angular_distortion = std::max(d.angular_distortion, std::abs(slope - d.tilt));
    }
    const double chord = m.settlement.front() + d.tilt * (m.x[i] - m.x.front());
    const double deviation = m.settlement[i] - chord; // positive: sags below the chord
    if (std::abs(deviation) > std::abs(largest_deviation))
      largest_deviation = deviation;
  }
  d.deflection_ratio = std::abs(largest_deviation) / d.length;
  d.hogging = largest_deviation < 0.0;
  d.horizontal_strain = (m.ux.back() - m.ux.front()) / d.length;
  return d;
}

DamageCategory category_from_strain(double strain) {
  if (strain < 0.0005)
    return {0, "negligible", "< 0.1 mm"};
  if (strain < 0.00075)
    return {1, "very slight", "up to 1 mm"};
  if (strain < 0.0015)
    return {2, "slight", "up to 5 mm"};
  if (strain < 0.003)
    return {3, "moderate", "5-15 mm, or several > 3 mm"};
  return {4, "severe to very severe", "15-25 mm, or > 25 mm"};
}

double principal_tensile_strain(double eh, double beta) {
  return eh / 2.0 + std::sqrt(eh * eh / 4.0 + beta * beta / 4.0);
}

BeamStrains
deep_beam_strains(double deflection_ratio, bool hogging, double L, double H, double eh) {
  const double nu = 0.3, E_over_G = 2.6;
  // Per unit thickness: second moment and distance from the neutral axis to the
  // extreme fibre in tension.
  const double I = hogging ? H * H * H / 3.0 : H * H * H / 12.0;
  const double t = hogging ? H : H / 2.0;
  const double bending_max =
      deflection_ratio / (L / (12.0 * t) + 3.0 * I * E_over_G / (2.0 * t * L * H));
  const double diagonal_max =
      deflection_ratio / (1.0 + H * L * L / (18.0 * I * E_over_G));
  BeamStrains s;
  s.bending = bending_max + eh;
  s.diagonal = eh * (1.0 - nu) / 2.0 + std::sqrt(eh * eh * std::pow((1.0 + nu) / 2.0, 2) +
                                                 diagonal_max * diagonal_max);
  return s;
}

} // namespace settlewell::checks
