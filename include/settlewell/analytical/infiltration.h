#pragma once

#include <vector>

/// Srivastava & Yeh (1991): one-dimensional transient infiltration toward a water
/// table in a homogeneous Gardner soil, k = ks exp(a psi) and theta = theta_r +
/// (theta_s - theta_r) exp(a psi), for which Richards' equation is linear in k.
namespace settlewell::analytical {

/// A column of height L over a water table held at its base (psi = 0 at z = 0, z
/// up), hydrostatic and still at t = 0 (psi = -z), that receives a constant
/// infiltration q from t = 0 on at its top. The series is Srivastava & Yeh's for
/// a flux changed from 0 to q (its form from memory; derived here again, with the
/// eigenvalues the roots of tan(lambda L*) = -2 lambda, L* = a L).
class GardnerInfiltration {
public:
  struct Soil {
    double conductivity = 0.0;      ///< ks, m/s
    double alpha = 0.0;             ///< a, 1/m
    double saturated_content = 0.0; ///< theta_s
    double residual_content = 0.0;  ///< theta_r
  };
  /// height L (m), infiltration q (m/s, downward positive). `terms` eigenvalues are
  /// kept: enough for a truncation error below 1e-16 at t* = a ks t / (theta_s -
  /// theta_r) above about 37 (L*/(pi terms))^2.
  GardnerInfiltration(Soil soil, double height, double infiltration, unsigned int terms);

  /// k / ks at height z (m) and time t (s).
  double relative_conductivity(double z, double t) const;
  /// psi (m) at height z and time t.
  double pressure_head(double z, double t) const;
  /// Water gained by the column since t = 0, integral of (theta - theta_0) dz, m.
  double stored_water(double t) const;

private:
  double scaled_time(double t) const;
  Soil soil_;
  double scaled_height_, flux_ratio_; ///< L* = a L, q* = q / ks
  std::vector<double> lambda_, coefficient_;
};

} // namespace settlewell::analytical
