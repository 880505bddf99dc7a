// Lines that take water only (pumped wells, seepage faces): the active set that
// seals such a line where water would enter, and holds it at its limit, atmospheric
// above the water it holds, where water leaves.
//
// The checks use steady flow through a confined strip 10 m long and 1 m high with
// a rigid skeleton: head H0 on the left end, the one-way line on the right end. The
// consistent outflow of the right end is then exact for the discrete solution as
// for the continuous one. The reason: Green's identity with the weight x, which the
// Q1 space holds, gives
//   L q_right = k (int_left h dy - int_right h dy)
// (Darcy's law with conservation of mass, common practice; derived here, not
// quoted). For a head hw held all along the right end this is the 1D
// q = k (H0 - hw) / L; with the right end at atmospheric pressure (h = y) it is
// q = k (H0 - mean y) / L, provided water leaves all along the end. That needs H0
// well above the end: near a face at h = y the ground's head is about the face's
// mean, so with H0 low the face's top, at a head above that, would take water in
// and be sealed (as the active set then finds). H0 = 20 m keeps the head next to
// the face's top above it.
#include "settlewell/mesh/axis_grading.h"
#include "settlewell/mesh/box_mesh.h"
#include "settlewell/output/probes.h"
#include "settlewell/physics/biot_problem.h"

#include <gtest/gtest.h>

#include <cmath>

using namespace settlewell;

namespace {

constexpr double length = 10.0, k = 1e-5, h_left = 2.0, h_high = 20.0;

Mesh strip_mesh() {
  BoxSpec box;
  // Square cells: Q1 on cells longer than sqrt(2) times their width couples
  // neighbours along the long side positively (no discrete maximum principle),
  // and a sealed node beside the face's top can then sit below its neighbours
  // and below its limit (measured: with 1 x 0.25 m cells the top node stayed
  // sealed at a head of -0.085 m beside ground at +1.5 m).
  box.x_edges = cell_edges({0.0, length, 40, 1.0});
  box.y_edges = cell_edges({-1.0, 0.0, 4, 1.0});
  return make_box_mesh(box, MPI_COMM_WORLD);
}

/// The strip with the left end's head h0 and the right end's hw held one way (or
/// both ways).
BiotSetup strip_setup(double hw, bool one_way, double h0 = h_left) {
  BiotSetup setup;
  PoroelasticMaterial sand = PoroelasticMaterial::isotropic(3e4, 0.3, k);
  sand.storage = 1e-5; // 1/kPa: the strip comes to rest within about 1e3 s
  setup.materials["soil"] = sand;
  setup.rigid_skeleton = true;
  setup.conditions.head("left", uniform([h0](double) { return h0; }));
  const auto held = uniform([hw](double) { return hw; });
  if (one_way)
    setup.conditions.pumped_head("right", held);
  else
    setup.conditions.head("right", held);
  return setup;
}

/// Runs the strip to steady state; returns the problem at t = 1e6 s.
std::unique_ptr<BiotProblem> steady(const Mesh& mesh, const BiotSetup& setup) {
  auto problem = std::make_unique<BiotProblem>(mesh, setup);
  for (double t = 10.0; t <= 1e6; t *= 10.0)
    problem->advance_to(t);
  return problem;
}

/// Head at a point, m (the initial head is zero).
double head_at(const BiotProblem& problem, double x, double y) {
  return probe(problem, dealii::Point<2>(x, y)).excess_pressure / 9.81;
}

} // namespace

TEST(OneWayLine, TakesWaterLikeAHeldHeadWhereTheGroundIsHigher) {
  const Mesh mesh = strip_mesh();
  const auto problem = steady(mesh, strip_setup(1.0, true));
  EXPECT_NEAR(problem->outflow("right"), k * (h_left - 1.0) / length, 1e-9 * k);
  const auto state = problem->one_way_state("right");
  EXPECT_TRUE(state.one_way);
  EXPECT_FALSE(state.stopped);
  EXPECT_FALSE(state.dry);
}

TEST(OneWayLine, IsSealedWhereItWouldPutWaterIntoTheGround) {
  const Mesh mesh = strip_mesh();
  // Held both ways, a head above the ground's injects k (hw - H0) / L ...
  const auto both_ways = steady(mesh, strip_setup(3.0, false));
  EXPECT_NEAR(both_ways->outflow("right"), -k * (3.0 - h_left) / length, 1e-9 * k);
  // ... held one way, the end is sealed: no flow, and the strip stands at H0.
  const auto one_way = steady(mesh, strip_setup(3.0, true));
  EXPECT_NEAR(one_way->outflow("right"), 0.0, 1e-9 * k);
  EXPECT_NEAR(head_at(*one_way, length, -0.5), h_left, 1e-6);
  const auto state = one_way->one_way_state("right");
  EXPECT_TRUE(state.stopped);
  EXPECT_FALSE(state.dry);
}

TEST(OneWayLine, RunDryDrainsAtAtmosphericPressure) {
  const Mesh mesh = strip_mesh();
  // A target 4 m below the line: its pore pressure is held at zero, h = y.
  const auto problem = steady(mesh, strip_setup(-5.0, true, h_high));
  EXPECT_NEAR(problem->outflow("right"), k * (h_high + 0.5) / length, 1e-9 * k);
  EXPECT_NEAR(head_at(*problem, length, -0.75), -0.75, 1e-6);
  const auto state = problem->one_way_state("right");
  EXPECT_TRUE(state.dry);
  EXPECT_FALSE(state.stopped);
}

