// A Cam Clay column whose heads fall 3 m at both drained faces: the final
// settlement against the one-dimensional e-log closed form, once with the clay
// lightly loaded far below its preconsolidation pressure (recompression, Cr) and
// once normally consolidated (compression, Cc); and Newton's convergence.
//
// Sources: Terzaghi's effective stress, delta sigma' = gamma_w delta h; the e-log
// settlement S = H/(1 + e0) C log10(sigma'f/sigma'0) (oedometer practice; Terzaghi
// & Peck 1948), integrated over the depth by Simpson's rule on 2000 slices;
// Modified Cam Clay (Roscoe & Burland 1968). Cam Clay's normal compression line
// is straight in v-ln p', and on one-dimensional strain its stress ratio keeps the
// value eta_K0 its flow rule gives (one_dimensional_stress_ratio, derived from the
// model's laws; Wood 1990 ch. 6 gives the approach). Started on that line, the column's
// compression follows Cc exactly; started with K0 = nu/(1 - nu) inside the yield surface,
// its elastic recompression keeps the stress ratio and follows Cr exactly. Any difference
// is the discretisation's.
//
// Tolerances, measured with 12 cells and a ramp over a day:
//  - recompression 3e-3: the error halved with each halving of the step (6.0e-3,
//    3.0e-3, 1.5e-3 at 10, 20 and 40 steps per decade): first order, from the shear
//    modulus taken at each increment's start; 40 steps per decade are used.
//  - normal compression 1e-4: 1.4e-3, 5e-5 and 2.8e-6 at the same steps; the
//    plastic strain, integrated exactly, dominates.
//  - Newton's order 2 within 0.15 (relative), run with a Newton tolerance of 1e-11
//    and exact corrections (GMRES to 1e-13): the median over triples of successive
//    residuals below 1e-2 of the largest step's; the first of them is often still
//    outside the asymptotic range.
#include "settlewell/core/units.h"
#include "settlewell/materials/cam_clay.h"
#include "settlewell/mesh/box_mesh.h"
#include "settlewell/output/probes.h"
#include "settlewell/verification/case_support.h"

#include <algorithm>
#include <cmath>

namespace settlewell::verification {

namespace {

const char* const name = "cam-clay-column";
const char* const elog = "e-log line, Terzaghi & Peck (1948)";

// An invented soft clay under 20 kPa of fill, water table at its top.
constexpr double height = 6.0;        // m
constexpr double fill = 20.0;         // kPa
constexpr double unit_weight = 17.0;  // kN/m3
constexpr double head_drop = 3.0;     // m
constexpr double conductivity = 2e-9; // m/s
constexpr double ramp_days = 1.0;
constexpr double steps_per_decade = 40.0;
constexpr double cc = 0.42, cr = 0.06, e0 = 1.15, phi = 26.0, nu = 0.3;

double vertical_start(double y) {
  return fill + (unit_weight - units::default_gamma_w) * (-y);
}

struct ColumnRun {
  double settlement = 0.0;
  unsigned int yielding = 0;
  double observed_order = 0.0; ///< Newton's, the median near the solution
};

/// k0: the start's ratio sigma'h/sigma'v; pop: preconsolidation over the start
/// (kPa), reached one-dimensionally with the ratio k0_past.
ColumnRun run_column(double k0, double pop, double k0_past, MPI_Comm comm) {
  BoxSpec box;
  box.x_edges = {0.0, 1.0};
  for (int i = 0; i <= 12; ++i)
    box.y_edges.push_back(-height + height * i / 12.0);
  const Mesh mesh = make_box_mesh(box, comm);
  BiotSetup setup;
  const auto m = CamClayParameters::from_indices(cc, cr, e0, phi, nu);
  set_clay_column(setup,
                  {m, [pop](double vertical, double) { return vertical + pop; }, k0_past},
                  conductivity, unit_weight, vertical_start, k0);
  auto& bc = setup.conditions;
  bc.fix("left", true, false).fix("right", true, false).fix("bottom", true, true);
  // The heads fall over a day (a ramp): each step's stress increment stays small
  // where the faces drain at once.
  bc.head("top", uniform(linear_ramp(-head_drop, units::days(ramp_days))));
  bc.head("bottom", uniform(linear_ramp(-head_drop, units::days(ramp_days))));
  show_newton_order(setup.newton);
  BiotProblem problem(mesh, setup);
  // From a thousandth of a day to 3e4 days (Tv above 5 for the softest state).
  std::vector<double> times;
  for (double t = 1e-3; t < 3.1e4; t *= std::pow(10.0, 1.0 / steps_per_decade))
    times.push_back(units::days(t));
  ColumnRun run;
  NewtonOrders orders;
  for (const double t : times) {
    const StepReport step = problem.advance_to(t);
    run.yielding = std::max(run.yielding, step.yielding_points);
    orders.add(step);
  }
  run.observed_order = orders.median();
  run.settlement = -probe(problem, dealii::Point<2>(0.5, 0.0)).uy;
  return run;
}

/// The e-log settlement of the column for index c, Simpson's rule over depth.
double elog_settlement(double c) {
  constexpr int n = 2000;
  double sum = 0.0;
  for (int i = 0; i <= n; ++i) {
    const double y = -height * i / n;
    const double s0 = vertical_start(y);
    const double f =
        c / (1.0 + e0) * std::log10((s0 + units::default_gamma_w * head_drop) / s0);
    sum += f * (i == 0 || i == n ? 1.0 : (i % 2 == 1 ? 4.0 : 2.0));
  }
  return sum * height / n / 3.0;
}

} // namespace

std::vector<CheckRow> run_cam_clay_column(const CaseSettings&, MPI_Comm comm) {
  const auto m = CamClayParameters::from_indices(cc, cr, e0, phi, nu);
  const double eta = one_dimensional_stress_ratio(m);
  const double k0_nc = (3.0 - eta) / (3.0 + 2.0 * eta);
  std::vector<CheckRow> rows;
  const double jaky = 1.0 - std::sin(phi * units::pi / 180.0); // Jaky (1944)
  const ColumnRun light = run_column(nu / (1.0 - nu), 60.0, jaky, comm);
  rows.push_back(relative_row(name, "recompression (POP 60 kPa): final settlement, m",
                              light.settlement, elog_settlement(cr), 3e-3, elog));
  rows.push_back(scaled_row(name, "recompression: points that yielded", light.yielding,
                            0.0, 1.0, 0.5, "by construction: POP keeps it elastic"));
  const ColumnRun soft = run_column(k0_nc, 0.0, k0_nc, comm);
  rows.push_back(relative_row(name, "normally consolidated: final settlement, m",
                              soft.settlement, elog_settlement(cc), 1e-4, elog));
  rows.push_back(relative_row(name, "Newton's observed order near the solution (median)",
                              soft.observed_order, 2.0, 0.15, newton_source));

  return rows;
}

} // namespace settlewell::verification
