#pragma once

#include <vector>

/// A wall's section resultants from values sampled across its thickness. Pure
/// functions; m, kPa, kN.
namespace settlewell::checks {

struct WallSection {
  double mean_displacement = 0.0; ///< horizontal, averaged over the thickness, m
  double moment = 0.0;            ///< integral of sigma_yy (x - x_c) dx, kNm per m run
};

/// From a quadrature rule across the thickness: the offsets x - x_c (m) of its
/// points from the centre line and their weights (m, summing to the thickness), the
/// vertical total stress (kPa, tension positive) and the horizontal displacement (m)
/// at each. The moment is positive when the face at larger x is in tension.
WallSection wall_section(const std::vector<double>& offsets,
                         const std::vector<double>& weights,
                         const std::vector<double>& sigma_yy,
                         const std::vector<double>& ux);

} // namespace settlewell::checks
