// Newton steps with a Cam Clay skeleton: a step that fails is taken again in
// halves, and when the halvings run out the state stays at the last accepted step.
#include "settlewell/core/errors.h"
#include "settlewell/core/units.h"
#include "settlewell/materials/cam_clay.h"
#include "settlewell/mesh/box_mesh.h"
#include "settlewell/output/probes.h"
#include "settlewell/physics/biot_problem.h"

#include <gtest/gtest.h>

using namespace settlewell;

namespace {

// An invented soft clay column, normally consolidated under 20 kPa of fill,
// whose heads fall 4 m over 10 days at both faces.
constexpr double fill = 20.0, unit_weight = 17.0; // kPa, kN/m3

Mesh column_mesh() {
  BoxSpec box;
  box.x_edges = {0.0, 1.0};
  for (int i = 0; i <= 8; ++i)
    box.y_edges.push_back(-6.0 + 0.75 * i);
  return make_box_mesh(box, MPI_COMM_WORLD);
}

BiotSetup clay_column(unsigned int max_iterations, unsigned int max_halvings) {
  BiotSetup setup;
  PoroelasticMaterial flow;
  flow.youngs_modulus = 5000.0; // the preconditioner's stiffness only
  flow.poisson_ratio = 0.3;
  flow.conductivity_x = flow.conductivity_y = 1e-8;
  setup.materials["soil"] = flow;
  const auto m = CamClayParameters::from_indices(0.45, 0.07, 1.2, 25.0, 0.3);
  const double k0 = 1.0 - std::sin(25.0 * units::pi / 180.0);
  setup.clays["soil"] = {m, [](double vertical, double) { return vertical; }, k0};
  setup.geostatic.unit_weights["soil"] = unit_weight;
  setup.geostatic.effective_stress = [k0](const dealii::Point<2>& x, auto) {
    dealii::SymmetricTensor<2, 3> s;
    s[1][1] = -(fill + (unit_weight - units::default_gamma_w) * (-x[1]));
    s[0][0] = s[2][2] = k0 * s[1][1];
    return s;
  };
  auto& bc = setup.conditions;
  bc.fix("left", true, false).fix("right", true, false).fix("bottom", true, true);
  bc.head("top", uniform(linear_ramp(-4.0, units::days(10.0))));
  bc.head("bottom", uniform(linear_ramp(-4.0, units::days(10.0))));
  setup.newton.max_iterations = max_iterations;
  setup.newton.max_halvings = max_halvings;
  return setup;
}

double settlement(const BiotProblem& problem) {
  return -probe(problem, dealii::Point<2>(0.5, 0.0)).uy;
}

} // namespace

// Five iterations are too few for the whole 10-day step and enough for its halves
// (measured; six would take the whole step).
TEST(NewtonStep, TakesAFailedStepAgainInHalves) {
  const Mesh mesh = column_mesh();
  BiotProblem halved(mesh, clay_column(5, 5));
  const StepReport step = halved.advance_to(units::days(10.0));
  EXPECT_EQ(step.sub_steps, 2u);
  EXPECT_DOUBLE_EQ(halved.time(), units::days(10.0));
  EXPECT_DOUBLE_EQ(step.dt, units::days(10.0));
  EXPECT_LE(step.newton_residuals.back(), 1e-8);
  EXPECT_GT(step.yielding_points, 0u);
  // The same two halves asked for by the caller, with room to converge: the
  // same answer, so nothing of the failed attempt was left behind.
  BiotProblem asked(mesh, clay_column(25, 0));
  asked.advance_to(units::days(5.0));
  asked.advance_to(units::days(10.0));
  EXPECT_GT(settlement(halved), 0.05);
  EXPECT_NEAR(settlement(halved), settlement(asked), 1e-6 * settlement(asked));
}

TEST(NewtonStep, KeepsTheLastAcceptedStateWhenTheHalvingsRunOut) {
  const Mesh mesh = column_mesh();
  BiotProblem problem(mesh, clay_column(1, 2));
  const double before = settlement(problem);
  try {
    problem.advance_to(units::days(10.0));
    FAIL() << "a Newton step limited to one iteration converged";
  } catch (const SolverError& e) {
    const std::string message = e.what();
    EXPECT_NE(message.find("halved 2 times"), std::string::npos) << message;
    EXPECT_NE(message.find("last accepted step, day 0"), std::string::npos) << message;
  }
  EXPECT_EQ(problem.time(), 0.0);
  EXPECT_EQ(settlement(problem), before);
}
