// Modified Cam Clay at one material point: the conversions from the oedometer's
// terms, the elastic region, and the consistent tangent against central finite
// differences of the update itself. The paths against closed forms are the
// verification case `cam-clay-paths` (src/verification/case_cam_clay.cc).
#include "settlewell/core/errors.h"
#include "settlewell/materials/cam_clay.h"
#include "settlewell/physics/biot_setup.h"
#include "settlewell/scenario/scenario.h"

#include <gtest/gtest.h>

#include <cmath>

using namespace settlewell;

namespace {

// An invented clay: Cc 0.42, Cr 0.06, e0 1.15, phi'cs 26 degrees, nu' 0.3.
CamClayParameters clay() {
  return CamClayParameters::from_indices(0.42, 0.06, 1.15, 26.0, 0.3);
}

/// The largest entry of (tangent - finite difference) over the largest entry of
/// the tangent, with central differences of step h on each strain component.
double
tangent_mismatch(const CamClayState& from, const PlaneTensor& increment, double h) {
  const auto m = clay();
  const auto update = cam_clay_update(m, from, increment);
  double largest = 0.0, mismatch = 0.0;
  for (int j = 0; j < 4; ++j) {
    auto up = increment, down = increment;
    up[j] += h;
    down[j] -= h;
    const auto s_up = cam_clay_update(m, from, up).state.stress;
    const auto s_down = cam_clay_update(m, from, down).state.stress;
    for (int i = 0; i < 4; ++i) {
      const double fd = (s_up[i] - s_down[i]) / (2.0 * h);
      largest = std::max(largest, std::abs(update.tangent[i][j]));
      mismatch = std::max(mismatch, std::abs(update.tangent[i][j] - fd));
    }
  }
  return mismatch / largest;
}

} // namespace

TEST(CamClay, ConvertsTheOedometerIndices) {
  const auto m = CamClayParameters::from_indices(0.46, 0.069, 0.9, 30.0, 0.25);
  EXPECT_NEAR(m.lambda, 0.46 / 2.302585093, 1e-9);
  EXPECT_NEAR(m.kappa, 0.069 / 2.302585093, 1e-9);
  EXPECT_DOUBLE_EQ(m.specific_volume, 1.9);
  // sin 30 = 1/2: M = 3 / 2.5 = 1.2.
  EXPECT_NEAR(m.critical_state_slope, 1.2, 1e-12);
  // sigma'p = 120 kPa, K0nc = 0.5, M = 1.2: p' = 80, q = 60, p'c = 80 + 3600/115.2.
  EXPECT_NEAR(yield_size_from_vertical_preconsolidation(120.0, 0.5, 1.2), 111.25, 1e-9);
}

TEST(CamClay, RejectsParametersOutOfRange) {
  auto m = clay();
  m.kappa = m.lambda; // Cr >= Cc
  EXPECT_THROW(m.validate("materials.clay"), InputError);
  m = clay();
  m.specific_volume = 0.9;
  EXPECT_THROW(m.validate("materials.clay"), InputError);
  EXPECT_NO_THROW(clay().validate("materials.clay"));
}

TEST(CamClay, RefusesAStateWithoutCompression) {
  const CamClayState tensile{{{5.0, 5.0, 5.0, 0.0}}, 100.0};
  EXPECT_THROW(cam_clay_update(clay(), tensile, {{0.0, -1e-4, 0.0, 0.0}}), SolverError);
}

TEST(CamClay, StaysElasticInsideTheYieldSurface) {
  // Isotropically overconsolidated to four times p': a small compression stays
  // inside the ellipse and follows p' = p'0 exp(v0 dev / kappa) (compression +).
  const auto m = clay();
  const CamClayState ocr4{{{-100.0, -100.0, -100.0, 0.0}}, 400.0};
  const auto u = cam_clay_update(m, ocr4, {{-1e-3, -1e-3, -1e-3, 0.0}});
  EXPECT_FALSE(u.yielded);
  EXPECT_DOUBLE_EQ(u.state.yield_size, 400.0);
  EXPECT_NEAR(mean_effective_stress(u.state.stress),
              100.0 * std::exp(m.specific_volume * 3e-3 / m.kappa), 1e-9);
  EXPECT_NEAR(deviator_stress(u.state.stress), 0.0, 1e-9);
}

