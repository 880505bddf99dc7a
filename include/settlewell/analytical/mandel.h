#pragma once

#include <vector>

/// Published closed-form solutions, as pure functions of dimensionless groups.
/// They are the references of the verification cases and of the engineering
/// checks, and are themselves checked against tabulated values in
/// tests/unit/analytical_test.cc.
namespace settlewell::analytical {

// --- Mandel (1953) problem; Abousleiman et al. (1996) form --------------------
/// Plane-strain specimen |x| <= a between rigid frictionless plates carrying 2F.
class MandelSolution {
public:
  /// nu drained, nu_u undrained Poisson's ratio; terms of the series.
  MandelSolution(double nu, double nu_u, unsigned int n_terms = 400);
  /// p / p0, p0 = F B (1 + nu_u) / (3a), at x/a and t* = c t / a^2.
  double pressure_ratio(double x_over_a, double t_star) const;
  /// 2 G a uy(b) / (F b): the plate's vertical displacement.
  double plate_displacement_ratio(double t_star) const;
  /// 2 G ux(a) / F: the lateral displacement of the free side.
  double side_displacement_ratio(double t_star) const;
  const std::vector<double>& roots() const { return roots_; }

private:
  double sum_sin_cos(double t_star) const;
  double nu_, nu_u_;
  std::vector<double> roots_;
};

} // namespace settlewell::analytical
