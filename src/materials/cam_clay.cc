#include "settlewell/materials/cam_clay.h"

#include "range_check.h"
#include "settlewell/core/units.h"

#include <cmath>
#include <string>

namespace settlewell {

using materials_detail::require;

CamClayParameters CamClayParameters::from_indices(double compression_index,
                                                  double recompression_index,
                                                  double void_ratio,
                                                  double friction_angle_degrees,
                                                  double poisson_ratio) {
  CamClayParameters m;
  m.lambda = compression_index / std::log(10.0);
  m.kappa = recompression_index / std::log(10.0);
  m.specific_volume = 1.0 + void_ratio;
  m.critical_state_slope = settlewell::critical_state_slope(friction_angle_degrees);
  m.poisson_ratio = poisson_ratio;
  return m;
}

void CamClayParameters::validate(const std::string& where) const {
  require(std::isfinite(kappa) && kappa > 0.0, where,
          "the recompression slope (kappa = Cr / ln 10) must be positive", kappa);
  require(std::isfinite(lambda) && lambda > kappa, where,
          "the compression slope (lambda = Cc / ln 10) must exceed kappa", lambda);
  require(std::isfinite(specific_volume) && specific_volume > 1.0, where,
          "the void ratio must be positive", specific_volume - 1.0);
  require(critical_state_slope > 0.0 && critical_state_slope < 3.0, where,
          "M must lie in (0, 3) (friction angle in (0, 90) degrees)",
          critical_state_slope);
  require(poisson_ratio > -1.0 && poisson_ratio < 0.5, where,
          "Poisson's ratio must lie in (-1, 0.5)", poisson_ratio);
  require(std::isfinite(shear_modulus) && shear_modulus >= 0.0, where,
          "the shear modulus must not be negative, kPa", shear_modulus);
}

double one_dimensional_stress_ratio(const CamClayParameters& m) {
  const double mm = m.critical_state_slope * m.critical_state_slope;
  const double nu = m.poisson_ratio;
  const auto gap = [&](double eta) {
    return eta * m.kappa * 2.0 * (1.0 + nu) / (9.0 * (1.0 - 2.0 * nu)) +
           (m.lambda - m.kappa) * 2.0 * eta / (mm - eta * eta) - 2.0 / 3.0 * m.lambda;
  };
  // The gap rises from -2 lambda/3 at 0 to +infinity at M: bisection.
  double lo = 0.0, hi = m.critical_state_slope * (1.0 - 1e-12);
  for (int i = 0; i < 200; ++i) {
    const double mid = 0.5 * (lo + hi);
    (gap(mid) < 0.0 ? lo : hi) = mid;
  }
  return 0.5 * (lo + hi);
}

double critical_state_slope(double friction_angle_degrees) {
  const double s = std::sin(friction_angle_degrees * units::pi / 180.0);
  return 6.0 * s / (3.0 - s);
}

double yield_size_from_vertical_preconsolidation(double vertical_preconsolidation,
                                                 double k0_normally_consolidated,
                                                 double m) {
  const double p =
      vertical_preconsolidation * (1.0 + 2.0 * k0_normally_consolidated) / 3.0;
  const double q = vertical_preconsolidation * (1.0 - k0_normally_consolidated);
  return p + q * q / (m * m * p);
}

double yield_size_through(const PlaneTensor& stress, double m) {
  const double p = mean_effective_stress(stress);
  const double q = deviator_stress(stress);
  return p + q * q / (m * m * p);
}

double mean_effective_stress(const PlaneTensor& stress) {
  return -(stress[0] + stress[1] + stress[2]) / 3.0;
}

namespace {

constexpr std::array<double, 4> unit{{1.0, 1.0, 1.0, 0.0}};
using Vector3 = std::array<double, 3>;
using Matrix3 = std::array<Vector3, 3>;

/// The deviator of a tensor, with the sign flipped (compression positive).
PlaneTensor compressive_deviator(const PlaneTensor& t) {
  const double mean = (t[0] + t[1] + t[2]) / 3.0;
  return {{mean - t[0], mean - t[1], mean - t[2], -t[3]}};
}

/// The unknowns of the plastic return and how they move with the volumetric strain
/// increment (compression positive) and the trial deviator q_tr.
struct Return {
  double p = 0.0, pc = 0.0, gamma = 0.0;
  double dp_dv = 0.0, dp_dq = 0.0, dgamma_dv = 0.0, dgamma_dq = 0.0;
  unsigned int iterations = 0;
};

/// Solves J x = b for a 3 x 3 system (Cramer's rule; J is well conditioned here).
Vector3 solve3(const Matrix3& j, const Vector3& b) {
  const auto det = [](const Matrix3& a) {
    return a[0][0] * (a[1][1] * a[2][2] - a[1][2] * a[2][1]) -
           a[0][1] * (a[1][0] * a[2][2] - a[1][2] * a[2][0]) +
           a[0][2] * (a[1][0] * a[2][1] - a[1][1] * a[2][0]);
  };
  const double d = det(j);
  Vector3 x{};
  for (int c = 0; c < 3; ++c) {
    auto a = j;
    for (int r = 0; r < 3; ++r)
      a[r][c] = b[r];
    x[c] = det(a) / d;
  }
  return x;
}

class PlasticReturn {
public:
  PlasticReturn(const CamClayParameters& m,
                double g,
                double p_trial,
                double q_trial,
                double pc_committed)
      : m_(m)
      , g_(g)
      , p_tr_(p_trial)
      , q_tr_(q_trial)
      , pc_n_(pc_committed) {}