TEST(OneWayLine, SeepageFaceAboveTheWaterItHolds) {
  const Mesh mesh = strip_mesh();
  // Water held at -0.5 m: below it the head is -0.5 m, above it the pressure is
  // atmospheric (h = y), so the right end's mean head is the mean of the two parts:
  // (0.5 (-0.5) + int_{-0.5}^{0} y dy) / 1 = -0.25 - 0.125.
  const auto problem = steady(mesh, strip_setup(-0.5, true, h_high));
  EXPECT_NEAR(problem->outflow("right"), k * (h_high + 0.375) / length, 1e-9 * k);
  EXPECT_NEAR(head_at(*problem, length, -0.25), -0.25, 1e-6);
  EXPECT_NEAR(head_at(*problem, length, -0.75), -0.5, 1e-6);
}

TEST(OneWayLine, APumpedLinePassesWaterBetweenDepthsWhileItPumps) {
  // A 1 m square (8 x 8 cells): the left side's head rises with height,
  // h = 0.6 + 8 (y + 0.5) (-3.4 m at the base, 4.6 m at the top, 0.6 m on
  // average); the right side holds 0.5 m, above its top, so all of it lies below
  // the water it holds. Held all along, water enters the ground near the right
  // side's base and leaves near its top, and the net is exact for the discrete
  // solution too (the identity above with L = 1 m): k (0.6 - 0.5) / 1 m.
  BoxSpec box;
  box.x_edges = cell_edges({0.0, 1.0, 8, 1.0});
  box.y_edges = cell_edges({-1.0, 0.0, 8, 1.0});
  const Mesh mesh = make_box_mesh(box, MPI_COMM_WORLD);
  const auto square = [](HydraulicCondition::Exchange exchange) {
    BiotSetup setup = strip_setup(0.5, true);
    setup.conditions.hydraulic.front().value = [](const dealii::Point<2>& x, double) {
      return 0.6 + 8.0 * (x[1] + 0.5);
    };
    setup.conditions.hydraulic.back().exchange = exchange;
    return setup;
  };
  const auto pumped = steady(mesh, square(HydraulicCondition::Exchange::pumped));
  EXPECT_NEAR(pumped->outflow("right"), k * 0.1, 1e-9 * k);
  EXPECT_FALSE(pumped->one_way_state("right").stopped);
  // Point by point (a seepage face held at that head), the base is sealed
  // instead: the head there falls below the line's, and more water leaves in net.
  const auto per_point = steady(mesh, square(HydraulicCondition::Exchange::seepage_face));
  EXPECT_LT(head_at(*per_point, 1.0, -1.0), 0.5 - 1e-3);
  EXPECT_GT(per_point->outflow("right"), 1.01 * k * 0.1);
}

TEST(OneWayLine, AStoppedPumpStartsAgainWhenTheGroundRisesAboveItsHead) {
  const Mesh mesh = strip_mesh();
  // Held at 3 m until t = 1e4 s (above the ground's 2 m: stopped), then at 1 m.
  BiotSetup setup = strip_setup(0.0, true);
  setup.conditions.hydraulic.back().value =
      uniform([](double t) { return t <= 1e4 ? 3.0 : 1.0; });
  BiotProblem problem(mesh, setup);
  for (double t = 10.0; t <= 1e4; t *= 10.0)
    problem.advance_to(t);
  EXPECT_TRUE(problem.one_way_state("right").stopped);
  EXPECT_NEAR(problem.outflow("right"), 0.0, 1e-9 * k);
  for (double t = 1e5; t <= 1e7; t *= 10.0)
    problem.advance_to(t);
  EXPECT_FALSE(problem.one_way_state("right").stopped);
  EXPECT_NEAR(problem.outflow("right"), k * (h_left - 1.0) / length, 1e-9 * k);
}

TEST(OneWayLine, APumpedLineOpensAndClosesWithItsWindow) {
  const Mesh mesh = strip_mesh();
  // Held at 1 m from t = 1e5 s to 2e6 s only: no flow before (the strip comes to
  // stand at H0), Darcy's flow while it applies, none after. Steps of constant
  // length, each about the strip's diffusion time (1e3 s) and then 1e5 s.
  BiotSetup setup = strip_setup(1.0, true);
  setup.conditions.hydraulic.back().window = TimeWindow{1e5, 2e6};
  BiotProblem problem(mesh, setup);
  for (int i = 1; i <= 100; ++i)
    problem.advance_to(1e3 * i);
  EXPECT_FALSE(problem.one_way_state("right").one_way);
  EXPECT_NEAR(head_at(problem, length, -0.5), h_left, 1e-6);
  for (int i = 2; i <= 20; ++i)
    problem.advance_to(1e5 * i);
  EXPECT_TRUE(problem.one_way_state("right").one_way);
  EXPECT_NEAR(problem.outflow("right"), k * (h_left - 1.0) / length, 1e-9 * k);
  problem.advance_to(2.1e6);
  EXPECT_FALSE(problem.one_way_state("right").one_way);
  EXPECT_NEAR(problem.outflow("right"), 0.0, 1e-9 * k);
}
