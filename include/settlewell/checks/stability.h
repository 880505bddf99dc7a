#pragma once

#include <limits>

/// Factors of safety of an excavation base. Pure functions; kN/m^3, m, kPa.
/// A factor is +infinity when nothing drives the failure (no upward gradient, no
/// excess head, no pore pressure).
namespace settlewell::checks {

inline constexpr double unbounded = std::numeric_limits<double>::infinity();

/// Critical hydraulic gradient i_c = gamma'/gamma_w (Terzaghi 1922; 1943).
double critical_gradient(double saturated_unit_weight, double gamma_w);

/// Factor against piping, i_c / i_exit (common practice; the required value
/// depends on the code). `exit_gradient` is upward positive.
double piping_factor(double critical, double exit_gradient);

/// Terzaghi's (1943) heave check on the prism of depth d and width d/2 beside the
/// wall toe: FS = gamma' d / (gamma_w h_a), h_a the mean excess head on its base.
double heave_factor(double submerged_unit_weight,
                    double depth,
                    double mean_excess_head,
                    double gamma_w);

/// Uplift of a low-permeability layer (common practice, e.g. Terzaghi, Peck &
/// Mesri 1996): weight of the soil above its underside over the pore pressure
/// there, sum(gamma_i t_i) / (gamma_w h_p).
double uplift_factor(double overburden, double pore_pressure);

} // namespace settlewell::checks
