#pragma once

#include <string>

namespace settlewell {

/// Isotropic linear-elastic skeleton with anisotropic hydraulic conductivity.
/// Units: kPa, m/s, 1/kPa. Pure data and pure functions: no mesh, no MPI.
struct PoroelasticMaterial {
  double youngs_modulus = 0.0; ///< drained E', kPa
  double poisson_ratio = 0.0;  ///< drained nu'
  double conductivity_x = 0.0; ///< kx (kr in axisymmetric), m/s
  double conductivity_y = 0.0; ///< ky (kz in axisymmetric), m/s
  double biot_alpha = 1.0;     ///< Biot coefficient alpha, (0, 1]
  double storage = 0.0;        ///< S = 1/M, 1/kPa (0: incompressible constituents)

  /// E' from the coefficient of volume compressibility mv (1/kPa), i.e. the
  /// constrained modulus 1/mv, and nu'.
  static double youngs_from_mv(double mv, double nu);
  /// E' (kPa), nu' and one conductivity k (m/s) in both directions; alpha = 1, S = 0.
  static PoroelasticMaterial isotropic(double youngs, double nu, double k);

  double lame_lambda() const;
  double shear_modulus() const;
  /// Constrained (oedometer) modulus K + 4G/3 = 1/mv, kPa.
  double constrained_modulus() const;
  /// Generalised coefficient of consolidation k/(gamma_w (S + alpha^2/M_oed)), m^2/s,
  /// for the conductivity of the given direction.
  double consolidation_coefficient(double conductivity, double gamma_w) const;

  /// Throws InputError naming `where` if a value is out of its physical range.
  void validate(const std::string& where) const;
};

} // namespace settlewell
