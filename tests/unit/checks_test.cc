// The engineering checks' pure functions against hand calculations and the
// check values of docs/verification-references.md (sections 6 and 8).
#include "settlewell/checks/damage.h"
#include "settlewell/checks/one_d.h"
#include "settlewell/checks/stability.h"

#include <gtest/gtest.h>

#include <cmath>
#include <limits>

namespace c = settlewell::checks;

// Synthetic trough s = 40 mm exp(-x^2 / (2 * 10^2)) with A, B, C at 5, 15, 25 m:
// check values "computed here" in docs/verification-references.md, section 8 (Burland &
// Wroth 1974 definitions).
TEST(Damage, GaussianTroughMeasuresMatchTheReferenceValues) {
  c::FoundationMovement m;
  for (const double x : {5.0, 15.0, 25.0}) {
    m.x.push_back(x);
    m.settlement.push_back(0.040 * std::exp(-x * x / 200.0));
    m.ux.push_back(0.0);
  }
  EXPECT_NEAR(m.settlement[0], 35.2999e-3, 1e-7);
  const c::Distortion d = c::distortion(m);
  EXPECT_NEAR(d.tilt, -1.67712e-3, 1e-8);
  EXPECT_NEAR(d.angular_distortion, 5.54258e-4, 1e-9);
  EXPECT_NEAR(d.deflection_ratio, 2.77129e-4, 1e-9);
  EXPECT_TRUE(d.hogging);
  EXPECT_NEAR(d.max_settlement, 35.2999e-3, 1e-7);
  EXPECT_NEAR(d.differential, (35.2999 - 1.75748) * 1e-3, 1e-7);
  EXPECT_DOUBLE_EQ(d.horizontal_strain, 0.0);
}

TEST(Damage, SaggingAndHorizontalStrain) {
  c::FoundationMovement m{{0.0, 10.0, 20.0}, {0.0, 0.004, 0.0}, {0.0, 0.001, 0.002}};
  const c::Distortion d = c::distortion(m);
  EXPECT_FALSE(d.hogging);
  EXPECT_NEAR(d.deflection_ratio, 0.004 / 20.0, 1e-15);
  EXPECT_NEAR(d.horizontal_strain, 0.002 / 20.0, 1e-15);
  EXPECT_NEAR(d.angular_distortion, 0.004 / 10.0, 1e-15);
}

// Limiting tensile strains of Boscardin & Cording (1989) and Burland (1995):
// 0.05, 0.075, 0.15 and 0.3 %, checked at, just below and just above each.
TEST(Damage, CategoriesChangeExactlyAtTheLimitingStrains) {
  const double limits[] = {0.0005, 0.00075, 0.0015, 0.003};
  for (int k = 0; k < 4; ++k) {
    EXPECT_EQ(c::category_from_strain(limits[k] * (1 - 1e-9)).category, k) << limits[k];
    EXPECT_EQ(c::category_from_strain(limits[k]).category, k + 1) << limits[k];
    EXPECT_EQ(c::category_from_strain(limits[k] * (1 + 1e-9)).category, k + 1)
        << limits[k];
  }
  EXPECT_EQ(c::category_from_strain(0.0).degree, "negligible");
  EXPECT_EQ(c::category_from_strain(0.01).degree, "severe to very severe");
}

// With no horizontal strain the principal strain is beta/2, so the category
// boundaries in angular distortion are 1.0, 1.5, 3.0, 6.0 x 1e-3
// (docs/verification-references.md, section 8).
TEST(Damage, PrincipalStrainWithoutHorizontalStrainIsHalfTheDistortion) {
  const double boundaries[] = {1.0e-3, 1.5e-3, 3.0e-3, 6.0e-3};
  for (int k = 0; k < 4; ++k) {
    EXPECT_NEAR(c::principal_tensile_strain(0.0, boundaries[k]), boundaries[k] / 2,
                1e-15);
    EXPECT_EQ(
        c::category_from_strain(c::principal_tensile_strain(0.0, 0.999 * boundaries[k]))
            .category,
        k);
    EXPECT_EQ(
        c::category_from_strain(c::principal_tensile_strain(0.0, 1.001 * boundaries[k]))
            .category,
        k + 1);
  }
  // Pure horizontal tension is itself the principal strain; compression relieves.
  EXPECT_NEAR(c::principal_tensile_strain(0.001, 0.0), 0.001, 1e-15);
  EXPECT_NEAR(c::principal_tensile_strain(-0.001, 0.0), 0.0, 1e-15);
}

