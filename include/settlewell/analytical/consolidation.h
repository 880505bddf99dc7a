#pragma once

/// Published closed-form solutions, as pure functions of dimensionless groups.
/// They are the references of the verification cases and of the engineering
/// checks, and are themselves checked against tabulated values in
/// tests/unit/analytical_test.cc.
namespace settlewell::analytical {

// --- Terzaghi (1925) one-dimensional consolidation; Taylor (1948) -------------
/// Average degree of consolidation U(Tv) for a uniform initial excess.
double terzaghi_average_degree(double Tv);
/// Excess pore pressure ratio u/u0 at Z = z/Hdr (z from the drained face).
double terzaghi_excess_ratio(double Z, double Tv);
/// The same series when time is advanced by n equal steps of dT as the model takes
/// them (next_step_weights): `euler_steps` implicit-Euler steps (at least one),
/// then BDF2. Each Fourier mode's amplitude a_k falls by 1 / (1 + M^2 dT) in an
/// Euler step and follows a_{k+1} = (4 a_k - a_{k-1}) / (3 + 2 M^2 dT) in a BDF2
/// step, instead of exp(-M^2 T) [derived here: the eigen-expansion of Terzaghi's
/// series under that scheme].
double terzaghi_excess_ratio_stepped(double Z,
                                     double dT,
                                     unsigned int n_steps,
                                     unsigned int euler_steps);
/// Tv at which U reaches the given value (0 < U < 1), a root of the series.
double terzaghi_time_factor(double U);

// --- Olson (1977): load ramped linearly to q0 over Tc, then held -------------
double olson_average_degree(double T, double Tc);
/// Excess ratio u/q0 at Z [derived here by eigenfunction expansion; it reproduces
/// Olson's U].
double olson_excess_ratio(double Z, double T, double Tc);

} // namespace settlewell::analytical
