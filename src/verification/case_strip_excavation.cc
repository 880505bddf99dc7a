// A long, shallow strip excavation in level ground: an unloading of the surface.
//
// An invented site: saturated soil (20 kN/m^3, E 20 MPa, nu 0.3, k 1e-7 m/s), the
// water table at the ground surface, at rest with the elastic K0 = nu / (1 - nu).
// At t = 0 a strip 10 m wide (b = 5 m each side of the centre line; half of it is
// modelled) is dug D = 0.05 m deep, and its floor drains at the water table's head.
// The dug soil carried q = 20 * 0.05 = 1 kPa of total stress on the floor, so the
// ground below is unloaded by a uniform strip load -q. (Linear elasticity: the
// size of q does not matter; a shallow dig keeps the trench close to a surface
// load.) The model is 400 b deep and wide, on a rigid base, to stand for the
// half-space.
//
// Sources: the stresses under a uniform strip load q on an elastic half-space
// (plane strain; independent of the elastic constants), with alpha the angle the
// strip subtends at the point and delta the angle from the vertical to the line to
// its nearer edge (Poulos & Davis 1974, strip loading [from memory]):
//   sigma_z = q/pi [alpha + sin(alpha) cos(alpha + 2 delta)]
//   sigma_x = q/pi [alpha - sin(alpha) cos(alpha + 2 delta)]
//   tau_xz  = q/pi  sin(alpha) sin(alpha + 2 delta),
// reached by the effective stresses once the soil has drained. Undrained (the
// first, short step), the total stresses are the same and the soil keeps its
// volume: with B = 1 (Skempton 1954) and plane strain, the excess pore pressure is
// the in-plane mean total stress change, (sigma_x + sigma_z)/2 = q alpha / pi,
// negative here [derived in docs/verification-references.md, section 10].
#include "settlewell/core/units.h"
#include "settlewell/mesh/axis_grading.h"
#include "settlewell/mesh/box_mesh.h"
#include "settlewell/output/derived.h"
#include "settlewell/output/probes.h"
#include "settlewell/output/samples.h"
#include "settlewell/verification/case_support.h"

#include <cmath>

