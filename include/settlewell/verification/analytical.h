#pragma once

#include <vector>

/// Published closed-form solutions, as pure functions of dimensionless groups.
/// They are the references of the verification cases and are themselves checked
/// against tabulated values in tests/unit/analytical_test.cc.
namespace settlewell::analytical {

// --- Terzaghi (1925) one-dimensional consolidation; Taylor (1948) -------------
/// Average degree of consolidation U(Tv) for a uniform initial excess.
double terzaghi_average_degree(double Tv);
/// Excess pore pressure ratio u/u0 at Z = z/Hdr (z from the drained face).
double terzaghi_excess_ratio(double Z, double Tv);
/// The same series when time is advanced by n backward-Euler steps of dT: each
/// Fourier mode decays by (1 + M^2 dT)^-n instead of exp(-M^2 T) [derived here:
/// the eigen-expansion of Terzaghi's series under implicit Euler].
double terzaghi_excess_ratio_backward_euler(double Z, double dT, unsigned int n_steps);
/// Tv at which U reaches the given value (0 < U < 1), by bisection on the series.
double terzaghi_time_factor(double U);

// --- Olson (1977): load ramped linearly to q0 over Tc, then held -------------
double olson_average_degree(double T, double Tc);
/// Excess ratio u/q0 at Z [derived here by eigenfunction expansion; it reproduces
/// Olson's U].
double olson_excess_ratio(double Z, double T, double Tc);

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

// --- Wells in a confined aquifer ---------------------------------------------
/// Theis (1935) well function W(u) = E1(u).
double theis_well_function(double u);
/// Theis drawdown s(r, t), m; Q m^3/s, T m^2/s, S storativity, r m, t s.
double theis_drawdown(double Q, double T, double S, double r, double t);
/// Thiem (1906) steady drawdown difference s(r1) - s(r2) = Q/(2 pi T) ln(r2/r1).
double thiem_drawdown_difference(double Q, double T, double r1, double r2);

// --- Seepage under a single cutoff wall (Harr 1962; conformal mapping) -------
/// Flow per metre run under a thin impermeable wall of depth d in a layer of
/// thickness T on an impermeable base: q/(k h) = K(l')/(2 K(l)), l = sin(pi d/(2T)),
/// with K the complete elliptic integral of the first kind (modulus l), taken from
/// the C++ standard library (std::comp_ellint_1).
double harr_discharge_ratio(double d_over_T);
/// Exit gradient at the downstream face of the wall, i_E T / h = pi/(4 l K(l))
/// [derived in the verification references from the same map; it tends to
/// Harr's h/(pi d) as d/T -> 0].
double harr_exit_gradient_ratio(double d_over_T);

} // namespace settlewell::analytical
