// The dug surface drains to the pit, one way: steady seepage through a dug column.
//
// An invented column, 1 m wide: 2 m of fill over 6 m of sand (k = 1e-5 m/s) on a
// base whose head is held; the water table at the top of the sand (-2 m). At t = 0
// the fill is dug away, the pit's water stands at the new floor (-2 m), and the
// base head changes. Source: Darcy (1856), q = k (h_base - h_floor) / L in steady
// 1D flow.
//  - Base head raised to +1 m: water flows up and leaves through the floor, which
//    holds the pit's pressure: q = 1e-5 * 3 / 6 = 5e-6 m^3/s per m^2.
//  - Base head lowered to -5 m: the sand drains downward; the floor may not take
//    water from the pit, so it seals: no flow through it, and at steady state the
//    whole sand stands at the base's head (its pore pressure falls below the pit's
//    at the floor, where a fixed-head floor would have fed the sand with
//    5e-6 m^3/s per m^2 instead).
//  - Raised first, until the upward flow is steady, then lowered: the floor that
//    drained must stop draining, and the same sealed state follows.
#include "settlewell/core/units.h"
#include "settlewell/mesh/axis_grading.h"
#include "settlewell/mesh/box_mesh.h"
#include "settlewell/output/probes.h"
#include "settlewell/verification/case_support.h"

namespace settlewell::verification {

namespace {

constexpr double floor_level = -2.0, base = -8.0, sand_k = 1e-5;

// Tolerance 1e-6: Q1 pressures are exact for the linear head of steady 1D flow;
// four steps of 1e3 times the sand's consolidation time leave a few 1e-9 of the
// transient (the first is implicit Euler after a step 1000 times shorter; each BDF2
// step after it divides what is left by about 2 pi^2/4 1e3 but carries a share of
// the state two steps back [derived here]), and the discharge is the consistent
// flux at the floor's dofs.
constexpr double steady_tolerance = 1e-6;

Mesh column_mesh(MPI_Comm comm) {
  BoxSpec box;
  box.x_edges = {0.0, 1.0};
  std::vector<double> y = cell_edges({base, floor_level, 12, 1.0});
  const auto fill = cell_edges({floor_level, 0.0, 4, 1.0});
  y.insert(y.end(), fill.begin() + 1, fill.end());
  box.y_edges = y;
  box.bands = {{"sand", base, floor_level}, {"fill", floor_level, 0.0}};
  return make_box_mesh(box, comm);
}

/// The base head against time, m.
BiotSetup column_setup(const TimeFunction& base_head) {
  BiotSetup setup;
  PoroelasticMaterial sand;
  sand.poisson_ratio = 0.3;
  sand.youngs_modulus = 50000.0;
  sand.conductivity_x = sand.conductivity_y = sand_k;
  setup.materials = {{"sand", sand}, {"fill", sand}};
  setup.initial_head = [](const dealii::Point<2>&) { return floor_level; };
  auto& bc = setup.conditions;
  bc.fix("left", true, false).fix("right", true, false).fix("bottom", true, true);
  bc.head("bottom", uniform(base_head));
  const double gamma_w = setup.gamma_w;
  setup.geostatic.effective_stress = [gamma_w](const dealii::Point<2>& x,
                                               dealii::types::material_id) {
    const double vertical = 19.0 * (0.0 - x[1]) - gamma_w * (floor_level - x[1]);
    dealii::SymmetricTensor<2, 3> s;
    s[1][1] = -vertical;
    s[0][0] = s[2][2] = -0.5 * vertical;
    return s;
  };
  setup.geostatic.unit_weights = {{"sand", 19.0}, {"fill", 19.0}};
  setup.excavation.push_back(
      {0.0, 0.0, [](const dealii::Point<2>& centre, dealii::types::material_id) {
         return centre[1] > floor_level;
       }});
  setup.pit_water_head = [](double) { return floor_level; };
  return setup;
}

struct Steady {
  double floor_outflow; ///< m^3/s per m run (the column is 1 m wide)
  double head_mid;      ///< m, mid-sand
};

/// The sand's consolidation time L^2 / cv, s.
double consolidation_time() {
  const auto& sand = column_setup(step_at_start(0.0)).materials.at("sand");
  const double cv = sand.consolidation_coefficient(sand_k, units::default_gamma_w);
  return (floor_level - base) * (floor_level - base) / cv;
}

/// Runs to a steady state under `base_head(t)`, through the times `t` (s).
Steady run_to_steady(const TimeFunction& base_head,
                     const std::vector<double>& times,
                     MPI_Comm comm) {
  const Mesh mesh = column_mesh(comm);
  BiotProblem problem(mesh, column_setup(base_head));
  for (const double t : times)
    problem.advance_to(t);
  const double y_mid = 0.5 * (floor_level + base);
  const double p = probe(problem, dealii::Point<2>(0.5, y_mid)).excess_pressure;
  return {problem.drained_surface_outflow(), floor_level + p / problem.setup().gamma_w};
}

} // namespace

std::vector<CheckRow> run_drained_formation(const CaseSettings&, MPI_Comm comm) {
  const std::string name = "drained-formation";
  const double L = floor_level - base;
  const double darcy = sand_k * (1.0 - floor_level) / L; // m^3/s per m^2, upward
  const double t_c = consolidation_time();
  std::vector<double> times;
  for (const double f : {1e-3, 1e-2, 1e-1, 1.0, 1e3, 2e3, 3e3, 4e3})
    times.push_back(f * t_c);
  const Steady up = run_to_steady(step_at_start(1.0), times, comm);
  const Steady down = run_to_steady(step_at_start(-5.0), times, comm);
  // Up until 4e3 t_c, then down: the same times again after the switch.
  const double t_switch = times.back();
  std::vector<double> both = times;
  for (const double t : times)
    both.push_back(t_switch + t);
  const Steady switched = run_to_steady(
      [t_switch](double t) { return t <= t_switch ? 1.0 : -5.0; }, both, comm);
  return {
      relative_row(name, "upward seepage: floor discharge, m3/s per m", up.floor_outflow,
                   darcy, steady_tolerance, "Darcy (1856), q = k dh / L"),
      relative_row(name, "upward seepage: head at mid-sand, m", up.head_mid,
                   0.5 * (1.0 + floor_level), steady_tolerance,
                   "Darcy (1856), linear head in steady 1D flow"),
      scaled_row(name,
                 "downward drainage: floor discharge, m3/s per m (error rel. to k dh/L)",
                 down.floor_outflow, 0.0, darcy, steady_tolerance,
                 "a pit floor takes no water from the pit (one-way drain)"),
      relative_row(name, "downward drainage: head at mid-sand, m", down.head_mid, -5.0,
                   steady_tolerance, "no flow through the sealed floor: the base's head"),
      scaled_row(name,
                 "upward, then downward: floor discharge, m3/s per m (error rel. to k "
                 "dh/L)",
                 switched.floor_outflow, 0.0, darcy, steady_tolerance,
                 "a pit floor takes no water from the pit (one-way drain)"),
      relative_row(name, "upward, then downward: head at mid-sand, m", switched.head_mid,
                   -5.0, steady_tolerance,
                   "no flow through the sealed floor: the base's head"),
  };
}

} // namespace settlewell::verification
