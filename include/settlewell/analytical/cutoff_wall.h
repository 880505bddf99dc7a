#pragma once

/// Published closed-form solutions, as pure functions of dimensionless groups.
/// They are the references of the verification cases and of the engineering
/// checks, and are themselves checked against tabulated values in
/// tests/unit/analytical_test.cc.
namespace settlewell::analytical {

// --- Seepage under a single cutoff wall (Harr 1962; conformal mapping) -------
/// Flow per metre run under a thin impermeable wall of depth d in a layer of
/// thickness T on an impermeable base: q/(k h) = K(l')/(2 K(l)), l = sin(pi d/(2T)),
/// with K the complete elliptic integral of the first kind (modulus l), taken from
/// the C++ standard library (std::comp_ellint_1).
double harr_discharge_ratio(double d_over_T);
/// Exit gradient at the downstream face of the wall, i_E T / h = pi/(4 l K(l))
/// [derived in docs/verification-references.md from the same map; it tends to
/// Harr's h/(pi d) as d/T -> 0].
double harr_exit_gradient_ratio(double d_over_T);

} // namespace settlewell::analytical
