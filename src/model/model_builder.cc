#include "settlewell/model/model_builder.h"

#include "settlewell/core/errors.h"
#include "settlewell/core/units.h"
#include "settlewell/mesh/gmsh_mesh.h"

#include <deal.II/base/mpi.h>

#include <algorithm>
#include <cmath>
#include <functional>
#include <limits>
#include <set>
#include <sstream>

namespace settlewell::model {

using namespace dealii;
using scenario::BoundarySpec;
using scenario::Scenario;
using scenario::Target;

std::map<std::string, std::string> region_materials(const Scenario& s, const Mesh& mesh) {
  std::map<std::string, std::string> out;
  const std::vector<scenario::Layer>* layers =
      s.section ? &s.section->layers : (s.box ? &s.box->layers : nullptr);
  if (layers)
    for (const auto& l : *layers)
      out[l.name] = l.material;
  if (s.section && s.section->wall)
    out[section_names::wall_region] = s.section->wall->material;
  if (s.section && s.section->wall && s.section->wall->interface_thickness > 0.0)
    out[section_names::wall_interface] = s.section->wall->interface_material;
  if (s.mesh_file) {
    for (const auto& [region, material] : s.mesh_file->region_materials) {
      if (!mesh.names.has_region(region))
        throw InputError(s.location_of("mesh_file") + ": mesh_file.regions." + region +
                         ": the mesh has no region (physical surface) of that name");
      out[region] = material;
    }
  }
  std::map<std::string, std::string> used;
  for (const auto& region : mesh.names.region_names()) {
    auto found = out.find(region);
    if (found == out.end() && s.mesh_file && s.materials.count(region))
      found = out.emplace(region, region).first; // a region named after its material
    if (found == out.end())
      throw InputError(s.location_of(s.mesh_file ? "mesh_file" : "materials") +
                       ": region '" + region + "' of the mesh has no material" +
                       (s.mesh_file ? "; add it under [mesh_file.regions]" : ""));
    used.insert(*found);
  }
  return used;
}

namespace {

BoundarySpec role(BoundarySpec::Hydraulic h, BoundarySpec::Mechanical m) {
  BoundarySpec b;
  b.hydraulic = h;
  b.mechanical = m;
  return b;
}

BoundarySpec default_role(const Scenario& s, const std::string& name) {
  using H = BoundarySpec::Hydraulic;
  using M = BoundarySpec::Mechanical;
  namespace n = section_names;
  if (s.section) {
    if (name == n::far_boundary)
      return role(H::fixed_head, M::roller);
    if (name == n::model_base)
      return role(H::no_flow, M::fixed);
    if (name == n::symmetry_axis || name == n::well_casing)
      return role(H::no_flow, M::roller);
    if (name.rfind("well_", 0) == 0)
      return role(H::unset, M::roller); // an axisymmetric well screen: stages control it
  }
  if (s.box) {
    if (name == "left" || name == "right")
      return role(H::no_flow, M::roller);
    if (name == "bottom")
      return role(H::no_flow, M::fixed);
  }
  return role(H::no_flow, M::free);
}

/// Length of a line (times 2 pi r in axisymmetric), m or m^2.
double line_measure(const Mesh& mesh, const std::string& name, AnalysisType analysis) {
  auto weight = [&](const Point<2>& a, const Point<2>& b) {
    const double length = a.distance(b);
    return analysis == AnalysisType::axisymmetric ? length * units::pi * (a[0] + b[0])
                                                  : length;
  };
  const auto internal = mesh.internal_lines.find(name);
  if (internal != mesh.internal_lines.end()) {
    double total = 0.0;
    for (const auto& seg : internal->second)
      total += weight(seg.a, seg.b);
    return total;
  }
  const auto id = mesh.names.boundary_id(name);
  double total = 0.0;
  for (const auto& cell : mesh.triangulation->active_cell_iterators())
    if (cell->is_locally_owned())
      for (const unsigned int f : cell->face_indices())
        if (cell->at_boundary(f) && cell->face(f)->boundary_id() == id)
          total += weight(cell->face(f)->vertex(0), cell->face(f)->vertex(1));
  return Utilities::MPI::sum(total, mesh.triangulation->get_communicator());
}

/// The stage-by-stage control of one line.
struct ControlItem {
  std::vector<std::optional<Target>> targets;
  std::optional<std::function<double(const Point<2>&)>> initial;
  /// How a head held there lets water through (HydraulicCondition::Exchange).
  HydraulicCondition::Exchange exchange = HydraulicCondition::Exchange::both_ways;
};

void require_line(const Scenario& s,
                  const Mesh& mesh,
                  const std::string& line,
                  const std::string& where,
                  const std::string& what) {
  if (!mesh.has_line(line))
    throw InputError(s.location_of(where) + ": " + what +
                     ": the mesh has no line named '" + line + "'");
}

/// The mesh line of a stage's well: `well_<name>` in a section, and in a mesh file
/// too when it has that line (as `settlewell mesh` names them); else `<name>`.
std::string well_line(const Scenario& s, const Mesh& mesh, const std::string& well) {
  const std::string prefixed = section_names::well(well);
  return s.section || mesh.has_line(prefixed) ? prefixed : well;
}

bool recharge_well(const Scenario& s, const std::string& well) {
  if (!s.section)
    return false;
  const auto& wells = s.section->wells;
  return std::any_of(wells.begin(), wells.end(),
                     [&](const auto& w) { return w.name == well && w.recharge; });
}

std::map<std::string, ControlItem>
hydraulic_items(const Scenario& s,
                const Mesh& mesh,
                const InitialState& initial,
                const std::map<std::string, BoundarySpec>& roles,
                std::vector<PumpedLine>& pumped) {
  std::map<std::string, ControlItem> items;
  const std::size_t n = s.stages.size();
  auto item = [&](const std::string& line) -> ControlItem& {
    auto& it = items[line];
    it.targets.resize(n);
    return it;
  };
  for (const auto& [name, spec] : roles)
    if (spec.hydraulic == BoundarySpec::Hydraulic::fixed_head) {
      auto& it = item(name);
      if (spec.head)
        it.initial = [h = *spec.head](const Point<2>&) { return h; };
      else
        it.initial = [&initial](const Point<2>& x) { return initial.head(x); };
    } else if (spec.hydraulic == BoundarySpec::Hydraulic::seepage_face) {
      auto& it = item(name);
      it.initial = [](const Point<2>& x) { return x[1]; }; // atmospheric pressure
      it.exchange = HydraulicCondition::Exchange::seepage_face;
    }
  for (std::size_t k = 0; k < n; ++k) {
    const auto& stage = s.stages[k];
    const std::string where = "stages." + stage.name;
    for (const auto& [name, target] : stage.boundary_targets) {
      require_line(s, mesh, name, where, "stage '" + stage.name + "' boundary " + name);
      item(name).targets[k] = target;
    }
    for (const auto& [well, target] : stage.wells) {
      const std::string line = well_line(s, mesh, well);
      if (!mesh.has_line(line))
        throw InputError(s.location_of(where) + ": stage '" + stage.name + "' well '" +
                         well + "': the mesh has no line named '" + well + "' or '" +
                         section_names::well(well) + "'");
      item(line).targets[k] = target;
      item(line).exchange = recharge_well(s, well)
                                ? HydraulicCondition::Exchange::both_ways
                                : HydraulicCondition::Exchange::pumped;
    }
    if (stage.excavation_level_head) {
      auto& it = item(section_names::excavation_level);
      it.targets[k] = Target{Target::Kind::head, *stage.excavation_level_head};
      it.exchange = HydraulicCondition::Exchange::pumped; // from a sump
    }
  }
  if (s.section)
    for (const auto& w : s.section->wells)
      if (items.count(section_names::well(w.name)))
        pumped.push_back({w.name, section_names::well(w.name), false, w.recharge});
  if (!s.section)
    for (const auto& stage : s.stages)
      for (const auto& [well, target] : stage.wells)
        if (std::none_of(pumped.begin(), pumped.end(),
                         [&w = well](auto& p) { return p.label == w; }))
          pumped.push_back({well, well_line(s, mesh, well)});
  if (items.count(section_names::excavation_level))
    pumped.push_back({section_names::excavation_level, section_names::excavation_level});
  return items;
}

void add_hydraulic(const Scenario& s,
                   const Mesh& mesh,
                   const InitialState& initial,
                   const Schedule& schedule,
                   const std::map<std::string, ControlItem>& items,
                   BoundaryConditions& bc) {
  auto h0 = [&initial](const Point<2>& x) { return initial.head(x); };
  for (const auto& [line, item] : items) {
    const double measure = line_measure(mesh, line, s.analysis);
    for (const auto& phase : control_phases(schedule, item.targets, item.initial, h0)) {
      if (phase.kind == Target::Kind::head) {
        bc.head(line, phase.value, phase.window);
        bc.hydraulic.back().exchange = item.exchange;
        continue;
      }
      // A discharge (m^3/s per metre run, or per well) spread evenly over the line.
      const FieldFunction q = phase.value;
      bc.outflow(
          line, [q, measure](const Point<2>& x, double t) { return q(x, t) / measure; },
          phase.window);
    }
  }
}

void add_mechanical(const Mesh& mesh,
                    const std::map<std::string, BoundarySpec>& roles,
                    AnalysisType analysis,
                    BoundaryConditions& bc) {
  for (const auto& [name, spec] : roles) {
    if (spec.mechanical == BoundarySpec::Mechanical::rigid_plate) {
      // The plate's force: its mean pressure over its length (per metre run) or
      // its area (axisymmetric), from the first instant on.
      const double force = spec.plate_pressure * line_measure(mesh, name, analysis);
      bc.rigid_plate(name, [force](double t) { return t > 0.0 ? force : 0.0; });
    }
    if (spec.mechanical == BoundarySpec::Mechanical::fixed)
      bc.fix(name, true, true);
    if (spec.mechanical == BoundarySpec::Mechanical::roller) {
      const unsigned int axis = boundary_normal_axis(mesh, name);
      bc.fix(name, axis == 0, axis == 1);
    }
  }
}

void add_loads(const Scenario& s,
               const Mesh& mesh,
               const Schedule& schedule,
               BoundaryConditions& bc) {
  // Each loaded strip is an item whose pressure ramps like a discharge (from 0).
  struct Strip {
    double x_from, x_to;
    std::vector<std::optional<Target>> targets;
  };
  std::map<std::string, std::vector<Strip>> strips;
  for (std::size_t k = 0; k < s.stages.size(); ++k)
    for (const auto& load : s.stages[k].loads) {
      if (!mesh.names.has_boundary(load.boundary))
        throw InputError(s.location_of("stages." + s.stages[k].name) + ": stage '" +
                         s.stages[k].name + "' load: no boundary named '" +
                         load.boundary + "'");
      auto& list = strips[load.boundary];
      auto found = std::find_if(list.begin(), list.end(), [&](const Strip& st) {
        return st.x_from == load.x_from && st.x_to == load.x_to;
      });
      if (found == list.end())
        found = list.insert(list.end(),
                            Strip{load.x_from, load.x_to,
                                  std::vector<std::optional<Target>>(s.stages.size())});
      found->targets[k] = Target{Target::Kind::discharge, load.pressure};
    }
  auto zero = [](const Point<2>&) { return 0.0; };
  for (const auto& [boundary, list] : strips) {
    std::vector<std::tuple<double, double, FieldFunction>> pieces;
    for (const auto& strip : list)
      for (const auto& phase :
           control_phases(schedule, strip.targets, std::nullopt, zero))
        pieces.emplace_back(strip.x_from, strip.x_to, phase.value);
    bc.normal_traction(boundary, [pieces](const Point<2>& x, double t) {
      double pressure = 0.0;
      for (const auto& [a, b, p] : pieces)
        if (x[0] >= a && x[0] <= b)
          pressure += p(x, t);
      return -pressure; // a compressive surcharge is a negative normal traction
    });
  }
}

/// The water level in the pit at time t: the stage's pit_water_level, else the
/// level the pit has been dug to (`ground` before any dig).
TimeFunction pit_water_head(const Scenario& s, const Schedule& schedule, double ground) {
  std::vector<std::pair<double, double>> level; // (stage end, level)
  double dug_to = ground;
  for (std::size_t k = 0; k < s.stages.size(); ++k) {
    dug_to = s.stages[k].dig_level.value_or(dug_to);
    level.emplace_back(schedule.stages()[k].end,
                       s.stages[k].pit_water_level.value_or(dug_to));
  }
  return [level](double t) {
    for (const auto& [end, h] : level)
      if (t <= end * (1 + 1e-12))
        return h;
    return level.back().second;
  };
}

/// A mesh file's pit: the regions its dig stages take out, and the highest and
/// lowest vertex of their cells (the top is the ground before any dig).
struct PitRegions {
  std::set<types::material_id> ids;
  double top = -std::numeric_limits<double>::infinity();
  double bottom = std::numeric_limits<double>::infinity();
  double model_height = 0.0; ///< of the whole mesh, m
};

std::string number_text(double v) {
  std::ostringstream os;
  os << v;
  return os.str();
}

PitRegions pit_regions(const Scenario& s, const Mesh& mesh) {
  PitRegions pit;
  for (const auto& name : s.mesh_file->excavation_regions) {
    if (!mesh.names.has_region(name)) {
      std::string known;
      for (const auto& r : mesh.names.region_names())
        known += (known.empty() ? "" : ", ") + r;
      throw InputError(s.location_of("mesh_file.excavation_regions." + name) +
                       ": mesh_file.excavation_regions: the mesh has no region "
                       "(physical surface) named '" +
                       name + "' (known: " + known + ")");
    }
    pit.ids.insert(mesh.names.region_id(name));
  }
  double high = -std::numeric_limits<double>::infinity(), low = -high;
  for (const auto& cell : mesh.triangulation->active_cell_iterators())
    if (cell->is_locally_owned())
      for (const unsigned int v : cell->vertex_indices()) {
        const double y = cell->vertex(v)[1];
        high = std::max(high, y), low = std::min(low, y);
        if (pit.ids.count(cell->material_id()))
          pit.top = std::max(pit.top, y), pit.bottom = std::min(pit.bottom, y);
      }
  const MPI_Comm comm = mesh.triangulation->get_communicator();
  pit.top = Utilities::MPI::max(pit.top, comm);
  pit.bottom = Utilities::MPI::min(pit.bottom, comm);
  pit.model_height = Utilities::MPI::max(high, comm) - Utilities::MPI::min(low, comm);
  return pit;
}

/// The centre of a pit cell that `level` passes through (vertices more than `tol`
/// above and below it): of those on all processes, the one least in x, then in y.
std::optional<Point<2>>
pit_cell_cut_by(const Mesh& mesh, const PitRegions& pit, double level, double tol) {
  const double none = std::numeric_limits<double>::infinity();
  Point<2> least(none, none);
  for (const auto& cell : mesh.triangulation->active_cell_iterators()) {
    if (!cell->is_locally_owned() || !pit.ids.count(cell->material_id()))
      continue;
    bool above = false, below = false;
    for (const unsigned int v : cell->vertex_indices()) {
      above = above || cell->vertex(v)[1] > level + tol;
      below = below || cell->vertex(v)[1] < level - tol;
    }
    const Point<2> c = cell->center();
    if (above && below && (c[0] < least[0] || (c[0] == least[0] && c[1] < least[1])))
      least = c;
  }
  const MPI_Comm comm = mesh.triangulation->get_communicator();
  const double x = Utilities::MPI::min(least[0], comm);
  const double y = Utilities::MPI::min(least[0] == x ? least[1] : none, comm);
  if (x == none)
    return std::nullopt;
  return Point<2>(x, y);
}

/// A mesh file's dig level of stage k: inside the pit's height, along cell sides.
void check_mesh_dig_level(const Scenario& s,
                          const Mesh& mesh,
                          const PitRegions& pit,
                          std::size_t k,
                          double tol) {
  const auto& stage = s.stages[k];
  const double level = *stage.dig_level;
  const std::string where = s.location_of("stages." + stage.name + ".dig_level") +
                            ": stages[" + std::to_string(k) + "].dig_level: ";
  if (!(level < pit.top - tol))
    throw InputError(where + "must lie below the top of the excavation regions (" +
                     number_text(pit.top) + " m, mesh_file.excavation_regions)");
  if (level < pit.bottom - tol)
    throw InputError(where + "lies below the excavation regions (their lowest point " +
                     number_text(pit.bottom) + " m, mesh_file.excavation_regions)");
  if (const auto c = pit_cell_cut_by(mesh, pit, level, tol))
    throw InputError(where + "stage '" + stage.name + "' digs to " + number_text(level) +
                     " m, which cuts through cells of the excavation regions (one "
                     "centred at (" +
                     number_text((*c)[0]) + ", " + number_text((*c)[1]) +
                     ")); put a mesh line at " + number_text(level) + " m there");
}

/// A mesh file's dig levels and pit water levels against its pit (no water above
/// the pit's top).
void check_mesh_pit(const Scenario& s, const Mesh& mesh, const PitRegions& pit) {
  const double tol = 1e-6 * pit.model_height;
  for (std::size_t k = 0; k < s.stages.size(); ++k) {
    const auto& stage = s.stages[k];
    if (stage.pit_water_level && *stage.pit_water_level > pit.top + tol)
      throw InputError(s.location_of("stages." + stage.name + ".pit_water_level") +
                       ": stages[" + std::to_string(k) +
                       "].pit_water_level: lies above the top of the excavation "
                       "regions (" +
                       number_text(pit.top) + " m)");
    if (stage.dig_level)
      check_mesh_dig_level(s, mesh, pit, k, tol);
  }
}

/// One excavation event per digging stage: the cells `in_pit` accepts whose centre
/// lies above the stage's dig level.
void add_digs(const Scenario& s,
              const Schedule& schedule,
              const std::function<bool(const Point<2>&, types::material_id)>& in_pit,
              BiotSetup& setup) {
  for (std::size_t k = 0; k < s.stages.size(); ++k) {
    if (!s.stages[k].dig_level)
      continue;
    const double level = *s.stages[k].dig_level;
    const StageTimes& times = schedule.stages()[k];
    setup.excavation.push_back(
        {times.start, times.ramp_end,
         [level, in_pit](const Point<2>& centre, types::material_id region) {
           return in_pit(centre, region) && centre[1] > level;
         }});
  }
}

/// The digging of a section's pit: the cells inside the walls.
void add_section_digs(const Scenario& s, const Schedule& schedule, BiotSetup& setup) {
  const double half_width = s.section->excavation_width / 2;
  const bool whole_width =
      !s.section->half_model && s.analysis != AnalysisType::axisymmetric;
  add_digs(
      s, schedule,
      [=](const Point<2>& centre, types::material_id) {
        return (whole_width ? std::abs(centre[0]) : centre[0]) < half_width;
      },
      setup);
}

/// The digging of a mesh file's pit: the cells of its excavation regions.
void add_mesh_digs(const Scenario& s,
                   const Schedule& schedule,
                   const PitRegions& pit,
                   BiotSetup& setup) {
  add_digs(
      s, schedule,
      [ids = pit.ids](const Point<2>&, types::material_id region) {
        return ids.count(region) != 0;
      },
      setup);
}

/// The pit's digging: at the start of each stage that digs, the pit's cells above
/// its dig level (section: inside the walls; mesh file: of its excavation regions),
/// released over its ramp; the surface it exposes drains to the pit, and its water
/// is pumped.
void add_excavation(const Scenario& s,
                    const Mesh& mesh,
                    const Schedule& schedule,
                    BiotSetup& setup,
                    std::vector<PumpedLine>& pumped) {
  double ground = 0.0; // the pit's top before any dig
  if (s.section) {
    ground = s.section->ground_surface;
    add_section_digs(s, schedule, setup);
  } else if (s.mesh_file && !s.mesh_file->excavation_regions.empty()) {
    const PitRegions pit = pit_regions(s, mesh);
    check_mesh_pit(s, mesh, pit);
    ground = pit.top;
    add_mesh_digs(s, schedule, pit, setup);
  }
  if (setup.excavation.empty())
    return;
  setup.pit_water_head = pit_water_head(s, schedule, ground);
  pumped.push_back({"formation", "", true});
}

/// The props as springs on the wall's inner face: per wall side in plane strain
/// (pushing the wall away from the pit), a ring in a shaft (radial stiffness
/// 2 pi EA / R and preload 2 pi R p for the full circle).
void add_props(const Scenario& s, const Schedule& schedule, BiotSetup& setup) {
  if (!s.section)
    return;
  const auto& sec = *s.section;
  const double half = sec.excavation_width / 2;
  for (const auto& prop : sec.props) {
    double from = 0.0;
    for (std::size_t k = 0; k < s.stages.size(); ++k)
      if (s.stages[k].name == prop.stage)
        from = schedule.stages()[k].start;
    if (s.analysis == AnalysisType::axisymmetric) {
      setup.springs.push_back({"prop " + prop.name, Point<2>(half, prop.level), 0, 1.0,
                               2 * units::pi * prop.stiffness / half,
                               2 * units::pi * half * prop.preload, from});
      continue;
    }
    if (sec.wall->right)
      setup.springs.push_back({"prop " + prop.name, Point<2>(half, prop.level), 0, 1.0,
                               prop.stiffness, prop.preload, from});
    if (sec.wall->left)
      setup.springs.push_back({"prop " + prop.name + " (left wall)",
                               Point<2>(-half, prop.level), 0, -1.0, prop.stiffness,
                               prop.preload, from});
  }
}

} // namespace

std::map<std::string, BoundarySpec> boundary_roles(const Scenario& s, const Mesh& mesh) {
  std::map<std::string, BoundarySpec> roles;
  for (const auto& name : mesh.names.boundary_names()) {
    const auto spec = s.boundaries.find(name);
    if (spec == s.boundaries.end() || !spec->second.part)
      roles[name] = default_role(s, name);
  }
  const auto apply = [&](const std::string& name, const BoundarySpec& spec) {
    const bool internal = mesh.internal_lines.count(name) != 0;
    if (!mesh.names.has_boundary(name) && !internal) {
      std::string known;
      for (const auto& b : mesh.names.boundary_names())
        known += (known.empty() ? "" : ", ") + b;
      throw InputError(s.location_of("boundaries." + name) + ": boundaries." + name +
                       ": the mesh has no boundary of that name (known: " + known + ")");
    }
    if (internal && spec.mechanical != BoundarySpec::Mechanical::unset)
      throw InputError(s.location_of("boundaries." + name) + ": boundaries." + name +
                       ": is an internal line and takes no mechanical condition");
    auto& r = roles[name];
    if (spec.hydraulic != BoundarySpec::Hydraulic::unset)
      r.hydraulic = spec.hydraulic, r.head = spec.head;
    if (spec.mechanical != BoundarySpec::Mechanical::unset)
      r.mechanical = spec.mechanical, r.plate_pressure = spec.plate_pressure;
  };
  for (const auto& [name, spec] : s.boundaries)
    if (!spec.part)
      apply(name, spec);
  // A part starts from what holds on its boundary (parents first), then takes its
  // own settings.
  for (const auto& name : s.boundary_parts_parents_first()) {
    const auto& spec = s.boundaries.at(name);
    roles[name] = roles.at(spec.part->of);
    apply(name, spec);
  }
  return roles;
}

namespace {
/// The clay's yield ellipse from its preconsolidation: sigma'p reached
/// one-dimensionally with K0nc = 1 - sin phi'cs (Jaky 1944).
ClaySkeleton clay_skeleton(const scenario::Material::CamClay& clay) {
  return {clay.parameters,
          [clay](double vertical_start, double elevation) {
            return clay.preconsolidation(vertical_start, elevation);
          },
          1.0 - std::sin(clay.friction_angle * units::pi / 180.0),
          clay.permeability_change_index};
}
} // namespace

Model build_model(const Scenario& s,
                  const Mesh& mesh,
                  const InitialState& initial,
                  const Schedule& schedule) {
  Model model;
  BiotSetup& setup = model.setup;
  setup.analysis = s.analysis;
  setup.rigid_skeleton = s.coupling == scenario::Coupling::flow_only;
  setup.gamma_w = s.gamma_w;
  for (const auto& [region, material] : region_materials(s, mesh)) {
    setup.materials[region] = s.materials.at(material).poroelastic;
    setup.geostatic.unit_weights[region] = s.materials.at(material).unit_weight;
    if (const auto& clay = s.materials.at(material).cam_clay)
      setup.clays[region] = clay_skeleton(*clay);
    if (const auto& curve = s.materials.at(material).retention)
      setup.unsaturated[region] = *curve;
  }
  setup.geostatic.effective_stress = [&initial](const Point<2>& x, types::material_id r) {
    return initial.start_effective_stress(x, r);
  };
  setup.gravity_loading = s.gravity_loading;
  setup.initial_head = [&initial](const Point<2>& x) { return initial.head(x); };
  setup.solver = s.numerics.solver;
  if ((!setup.clays.empty() || !setup.unsaturated.empty()) &&
      setup.solver == SolverChoice::automatic)
    setup.solver = SolverChoice::direct; // Newton's tangent is not symmetric
  setup.solver_tolerance = s.numerics.tolerance;
  const auto roles = boundary_roles(s, mesh);
  const auto items = hydraulic_items(s, mesh, initial, roles, model.pumped);
  add_hydraulic(s, mesh, initial, schedule, items, setup.conditions);
  add_mechanical(mesh, roles, s.analysis, setup.conditions);
  add_loads(s, mesh, schedule, setup.conditions);
  add_excavation(s, mesh, schedule, setup, model.pumped);
  add_props(s, schedule, setup);
  return model;
}

} // namespace settlewell::model
