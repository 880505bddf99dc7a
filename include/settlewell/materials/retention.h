#pragma once

#include <string>

namespace settlewell {

/// How much water a soil holds and how well it conducts it above the water
/// table, as functions of the pressure head psi = p / gamma_w (m; negative where
/// the water is in suction). At psi >= 0 the soil is saturated: theta = theta_s,
/// k_r = 1. Pure data and pure functions: no mesh, no MPI.
struct RetentionCurve {
  enum class Model {
    /// Van Genuchten (1980) eq. 3, S_e = [1 + (a |psi|)^n]^-m with m = 1 - 1/n,
    /// and Mualem's relative conductivity with l = 1/2 (van Genuchten 1980 eq. 8),
    /// k_r = S_e^(1/2) [1 - (1 - S_e^(1/m))^m]^2.
    van_genuchten,
    /// Gardner's (1958) exponential conductivity, k_r = exp(a psi), with the
    /// water content of the same exponent, S_e = exp(a psi): the pair for which
    /// Richards' equation becomes linear in k and has the closed forms of
    /// Srivastava & Yeh (1991).
    gardner,
  };
  Model model = Model::van_genuchten;
  double saturated_content = 0.0; ///< theta_s, the porosity the water fills, -
  double residual_content = 0.0;  ///< theta_r, -
  double alpha = 0.0;             ///< a, 1/m (of pressure head)
  double n = 0.0;                 ///< van Genuchten's n (> 1); unused by Gardner's

  /// The curve at one pressure head, with the derivatives Newton's method needs.
  struct Point {
    double content = 0.0;            ///< theta, -
    double capacity = 0.0;           ///< d theta / d psi, 1/m
    double saturation = 0.0;         ///< S_r = theta / theta_s, -
    double conductivity = 0.0;       ///< k_r, -
    double conductivity_slope = 0.0; ///< d k_r / d psi, 1/m
  };
  Point at(double pressure_head) const;

  /// Throws InputError naming `where` if a value is out of its physical range.
  void validate(const std::string& where) const;
  /// "van_genuchten" or "gardner".
  static const char* name(Model model);
};

} // namespace settlewell
