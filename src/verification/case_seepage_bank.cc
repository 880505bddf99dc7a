// Steady flow through a bank of Gardner sand between a pond and a ditch (rigid
// skeleton), its downstream face a seepage face above the ditch's water: the
// discharge against Dupuit's value and the capillary allowance, the discharge
// against the Kirchhoff integral of the computed face, and the face's two
// one-way conditions (no water enters where it is held, no pressure above
// atmospheric where it is sealed).
//
// Sources. Dupuit's discharge q = k (h1^2 - h2^2) / (2 L) is exact for the
// discharge of a saturated bank with a seepage face (Charny 1951). With a
// retention curve the soil above the phreatic line carries water too; with
// Gardner's k_r = exp(a psi) and the Kirchhoff potential Phi(psi) = exp(a psi)/a
// below zero, 1/a + psi above, Darcy's law gives the horizontal flux -k dPhi/dx,
// and with no flow through the base and the top, for a bank of height H = h1,
//   q L = k [ integral of Phi over the pond face - integral over the ditch face ]
// (derived here, as Charny's proof is; the Kirchhoff transform is common
// practice). The pond face gives h1/a + h1^2/2. On the ditch face Phi = 1/a + psi
// below the ditch's water, 1/a on the seepage face and between 0 and 1/a above
// it, so
//   k (h1^2 - h2^2) / (2 L) <= q <= k (h1^2 - h2^2) / (2 L) + k (h1 - h2) / (a L).
//
// Measured at the steady state (day 46) on 20 x 10, 40 x 20 and 80 x 40 cells:
// q = 1.27756e-4, 1.27730e-4 and 1.27759e-4 m^2/s, 0.776, 0.773 and 0.776 of the
// way from Dupuit's value (1.2e-4) to the bound (1.3e-4); q against the Kirchhoff
// integrals 2.1e-5, 3.4e-6 and 1.2e-6 relative. Run on 40 x 20: the Kirchhoff row's
// tolerance, 1e-5, is about three times its error. The face's rows are exact
// conditions of the active set: water entering a held point is zero (it was 40 %
// of the outflow when Newton's matrix kept the constraint rows of released
// points), and the pressure is at most atmospheric to round-off.
#include "settlewell/core/units.h"
#include "settlewell/mesh/box_mesh.h"
#include "settlewell/output/probes.h"
#include "settlewell/verification/case_support.h"

#include <algorithm>
#include <cmath>

