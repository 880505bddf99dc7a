#include "settlewell/materials/poroelastic.h"

#include "range_check.h"

#include <cmath>

namespace settlewell {

PoroelasticMaterial PoroelasticMaterial::isotropic(double youngs, double nu, double k) {
  PoroelasticMaterial m;
  m.youngs_modulus = youngs;
  m.poisson_ratio = nu;
  m.conductivity_x = m.conductivity_y = k;
  return m;
}

double PoroelasticMaterial::youngs_from_mv(double mv, double nu) {
  // M_oed = E (1 - nu) / ((1 + nu)(1 - 2 nu)) = 1/mv (docs/verification-references.md,
  // section 9).
  return (1.0 + nu) * (1.0 - 2.0 * nu) / ((1.0 - nu) * mv);
}

double PoroelasticMaterial::lame_lambda() const {
  const double nu = poisson_ratio;
  return youngs_modulus * nu / ((1.0 + nu) * (1.0 - 2.0 * nu));
}

double PoroelasticMaterial::shear_modulus() const {
  return youngs_modulus / (2.0 * (1.0 + poisson_ratio));
}

double PoroelasticMaterial::constrained_modulus() const {
  return lame_lambda() + 2.0 * shear_modulus();
}

double PoroelasticMaterial::consolidation_coefficient(double conductivity,
                                                      double gamma_w) const {
  const double s1d = storage + biot_alpha * biot_alpha / constrained_modulus();
  return conductivity / (gamma_w * s1d);
}

using materials_detail::require;

void PoroelasticMaterial::validate(const std::string& where) const {
  require(std::isfinite(youngs_modulus) && youngs_modulus > 0.0, where,
          "Young's modulus must be positive, kPa", youngs_modulus);
  require(poisson_ratio > -1.0 && poisson_ratio < 0.5, where,
          "Poisson's ratio must lie in (-1, 0.5)", poisson_ratio);
  require(std::isfinite(conductivity_x) && conductivity_x > 0.0, where,
          "horizontal hydraulic conductivity must be positive, m/s", conductivity_x);
  require(std::isfinite(conductivity_y) && conductivity_y > 0.0, where,
          "vertical hydraulic conductivity must be positive, m/s", conductivity_y);
  require(biot_alpha > 0.0 && biot_alpha <= 1.0, where,
          "Biot coefficient must lie in (0, 1]", biot_alpha);
  require(std::isfinite(storage) && storage >= 0.0, where,
          "storage coefficient must not be negative, 1/kPa", storage);
}

} // namespace settlewell
