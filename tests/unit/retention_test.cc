// Retention curves: values against the published formulas written out directly
// (van Genuchten 1980 eqs. 3 and 8; Gardner 1958's exponential form as used by
// Srivastava & Yeh 1991), and the derivatives Newton's method uses against
// central differences.
#include "settlewell/core/errors.h"
#include "settlewell/materials/retention.h"

#include <gtest/gtest.h>

#include <cmath>

using settlewell::RetentionCurve;

namespace {

RetentionCurve loam(double n) {
  RetentionCurve c;
  c.model = RetentionCurve::Model::van_genuchten;
  c.saturated_content = 0.42;
  c.residual_content = 0.05;
  c.alpha = 2.0;
  c.n = n;
  return c;
}

RetentionCurve exponential() {
  RetentionCurve c = loam(0.0);
  c.model = RetentionCurve::Model::gardner;
  return c;
}

} // namespace

TEST(Retention, VanGenuchtenMualemMatchesTheFormulasAsPublished) {
  // van Genuchten (1980) eq. 3 for S_e and eq. 8 for k_r, evaluated here in
  // their published form, S_e first.
  for (const double n : {1.3, 2.0, 3.5})
    for (const double psi : {-0.01, -0.3, -1.0, -4.0}) {
      const RetentionCurve c = loam(n);
      const double m = 1.0 - 1.0 / n;
      const double se = std::pow(1.0 + std::pow(-c.alpha * psi, n), -m);
      const double kr =
          std::sqrt(se) * std::pow(1.0 - std::pow(1.0 - std::pow(se, 1.0 / m), m), 2);
      const auto p = c.at(psi);
      EXPECT_NEAR(p.content, 0.05 + 0.37 * se, 1e-14) << n << " " << psi;
      EXPECT_NEAR(p.saturation, (0.05 + 0.37 * se) / 0.42, 1e-14);
      EXPECT_NEAR(p.conductivity, kr, 1e-10 * std::max(kr, 1e-6)) << n << " " << psi;
    }
  // One point by hand: a = 2/m, n = 2, psi = -1 m: S_e = 5^-1/2, and k_r =
  // 5^-1/4 (1 - 0.8^1/2)^2 = 0.668740305 * 0.0111456180 = 0.00745352398.
  const auto p = loam(2.0).at(-1.0);
  EXPECT_NEAR(p.content, 0.05 + 0.37 / std::sqrt(5.0), 1e-14);
  EXPECT_NEAR(p.conductivity, 0.00745352398, 1e-11);
}

TEST(Retention, GardnerIsExponentialInTheHead) {
  const auto p = exponential().at(-0.75);
  EXPECT_NEAR(p.conductivity, std::exp(-1.5), 1e-15);
  EXPECT_NEAR(p.content, 0.05 + 0.37 * std::exp(-1.5), 1e-15);
  EXPECT_NEAR(p.capacity, 0.37 * 2.0 * std::exp(-1.5), 1e-15);
}

TEST(Retention, SaturatedAtAndBelowTheWaterTable) {
  for (const RetentionCurve& c : {loam(1.6), exponential()})
    for (const double psi : {0.0, 2.5}) {
      const auto p = c.at(psi);
      EXPECT_EQ(p.content, 0.42);
      EXPECT_EQ(p.saturation, 1.0);
      EXPECT_EQ(p.conductivity, 1.0);
      EXPECT_EQ(p.capacity, 0.0);
      EXPECT_EQ(p.conductivity_slope, 0.0);
    }
}

TEST(Retention, DerivativesMatchCentralDifferences) {
  // Steps of 1e-5 m; the differences' own error is O(h^2) times the third
  // derivative, far below the tolerance of 1e-6 relative.
  const double h = 1e-5;
  for (const RetentionCurve& c : {loam(1.3), loam(2.0), loam(3.5), exponential()})
    for (const double psi : {-0.05, -0.4, -1.0, -3.0}) {
      const auto p = c.at(psi), up = c.at(psi + h), down = c.at(psi - h);
      const double capacity = (up.content - down.content) / (2.0 * h);
      const double slope = (up.conductivity - down.conductivity) / (2.0 * h);
      EXPECT_NEAR(p.capacity, capacity, 1e-6 * std::abs(capacity)) << psi;
      EXPECT_NEAR(p.conductivity_slope, slope, 1e-6 * std::abs(slope)) << psi;
    }
}

TEST(Retention, ContentAndConductivityFallAsTheSoilDries) {
  for (const RetentionCurve& c : {loam(1.3), loam(3.5), exponential()}) {
    double content = 1.0, conductivity = 2.0;
    for (double psi = -1e-3; psi > -20.0; psi *= 1.5) {
      const auto p = c.at(psi);
      EXPECT_LT(p.content, content);
      EXPECT_GT(p.content, c.residual_content);
      EXPECT_LT(p.conductivity, conductivity);
      EXPECT_GE(p.conductivity, 0.0);
      EXPECT_GT(p.capacity, 0.0);
      content = p.content;
      conductivity = p.conductivity;
    }
  }
}

TEST(Retention, OutOfRangeParametersAreRefused) {
  RetentionCurve c = loam(1.0);
  EXPECT_THROW(c.validate("materials.sand.retention"), settlewell::InputError);
  c = loam(2.0);
  c.residual_content = 0.5;
  EXPECT_THROW(c.validate("materials.sand.retention"), settlewell::InputError);
  c = loam(2.0);
  c.alpha = 0.0;
  EXPECT_THROW(c.validate("materials.sand.retention"), settlewell::InputError);
  EXPECT_NO_THROW(loam(2.0).validate("materials.sand.retention"));
  EXPECT_NO_THROW(exponential().validate("materials.sand.retention"));
}