// Deep beam (Burland 1995) by hand for L = H = 10 m, sagging, dL = 1e-4, eh = 0:
// I = 1000/12, t = 5: bending = 1e-4 / (10/60 + 3*I*2.6/(2*5*10*10)) = 1e-4/0.816667;
// diagonal = 1e-4 / (1 + 10*100/(18*I*2.6)) = 1e-4/1.2564103.
TEST(Damage, DeepBeamStrainsByHand) {
  const c::BeamStrains s = c::deep_beam_strains(1e-4, false, 10.0, 10.0, 0.0);
  EXPECT_NEAR(s.bending, 1e-4 / 0.8166667, 1e-10);
  EXPECT_NEAR(s.diagonal, 1e-4 / 1.2564103, 1e-10);
}

// References section 6: Gs = 2.65, e = 0.65 give i_c = 1; the infinite-depth
// example d = 6 m, h_a = 1.41584 m, gamma' = 10 kN/m^3 gives FS_heave = 4.31983;
// 4 m of clay at 18 kN/m^3 over h_p = 10 m gives FS_uplift = 0.733945, and
// FS = 1.1 at h_p = 6.67223 m.
TEST(Stability, FactorsMatchTheReferenceHandCalculations) {
  const double gw = 9.81;
  const double gamma_sat = (2.65 + 0.65) / (1 + 0.65) * gw;
  EXPECT_NEAR(c::critical_gradient(gamma_sat, gw), 1.0, 1e-12);
  // The inputs are the references' 6-digit values, so the factors agree to about
  // 3e-6 relative.
  EXPECT_NEAR(c::piping_factor(1.0, 0.212207), 4.71239, 3e-5);
  EXPECT_NEAR(c::heave_factor(10.0, 6.0, 1.41584, gw), 4.31983, 3e-5);
  EXPECT_NEAR(c::uplift_factor(4 * 18.0, gw * 10.0), 0.733945, 1e-6);
  EXPECT_NEAR(c::uplift_factor(4 * 18.0, gw * 6.67223), 1.1, 1e-6);
  EXPECT_EQ(c::piping_factor(1.0, -0.1), c::unbounded);
  EXPECT_EQ(c::heave_factor(10.0, 6.0, 0.0, gw), c::unbounded);
  EXPECT_EQ(c::uplift_factor(72.0, -5.0), c::unbounded);
}

// A hand calculation with numbers of our own: 6 m of clay (mv 0.6 MPa^-1,
// cv 2e-7 m^2/s) between an upper sand whose head stays and a lower sand 3 m thick
// (mv 1.5e-5 1/kPa) whose head falls 5 m.
//   clay: mv gw H (0 + 5)/2 = 0.6e-3 * 9.81 * 6 * 2.5 = 0.088290 m, Hdr = 3 m,
//         t50 = 0.197 * 9 / 2e-7 = 8.865e6 s, t90 = 0.848 * 9 / 2e-7 = 3.816e7 s
//   lower sand: 1.5e-5 * 9.81 * 5 * 3 = 0.0022073 m
TEST(OneD, EstimateMatchesAHandCalculation) {
  std::vector<c::ColumnLayer> layers{
      {"upper_sand", 0.0, -2.0, 2e-5, 1.0, false, 0.0},
      {"clay", -2.0, -8.0, 0.6e-3, 2e-7, true, 0.0},
      {"lower_sand", -8.0, -11.0, 1.5e-5, 1.0, false, 5.0}};
  const c::OneDEstimate e = c::estimate_one_d(layers, 9.81, true);
  EXPECT_NEAR(e.layers[1].settlement, 0.088290, 1e-6);
  EXPECT_NEAR(e.layers[1].drainage_path, 3.0, 1e-12);
  EXPECT_EQ(e.layers[1].drained_faces, 2);
  EXPECT_NEAR(e.layers[1].t50, 8.865e6, 1.0);
  EXPECT_NEAR(e.layers[1].t90, 3.816e7, 1.0);
  EXPECT_NEAR(e.layers[2].settlement, 0.0022073, 1e-7);
  EXPECT_NEAR(e.ultimate, 0.088290 + 0.0022073, 1e-6);
  // Instantaneous drop: at t50 of the clay, half the clay's share (Tv = 0.197
  // gives U = 0.500338, Terzaghi 1925) plus all of the sand's.
  EXPECT_NEAR(e.settlement_at(8.865e6, 0.0), 0.500338 * 0.088290 + 0.0022073, 1e-6);
  // Ramped over Tc = 0.5: Olson (1977) U(0.5, 0.5) = 0.524667.
  const double ramp = 0.5 * 9 / 2e-7;
  EXPECT_NEAR(e.settlement_at(ramp, ramp), 0.524667 * 0.088290 + 0.0022073, 1e-6);
  EXPECT_GT(e.t50(ramp), e.t50(0.0));
}

