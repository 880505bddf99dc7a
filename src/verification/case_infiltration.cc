// Transient infiltration toward a water table through a column of Gardner soil on
// a rigid skeleton: the pressure head and the water the column takes in against
// Srivastava & Yeh's (1991) closed form, the water balance of every step, and
// Newton's convergence.
//
// Source: Srivastava & Yeh (1991), the homogeneous column: Gardner's exponential k
// and theta with one exponent make Richards' equation linear in k
// (analytical/infiltration.h; the series derived again there, and checked in
// tests/unit/analytical_test.cc against a finite-difference solution).
//
// Tolerances, measured with 32 cells (0.0625 m) and geometric steps from 10 s:
// implicit Euler is first order in the step and Q1 second order in the cell, and
// the step sets the error. The largest head error was 1.8e-3, 9.7e-4 and 5.5e-4 m
// and the largest error of the water taken in 3.7e-3, 1.9e-3 and 9.2e-4 at 80,
// 160 and 320 steps per decade (64 cells at 320: 4.5e-4 m and 9.4e-4). At 160:
// heads within 3e-3 m and water within 5e-3, about three times the errors; the
// observed order of the step, 1 within 0.25, shows the error is the scheme's.
#include "settlewell/analytical/infiltration.h"
#include "settlewell/core/units.h"
#include "settlewell/mesh/box_mesh.h"
#include "settlewell/output/probes.h"
#include "settlewell/verification/case_support.h"

#include <algorithm>
#include <cmath>
#include <set>

namespace settlewell::verification {

namespace {

const char* const name = "unsaturated-infiltration";
const char* const source = "Srivastava & Yeh (1991), homogeneous Gardner column";

// An invented fine sand, 2 m above its water table, wetted at half its ks.
constexpr double height = 2.0;        // m
constexpr double conductivity = 1e-5; // ks, m/s
constexpr double alpha = 2.0;         // 1/m
constexpr double theta_s = 0.40, theta_r = 0.06;
constexpr double infiltration = 0.5e-5; // m/s

struct InfiltrationRun {
  std::map<double, std::vector<double>> heads; ///< psi at check_heights per check time
  std::map<double, double> stored;             ///< m, per check time
  double balance = 0.0;                        ///< WaterBalance::worst
  double observed_order = 0.0;
};

const std::vector<double> check_heights{0.5, 1.0, 1.5, 2.0};
const std::vector<double> check_times{1e4, 1e5, 3e5};

BiotSetup infiltration_setup() {
  BiotSetup setup;
  setup.rigid_skeleton = true;
  PoroelasticMaterial sand;
  sand.youngs_modulus = 40000.0; // unused: the skeleton is rigid
  sand.poisson_ratio = 0.25;
  sand.conductivity_x = sand.conductivity_y = conductivity;
  setup.materials["soil"] = sand;
  RetentionCurve curve;
  curve.model = RetentionCurve::Model::gardner;
  curve.saturated_content = theta_s;
  curve.residual_content = theta_r;
  curve.alpha = alpha;
  setup.unsaturated["soil"] = curve;
  setup.initial_head = [](const dealii::Point<2>&) { return 0.0; }; // at the base
  setup.conditions.head("bottom", uniform([](double) { return 0.0; }));
  setup.conditions.outflow("top", uniform(step_at_start(-infiltration)));
  show_newton_order(setup.newton);
  return setup;
}

InfiltrationRun run_column(unsigned int cells, double steps_per_decade, MPI_Comm comm) {
  BoxSpec box;
  box.x_edges = {0.0, 0.25};
  for (unsigned int i = 0; i <= cells; ++i)
    box.y_edges.push_back(height * i / cells);
  const Mesh mesh = make_box_mesh(box, comm);
  BiotProblem problem(mesh, infiltration_setup());
  std::set<double> times(check_times.begin(), check_times.end());
  // Geometric steps, none within a tenth of a step of a check time.
  const double ratio = std::pow(10.0, 1.0 / steps_per_decade);
  for (double t = 10.0; t < 3e5; t *= ratio)
    if (std::none_of(check_times.begin(), check_times.end(),
                     [&](double c) { return std::abs(t - c) < 0.1 * (ratio - 1.0) * c; }))
      times.insert(t);
  InfiltrationRun run;
  NewtonOrders orders;
  WaterBalance balance;
  double stored = 0.0;
  for (const double t : times) {
    const StepReport step = problem.advance_to(t);
    orders.add(step);
    balance.add(problem, step);
    stored += problem.storage_change().net / 0.25; // per unit area
    if (!std::count(check_times.begin(), check_times.end(), t))
      continue;
    run.stored[t] = stored;
    for (const double z : check_heights) {
      const double p = probe(problem, dealii::Point<2>(0.125, z)).excess_pressure;
      run.heads[t].push_back(-z + p / problem.setup().gamma_w);
    }
  }
  run.observed_order = orders.median();
  run.balance = balance.worst();
  return run;
}

} // namespace

std::vector<CheckRow> run_unsaturated_infiltration(const CaseSettings&, MPI_Comm comm) {
  const analytical::GardnerInfiltration exact({conductivity, alpha, theta_s, theta_r},
                                              height, infiltration, 200);
  const InfiltrationRun run = run_column(32, 160.0, comm);
  const InfiltrationRun coarse = run_column(32, 80.0, comm);
  std::vector<CheckRow> rows;
  for (const double t : check_times) {
    const std::string when = "t = " + std::to_string(int(t)) + " s";
    for (std::size_t k = 0; k < check_heights.size(); ++k) {
      const double z = check_heights[k];
      rows.push_back(scaled_row(
          name,
          "pressure head, m, at z = " + std::to_string(z).substr(0, 3) + " m, " + when,
          run.heads.at(t)[k], exact.pressure_head(z, t), 1.0, 3e-3, source));
    }
    rows.push_back(relative_row(name, "water taken in, m, " + when, run.stored.at(t),
                                exact.stored_water(t), 5e-3, source));
  }
  const double t = 1e5, reference = exact.stored_water(t);
  const double order = std::log2(std::abs(coarse.stored.at(t) - reference) /
                                 std::abs(run.stored.at(t) - reference));
  rows.push_back(relative_row(name,
                              "observed order in the step (80 to 160 per decade), water "
                              "taken in at t = 100000 s",
                              order, 1.0, 0.25,
                              "implicit Euler is first order (common practice)"));
  rows.push_back(water_balance_row(name, run.balance));
  rows.push_back(relative_row(name, "Newton's observed order near the solution (median)",
                              run.observed_order, 2.0, 0.15, newton_source));
  return rows;
}

} // namespace settlewell::verification