  /// Newton on r1 = ln(p/p_tr) + v0 dev_p/kappa, r2 = ln(pc/pc_n) - v0 dev_p /
  /// (lambda - kappa), r3 = f / pc_n^2, with dev_p = gamma (2p - pc).
  Return solve() const {
    Return x{p_tr_, pc_n_, 0.0};
    for (x.iterations = 1; x.iterations <= max_iterations; ++x.iterations) {
      const auto r = residual(x);
      const auto step = solve3(jacobian(x), Vector3{{-r[0], -r[1], -r[2]}});
      // Damped so that p', p'c stay positive and the multiplier non-negative.
      double scale = 1.0;
      while (scale > 1e-8 && !admissible(x, step, scale))
        scale *= 0.5;
      x.p += scale * step[0];
      x.pc += scale * step[1];
      x.gamma += scale * step[2];
      const auto after = residual(x);
      if (std::abs(after[0]) + std::abs(after[1]) + std::abs(after[2]) < tolerance)
        return with_sensitivities(x);
    }
    throw SolverError("Cam Clay: the return to the yield surface did not converge in " +
                      std::to_string(max_iterations) + " iterations");
  }

private:
  static constexpr unsigned int max_iterations = 60;
  static constexpr double tolerance = 1e-13;

  double shrink(double gamma) const {
    const double m2 = m_.critical_state_slope * m_.critical_state_slope;
    return 1.0 / (1.0 + 6.0 * g_ * gamma / m2);
  }
  double dshrink(double gamma) const {
    const double m2 = m_.critical_state_slope * m_.critical_state_slope;
    const double c = shrink(gamma);
    return -6.0 * g_ / m2 * c * c;
  }
  double swelling() const { return m_.specific_volume / m_.kappa; }
  double hardening() const { return m_.specific_volume / (m_.lambda - m_.kappa); }

  Vector3 residual(const Return& x) const {
    const double m2 = m_.critical_state_slope * m_.critical_state_slope;
    const double dev_p = x.gamma * (2.0 * x.p - x.pc);
    const double q = shrink(x.gamma) * q_tr_;
    return {{std::log(x.p / p_tr_) + swelling() * dev_p,
             std::log(x.pc / pc_n_) - hardening() * dev_p,
             (q * q / m2 + x.p * (x.p - x.pc)) / (pc_n_ * pc_n_)}};
  }

  Matrix3 jacobian(const Return& x) const {
    const double m2 = m_.critical_state_slope * m_.critical_state_slope;
    const double a = 2.0 * x.p - x.pc;
    const double q = shrink(x.gamma) * q_tr_;
    const double dq = dshrink(x.gamma) * q_tr_;
    const double scale = 1.0 / (pc_n_ * pc_n_);
    Matrix3 j;
    j[0] = {
        {1.0 / x.p + 2.0 * swelling() * x.gamma, -swelling() * x.gamma, swelling() * a}};
    j[1] = {{-2.0 * hardening() * x.gamma, 1.0 / x.pc + hardening() * x.gamma,
             -hardening() * a}};
    j[2] = {{a * scale, -x.p * scale, 2.0 * q * dq / m2 * scale}};
    return j;
  }

  bool admissible(const Return& x, const Vector3& step, double s) const {
    return x.p + s * step[0] > 0.0 && x.pc + s * step[1] > 0.0 &&
           x.gamma + s * step[2] >= 0.0;
  }