// A clay on an impermeable base drains through its top only: uniform stress
// change and Hdr = H.
TEST(OneD, SingleDrainageUsesTheWholeThickness) {
  std::vector<c::ColumnLayer> layers{{"sand", 0.0, -3.0, 2e-5, 1.0, false, 4.0},
                                     {"clay", -3.0, -7.0, 1e-3, 1e-7, true, 0.0}};
  const c::OneDEstimate e = c::estimate_one_d(layers, 9.81, true);
  EXPECT_EQ(e.layers[1].drained_faces, 1);
  EXPECT_NEAR(e.layers[1].drainage_path, 4.0, 1e-12);
  EXPECT_NEAR(e.layers[1].settlement, 1e-3 * 9.81 * 4.0 * 4.0, 1e-12);
}

// Two clays in sequence between a sand whose head stays and a sand whose head
// falls 6 m (numbers of our own). Steady seepage across the pair at the end: the
// fall is shared by H / k, clay A 4 m at k = 1e-9 m/s (4e9 s), clay B 2 m at
// 4e-9 m/s (0.5e9 s), of 4.5e9 s in all.
//   A: mean fall 6 * 2e9 / 4.5e9 = 2.666667 m, mv 1e-3: 1e-3 * 9.81 * 2.666667 * 4
//      = 0.104640 m
//   B: mean fall 6 * 4.25e9 / 4.5e9 = 5.666667 m, mv 5e-4: 5e-4 * 9.81 * 5.666667 * 2
//      = 0.055590 m
// Time (the transformed-thickness approximation, common practice): sum H / sqrt(cv)
// = 4 / sqrt(1e-7) + 2 / sqrt(4e-7) = 15811.39 s^0.5; halved for two drained faces
// and put in each layer's cv: A 2.5 m, B 5.0 m, so both reach Tv = 0.197 together.
TEST(OneD, ClaysInSequenceShareTheSeepageAndOneTimeScale) {
  std::vector<c::ColumnLayer> layers{
      {"upper_sand", 0.0, -2.0, 2e-5, 1.0, false, 0.0},
      {"clay_a", -2.0, -6.0, 1e-3, 1e-7, true, 0.0},
      {"clay_b", -6.0, -8.0, 5e-4, 4e-7, true, 0.0},
      {"lower_sand", -8.0, -11.0, 1.5e-5, 1.0, false, 6.0}};
  layers[1].conductivity = 1e-9;
  layers[2].conductivity = 4e-9;
  const c::OneDEstimate e = c::estimate_one_d(layers, 9.81, true);
  EXPECT_NEAR(e.layers[1].settlement, 0.104640, 1e-6);
  EXPECT_NEAR(e.layers[2].settlement, 0.055590, 1e-6);
  EXPECT_EQ(e.layers[1].drained_faces, 2);
  EXPECT_EQ(e.layers[2].drained_faces, 2);
  EXPECT_NEAR(e.layers[1].drainage_path, 2.5, 1e-9);
  EXPECT_NEAR(e.layers[2].drainage_path, 5.0, 1e-9);
  EXPECT_NEAR(e.layers[1].t50, e.layers[2].t50, 1e-6 * e.layers[1].t50);
}

