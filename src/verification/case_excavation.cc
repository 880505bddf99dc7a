// Soil removed over the whole width of a layered elastic column: a 1D unloading.
//
// An invented column, 1 m wide: 2.4 m of fill (19.5 kN/m^3) over 6 m of clay
// (mv 0.4 /MPa, k 1e-9 m/s) over 4 m of dense sand (mv 0.025 /MPa, k 1e-4 m/s) on a
// fixed, drained base; sides on rollers; the water table at the top of the clay.
// At t = 0 the fill is dug away at once and the new formation drains at the water
// table's head. The unloading is the fill's weight, delta sigma_v = -19.5 * 2.4 =
// -46.8 kPa at every depth below.
//
// Sources: the drained heave of each layer is delta sigma_v H / M, M = 1/mv the
// constrained modulus (1D strain; the same relation as S = mv delta sigma' H of
// Terzaghi 1925); the undrained response to a change of total stress with B = 1
// (alpha = 1, S = 0) is an equal change of pore pressure (Skempton 1954); the clay
// then swells as Terzaghi's (1925) double-drained layer consolidates, with the sign
// reversed (linear elasticity: unloading is loading with the opposite sign).
//
// A second run puts a 30 kPa surcharge on the fill first, lets the column settle
// under it, and then digs the fill with its release spread over a stage: the
// surcharge leaves with the fill, so by superposition (linear elasticity) the final
// drained movement is the fill's unloading alone. This checks that the stress the
// removed cells carried at removal (not only their geostatic state) is released.
//
// A third run (the case gravity-start) starts the same column from a drained
// gravity-loading solve instead of the K0 state. Level ground with its sides on
// rollers is in 1D strain, so the solve gives sigma'_v = sigma_v - p0 (the column's
// equilibrium with Terzaghi's effective stress) and sigma'_h = nu / (1 - nu)
// sigma'_v (Hooke's law with no lateral strain: the elastic at-rest ratio, common
// practice), the K0 state with K0 = nu / (1 - nu); its displacement is not
// reported. Digging the fill then gives the same drained heave as from the K0
// state (linearity), the stress that remains balances the weight of the soil left
// above (equilibrium), and sigma'_h / sigma'_v stays nu / (1 - nu) (elastic from a
// stress-free start).
#include "settlewell/analytical/consolidation.h"
#include "settlewell/mesh/axis_grading.h"
#include "settlewell/mesh/box_mesh.h"
#include "settlewell/output/derived.h"
#include "settlewell/output/probes.h"
#include "settlewell/output/samples.h"
#include "settlewell/time/time_grid.h"
#include "settlewell/verification/case_support.h"

#include <map>