  /// Implicit differentiation of r(x; dev, q_tr) = 0: J dx = -dr/d(dev, q_tr).
  Return with_sensitivities(Return x) const {
    const double m2 = m_.critical_state_slope * m_.critical_state_slope;
    const auto j = jacobian(x);
    // ln p_tr grows with v0 dev / kappa, so dr1/d(dev) = -v0/kappa.
    const auto by_v = solve3(j, Vector3{{swelling(), 0.0, 0.0}});
    const double c = shrink(x.gamma);
    const auto by_q =
        solve3(j, Vector3{{0.0, 0.0, -2.0 * c * c * q_tr_ / m2 / (pc_n_ * pc_n_)}});
    x.dp_dv = by_v[0];
    x.dgamma_dv = by_v[2];
    x.dp_dq = by_q[0];
    x.dgamma_dq = by_q[2];
    return x;
  }

  const CamClayParameters& m_;
  double g_, p_tr_, q_tr_, pc_n_;
};

PlaneTangent assemble_tangent(double dp_dv,
                              double dp_dq,
                              double dgamma_dv,
                              double dgamma_dq,
                              double dc_dgamma,
                              double c,
                              double g,
                              const PlaneTensor& s_trial,
                              const PlaneTensor& n) {
  // Flow direction as a row over strain components: d(q_tr) = 2G n : de.
  const std::array<double, 4> n_row{{n[0], n[1], n[2], 2.0 * n[3]}};
  PlaneTangent d{};
  for (int i = 0; i < 4; ++i)
    for (int k = 0; k < 4; ++k) {
      const double dq_tr = 2.0 * g * n_row[k];
      const double deviatoric =
          (i < 3 && k < 3) ? (i == k ? 1.0 : 0.0) - 1.0 / 3.0 : (i == k ? 1.0 : 0.0);
      d[i][k] = unit[i] * (dp_dv * unit[k] + dp_dq * dq_tr) +
                dc_dgamma * s_trial[i] * (dgamma_dv * unit[k] + dgamma_dq * dq_tr) +
                2.0 * g * c * deviatoric;
    }
  return d;
}

} // namespace

double deviator_stress(const PlaneTensor& stress) {
  const auto s = compressive_deviator(stress);
  return std::sqrt(1.5 * double_contraction(s, s));
}

CamClayUpdate cam_clay_update(const CamClayParameters& m,
                              const CamClayState& committed,
                              const PlaneTensor& strain_increment) {
  const double p_n = mean_effective_stress(committed.stress);
  if (!(p_n > 0.0) || !(committed.yield_size > 0.0))
    throw SolverError("Cam Clay: the mean effective stress (" + std::to_string(p_n) +
                      " kPa) and the yield size must be positive");
  const double v0_over_kappa = m.specific_volume / m.kappa;
  const double g = m.shear_modulus > 0.0
                       ? m.shear_modulus
                       : 1.5 * v0_over_kappa * p_n * (1.0 - 2.0 * m.poisson_ratio) /
                             (1.0 + m.poisson_ratio);
  // Compression positive from here on.
  const double dev = -(strain_increment[0] + strain_increment[1] + strain_increment[2]);
  const auto de = compressive_deviator(strain_increment);
  const auto s_n = compressive_deviator(committed.stress);
  PlaneTensor s_trial;
  for (int i = 0; i < 4; ++i)
    s_trial[i] = s_n[i] + 2.0 * g * de[i];
  const double p_trial = p_n * std::exp(v0_over_kappa * dev);
  const double q_trial = std::sqrt(1.5 * double_contraction(s_trial, s_trial));
  PlaneTensor n{};
  if (q_trial > 0.0)
    for (int i = 0; i < 4; ++i)
      n[i] = 1.5 * s_trial[i] / q_trial;

  const double m2 = m.critical_state_slope * m.critical_state_slope;
  const double pc_n = committed.yield_size;
  const double f_trial = q_trial * q_trial / m2 + p_trial * (p_trial - pc_n);

  CamClayUpdate out;
  Return x{p_trial, pc_n, 0.0, v0_over_kappa * p_trial, 0.0, 0.0, 0.0, 0};
  double c = 1.0, dc = 0.0;
  if (f_trial > 1e-12 * pc_n * pc_n) {
    x = PlasticReturn(m, g, p_trial, q_trial, pc_n).solve();
    c = 1.0 / (1.0 + 6.0 * g * x.gamma / m2);
    dc = -6.0 * g / m2 * c * c;
    out.yielded = true;
    out.iterations = x.iterations;
  }
  for (int i = 0; i < 4; ++i)
    out.state.stress[i] = -(x.p * unit[i] + c * s_trial[i]);
  out.state.yield_size = x.pc;
  out.tangent =
      assemble_tangent(x.dp_dv, x.dp_dq, x.dgamma_dv, x.dgamma_dq, dc, c, g, s_trial, n);
  return out;
}

} // namespace settlewell
