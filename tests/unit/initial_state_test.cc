// The state at t = 0 from a scenario: heads (the water table, given layer heads and
// the steady leakage profile between them), the geostatic vertical effective stress
// from the saturated unit weights, and the horizontal one from K0. Every expected
// value is a hand calculation written beside the check.
#include "settlewell/mesh/gmsh_mesh.h"
#include "settlewell/model/initial_state.h"
#include "settlewell/scenario/parse.h"

#include <gtest/gtest.h>

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
