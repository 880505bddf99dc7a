// What a run tells the user in text: the check summary, the closing summary and
// the manifest.
#include "run_extremes.h"

#include "run_recorder.h"
#include "settlewell/core/errors.h"
#include "settlewell/core/units.h"
#include "settlewell/core/version.h"
#include "settlewell/mesh/gmsh_mesh.h"
#include "settlewell/model/initial_state.h"
#include "settlewell/model/model_builder.h"
#include "settlewell/physics/resolved_conditions.h"
#include "settlewell/simulation/run_files.h"

#include <deal.II/base/mpi.h>
#include <deal.II/grid/grid_tools.h>
#include <deal.II/grid/grid_tools_cache.h>

#include <fstream>
#include <iomanip>
#include <ostream>

namespace settlewell {

using namespace dealii;

namespace {

std::string days_text(double seconds) {
  std::ostringstream os;
  os << std::setprecision(6) << units::to_days(seconds);
  return os.str();
}

std::string role_text(const scenario::BoundarySpec& b) {
  using H = scenario::BoundarySpec::Hydraulic;
  using M = scenario::BoundarySpec::Mechanical;
  std::ostringstream h;
  if (b.hydraulic == H::fixed_head && b.head)
    h << "fixed head " << *b.head << " m";
  else if (b.hydraulic == H::fixed_head)
    h << "fixed head (the initial head)";
  else
    h << (b.hydraulic == H::no_flow ? "no flow" : "set by the stages");
  const char* m = b.mechanical == M::fixed    ? "fixed"
                  : b.mechanical == M::roller ? "roller (normal fixed)"
                                              : "free";
  return h.str() + ", " + m;
}

std::string target_text(const scenario::Target& t) {
  std::ostringstream os;
  if (t.kind == scenario::Target::Kind::head)
    os << "head " << t.value << " m";
  else
    os << "discharge " << t.value * units::seconds_per_day << " m3/day";
  return os.str();
}

void describe_stages(const scenario::Scenario& s,
                     const model::Schedule& schedule,
                     std::ostream& out) {
  out << "Stages:\n";
  for (std::size_t k = 0; k < s.stages.size(); ++k) {
    const auto& st = s.stages[k];
    const auto& times = schedule.stages()[k];
    out << "  " << k + 1 << ". " << st.name << ": day " << days_text(times.start)
        << " to " << days_text(times.end) << ", ramp " << days_text(st.ramp) << " days";
    for (const auto& [well, target] : st.wells)
      out << "; well " << well << " " << target_text(target);
    for (const auto& [b, head] : st.boundary_heads)
      out << "; " << b << " head " << head << " m";
    if (st.excavation_level_head)
      out << "; excavation level head " << *st.excavation_level_head << " m";
    for (const auto& load : st.loads)
      out << "; load " << load.pressure << " kPa on " << load.boundary << " x "
          << load.x_from << " to " << load.x_to << " m";
    out << '\n';
  }
}

} // namespace

void describe_scenario(const scenario::Scenario& s,
                       const Mesh& mesh,
                       const model::Schedule& schedule,
                       std::ostream& out) {
  out << "Scenario: " << (s.title.empty() ? std::string("(untitled)") : s.title) << " ("
      << s.source_path << ")\n";
  out << "Analysis: "
      << (s.analysis == AnalysisType::axisymmetric ? "axisymmetric (r = x, z = y)"
                                                   : "plane strain (per metre run)")
      << ", unit weight of water " << s.gamma_w << " kN/m3\n";
  out << "Regions (material):\n";
  for (const auto& [region, material] : model::region_materials(s, mesh)) {
    const auto& m = s.materials.at(material);
    out << "  " << region << " (" << material << "): E' " << m.poroelastic.youngs_modulus
        << " kPa, nu' " << m.poroelastic.poisson_ratio << ", kx "
        << m.poroelastic.conductivity_x << " m/s, ky " << m.poroelastic.conductivity_y
        << " m/s, unit weight " << m.unit_weight << " kN/m3, K0 " << m.k0 << '\n';
  }
  out << "Boundaries:\n";
  for (const auto& [name, role] : model::boundary_roles(s, mesh))
    out << "  " << name << ": " << role_text(role) << '\n';
  if (!mesh.internal_lines.empty()) {
    out << "Internal lines:";
    for (const auto& [name, segments] : mesh.internal_lines)
      out << ' ' << name;
    out << '\n';
  }
  describe_stages(s, schedule, out);
  const MeshSummary size = summarise(mesh);
  out << "Mesh: " << size.n_cells << " quadrilateral cells, " << size.n_vertices
      << " vertices; about " << size.estimated_dofs()
      << " unknowns (Q2 displacement, Q1 pressure)\n";
  out << "Time: " << schedule.step_times().size() << " steps, "
      << schedule.output_times().size() << " output times, ending at day "
      << days_text(s.end_time()) << '\n';
}

void check_scenario(const scenario::Scenario& s, MPI_Comm comm, std::ostream& out) {
  const Mesh mesh = make_scenario_mesh(s, comm);
  const model::InitialState initial(s, mesh);
  const model::Schedule schedule(s);
  const model::Model m = model::build_model(s, mesh, initial, schedule);
  (void)resolve_conditions(m.setup, mesh); // names and conflicts
  for (const auto& [region, material] : m.setup.materials)
    material.validate("material of region '" + region + "'");
  const GridTools::Cache<2> cache(*mesh.triangulation);
  for (const auto& p : s.output.points) {
    bool found = false;
    try {
      const auto cell =
          GridTools::find_active_cell_around_point(cache, Point<2>(p.x, p.y));
      found =
          cell.first.state() == IteratorState::valid && cell.first->is_locally_owned();
    } catch (const std::exception&) {
    }
    if (!Utilities::MPI::logical_or(found, comm))
      throw InputError(s.location_of("output") + ": output.points '" + p.name +
                       "' lies outside the mesh");
  }
  if (Utilities::MPI::this_mpi_process(comm) == 0) {
    describe_scenario(s, mesh, schedule, out);
    out << "The scenario is valid.\n";
  }
}

namespace {

std::string stage_changes(const scenario::Stage& st) {
  std::ostringstream os;
  const char* sep = "";
  for (const auto& [well, target] : st.wells)
    os << sep << "well " << well << ": " << target_text(target), sep = "; ";
  for (const auto& [b, head] : st.boundary_heads)
    os << sep << b << " head " << head << " m", sep = "; ";
  if (st.excavation_level_head)
    os << sep << "excavation level head " << *st.excavation_level_head << " m",
        sep = "; ";
  for (const auto& load : st.loads)
    os << sep << load.pressure << " kPa on " << load.boundary << " (x " << load.x_from
       << " to " << load.x_to << " m)",
        sep = "; ";
  const std::string text = os.str();
  return text.empty() ? "no change (held)" : text;
}

std::vector<std::string> geometry_lines(const scenario::Scenario& s) {
  std::vector<std::string> lines;
  std::ostringstream os;
  if (s.section) {
    const auto& sec = *s.section;
    os << "Parametric section: ground surface " << sec.ground_surface << " m, model base "
       << sec.bottom << " m, excavation " << sec.excavation_width << " m wide to "
       << sec.excavation_level() << " m, far boundary " << sec.far_distance
       << " m beyond the wall" << (sec.half_model ? ", half model" : ", full model");
    lines.push_back(os.str());
    if (sec.wall) {
      std::ostringstream w;
      w << "Cutoff wall: " << sec.wall->thickness << " m thick, toe at " << sec.wall->toe
        << " m, material " << sec.wall->material;
      lines.push_back(w.str());
    }
    for (const auto& well : sec.wells) {
      std::ostringstream w;
      w << "Well " << well.name << ": x " << well.x << " m, screen " << well.screen_bottom
        << " to " << well.screen_top << " m";
      lines.push_back(w.str());
    }
    for (const auto& l : sec.layers) {
      std::ostringstream w;
      w << "Layer " << l.name << " (" << l.material << ") from " << l.top << " m";
      lines.push_back(w.str());
    }
  } else if (s.box) {
    os << "Layered box " << s.box->width << " m wide, base at " << s.box->bottom << " m";
    lines.push_back(os.str());
    for (const auto& l : s.box->layers)
      lines.push_back("Layer " + l.name + " (" + l.material + ") from " +
                      std::to_string(l.top) + " m");
  } else {
    lines.push_back("Mesh file " + s.mesh_file->path);
  }
  std::ostringstream gw;
  gw << "Initial water table " << s.groundwater.water_table << " m";
  for (const auto& [layer, head] : s.groundwater.layer_heads)
    gw << "; head " << head << " m in " << layer;
  lines.push_back(gw.str());
  return lines;
}

} // namespace

toml::table inputs_table(const scenario::Scenario& s,
                         const Mesh& mesh,
                         const model::Schedule& schedule) {
  toml::array materials, boundaries, stages, geometry;
  for (const auto& [region, name] : model::region_materials(s, mesh)) {
    const auto& m = s.materials.at(name);
    materials.push_back(
        toml::table{{"region", region},
                    {"material", name},
                    {"unit_weight", m.unit_weight},
                    {"youngs_modulus_kPa", m.poroelastic.youngs_modulus},
                    {"poisson_ratio", m.poroelastic.poisson_ratio},
                    {"mv_per_kPa", 1.0 / m.poroelastic.constrained_modulus()},
                    {"kx", m.poroelastic.conductivity_x},
                    {"ky", m.poroelastic.conductivity_y},
                    {"k0", m.k0}});
  }
  for (const auto& [name, role] : model::boundary_roles(s, mesh))
    boundaries.push_back(toml::table{{"name", name}, {"role", role_text(role)}});
  for (std::size_t k = 0; k < s.stages.size(); ++k)
    stages.push_back(
        toml::table{{"name", s.stages[k].name},
                    {"start_days", units::to_days(schedule.stages()[k].start)},
                    {"end_days", units::to_days(schedule.stages()[k].end)},
                    {"ramp_days", units::to_days(s.stages[k].ramp)},
                    {"changes", stage_changes(s.stages[k])}});
  for (const auto& line : geometry_lines(s))
    geometry.push_back(line);
  return toml::table{{"materials", materials},
                     {"boundaries", boundaries},
                     {"stages", stages},
                     {"geometry", geometry}};
}

void print_summary(std::ostream& out, const RunSummary& r, const scenario::Scenario& s) {
  const bool per_metre = s.analysis == AnalysisType::plane_strain;
  out << std::fixed;
  out << "Run finished: " << r.steps << " steps, " << r.cells << " cells, " << r.dofs
      << " unknowns, " << std::setprecision(1) << r.wall_seconds << " s wall time\n";
  out << std::setprecision(1);
  if (r.settlement_inside)
    out << "  largest settlement inside the wall (pit surface): "
        << *r.settlement_inside * 1000 << " mm\n";
  if (r.settlement_outside)
    out << "  largest settlement outside the wall (ground surface): "
        << *r.settlement_outside * 1000 << " mm\n";
  if (!r.settlement_inside)
    out << "  largest settlement: " << r.settlement_anywhere * 1000 << " mm\n";
  out << std::setprecision(2);
  if (r.drawdown_outside)
    out << "  largest drawdown outside the wall: " << *r.drawdown_outside << " m\n";
  else
    out << "  largest drawdown: " << r.drawdown_anywhere << " m\n";
  double total = 0.0;
  for (const auto& [label, volume] : r.pumped_volume) {
    out << "  pumped volume, " << label << ": " << std::setprecision(1) << volume
        << (per_metre ? " m3 per metre run\n" : " m3\n");
    total += volume;
  }
  if (r.pumped_volume.size() > 1)
    out << "  pumped volume, total: " << total
        << (per_metre ? " m3 per metre run\n" : " m3\n");
  out << "  results: " << r.run_directory
      << " (fields/fields.pvd, points.csv, profiles/, "
      << "steps.csv, manifest.json)\n";
  out << "These results come from a linear poroelastic model; they must be reviewed by a "
         "qualified geotechnical engineer, and local codes and licensed practice "
         "govern.\n";
}

void write_manifest(const std::string& path,
                    const scenario::Scenario& s,
                    const model::Schedule& schedule,
                    const RunSummary& r,
                    const std::string& started,
                    MPI_Comm comm) {
  if (Utilities::MPI::this_mpi_process(comm) != 0)
    return;
  std::ofstream out(path);
  out << std::setprecision(10);
  out << "{\n  \"program\": " << json_string("settlewell")
      << ",\n  \"version\": " << json_string(version_string)
      << ",\n  \"input\": " << json_string(s.source_path)
      << ",\n  \"input_sha256\": " << json_string(sha256_of_file(s.source_path))
      << ",\n  \"title\": " << json_string(s.title)
      << ",\n  \"started\": " << json_string(started)
      << ",\n  \"finished\": " << json_string(utc_now())
      << ",\n  \"wall_time_s\": " << r.wall_seconds
      << ",\n  \"processes\": " << Utilities::MPI::n_mpi_processes(comm)
      << ",\n  \"cells\": " << r.cells << ",\n  \"unknowns\": " << r.dofs
      << ",\n  \"steps\": " << r.steps
      << ",\n  \"time_unit\": \"days\",\n  \"stages\": [";
  for (std::size_t k = 0; k < schedule.stages().size(); ++k) {
    const auto& st = schedule.stages()[k];
    std::size_t n = 0;
    for (const double t : schedule.step_times())
      n += t > st.start && t <= st.end;
    out << (k ? "," : "") << "\n    {\"name\": " << json_string(st.name)
        << ", \"start\": " << units::to_days(st.start)
        << ", \"end\": " << units::to_days(st.end)
        << ", \"ramp_end\": " << units::to_days(st.ramp_end) << ", \"steps\": " << n
        << "}";
  }
  out << "\n  ]\n}\n";
}

} // namespace settlewell
