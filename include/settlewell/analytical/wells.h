#pragma once

/// Published closed-form solutions, as pure functions of dimensionless groups.
/// They are the references of the verification cases and of the engineering
/// checks, and are themselves checked against tabulated values in
/// tests/unit/analytical_test.cc.
namespace settlewell::analytical {

// --- Wells in a confined aquifer ---------------------------------------------
/// Theis (1935) well function W(u) = E1(u).
double theis_well_function(double u);
/// Theis drawdown s(r, t), m; Q m^3/s, T m^2/s, S storativity, r m, t s.
double theis_drawdown(double Q, double T, double S, double r, double t);
/// Thiem (1906) steady drawdown difference s(r1) - s(r2) = Q/(2 pi T) ln(r2/r1).
double thiem_drawdown_difference(double Q, double T, double r1, double r2);
/// An infinite row of equal wells, spacing a, each pumping Q (m^3/s) from an
/// aquifer of transmissivity T (m^2/s), in steady flow: the head at a well's face
/// (radius r) lies below the head averaged along the row by
/// Q/(2 pi T) ln(a / (2 pi r)), m (Muskat 1937, the line of wells; from memory).
/// A plane-strain section sees the row as a line sink carrying that average.
double well_row_convergence_loss(double Q, double T, double spacing, double radius);

} // namespace settlewell::analytical
