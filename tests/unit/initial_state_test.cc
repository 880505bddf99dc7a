// The state at t = 0 from a scenario: heads (the water table, given layer heads and
// the steady leakage profile between them), the geostatic vertical effective stress
// from the saturated unit weights, and the horizontal one from K0. Every expected
// value is a hand calculation written beside the check.
#include "settlewell/mesh/gmsh_mesh.h"
#include "settlewell/model/initial_state.h"
#include "settlewell/scenario/parse.h"

#include <gtest/gtest.h>

#include <cmath>

namespace sc = settlewell::scenario;
using dealii::Point;

namespace {

// An invented profile: sand over clay over silt over an underdrained gravel whose
// head (-5 m) is 4 m below the water table (-1 m).
const char* layered = R"(
unit_weight_water = 9.81
[materials.sand]
unit_weight = 19.0
youngs_modulus = 30000
poisson_ratio = 0.3
conductivity = 1e-4
earth_pressure_at_rest = 0.45
[materials.clay]
unit_weight = 17.0
mv = 1e-3
poisson_ratio = 0.3
conductivity_x = 2e-9
conductivity_y = 1e-9
earth_pressure_at_rest = 0.6
[materials.silt]
unit_weight = 18.0
youngs_modulus = 10000
poisson_ratio = 0.3
conductivity = 4e-9
[materials.gravel]
unit_weight = 21.0
youngs_modulus = 80000
poisson_ratio = 0.3
conductivity = 1e-3
[box]
bottom = -20.0
layers = [ { top = 0.0, material = "sand" },  { top = -6.0, material = "clay" },
           { top = -10.0, material = "silt" }, { top = -14.0, material = "gravel" } ]
[groundwater]
water_table = -1.0
layer_heads = { gravel = -5.0 }
[[stages]]
name = "hold"
duration = 1.0
)";

struct Fixture {
  sc::Scenario scenario = sc::parse_scenario(layered, "layered.toml");
  settlewell::Mesh mesh = settlewell::make_scenario_mesh(scenario, MPI_COMM_WORLD);
  settlewell::model::InitialState state{scenario, mesh};
  dealii::types::material_id region(const std::string& name) const {
    return mesh.names.region_id(name);
  }
};

} // namespace

TEST(InitialState, HeadsFollowTheWaterTableTheGivenHeadAndTheLeakageBetween) {
  const Fixture f;
  // Sand: the water table's head. Gravel: its given head.
  EXPECT_NEAR(f.state.head(Point<2>(0.5, -3.0)), -1.0, 1e-12);
  EXPECT_NEAR(f.state.head(Point<2>(0.5, -17.0)), -5.0, 1e-12);
  // Clay and silt carry the 4 m fall in proportion to their resistance dz/ky:
  // clay 4/1e-9 = 4e9, silt 4/4e-9 = 1e9 s, so the clay takes 4 * 4/5 = 3.2 m.
  EXPECT_NEAR(f.state.head(Point<2>(0.5, -10.0)), -4.2, 1e-12);
  EXPECT_NEAR(f.state.head(Point<2>(0.5, -8.0)), -2.6, 1e-12);  // mid-clay
  EXPECT_NEAR(f.state.head(Point<2>(0.5, -12.0)), -4.6, 1e-12); // mid-silt
  // The gradient dh/dy in the clay: 3.2 m over 4 m.
  EXPECT_NEAR(f.state.head_gradient(Point<2>(0.5, -8.0))[1], 0.8, 1e-12);
  EXPECT_NEAR(f.state.head_gradient(Point<2>(0.5, -3.0))[1], 0.0, 1e-12);
}