TEST(CamClay, TangentMatchesFiniteDifferencesWhenElastic) {
  const CamClayState ocr4{{{-100.0, -120.0, -90.0, 10.0}}, 400.0};
  EXPECT_LT(tangent_mismatch(ocr4, {{-2e-4, -5e-4, 1e-4, 3e-4}}, 1e-7), 1e-6);
}

TEST(CamClay, TangentMatchesFiniteDifferencesOnTheWetSide) {
  // Normally consolidated under K0-like stresses, pushed past the yield surface
  // by a general plane-strain increment with shear (hardening).
  const auto m = clay();
  const CamClayState nc{
      {{-60.0, -100.0, -60.0, 5.0}},
      yield_size_from_vertical_preconsolidation(100.0, 0.6, m.critical_state_slope)};
  const PlaneTensor increment{{1e-3, -4e-3, 2e-4, -1e-3}};
  ASSERT_TRUE(cam_clay_update(m, nc, increment).yielded);
  EXPECT_LT(tangent_mismatch(nc, increment, 1e-8), 1e-5);
}

TEST(CamClay, TangentMatchesFiniteDifferencesOnTheDrySide) {
  // Heavily overconsolidated (p' well below p'c / 2) and sheared to yield: the
  // surface shrinks (softening) and the tangent must still be consistent.
  const CamClayState heavy{{{-40.0, -40.0, -40.0, 0.0}}, 300.0};
  const PlaneTensor increment{{2e-2, -2e-2, 0.0, 1.2e-2}};
  const auto u = cam_clay_update(clay(), heavy, increment);
  ASSERT_TRUE(u.yielded);
  EXPECT_LT(u.state.yield_size, 300.0);
  EXPECT_LT(tangent_mismatch(heavy, increment, 1e-8), 1e-5);
}

// A preconsolidation profile, by hand: POP 40 kPa at -9 m and 10 kPa at -4 m.
TEST(CamClayScenario, PreconsolidationProfileIsLinearBetweenItsPointsAndConstantBeyond) {
  scenario::Material::CamClay c;
  c.past = scenario::Material::CamClay::Past::pop;
  c.past_profile = {{-9.0, 40.0}, {-4.0, 10.0}};
  EXPECT_DOUBLE_EQ(c.past_at(-6.5), 25.0);
  EXPECT_DOUBLE_EQ(c.past_at(-4.0), 10.0);
  EXPECT_DOUBLE_EQ(c.past_at(0.0), 10.0);
  EXPECT_DOUBLE_EQ(c.past_at(-20.0), 40.0);
  EXPECT_DOUBLE_EQ(c.preconsolidation(100.0, -6.5), 125.0); // sigma'v0 + POP
  c.past = scenario::Material::CamClay::Past::ocr;
  c.past_profile = {{-9.0, 2.0}, {-4.0, 1.0}};
  EXPECT_DOUBLE_EQ(c.preconsolidation(80.0, -5.0), 96.0); // OCR 1.2 there
  c.past_profile.clear();
  c.past_value = 1.5;
  EXPECT_DOUBLE_EQ(c.preconsolidation(80.0, -5.0), 120.0);
}

TEST(ClaySkeleton, PermeabilityChangeIndexEqualToCcGivesConstantCvOnTheCompressionLine) {
  // Taylor (1948): k = k0 10^((e - e0)/Ck); with e - e0 = -Cc log10(sigma'/sigma'0)
  // on the normal compression line and Ck = Cc, k = k0 sigma'0/sigma' (what Davis
  // & Raymond 1965 assume). Small strain: e - e0 = v0 tr(eps).
  ClaySkeleton c;
  c.parameters = clay();
  EXPECT_EQ(c.conductivity_rate(), 0.0);                // no Ck: k stays
  c.permeability_change_index = 0.42;                   // = Cc
  const double strain = -0.42 / 2.15 * std::log10(3.0); // sigma' tripled
  EXPECT_NEAR(std::exp(c.conductivity_rate() * strain), 1.0 / 3.0, 1e-14);
}
