// A column of silty sand whose water table is lowered 3 m from its top: the final
// settlement against the one-dimensional hand calculation in which the soil above
// the new water table drains along its retention curve, keeps only its moist
// weight and carries Bishop's effective stress with chi = S_r.
//
// Sources: the settlement S = integral of mv delta sigma'v dz (oedometer practice,
// Terzaghi 1943); Bishop's (1959) effective stress sigma' = sigma - chi p with chi
// the degree of saturation (Schrefler 1984, from memory); van Genuchten's (1980)
// retention curve; at the final, still state the pore pressure is hydrostatic
// about the new water table, p = gamma_w (h - y), above it too. The hand
// calculation integrates the closed forms by Simpson's rule on 4000 slices, and
// the weight above each slice cumulatively on the same slices (its error is below
// 1e-9 of the settlement).
//
// Tolerance 1e-7 relative, measured: 1.1e-6, 3.5e-8 and 6.4e-9 at 12, 24 and 48
// cells. The final pore pressure is linear and exact in Q1; what is left is the
// quadrature of the curved saturation profile. The check discriminates: the
// saturated model's hand value, mv gamma_w 3 m over the whole 6 m, is 1.77e-2 m
// against 1.19e-2 m here.
#include "settlewell/core/units.h"
#include "settlewell/materials/retention.h"
#include "settlewell/mesh/box_mesh.h"
#include "settlewell/output/probes.h"
#include "settlewell/verification/case_support.h"

#include <cmath>

namespace settlewell::verification {

namespace {

const char* const name = "lowered-water-table";

// An invented silty sand 6 m deep, its water table lowered from the top to 3 m.
constexpr double height = 6.0;        // m
constexpr double lowering = 3.0;      // m
constexpr double mv = 1e-4;           // 1/kPa
constexpr double poisson = 0.3;       //
constexpr double conductivity = 1e-6; // m/s

RetentionCurve silty_sand() {
  RetentionCurve c;
  c.model = RetentionCurve::Model::van_genuchten;
  c.saturated_content = 0.38;
  c.residual_content = 0.05;
  c.alpha = 1.5;
  c.n = 2.5;
  return c;
}

struct LoweredRun {
  double settlement = 0.0; ///< m
  double balance = 0.0;    ///< WaterBalance::worst
};

LoweredRun run_column(unsigned int cells, MPI_Comm comm) {
  BoxSpec box;
  box.x_edges = {0.0, 0.5};
  for (unsigned int i = 0; i <= cells; ++i)
    box.y_edges.push_back(-height + height * i / cells);
  const Mesh mesh = make_box_mesh(box, comm);
  BiotSetup setup;
  PoroelasticMaterial soil;
  soil.youngs_modulus = PoroelasticMaterial::youngs_from_mv(mv, poisson);
  soil.poisson_ratio = poisson;
  soil.conductivity_x = soil.conductivity_y = conductivity;
  setup.materials["soil"] = soil;
  setup.unsaturated["soil"] = silty_sand();
  setup.initial_head = [](const dealii::Point<2>&) { return 0.0; }; // at the top
  auto& bc = setup.conditions;
  bc.fix("left", true, false).fix("right", true, false).fix("bottom", true, true);
  bc.head("bottom", uniform(linear_ramp(-lowering, units::days(1.0))));
  BiotProblem problem(mesh, setup);
  // To a still state: the drained soil's low conductivity makes it slow (at 3e7
  // s the settlement was still 1 % above its end, at 3e8 s 1e-4).
  LoweredRun run;
  WaterBalance balance;
  for (double t = 600.0; t < 3e9; t *= std::pow(10.0, 0.1))
    balance.add(problem, problem.advance_to(t));
  run.balance = balance.worst();
  run.settlement = -probe(problem, dealii::Point<2>(0.25, 0.0)).uy;
  return run;
}

/// The settlement of the hand calculation, m.
double hand_settlement() {
  const RetentionCurve curve = silty_sand();
  const double gw = units::default_gamma_w;
  constexpr int n = 4000;
  const double dz = height / n;
  // From the top down: the weight lost above a depth, the effective stress
  // change there, Simpson's weights.
  double lost_above = 0.0, sum = 0.0, previous_loss = 0.0;
  for (int i = 0; i <= n; ++i) {
    const double y = -dz * i;
    const double p_start = -gw * y, p_end = gw * (-lowering - y);
    const auto end = curve.at(p_end / gw);
    const double loss = gw * (curve.saturated_content - end.content);
    if (i > 0)
      lost_above += 0.5 * (loss + previous_loss) * dz; // trapezoid: linear near 0
    previous_loss = loss;
    // Compression positive: delta sigma'v = delta sigma_v - delta(chi p).
    const double change = -lost_above - (end.saturation * p_end - p_start);
    sum += mv * change * (i == 0 || i == n ? 1.0 : (i % 2 == 1 ? 4.0 : 2.0));
  }
  return sum * dz / 3.0;
}

} // namespace

std::vector<CheckRow> run_lowered_water_table(const CaseSettings&, MPI_Comm comm) {
  const LoweredRun run = run_column(24, comm);
  std::vector<CheckRow> rows;
  rows.push_back(relative_row(name, "final settlement of the top, m", run.settlement,
                              hand_settlement(), 1e-7,
                              "mv integral with Bishop's stress and the moist weight "
                              "(Terzaghi 1943; Bishop 1959; van Genuchten 1980)"));
  rows.push_back(water_balance_row(name, run.balance));
  return rows;
}

} // namespace settlewell::verification