namespace settlewell::verification {

namespace {

const char* const name = "seepage-face-bank";

// An invented sand bank 10 m wide, the pond 5 m deep, the ditch 1 m.
constexpr double width = 10.0, pond = 5.0, ditch = 1.0; // m
constexpr double conductivity = 1e-4;                   // m/s
constexpr double gardner_a = 4.0;                       // 1/m

struct BankRun {
  double discharge = 0.0;     ///< m^2/s entering from the pond
  double face_integral = 0.0; ///< integral of Phi over the ditch face, m^2
  double held_inflow = 0.0;   ///< largest StepReport::held_inflow_share
  double face_pressure = 0.0; ///< largest pore pressure on the face above the ditch, kPa
  double balance = 0.0;       ///< WaterBalance::worst
};

BiotSetup bank_setup() {
  BiotSetup setup;
  setup.rigid_skeleton = true;
  PoroelasticMaterial sand;
  sand.youngs_modulus = 40000.0; // unused: the skeleton is rigid
  sand.poisson_ratio = 0.25;
  sand.conductivity_x = sand.conductivity_y = conductivity;
  sand.storage = 2e-7; // 1/kPa, the saturated sand's own compressibility
  setup.materials["soil"] = sand;
  RetentionCurve curve;
  curve.model = RetentionCurve::Model::gardner;
  curve.saturated_content = 0.35;
  curve.residual_content = 0.05;
  curve.alpha = gardner_a;
  setup.unsaturated["soil"] = curve;
  setup.initial_head = [](const dealii::Point<2>&) { return pond; }; // full to the top
  setup.conditions.head("left", uniform([](double) { return pond; }));
  // The ditch drawn down from the pond's level over a day.
  HydraulicCondition face;
  face.boundary = "right";
  face.value = uniform([](double t) {
    return pond - (pond - ditch) * std::min(1.0, t / units::days(1.0));
  });
  face.exchange = HydraulicCondition::Exchange::seepage_face;
  setup.conditions.hydraulic.push_back(face);
  return setup;
}

/// Phi(psi) of Gardner's curve, m.
double kirchhoff(double psi) {
  return psi < 0.0 ? std::exp(gardner_a * psi) / gardner_a : 1.0 / gardner_a + psi;
}

void read_face(const BiotProblem& problem, BankRun& run) {
  // Simpson's rule on 400 slices of the ditch face; psi is linear on each Q1 edge.
  constexpr int n = 400;
  const double gw = problem.setup().gamma_w, dz = pond / n;
  double sum = 0.0;
  for (int i = 0; i <= n; ++i) {
    const double z = dz * i;
    const double p =
        probe(problem, dealii::Point<2>(width, z)).excess_pressure + gw * (pond - z);
    if (z > ditch)
      run.face_pressure = std::max(run.face_pressure, p);
    sum += kirchhoff(p / gw) * (i == 0 || i == n ? 1.0 : (i % 2 == 1 ? 4.0 : 2.0));
  }
  run.face_integral = sum * dz / 3.0;
}

BankRun run_bank(unsigned int cells_x, MPI_Comm comm) {
  BoxSpec box;
  for (unsigned int i = 0; i <= cells_x; ++i)
    box.x_edges.push_back(width * i / cells_x);
  for (unsigned int i = 0; i <= cells_x / 2; ++i)
    box.y_edges.push_back(pond * i / (cells_x / 2));
  const Mesh mesh = make_box_mesh(box, comm);
  BiotProblem problem(mesh, bank_setup());
  // Geometric steps to day 46, about 60 times the bank's drainage time
  // L^2 (theta_s - theta_r) / (k h1), 0.7 days; the end of the ditch's fall hit.
  std::vector<double> times{units::days(1.0)};
  for (double t = 100.0; t < 4e6; t *= std::pow(10.0, 0.05))
    if (std::abs(t - units::days(1.0)) > 0.05 * t)
      times.push_back(t);
  std::sort(times.begin(), times.end());
  BankRun run;
  WaterBalance balance;
  for (const double t : times) {
    const StepReport step = problem.advance_to(t);
    balance.add(problem, step);
    run.held_inflow = std::max(run.held_inflow, step.held_inflow_share);
  }
  run.balance = balance.worst();
  run.discharge = -problem.outflow("left");
  read_face(problem, run);
  return run;
}

} // namespace

std::vector<CheckRow> run_seepage_face_bank(const CaseSettings&, MPI_Comm comm) {
  const BankRun run = run_bank(40, comm);
  const double k = conductivity, a = gardner_a;
  const double dupuit = k * (pond * pond - ditch * ditch) / (2.0 * width);
  const double allowance = k * (pond - ditch) / (a * width);
  const double kirchhoff_q =
      k / width * (pond / a + 0.5 * pond * pond - run.face_integral);
  std::vector<CheckRow> rows;
  rows.push_back(scaled_row(
      name,
      "steady discharge above Dupuit's, over the capillary allowance k (h1 - h2) / "
      "(a L): lies in [0, 1]",
      (run.discharge - dupuit) / allowance, 0.5, 1.0, 0.5,
      "Dupuit's discharge, exact with a seepage face (Charny 1951); the allowance "
      "from the Kirchhoff integral of Gardner's curve, derived in the source"));
  rows.push_back(relative_row(
      name, "steady discharge, m^2/s, against k/L times the Kirchhoff integrals",
      run.discharge, kirchhoff_q, 1e-5,
      "Darcy's law integrated over the bank's height (Kirchhoff transform, common "
      "practice)"));
  rows.push_back(
      scaled_row(name,
                 "water entering held points of the seepage face, over the "
                 "water leaving, worst step",
                 run.held_inflow, 0.0, 1.0, 1e-6,
                 "a seepage face takes no water in (Neuman 1973, from memory)"));
  rows.push_back(scaled_row(name,
                            "largest pore pressure on the face above the ditch, kPa",
                            run.face_pressure, 0.0, 1.0, 1e-6,
                            "a seepage face holds at most atmospheric pressure "
                            "(Neuman 1973, from memory)"));
  rows.push_back(water_balance_row(name, run.balance));
  return rows;
}

} // namespace settlewell::verification