namespace settlewell::verification {

namespace {

constexpr double formation = -2.4, clay_base = -8.4, base = -12.4; // m
constexpr double fill_weight = 19.5, clay_weight = 17.5, sand_weight = 20.0;
constexpr double clay_mv = 0.4e-3, sand_mv = 2.5e-5, poisson = 0.3;
constexpr double clay_k = 1e-9, sand_k = 1e-4, k0 = 0.5;
constexpr double unloading = fill_weight * (0.0 - formation); // kPa

// Tolerances, with the reason for each:
//  - drained heave within 1e-4: after a last step of dTv = 1e4 (implicit Euler, as
//    it is 5000 times the step before) the excess left is below 1e-6 of its start,
//    and Q2 displacements are exact for the uniform strain of each layer;
//  - undrained pore pressure within 0.5 %: the first step (dTv = 1e-5) drains a
//    layer of about 0.3 % of the drainage path at the faces, far from mid-clay;
//  - degree of swelling within 1 %: 24 cells over the clay (12 per drainage path,
//    growing by 12 % from the faces) and 100 steps per decade of Tv (BDF2), as in
//    the Terzaghi cases, whose measured error is below 0.25 %.
constexpr double drained_tolerance = 1e-4;
constexpr double undrained_tolerance = 0.005;
constexpr double degree_tolerance = 0.01;

PoroelasticMaterial soil(double mv, double k) {
  return PoroelasticMaterial::isotropic(PoroelasticMaterial::youngs_from_mv(mv, poisson),
                                        poisson, k);
}

/// Total vertical stress at y before the dig, kPa (compression positive).
double overburden(double y) {
  const double fill = std::min(0.0 - y, 0.0 - formation);
  const double clay = std::clamp(formation - y, 0.0, formation - clay_base);
  const double sand = std::max(clay_base - y, 0.0);
  return fill_weight * fill + clay_weight * clay + sand_weight * sand;
}

Mesh column_mesh(MPI_Comm comm) {
  BoxSpec box;
  box.x_edges = {0.0, 1.0};
  std::vector<double> y = cell_edges({base, clay_base, 8, 1.0});
  const auto clay = symmetric_cell_edges(clay_base, formation, 24, 1.12);
  y.insert(y.end(), clay.begin() + 1, clay.end());
  const auto fill = cell_edges({formation, 0.0, 4, 1.0});
  y.insert(y.end(), fill.begin() + 1, fill.end());
  box.y_edges = y;
  box.bands = {{"sand", base, clay_base},
               {"clay", clay_base, formation},
               {"fill", formation, 0.0}};
  Mesh mesh = make_box_mesh(box, comm);
  mesh.internal_lines["formation"] = {Segment{{0.0, formation}, {1.0, formation}}};
  return mesh;
}

/// `dig_at` (s) and `release` (s): when the fill is dug and over how long its
/// forces are released; `surcharge` (kPa) on the fill from t = 0.
BiotSetup column_setup(double dig_at, double release, double surcharge) {
  BiotSetup setup;
  setup.materials = {{"fill", soil(5e-5, 1e-5)},
                     {"clay", soil(clay_mv, clay_k)},
                     {"sand", soil(sand_mv, sand_k)}};
  setup.initial_head = [](const dealii::Point<2>&) { return formation; };
  auto& bc = setup.conditions;
  bc.fix("left", true, false).fix("right", true, false).fix("bottom", true, true);
  bc.head("bottom", uniform(step_at_start(formation)));
  bc.head("formation", uniform(step_at_start(formation)));
  if (surcharge > 0.0)
    bc.normal_traction("top", uniform(step_at_start(-surcharge)));
  const double gamma_w = setup.gamma_w;
  setup.geostatic.effective_stress = [gamma_w](const dealii::Point<2>& x,
                                               dealii::types::material_id) {
    const double vertical = overburden(x[1]) - gamma_w * (formation - x[1]);
    dealii::SymmetricTensor<2, 3> s;
    s[1][1] = -vertical;
    s[0][0] = s[2][2] = -k0 * vertical;
    return s;
  };
  setup.geostatic.unit_weights = {
      {"fill", fill_weight}, {"clay", clay_weight}, {"sand", sand_weight}};
  setup.excavation.push_back(
      {dig_at, dig_at + release,
       [](const dealii::Point<2>& centre, dealii::types::material_id) {
         return centre[1] > formation;
       }});
  return setup;
}

/// The column started by gravity loading: no geostatic effective stress to begin
/// with; the drained solve at t = 0 builds it.
BiotSetup gravity_column_setup() {
  BiotSetup setup = column_setup(0.0, 0.0, 0.0);
  setup.geostatic.effective_stress = [](const dealii::Point<2>&,
                                        dealii::types::material_id) {
    return dealii::SymmetricTensor<2, 3>();
  };
  setup.gravity_loading = true;
  return setup;
}

double heave(const BiotProblem& problem, double y) {
  return probe(problem, dealii::Point<2>(0.5, y)).uy;
}

/// The formation's drained movement when a 30 kPa surcharge on the fill has
/// consolidated the column before the fill is dug, its forces released over
/// dTv = 0.1, and the column drained again. Each drained state is reached with three
/// steps of dTv = 1e4 after much shorter ones: the first is implicit Euler
/// (step_weights), which leaves (1 + pi^2/4 1e4)^-1 of the excess; each BDF2 step
/// after it divides what is left by about pi^2/2 1e4 but carries a share of the
/// state two steps back, so two leave about 2e-9 [derived here].
double surcharged_then_dug(const Mesh& mesh,
                           const std::function<double(double)>& time_of) {
  const double dig_at = time_of(3e4), release = time_of(0.1);
  BiotProblem problem(mesh, column_setup(dig_at, release, 30.0));
  for (const double Tv : {1e-3, 1e4, 2e4, 3e4})
    problem.advance_to(time_of(Tv));
  for (const double f : {0.25, 0.5, 0.75, 1.0})
    problem.advance_to(dig_at + f * release);
  for (const double Tv : {1e4, 2e4, 3e4})
    problem.advance_to(dig_at + release + time_of(Tv));
  return heave(problem, formation);
}

} // namespace

std::vector<CheckRow> run_excavation_column(const CaseSettings& settings, MPI_Comm comm) {
  const std::string name = "excavation-column";
  const Mesh mesh = column_mesh(comm);
  BiotProblem problem(mesh, column_setup(0.0, 0.0, 0.0));
  const auto& clay = problem.setup().materials.at("clay");
  const double cv = clay.consolidation_coefficient(clay_k, problem.setup().gamma_w);
  const double Hdr = (formation - clay_base) / 2;
  auto time_of = [&](double Tv) { return Tv * Hdr * Hdr / cv; };
  const double sand_heave = unloading * (clay_base - base) * sand_mv;
  const double clay_heave = unloading * (formation - clay_base) * clay_mv;

  const std::vector<double> check_Tv{0.01, 0.05, 0.197, 0.5, 1.0};
  std::vector<double> check_times;
  for (const double Tv : check_Tv)
    check_times.push_back(time_of(Tv));
  const auto times =
      merge_times(log_spaced_times(time_of(1e-5), time_of(2.0), 100.0), check_times);
  double first_excess = 0.0;
  std::map<double, double> swelling;
  auto observe = [&](const BiotProblem& p) {
    if (first_excess == 0.0)
      first_excess =
          probe(p, dealii::Point<2>(0.5, 0.5 * (formation + clay_base))).excess_pressure;
    for (std::size_t i = 0; i < check_times.size(); ++i)
      if (std::abs(p.time() - check_times[i]) < 1e-9 * check_times[i])
        swelling[check_Tv[i]] = (heave(p, formation) - sand_heave) / clay_heave;
  };
  auto writer = writer_for(settings, name, comm);
  march(problem, times, observe, writer.get(), check_times);

  std::vector<CheckRow> rows;
  rows.push_back(relative_row(name, "p/delta sigma_v at mid-clay after the first step",
                              first_excess / -unloading, 1.0, undrained_tolerance,
                              "B = 1 undrained response (Skempton 1954)"));
  for (const auto& [Tv, U] : swelling)
    rows.push_back(relative_row(name, label("clay swelling U at Tv", Tv), U,
                                analytical::terzaghi_average_degree(Tv), degree_tolerance,
                                "Terzaghi (1925) series, unloading"));
  problem.advance_to(time_of(1e4));
  rows.push_back(relative_row(name, "drained heave of the sand, m",
                              heave(problem, clay_base), sand_heave, drained_tolerance,
                              "delta sigma_v H / M per layer (1D strain)"));
  rows.push_back(relative_row(name, "drained heave of the formation, m",
                              heave(problem, formation), sand_heave + clay_heave,
                              drained_tolerance,
                              "delta sigma_v H / M per layer (1D strain)"));
  if (writer)
    writer->write(problem);
  rows.push_back(relative_row(
      name, "drained heave of the formation, fill dug under a surcharge, m",
      surcharged_then_dug(mesh, time_of), sand_heave + clay_heave, drained_tolerance,
      "superposition (linear elasticity); delta sigma_v H / M per layer"));
  return rows;
}

namespace {

/// Effective stresses on the column's axis at `ys`. From a gravity-loading start
/// the solution's strain holds all of the stress, so no initial state is added.
std::vector<SampleValues> stresses_at(const BiotProblem& problem,
                                      const std::vector<double>& ys) {
  std::vector<dealii::Point<2>> points;
  for (const double y : ys)
    points.emplace_back(0.5, y);
  const Derivation absolute(problem, InitialFields::from_setup(problem.setup()));
  return SamplePoints(problem, points, "gravity-start").evaluate(problem, absolute);
}

/// Rows for sigma'_v against `vertical(y)` and sigma'_h against nu/(1 - nu) of it.
void add_stress_rows(const std::string& name,
                     const std::string& when,
                     const std::vector<SampleValues>& values,
                     const std::vector<std::pair<std::string, double>>& places,
                     const std::function<double(double)>& vertical,
                     double tolerance,
                     std::vector<CheckRow>& rows) {
  const double ratio = poisson / (1.0 - poisson);
  for (std::size_t i = 0; i < places.size(); ++i) {
    const auto& [where, y] = places[i];
    rows.push_back(relative_row(name, "sigma'_v at " + where + " " + when + ", kPa",
                                values[i].vertical_effective_stress, vertical(y),
                                tolerance,
                                "sigma_v - p: column equilibrium, effective stress "
                                "(Terzaghi 1936, from memory)"));
    rows.push_back(relative_row(
        name, "sigma'_h at " + where + " " + when + ", kPa",
        values[i].horizontal_effective_stress, ratio * vertical(y), tolerance,
        "nu/(1 - nu) sigma'_v: Hooke's law, no lateral strain (common practice)"));
  }
}

} // namespace

std::vector<CheckRow> run_gravity_start(const CaseSettings& settings, MPI_Comm comm) {
  const std::string name = "gravity-start";
  const Mesh mesh = column_mesh(comm);
  BiotProblem problem(mesh, gravity_column_setup());
  const double gamma_w = problem.setup().gamma_w;
  const auto& clay = problem.setup().materials.at("clay");
  const double cv = clay.consolidation_coefficient(clay_k, gamma_w);
  const double Hdr = (formation - clay_base) / 2;
  auto time_of = [&](double Tv) { return Tv * Hdr * Hdr / cv; };
  // Tolerances: the start's stresses are linear in y in each layer, which Q2
  // displacements and 3-point Gauss rules represent exactly, so only round-off
  // remains (1e-8 of the value); the drained states after digging are reached as in
  // excavation-column (drained_tolerance, 1e-4).
  constexpr double exact_tolerance = 1e-8;
  std::vector<CheckRow> rows;

  problem.settle_under_gravity();
  const double mid_clay = 0.5 * (formation + clay_base),
               mid_sand = 0.5 * (clay_base + base);
  const std::vector<std::pair<std::string, double>> before{
      {"mid-fill", 0.5 * formation}, {"mid-clay", mid_clay}, {"mid-sand", mid_sand}};
  std::vector<double> ys;
  for (const auto& place : before)
    ys.push_back(place.second);
  add_stress_rows(
      name, "after gravity loading", stresses_at(problem, ys), before,
      [&](double y) { return overburden(y) - gamma_w * (formation - y); },
      exact_tolerance, rows);
  // The solve itself moves the surface (its settlement under the weight of the
  // column); none of it is reported.
  rows.push_back(scaled_row(name,
                            "reported settlement at the surface after gravity "
                            "loading (scale 1 mm), m",
                            -probe(problem, dealii::Point<2>(0.5, 0.0)).uy, 0.0, 1e-3,
                            exact_tolerance,
                            "the start of the analysis is the reference (definition)"));

  for (const double Tv : {1e4, 2e4, 3e4}) // dug at once in the first step, then drained
    problem.advance_to(time_of(Tv));
  const double sand_heave = unloading * (clay_base - base) * sand_mv;
  const double clay_heave = unloading * (formation - clay_base) * clay_mv;
  rows.push_back(relative_row(name, "drained heave of the formation, m",
                              heave(problem, formation), sand_heave + clay_heave,
                              drained_tolerance,
                              "delta sigma_v H / M per layer (1D strain)"));
  const std::vector<std::pair<std::string, double>> after{{"mid-clay", mid_clay},
                                                          {"mid-sand", mid_sand}};
  add_stress_rows(
      name, "after the dig, drained", stresses_at(problem, {mid_clay, mid_sand}), after,
      [&](double y) { return overburden(y) - unloading - gamma_w * (formation - y); },
      drained_tolerance, rows);
  if (auto writer = writer_for(settings, name, comm))
    writer->write(problem);
  return rows;
}

} // namespace settlewell::verification
