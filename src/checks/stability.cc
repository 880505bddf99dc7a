#include "settlewell/checks/stability.h"

namespace settlewell::checks {

double critical_gradient(double saturated_unit_weight, double gamma_w) {
  return (saturated_unit_weight - gamma_w) / gamma_w;
}

double piping_factor(double critical, double exit_gradient) {
  return exit_gradient > 0.0 ? critical / exit_gradient : unbounded;
}

double heave_factor(double submerged_unit_weight,
                    double depth,
                    double mean_excess_head,
                    double gamma_w) {
  return mean_excess_head > 0.0
             ? submerged_unit_weight * depth / (gamma_w * mean_excess_head)
             : unbounded;
}

double uplift_factor(double overburden, double pore_pressure) {
  return pore_pressure > 0.0 ? overburden / pore_pressure : unbounded;
}

} // namespace settlewell::checks
