#include "settlewell/analytical/infiltration.h"

#include "settlewell/analytical/roots.h"
#include "settlewell/core/units.h"

#include <cmath>

namespace settlewell::analytical {

// In z* = a z, t* = a ks t / (theta_s - theta_r), K* = k / ks the equation is
// K*_t = K*_zz + K*_z with K*(0) = 1, K*_z + K* = q* at L* and K*(z, 0) = e^-z.
// Its solution [derived here; the form of Srivastava & Yeh 1991, from memory]:
//   K* = q* + (1 - q*) e^-z
//        - 8 q* e^((L-z)/2) e^(-t/4) sum sin(l L) sin(l z) e^(-l^2 t) / (L (1 + 4 l^2) +
//        2)
// over the roots l of tan(l L) = -2 l, one in each ((n - 1/2) pi / L, n pi / L).

GardnerInfiltration::GardnerInfiltration(Soil soil,
                                         double height,
                                         double infiltration,
                                         unsigned int terms)
    : soil_(soil)
    , scaled_height_(soil.alpha * height)
    , flux_ratio_(infiltration / soil.conductivity) {
  const double l = scaled_height_;
  for (unsigned int n = 1; n <= terms; ++n) {
    const auto f = [l](double x) { return x * std::cos(x * l) + 0.5 * std::sin(x * l); };
    const double root = bracketed_root(f, (n - 0.5) * units::pi / l, n * units::pi / l);
    lambda_.push_back(root);
    coefficient_.push_back(-8.0 * flux_ratio_ * std::exp(0.5 * l) * std::sin(root * l) /
                           (l * (1.0 + 4.0 * root * root) + 2.0));
  }
}

double GardnerInfiltration::scaled_time(double t) const {
  return soil_.alpha * soil_.conductivity * t /
         (soil_.saturated_content - soil_.residual_content);
}

double GardnerInfiltration::relative_conductivity(double z, double t) const {
  const double zs = soil_.alpha * z, ts = scaled_time(t);
  double sum = 0.0;
  for (std::size_t n = 0; n < lambda_.size(); ++n)
    sum += coefficient_[n] * std::sin(lambda_[n] * zs) *
           std::exp(-(lambda_[n] * lambda_[n] + 0.25) * ts);
  return flux_ratio_ + (1.0 - flux_ratio_) * std::exp(-zs) + std::exp(-0.5 * zs) * sum;
}

double GardnerInfiltration::pressure_head(double z, double t) const {
  return std::log(relative_conductivity(z, t)) / soil_.alpha;
}

double GardnerInfiltration::stored_water(double t) const {
  // (theta_s - theta_r)/a times the integral of K* - e^-z* over the column: the
  // steady part q* (L* - 1 + e^-L*), and each mode's integral of e^-z/2 sin(l z),
  // l / (l^2 + 1/4).
  const double l = scaled_height_, ts = scaled_time(t);
  double sum = flux_ratio_ * (l - 1.0 + std::exp(-l));
  for (std::size_t n = 0; n < lambda_.size(); ++n) {
    const double mu = lambda_[n] * lambda_[n] + 0.25;
    sum += coefficient_[n] * lambda_[n] * std::exp(-mu * ts) / mu;
  }
  return (soil_.saturated_content - soil_.residual_content) / soil_.alpha * sum;
}

} // namespace settlewell::analytical