namespace settlewell::verification {

namespace {

constexpr double half_width = 5.0, dig_depth = 0.05;    // b and D = b/100, m
constexpr double extent = 400 * half_width;             // model depth and width, m
constexpr double unit_weight = 20.0, poisson = 0.3;     // kN/m^3, -
constexpr double youngs = 20000.0, conductivity = 1e-7; // kPa, m/s
constexpr double unloading = unit_weight * dig_depth;   // q, kPa
constexpr double pi = units::pi;
const char* const strip_source = "strip load on an elastic half-space (Poulos & Davis "
                                 "1974) [from memory]";

// Tolerance: 1 % of q on every row. The model stands for the half-space with a
// layer of finite depth on a rigid base and a trench of finite depth; both move
// the horizontal stress most (measured, largest error over the rows, relative to
// q): 4.7 % with a model 20 b deep and D = b/25, 1.9 % at 100 b, 1.3 % at 400 b,
// and 0.44 % at 400 b with D = b/100 (here); the vertical and shear stresses and
// the pore pressure stay within 0.3 % of q. The first step (cv t / b^2 = 1e-5)
// drains a layer of about 1 % of b below the floor, far from the points checked.
constexpr double tolerance = 0.01;

Mesh strip_mesh(MPI_Comm comm) {
  BoxSpec box;
  // Cells shrink toward the strip's edge (x = b, y = -D), where the stress is
  // singular, and toward the ground surface.
  std::vector<double> x = cell_edges({0.0, half_width, 24, 1.0 / 1.08});
  const auto beyond = cell_edges({half_width, extent, 60, 1.12});
  x.insert(x.end(), beyond.begin() + 1, beyond.end());
  box.x_edges = x;
  std::vector<double> y = cell_edges({-extent, -dig_depth, 70, 1.0 / 1.1});
  y.push_back(0.0);
  box.y_edges = y;
  box.parts.push_back({"top", "ground_surface",
                       [](const dealii::Point<2>& c) { return c[0] > half_width; }});
  Mesh mesh = make_box_mesh(box, comm);
  mesh.internal_lines["floor"] = {Segment{{0.0, -dig_depth}, {half_width, -dig_depth}}};
  return mesh;
}

BiotSetup strip_setup() {
  BiotSetup setup;
  setup.materials["soil"] = PoroelasticMaterial::isotropic(youngs, poisson, conductivity);
  setup.initial_head = [](const dealii::Point<2>&) { return 0.0; };
  auto& bc = setup.conditions;
  bc.fix("left", true, false).fix("right", true, false).fix("bottom", true, true);
  bc.head("ground_surface", uniform(step_at_start(0.0)));
  bc.head("floor", uniform(step_at_start(0.0)));
  const double gamma_w = setup.gamma_w, k0 = poisson / (1 - poisson);
  setup.geostatic.effective_stress = [gamma_w, k0](const dealii::Point<2>& x,
                                                   dealii::types::material_id) {
    const double vertical = (unit_weight - gamma_w) * -x[1];
    dealii::SymmetricTensor<2, 3> s;
    s[1][1] = -vertical;
    s[0][0] = s[2][2] = -k0 * vertical;
    return s;
  };
  setup.geostatic.unit_weights = {{"soil", unit_weight}};
  setup.excavation.push_back(
      {0.0, 0.0, [](const dealii::Point<2>& centre, dealii::types::material_id) {
         return centre[0] < half_width && centre[1] > -dig_depth;
       }});
  return setup;
}

/// A point `depth` below the floor, `offset` from the centre line.
struct Place {
  double offset, depth;
  std::string name;
};

/// The half-space's stress change under the strip (compression positive, so
/// negative for the unloading), with x measured from the centre line.
struct StripStress {
  double vertical, horizontal, shear, undrained_pressure;
};

StripStress strip_unloading(const Place& p) {
  // Angles from the vertical to the lines to the two edges, positive toward +x.
  const double to_far = std::atan2(-half_width - p.offset, p.depth);
  const double to_near = std::atan2(half_width - p.offset, p.depth);
  const double alpha = to_near - to_far;
  const double delta = -to_near; // from the vertical to the nearer edge's line
  const double q = -unloading;
  const double c = std::cos(alpha + 2 * delta), s = std::sin(alpha + 2 * delta);
  return {q / pi * (alpha + std::sin(alpha) * c), q / pi * (alpha - std::sin(alpha) * c),
          q / pi * std::sin(alpha) * s, q * alpha / pi};
}

} // namespace

std::vector<CheckRow> run_strip_excavation(const CaseSettings& settings, MPI_Comm comm) {
  const std::string name = "strip-excavation";
  const Mesh mesh = strip_mesh(comm); // the problem keeps a reference
  BiotProblem problem(mesh, strip_setup());
  const auto& soil = problem.setup().materials.at("soil");
  const double cv = soil.consolidation_coefficient(conductivity, problem.setup().gamma_w);
  const std::vector<Place> places{{0.0, 0.5 * half_width, "centre, z=b/2"},
                                  {0.0, half_width, "centre, z=b"},
                                  {0.0, 2 * half_width, "centre, z=2b"},
                                  {half_width, half_width, "edge, z=b"}};
  std::vector<CheckRow> rows;
  problem.advance_to(1e-5 * half_width * half_width / cv);
  for (const auto& p : places)
    rows.push_back(scaled_row(
        name, "undrained excess pore pressure, kPa, " + p.name + " (error rel. to q)",
        probe(problem, dealii::Point<2>(p.offset, -dig_depth - p.depth)).excess_pressure,
        strip_unloading(p).undrained_pressure, unloading, tolerance,
        "strip load (Poulos & Davis 1974) [from memory]; B = 1 (Skempton 1954), plane "
        "strain [derived in docs/verification-references.md]"));
  // Two steps of 1e4 times the model's drainage time leave no excess to speak of.
  const double drained = 1e4 * extent * extent / cv;
  problem.advance_to(drained);
  problem.advance_to(2 * drained);
  auto writer = writer_for(settings, name, comm);
  if (writer)
    writer->write(problem);
  // The stress changes: a derivation from a zero initial stress.
  const Derivation changes(problem, InitialFields::from_setup(problem.setup()));
  std::vector<dealii::Point<2>> points;
  for (const auto& p : places)
    points.emplace_back(p.offset, -dig_depth - p.depth);
  const auto values = SamplePoints(problem, points, name).evaluate(problem, changes);
  for (std::size_t i = 0; i < places.size(); ++i) {
    const Place& p = places[i];
    const StripStress reference = strip_unloading(p);
    const std::string at = ", kPa, " + p.name + " (error rel. to q)";
    rows.push_back(scaled_row(name, "drained vertical stress change" + at,
                              values[i].vertical_effective_stress, reference.vertical,
                              unloading, tolerance, strip_source));
    rows.push_back(scaled_row(name, "drained horizontal stress change" + at,
                              values[i].horizontal_effective_stress, reference.horizontal,
                              unloading, tolerance, strip_source));
    // Compression-positive tau_xz with z down is tension-positive sigma_xy with y up.
    if (p.offset > 0.0)
      rows.push_back(scaled_row(name, "drained shear stress change" + at,
                                values[i].shear_effective_stress, reference.shear,
                                unloading, tolerance, strip_source));
  }
  return rows;
}

} // namespace settlewell::verification
