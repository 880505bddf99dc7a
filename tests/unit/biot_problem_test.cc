// Behaviour of the Biot core that is not a published solution: input checks,
// reuse of the factorisation, the rigid-skeleton mode and body-force changes.
#include "settlewell/core/errors.h"
#include "settlewell/mesh/axis_grading.h"
#include "settlewell/mesh/box_mesh.h"
#include "settlewell/output/probes.h"
#include "settlewell/physics/biot_problem.h"

#include <gtest/gtest.h>

using namespace settlewell;

namespace {

Mesh column_mesh() {
  BoxSpec box;
  box.x_edges = {0.0, 1.0};
  box.y_edges = cell_edges({-6.0, 0.0, 12, 1.0});
  return make_box_mesh(box, MPI_COMM_WORLD);
}

BiotSetup column_setup() {
  BiotSetup setup;
  PoroelasticMaterial clay;
  clay.poisson_ratio = 0.3;
  clay.youngs_modulus = PoroelasticMaterial::youngs_from_mv(1e-3, 0.3);
  clay.conductivity_x = clay.conductivity_y = 1e-8;
  setup.materials["soil"] = clay;
  setup.conditions.fix("left", true, false)
      .fix("right", true, false)
      .fix("bottom", true, true);
  setup.conditions.head("top", uniform([](double) { return 0.0; }));
  return setup;
}

} // namespace

TEST(BiotProblem, UnknownBoundaryNameIsAnInputError) {
  const Mesh mesh = column_mesh();
  BiotSetup setup = column_setup();
  setup.conditions.head("rigth", uniform([](double) { return 1.0; }));
  EXPECT_THROW(BiotProblem(mesh, setup), InputError);
}

TEST(BiotProblem, RegionWithoutMaterialIsAnInputError) {
  const Mesh mesh = column_mesh();
  BiotSetup setup = column_setup();
  setup.materials.clear();
  setup.materials["clay"] = column_setup().materials.at("soil");
  try {
    BiotProblem problem(mesh, setup);
    FAIL();
  } catch (const InputError& e) {
    EXPECT_NE(std::string(e.what()).find("clay"), std::string::npos);
  }
}

TEST(BiotProblem, ConflictingConditionsAreInputErrors) {
  const Mesh mesh = column_mesh();
  BiotSetup two_hydraulic = column_setup();
  two_hydraulic.conditions.outflow("top", uniform([](double) { return 1e-6; }));
  EXPECT_THROW(BiotProblem(mesh, two_hydraulic), InputError);
  BiotSetup fixed_plate = column_setup();
  fixed_plate.conditions.rigid_plate("bottom", [](double) { return 10.0; });
  EXPECT_THROW(BiotProblem(mesh, fixed_plate), InputError);
  BiotSetup negative_radius = column_setup();
  negative_radius.analysis = AnalysisType::axisymmetric;
  BoxSpec box;
  box.x_edges = {-1.0, 1.0};
  box.y_edges = {0.0, 1.0};
  const Mesh across_axis = make_box_mesh(box, MPI_COMM_WORLD);
  EXPECT_THROW(BiotProblem(across_axis, negative_radius), InputError);
}

TEST(BiotProblem, TimeMustMoveForward) {
  const Mesh mesh = column_mesh();
  BiotProblem problem(mesh, column_setup());
  problem.advance_to(10.0);
  EXPECT_THROW(problem.advance_to(10.0), InternalError);
  EXPECT_THROW(problem.advance_to(5.0), InternalError);
}

// The matrix follows the effective step dt' (next_step_weights): three steps of
// implicit Euler first (dt' = 100), then BDF2 (dt' = 2/3 of 100), and a rung of
// steps twice as long takes its own matrix at its first step and keeps it.
TEST(BiotProblem, MatrixIsReusedWhileTheEffectiveStepIsUnchanged) {
  const Mesh mesh = column_mesh();
  BiotProblem problem(mesh, column_setup());
  EXPECT_TRUE(problem.advance_to(100.0).new_matrix);
  EXPECT_FALSE(problem.advance_to(200.0).new_matrix);
  EXPECT_FALSE(problem.advance_to(300.0).new_matrix);
  EXPECT_TRUE(problem.advance_to(400.0).new_matrix);
  EXPECT_FALSE(problem.advance_to(500.0).new_matrix);
  EXPECT_TRUE(problem.advance_to(700.0).new_matrix);
  EXPECT_FALSE(problem.advance_to(900.0).new_matrix);
}

TEST(BiotProblem, RigidSkeletonHoldsEveryDisplacementAtZero) {
  const Mesh mesh = column_mesh();
  BiotSetup setup = column_setup();
  setup.rigid_skeleton = true;
  setup.materials.at("soil").storage = 1e-5;
  setup.conditions.hydraulic.clear();
  setup.conditions.head("top", uniform(step_at_start(-2.0)));
  BiotProblem problem(mesh, setup);
  problem.advance_to(1e3);
  const PointValues mid = probe(problem, dealii::Point<2>(0.5, -3.0));
  EXPECT_EQ(mid.ux, 0.0);
  EXPECT_EQ(mid.uy, 0.0);
  const PointValues top = probe(problem, dealii::Point<2>(0.5, 0.0));
  EXPECT_NEAR(top.excess_pressure, -2.0 * 9.81, 1e-9);
}

// A change of unit weight dg in a laterally confined column of height H adds a
// vertical effective stress dg * depth once drained, so the top settles by
// mv * dg * H^2 / 2 (hand calculation, 1D oedometric strain).
TEST(BiotProblem, BodyForceChangeGivesTheOedometricSettlement) {
  const Mesh mesh = column_mesh();
  BiotSetup setup = column_setup();
  const double dg = 2.5; // kN/m^3 heavier
  setup.conditions.body_forces.push_back(
      {"soil", {{[](double) { return 0.0; }, step_at_start(-dg)}}});
  BiotProblem problem(mesh, setup);
  // After the undrained first step, long steps drain it: the excess left after a
  // step dt is about 1/(cv pi^2 dt / (4 H^2)) of the one before (1e-5 at 1e12 s).
  for (const double t : {1.0, 1e12, 1e16})
    problem.advance_to(t);
  const double settlement = -probe(problem, dealii::Point<2>(0.5, 0.0)).uy;
  EXPECT_NEAR(settlement, 1e-3 * dg * 36.0 / 2.0, 1e-9);
}