// The heads at a clay's own faces, where given, replace its neighbours' mean falls:
// the aquifer below falls 5.3 m on average but 3.85 m at the clay's underside.
TEST(OneD, FallsAtTheClaysFacesTakePrecedence) {
  std::vector<c::ColumnLayer> layers{{"clay", 0.0, -4.0, 1e-3, 1e-7, true, 0.0},
                                     {"aquifer", -4.0, -10.0, 1e-5, 1.0, false, 5.3}};
  layers[0].fall_top = 0.0;
  layers[0].fall_bottom = 3.85;
  const c::OneDEstimate e = c::estimate_one_d(layers, 9.81, true);
  EXPECT_NEAR(e.layers[0].settlement, 1e-3 * 9.81 * 0.5 * 3.85 * 4.0, 1e-12);
  layers[0].fall_bottom = std::numeric_limits<double>::quiet_NaN();
  EXPECT_NEAR(c::estimate_one_d(layers, 9.81, true).layers[0].settlement,
              1e-3 * 9.81 * 0.5 * 5.3 * 4.0, 1e-12);
}

// The e-log form of a clay with Cc 0.4, Cr 0.05, e0 1.0 (invented), by hand:
//   recompression 40 -> 69.43 kPa below sigma'p 70: 0.05 log10(69.43/40) / 2 = 0.0059872
//   across sigma'p 50: (0.05 log10(50/40) + 0.4 log10(69.43/50)) / 2 = 0.0309382
//   normally consolidated (sigma'p 30 < 40): 0.4 log10(69.43/40) / 2 = 0.0478974
//   unloading 40 -> 10.57 kPa: 0.05 log10(10.57/40) / 2 = -0.0144496
TEST(OneD, ElogStrainFollowsEachBranch) {
  c::ColumnLayer::Oedometer clay;
  clay.compression_index = 0.4;
  clay.recompression_index = 0.05;
  clay.void_ratio = 1.0;
  const double change = 9.81 * 3.0;
  EXPECT_NEAR(c::elog_strain(clay, 40.0, 70.0, change), 0.0059872, 1e-7);
  EXPECT_NEAR(c::elog_strain(clay, 40.0, 50.0, change), 0.0309382, 1e-7);
  EXPECT_NEAR(c::elog_strain(clay, 40.0, 30.0, change), 0.0478974, 1e-7);
  EXPECT_NEAR(c::elog_strain(clay, 40.0, 70.0, -change), -0.0144496, 1e-7);
}

// A 4 m draining clay layer whose head falls 3 m throughout, sigma'v0 from 40 to
// 60 kPa and sigma'p 30 kPa above it: the e-log strain integrated through it. By
// hand, Simpson's rule on its top, middle and bottom (0.0059872, 0.0050254,
// 0.0043333): 4/6 (0.0059872 + 4 x 0.0050254 + 0.0043333) = 0.020281 m; the exact
// integral (a fine trapezoidal sum) is 0.020279 m.
TEST(OneD, ElogLayerIntegratesThroughItsThickness) {
  c::ColumnLayer layer;
  layer.name = "clay";
  layer.top = 0.0;
  layer.bottom = -4.0;
  layer.mv = 1e-4; // not used by the e-log form
  layer.cv = 1e-7;
  layer.conductivity = 1e-9;
  layer.head_fall = 3.0;
  c::ColumnLayer::Oedometer clay;
  clay.compression_index = 0.4;
  clay.recompression_index = 0.05;
  clay.void_ratio = 1.0;
  clay.start_top = 40.0;
  clay.start_bottom = 60.0;
  clay.past_top = 70.0;
  clay.past_bottom = 90.0;
  layer.oedometer = clay;
  const c::OneDEstimate e = c::estimate_one_d({layer}, 9.81, true);
  EXPECT_NEAR(e.layers[0].settlement, 0.020279, 2e-6);
  // Its cv is that of the secant mv of the increment: k / (gamma_w S / (gamma_w dh H)).
  const double mv = e.layers[0].settlement / (9.81 * 3.0 * 4.0);
  EXPECT_NEAR(e.layers[0].cv, 1e-9 / (9.81 * mv), 1e-12);
}
