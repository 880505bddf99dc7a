#include "settlewell/materials/retention.h"

#include "range_check.h"

#include <cmath>

namespace settlewell {

using materials_detail::require;

namespace {

/// Van Genuchten's curve with Mualem's conductivity at x = a |psi| > 0, written in
/// y = 1 - S_e^(1/m) = x^n / (1 + x^n) so that nothing cancels near saturation.
/// Derivatives are with respect to x.
RetentionCurve::Point van_genuchten(const RetentionCurve& c, double x) {
  const double n = c.n, m = 1.0 - 1.0 / n;
  const double xn = std::pow(x, n), one_plus = 1.0 + xn;
  const double se = std::pow(one_plus, -m);
  const double dse = -m * n * std::pow(x, n - 1.0) * std::pow(one_plus, -m - 1.0);
  const double y = xn / one_plus;
  const double g = 1.0 - std::pow(y, m);
  // y^(m-1) dy/dx = n x^(n-2) (1 + x^n)^(-m-1): infinite at x -> 0 when n < 2
  // (Mualem's conductivity is not smooth at saturation then).
  const double ym_slope = n * std::pow(x, n - 2.0) * std::pow(one_plus, -m - 1.0);
  const double root_se = std::sqrt(se);
  RetentionCurve::Point p;
  p.content = c.residual_content + (c.saturated_content - c.residual_content) * se;
  p.capacity = (c.saturated_content - c.residual_content) * dse;
  p.conductivity = root_se * g * g;
  p.conductivity_slope = 0.5 / root_se * dse * g * g - 2.0 * root_se * g * m * ym_slope;
  return p;
}

RetentionCurve::Point gardner(const RetentionCurve& c, double psi) {
  const double se = std::exp(c.alpha * psi);
  RetentionCurve::Point p;
  p.content = c.residual_content + (c.saturated_content - c.residual_content) * se;
  p.capacity = (c.saturated_content - c.residual_content) * c.alpha * se;
  p.conductivity = se;
  p.conductivity_slope = c.alpha * se;
  return p;
}

} // namespace

RetentionCurve::Point RetentionCurve::at(double pressure_head) const {
  Point p;
  if (!(pressure_head < 0.0)) {
    p.content = saturated_content;
    p.conductivity = 1.0;
  } else if (model == Model::gardner) {
    p = gardner(*this, pressure_head);
  } else {
    p = van_genuchten(*this, -alpha * pressure_head);
    // d/dpsi = -a d/dx
    p.capacity *= -alpha;
    p.conductivity_slope *= -alpha;
  }
  p.saturation = p.content / saturated_content;
  return p;
}

void RetentionCurve::validate(const std::string& where) const {
  require(saturated_content > 0.0 && saturated_content < 1.0, where,
          "the saturated water content theta_s must lie in (0, 1)", saturated_content);
  require(residual_content >= 0.0 && residual_content < saturated_content, where,
          "the residual water content theta_r must lie in [0, theta_s)",
          residual_content);
  require(std::isfinite(alpha) && alpha > 0.0, where,
          "the retention parameter alpha must be positive, 1/m", alpha);
  if (model == Model::van_genuchten)
    require(std::isfinite(n) && n > 1.0, where,
            "van Genuchten's n must be greater than 1", n);
}

const char* RetentionCurve::name(Model model) {
  return model == Model::gardner ? "gardner" : "van_genuchten";
}

} // namespace settlewell
