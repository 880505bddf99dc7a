#include "settlewell/commands/check.h"

#include "settlewell/core/errors.h"
#include "settlewell/core/number_text.h"
#include "settlewell/core/units.h"
#include "settlewell/mesh/gmsh_mesh.h"
#include "settlewell/model/initial_state.h"
#include "settlewell/model/model_builder.h"
#include "settlewell/model/schedule.h"
#include "settlewell/physics/resolved_conditions.h"
#include "settlewell/scenario/describe.h"

#include <deal.II/base/mpi.h>
#include <deal.II/base/mpi_remote_point_evaluation.h>
#include <deal.II/fe/mapping_q1.h>

#include <cmath>
#include <iomanip>
#include <ostream>
#include <sstream>

namespace settlewell {

using namespace dealii;
using scenario::role_text;

namespace {

std::string days_text(double seconds) {
  std::ostringstream os;
  os << std::setprecision(6) << units::to_days(seconds);
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
    out << "; " << scenario::stage_changes(st);
    out << '\n';
  }
}

/// The storage terms a material's pore-pressure equation uses, and where they
/// came from.
std::string storage_text(const scenario::Material& m, double gamma_w) {
  std::ostringstream os;
  const auto& p = m.poroelastic;
  os << "Biot alpha " << p.biot_alpha;
  if (p.storage == 0.0 && !m.storage_from) {
    os << ", S 0: water and grains incompressible (give porosity for the water's "
          "storage)";
    return os.str();
  }
  os << ", S " << p.storage << " 1/kPa (specific storage " << gamma_w * p.storage
     << " 1/m)";
  if (!m.storage_from) {
    os << " as given";
    return os.str();
  }
  os << " from porosity " << m.storage_from->porosity << ", Kw "
     << m.storage_from->water_bulk_modulus << " kPa, Ks ";
  if (m.storage_from->grain_bulk_modulus > 0.0)
    os << m.storage_from->grain_bulk_modulus << " kPa";
  else
    os << "infinite (incompressible grains)";
  return os.str();
}

/// How a soil with a retention curve drains above the water table.
std::string retention_text(const RetentionCurve& c) {
  std::ostringstream os;
  const bool gardner = c.model == RetentionCurve::Model::gardner;
  os << "drains along "
     << (gardner ? "Gardner's (1958) exponential curve"
                 : "van Genuchten's (1980) curve with Mualem's conductivity")
     << ", a " << c.alpha << " 1/m";
  if (!gardner)
    os << ", n " << c.n;
  os << ", theta_s " << c.saturated_content << ", theta_r " << c.residual_content
     << "; at 1 m of suction S_r " << significant(c.at(-1.0).saturation) << ", k_r "
     << significant(c.at(-1.0).conductivity);
  return os.str();
}

/// What a cam_clay material's skeleton uses, converted from the user's terms.
std::string clay_text(const scenario::Material::CamClay& c) {
  std::ostringstream os;
  const auto& m = c.parameters;
  os << "Modified Cam Clay from Cc " << c.compression_index << ", Cr "
     << c.recompression_index << ", e0 " << c.void_ratio << ", phi'cs "
     << c.friction_angle << " degrees: lambda " << m.lambda << ", kappa " << m.kappa
     << " (C / ln 10), v0 " << m.specific_volume << ", M " << m.critical_state_slope
     << ", K0nc " << 1.0 - std::sin(c.friction_angle * units::pi / 180.0)
     << " (Jaky 1944) on the past loading; preconsolidation " << c.past_text();
  if (c.permeability_change_index > 0.0)
    os << "; conductivity k0 10^((e - e0)/Ck) with Ck " << c.permeability_change_index
       << " (Taylor 1948), the k above being k0";
  os << "; the E' above is only the iterative solver's preconditioner's";
  return os.str();
}

void describe_scenario(const scenario::Scenario& s,
                       const Mesh& mesh,
                       const model::Schedule& schedule,
                       std::ostream& out) {
  out << "Scenario: " << (s.title.empty() ? std::string("(untitled)") : s.title) << " ("
      << s.source_path << ")\n";
  out << "Analysis: "
      << (s.analysis == AnalysisType::axisymmetric ? "axisymmetric (r = x, z = y)"
                                                   : "plane strain (per metre run)")
      << ", unit weight of water " << s.gamma_w << " kN/m3"
      << (s.coupling == scenario::Coupling::flow_only
              ? "; flow only (the skeleton held rigid: no movement computed)"
              : "")
      << "\n";
  out << "Regions (material):\n";
  for (const auto& [region, material] : model::region_materials(s, mesh)) {
    const auto& m = s.materials.at(material);
    out << "  " << region << " (" << material << "): E' " << m.poroelastic.youngs_modulus
        << " kPa, nu' " << m.poroelastic.poisson_ratio << ", kx "
        << m.poroelastic.conductivity_x << " m/s, ky " << m.poroelastic.conductivity_y
        << " m/s, unit weight " << m.unit_weight << " kN/m3, K0 " << m.k0 << '\n'
        << "    storage: " << storage_text(m, s.gamma_w) << '\n';
    if (m.cam_clay)
      out << "    skeleton: " << clay_text(*m.cam_clay) << '\n';
    if (m.retention)
      out << "    above the water table: " << retention_text(*m.retention) << '\n';
  }
  out << "Boundaries:\n";
  for (const auto& [name, role] : model::boundary_roles(s, mesh)) {
    out << "  " << name << ": " << role_text(role);
    const auto spec = s.boundaries.find(name);
    if (spec != s.boundaries.end() && spec->second.part)
      out << "; part of " << spec->second.part->of << ", its faces at "
          << boundary_extent(mesh, name).text();
    out << '\n';
  }
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

/// Every monitoring point must lie in the mesh (deal.II's remote point evaluation
/// finds it on whichever process owns it).
void check_output_points(const scenario::Scenario& s, const Mesh& mesh) {
  std::vector<Point<2>> points;
  for (const auto& p : s.output.points)
    points.emplace_back(p.x, p.y);
  Utilities::MPI::RemotePointEvaluation<2> locate;
  locate.reinit(points, *mesh.triangulation, MappingQ1<2>());
  for (std::size_t i = 0; i < points.size(); ++i)
    if (!locate.point_found(i))
      throw InputError(s.location_of("output") + ": output.points '" +
                       s.output.points[i].name + "' lies outside the mesh");
}

} // namespace

void check_scenario(const scenario::Scenario& s, MPI_Comm comm, std::ostream& out) {
  const Mesh mesh = make_scenario_mesh(s, comm);
  const model::InitialState initial(s, mesh);
  const model::Schedule schedule(s);
  const model::Model m = model::build_model(s, mesh, initial, schedule);
  (void)resolve_conditions(m.setup, mesh); // names and conflicts
  for (const auto& [region, material] : m.setup.materials)
    material.validate("material of region '" + region + "'");
  check_output_points(s, mesh);
  if (Utilities::MPI::this_mpi_process(comm) == 0) {
    describe_scenario(s, mesh, schedule, out);
    for (const auto& advice : scenario::advisories(s))
      out << "Warning: " << advice << ".\n";
    out << "The scenario is valid.\n";
  }
}

} // namespace settlewell