TEST(InitialState, VerticalEffectiveStressFromTheUnitWeightsAndHorizontalFromK0) {
  const Fixture f;
  // Mid-clay, y = -8: total 19 * 6 + 17 * 2 = 148 kPa; pore pressure
  // 9.81 (-2.6 + 8) = 52.974 kPa; sigma'v = 95.026 kPa; sigma'h = 0.6 sigma'v.
  const Point<2> clay(0.5, -8.0);
  EXPECT_NEAR(f.state.pore_pressure(clay), 52.974, 1e-9);
  const auto s = f.state.effective_stress(clay, f.region("clay"));
  EXPECT_NEAR(s[1][1], -95.026, 1e-9); // tension positive
  EXPECT_NEAR(s[0][0], -0.6 * 95.026, 1e-9);
  EXPECT_NEAR(s[2][2], -0.6 * 95.026, 1e-9);
  EXPECT_NEAR(s[0][1], 0.0, 1e-12);
  // Sand at y = -3, below the water table: 19 * 3 - 9.81 * 2 = 37.38 kPa, K0 0.45.
  const auto sand = f.state.effective_stress(Point<2>(0.5, -3.0), f.region("sand"));
  EXPECT_NEAR(sand[1][1], -37.38, 1e-9);
  EXPECT_NEAR(sand[0][0], -0.45 * 37.38, 1e-9);
  // K0 defaults to the registry's 0.5 in the silt, at y = -12: total
  // 148 + 17 * 2 + 18 * 2 = 218 kPa, pore pressure 9.81 (-4.6 + 12) = 72.594 kPa.
  const auto silt = f.state.effective_stress(Point<2>(0.5, -12.0), f.region("silt"));
  EXPECT_NEAR(silt[1][1], -(218.0 - 72.594), 1e-9);
  EXPECT_NEAR(silt[0][0], -0.5 * (218.0 - 72.594), 1e-9);
}

TEST(InitialState, MoistWeightAndBishopsStressAboveTheWaterTable) {
  // A Gardner sand (a 2/m, theta 0.30/0.05) with its water table at -2 m. Above
  // it the start is hydrostatic, psi = -(y + 2), and the sand lacks gamma_w
  // (theta_s - theta) = 9.81 * 0.25 (1 - e^(a psi)) of its saturated weight; over
  // the 2 m above the water table, integral of (1 - e^(-2 s)) ds from 0 to 2 =
  // 2 - (1 - e^-4)/2 = 1.5091578 m, a hand calculation.
  const char* sand = R"(
[materials.sand]
unit_weight = 19.0
youngs_modulus = 30000
poisson_ratio = 0.3
conductivity = 1e-4
saturated_water_content = 0.30
residual_water_content = 0.05
retention = "gardner"
retention_alpha = 2.0
[box]
bottom = -10.0
layers = [ { top = 0.0, material = "sand" } ]
[groundwater]
water_table = -2.0
[[stages]]
name = "hold"
duration = 1.0
)";
  const auto scenario = sc::parse_scenario(sand, "sand.toml");
  const auto mesh = settlewell::make_scenario_mesh(scenario, MPI_COMM_WORLD);
  const settlewell::model::InitialState state{scenario, mesh};
  const auto id = mesh.names.region_id("sand");
  const double gw = scenario.gamma_w, lacking = 2.0 - (1.0 - std::exp(-4.0)) / 2.0;
  // The state integrates the deficit by Simpson's rule on 64 slices: its error
  // bound, (2/180) h^4 max|f| with h = 1/32 m and f = 16 e^(2 psi), times
  // 9.81 * 0.25, is 4e-7 kPa.
  const double tolerance = 1e-6; // kPa
  // Below the water table, at -5 m: the saturated weight less that deficit, and
  // Terzaghi's stress.
  const Point<2> below(0.5, -5.0);
  const double total = 19.0 * 5.0 - gw * 0.25 * lacking;
  EXPECT_NEAR(state.vertical_total_stress(below, id), total, tolerance);
  EXPECT_NEAR(state.effective_stress(below, id)[1][1], -(total - gw * 3.0), tolerance);
  // At -1 m, 1 m of suction: the top metre, psi from -1 to -2 m, lacks the
  // integral of (1 - e^(-2 s)) ds from 1 to 2 = 1 - (e^-2 - e^-4)/2; Bishop's
  // stress adds S_r times the suction, S_r = (0.05 + 0.25 e^-2) / 0.30.
  const Point<2> above(0.5, -1.0);
  const double top_metre =
      19.0 - gw * 0.25 * (1.0 - (std::exp(-2.0) - std::exp(-4.0)) / 2.0);
  const double saturation = (0.05 + 0.25 * std::exp(-2.0)) / 0.30;
  EXPECT_NEAR(state.vertical_total_stress(above, id), top_metre, tolerance);
  EXPECT_NEAR(state.effective_stress(above, id)[1][1], -(top_metre + saturation * gw),
              tolerance);
}
