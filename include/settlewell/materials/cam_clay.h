#pragma once

#include <array>
#include <string>

namespace settlewell {

/// A symmetric stress or strain of a plane-strain or axisymmetric model: the
/// components xx, yy, zz (out of plane, or hoop) and xy, with the tensor (not the
/// engineering) shear. Tension positive, as everywhere inside the program.
using PlaneTensor = std::array<double, 4>;
/// d(stress)/d(strain) on PlaneTensor components: entry [i][j] is the change of
/// stress component i for a unit change of strain component j (for j = xy: of xy
/// and yx together).
using PlaneTangent = std::array<std::array<double, 4>, 4>;

/// Modified Cam Clay (Roscoe & Burland 1968) for a clay's skeleton, small strain.
/// Elastic volume change and hardening follow exponential laws of the volumetric
/// strain, p' = p'_n exp(v0 dev_e / kappa) and p'c = p'c_n exp(v0 dev_p /
/// (lambda - kappa)), i.e. straight lines in v-ln p' for a fixed specific volume v0
/// (small strain). The yield surface is q^2/M^2 + p'(p' - p'c) = 0 with
/// associated flow. Units: kPa.
struct CamClayParameters {
  double lambda = 0.0;               ///< slope of the normal compression line in v-ln p'
  double kappa = 0.0;                ///< slope of unloading-reloading lines in v-ln p'
  double specific_volume = 0.0;      ///< v0 = 1 + e0
  double critical_state_slope = 0.0; ///< M = q/p' at critical state
  double poisson_ratio = 0.0;        ///< nu', for the shear modulus when none is given
  /// G (kPa); 0 means G from nu' and the bulk modulus v0 p'/kappa at the start of
  /// each increment.
  double shear_modulus = 0.0;

  /// From the oedometer's terms: compression index Cc, recompression index Cr (of
  /// e against log10 sigma'), initial void ratio e0, the critical-state friction
  /// angle (degrees) and nu': lambda = Cc / ln 10, kappa = Cr / ln 10.
  static CamClayParameters from_indices(double compression_index,
                                        double recompression_index,
                                        double void_ratio,
                                        double friction_angle_degrees,
                                        double poisson_ratio);

  /// Throws InputError naming `where` if a value is out of its range.
  void validate(const std::string& where) const;
};

/// M in triaxial compression from the critical-state friction angle (degrees):
/// M = 6 sin(phi') / (3 - sin(phi')).
double critical_state_slope(double friction_angle_degrees);

/// p'c of the yield ellipse through the stress a clay reached when it was
/// consolidated one-dimensionally to the vertical effective stress sigma'p with
/// the earth-pressure coefficient K0nc (kPa): p' = sigma'p (1 + 2 K0nc)/3,
/// q = sigma'p (1 - K0nc), p'c = p' + q^2 / (M^2 p').
double yield_size_from_vertical_preconsolidation(double vertical_preconsolidation,
                                                 double k0_normally_consolidated,
                                                 double critical_state_slope);

/// The stress ratio eta = q/p' that the model keeps on one-dimensional normal
/// compression with G from nu' (the root in (0, M) of
///   (2/3) lambda = eta kappa 2(1 + nu)/(9(1 - 2 nu)) + (lambda - kappa) 2 eta/(M^2 -
///   eta^2),
/// derived from the model's laws; Wood 1990 ch. 6 gives the approach).
double one_dimensional_stress_ratio(const CamClayParameters& parameters);

/// The history a material point keeps between accepted steps.
struct CamClayState {
  PlaneTensor stress{};    ///< absolute effective stress, kPa, tension positive
  double yield_size = 0.0; ///< p'c, the size of the yield ellipse, kPa
};

struct CamClayUpdate {
  CamClayState state;
  PlaneTangent tangent{}; ///< consistent with the implicit update, kPa
  bool yielded = false;
  unsigned int iterations = 0; ///< of the local Newton solve (0 when elastic)
};

/// The stress, yield size and consistent tangent after the strain increment
/// (tension positive) from the committed state: implicit (backward Euler) return
/// to the yield surface, a pure function. Throws SolverError when the committed
/// mean effective stress is not positive or the local solve fails (the caller
/// cuts the step).
CamClayUpdate cam_clay_update(const CamClayParameters& parameters,
                              const CamClayState& committed,
                              const PlaneTensor& strain_increment);

/// Mean effective stress p' = -tr(sigma)/3 and deviator q = sqrt(3/2 s:s) of a
/// tension-positive stress, kPa (p' compression positive).
double mean_effective_stress(const PlaneTensor& stress);
double deviator_stress(const PlaneTensor& stress);
/// a : b of two PlaneTensors (the shear counted twice, for xy and yx).
inline double double_contraction(const PlaneTensor& a, const PlaneTensor& b) {
  return a[0] * b[0] + a[1] * b[1] + a[2] * b[2] + 2.0 * a[3] * b[3];
}
/// p'c of the yield ellipse through a stress (p' > 0), kPa: p' + q^2/(M^2 p').
double yield_size_through(const PlaneTensor& stress, double critical_state_slope);

} // namespace settlewell
