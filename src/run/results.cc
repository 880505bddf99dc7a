// The run's own part of results.toml, the summary read back from the results, the
// closing lines a run prints and manifest.json.
#include "results.h"

#include "settlewell/core/file_writing.h"
#include "settlewell/core/number_text.h"
#include "settlewell/core/units.h"
#include "settlewell/core/version.h"
#include "settlewell/model/model_builder.h"
#include "settlewell/output/run_folder.h"
#include "settlewell/run/stop_request.h"
#include "settlewell/scenario/describe.h"

#include <deal.II/base/mpi.h>

#include <fstream>
#include <iomanip>
#include <ostream>

namespace settlewell {

using units::to_days;

namespace {

/// The inputs as the report shows them: materials, geometry, boundaries, stages.
toml::table inputs_table(const scenario::Scenario& s,
                         const Mesh& mesh,
                         const model::Schedule& schedule) {
  toml::array materials, boundaries, stages, geometry;
  for (const auto& [region, name] : model::region_materials(s, mesh)) {
    const auto& m = s.materials.at(name);
    toml::table row{{"region", region},
                    {"material", name},
                    {"unit_weight", m.unit_weight},
                    {"youngs_modulus_kPa", m.poroelastic.youngs_modulus},
                    {"poisson_ratio", m.poroelastic.poisson_ratio},
                    {"mv_per_kPa", 1.0 / m.poroelastic.constrained_modulus()},
                    {"kx", m.poroelastic.conductivity_x},
                    {"ky", m.poroelastic.conductivity_y},
                    {"k0", m.k0}};
    // A clay's E' and mv are only the iterative solver's reference stiffness.
    if (m.cam_clay)
      row.insert("cam_clay", m.cam_clay->summary());
    materials.push_back(std::move(row));
  }
  for (const auto& [name, role] : model::boundary_roles(s, mesh))
    boundaries.push_back(
        toml::table{{"name", name}, {"role", scenario::role_text(role)}});
  for (std::size_t k = 0; k < s.stages.size(); ++k)
    stages.push_back(
        toml::table{{"name", s.stages[k].name},
                    {"start_days", units::to_days(schedule.stages()[k].start)},
                    {"end_days", units::to_days(schedule.stages()[k].end)},
                    {"ramp_days", units::to_days(s.stages[k].ramp)},
                    {"changes", scenario::stage_changes(s.stages[k])}});
  for (const auto& line : scenario::geometry_lines(s))
    geometry.push_back(line);
  return toml::table{{"materials", materials},
                     {"boundaries", boundaries},
                     {"stages", stages},
                     {"geometry", geometry}};
}

} // namespace

toml::table run_results(const scenario::Scenario& s,
                        const Mesh& mesh,
                        const model::Schedule& schedule,
                        const RunSummary& size,
                        const std::string& started,
                        MPI_Comm comm) {
  toml::table root{
      {"program", "settlewell"},
      {"version", version_string},
      {"input", s.source_path},
      {"input_sha256", sha256_of_file(s.source_path)},
      {"started", started},
      {"finished", utc_now()},
      {"processes", int64_t(dealii::Utilities::MPI::n_mpi_processes(comm))},
      {"title", s.title},
      {"analysis",
       s.analysis == AnalysisType::axisymmetric ? "axisymmetric" : "plane_strain"},
      {"coupling", s.coupling == scenario::Coupling::flow_only ? "flow_only" : "biot"},
      {"cells", int64_t(size.cells)},
      {"unknowns", int64_t(size.dofs)},
      {"steps", int64_t(size.steps)},
      {"wall_time_s", size.wall_seconds}};
  root.insert("inputs", inputs_table(s, mesh, schedule));
  toml::array stages;
  for (const auto& st : schedule.stages())
    stages.push_back(toml::table{{"name", st.name},
                                 {"start_days", to_days(st.start)},
                                 {"end_days", to_days(st.end)}});
  root.insert("stages", stages);
  return root;
}

void read_summary(const toml::table& r, RunSummary& summary) {
  const auto sum = r["summary"];
  summary.settlement_anywhere = sum["settlement_anywhere_m"].value_or(0.0);
  summary.drawdown_anywhere = sum["drawdown_anywhere_m"].value_or(0.0);
  summary.settlement_inside = sum["settlement_inside_m"].value<double>();
  summary.floor_heave = sum["floor_heave_m"].value<double>();
  summary.settlement_outside = sum["settlement_outside_m"].value<double>();
  summary.drawdown_outside = sum["drawdown_outside_m"].value<double>();
  summary.modelled_half = r["modelled_half"].value_or(false);
  summary.flow_only = r["coupling"].value_or(std::string()) == "flow_only";
  summary.suction_largest = sum["suction_largest_kPa"].value_or(0.0);
  summary.suction_steps_over =
      std::size_t(sum["steps_over_suction_limit"].value_or(int64_t(0)));
  for (const char* key :
       {"settlement_inside", "floor_heave", "settlement_outside", "settlement_anywhere",
        "drawdown_outside", "drawdown_anywhere", "suction_largest"})
    if (const auto* at = sum[std::string(key) + "_at"].as_table())
      summary.where[key] = place_text(
          (*at)["x_m"].value_or(0.0), (*at)["y_m"].value_or(0.0),
          (*at)["region"].value_or(std::string()), (*at)["time_days"].value_or(0.0));
  summary.head_rise_limit = r["head_rise"]["limit_m"].value_or(0.0);
  if (const auto* stages = r["head_rise"]["stages"].as_array())
    for (const auto& node : *stages) {
      const auto& stage = *node.as_table();
      summary.head_rise_steps_over +=
          std::size_t(stage["steps_over_limit"].value_or(int64_t(0)));
      const double rise = stage["largest_rise_m"].value_or(0.0);
      const auto* at = stage["largest_rise_at"].as_table();
      if (rise <= summary.head_rise_largest || at == nullptr)
        continue;
      summary.head_rise_largest = rise;
      summary.where["head_rise"] =
          place_text((*at)["x_m"].value_or(0.0), (*at)["y_m"].value_or(0.0),
                     (*at)["region"].value_or(std::string()),
                     (*at)["time_days"].value_or(0.0)) +
          " in stage '" + stage["stage"].value_or(std::string()) + "'";
    }
  if (const auto* lines = r["discharge"].as_array())
    for (const auto& node : *lines) {
      const auto& line = *node.as_table();
      const std::string label(line["line"].value_or(std::string_view()));
      summary.pumped_volume[label] = line["volume_m3"].value_or(0.0);
      const RunSummary::LineNotes notes{
          line["recharge"].value_or(false),
          std::size_t(line["steps_injecting"].value_or(int64_t(0))),
          std::size_t(line["steps_stopped"].value_or(int64_t(0))),
          std::size_t(line["steps_dry"].value_or(int64_t(0)))};
      if (notes.injecting + notes.stopped + notes.dry > 0)
        summary.line_notes[label] = notes;
      summary.final_discharge[label] =
          line["final_m3_per_day"].value_or(0.0) / units::seconds_per_day;
      auto& per_stage = summary.stage_volume[label];
      for (const auto& v : *line["stage_volumes_m3"].as_array())
        per_stage.push_back(v.value_or(0.0));
    }
  if (const auto* rows = r["well_levels"].as_array())
    for (const auto& node : *rows) {
      const auto& w = *node.as_table();
      summary.well_levels.push_back({w["well"].value_or(std::string()),
                                     w["level_at_end_m"].value_or(0.0),
                                     w["row_head_at_end_m"].value_or(0.0)});
    }
  if (const auto* sources = r["water_budget"]["sources"].as_array())
    for (const auto& node : *sources) {
      const auto& src = *node.as_table();
      summary.water_sources.emplace_back(src["name"].value_or(std::string()),
                                         src["share_of_pumped_volume"].value_or(0.0));
    }
  summary.drained_from_pores = r["water_budget"]["drained_from_pores_m3"].value<double>();
  summary.mass_balance = r["water_balance"]["largest_relative_error"].value_or(0.0);
  summary.mass_balance_tolerance = r["water_balance"]["tolerance"].value_or(0.0);
  summary.mass_balance_steps_off =
      std::size_t(r["water_balance"]["steps_over_tolerance"].value_or(int64_t(0)));
  summary.one_way_unsettled_steps =
      std::size_t(r["water_balance"]["steps_one_way_unsettled"].value_or(int64_t(0)));
  summary.held_feeding_steps =
      std::size_t(r["water_balance"]["steps_held_points_feeding"].value_or(int64_t(0)));
  summary.held_inflow_share =
      r["water_balance"]["largest_held_inflow_share"].value_or(0.0);
  summary.largest_movement = r["plausibility"]["largest_movement_m"].value_or(0.0);
  summary.movement_limit = r["plausibility"]["movement_limit_m"].value_or(0.0);
  summary.movement_steps_over =
      std::size_t(r["plausibility"]["steps_over_movement_limit"].value_or(int64_t(0)));
}

void print_summary(std::ostream& out, const RunSummary& r, const scenario::Scenario& s) {
  const bool per_metre = s.analysis == AnalysisType::plane_strain;
  out << std::fixed;
  out << "Run finished: " << r.steps << " steps, " << r.cells << " cells, " << r.dofs
      << " unknowns, " << std::setprecision(1) << r.wall_seconds << " s wall time\n";
  const auto where = [&](const char* key) {
    const auto it = r.where.find(key);
    return it == r.where.end() ? std::string() : " " + it->second;
  };
  const auto mm = [](double m) { return significant(1000 * m) + " mm"; };
  if (r.flow_only)
    out << "  flow only (coupling = \"flow_only\"): heads and discharges, no movement "
           "computed\n";
  if (r.settlement_inside && !r.flow_only)
    out << "  largest settlement inside the wall (pit surface"
        << (r.floor_heave ? ", until dug): " : "): ") << mm(*r.settlement_inside)
        << where("settlement_inside") << "\n";
  if (r.floor_heave && !r.flow_only)
    out << "  largest heave inside the wall (ground left in the pit, since the start): "
        << mm(*r.floor_heave) << where("floor_heave") << "\n";
  if (r.settlement_outside && !r.flow_only)
    out << "  largest settlement outside the wall (ground surface): "
        << mm(*r.settlement_outside) << where("settlement_outside") << "\n";
  if (!r.settlement_inside && !r.flow_only)
    out << "  largest settlement: " << mm(r.settlement_anywhere)
        << where("settlement_anywhere") << "\n";
  if (r.drawdown_outside)
    out << "  largest drawdown outside the wall: " << significant(*r.drawdown_outside)
        << " m" << where("drawdown_outside") << "\n";
  else
    out << "  largest drawdown: " << significant(r.drawdown_anywhere) << " m"
        << where("drawdown_anywhere") << "\n";
  const bool half = r.modelled_half;
  const auto volume_text = [&](double v) {
    return significant(v) + (per_metre ? " m3 per metre run" : " m3") +
           (half ? " in the modelled half (" + significant(2 * v) + " for the whole pit)"
                 : "");
  };
  double total = 0.0;
  for (const auto& [label, volume] : r.pumped_volume) {
    out << "  pumped volume, " << label << ": " << volume_text(volume) << "\n";
    total += volume;
  }
  if (r.pumped_volume.size() > 1)
    out << "  pumped volume, total: " << volume_text(total) << "\n";
  for (const auto& w : r.well_levels)
    out << "  water level in a well of " << w.well
        << " at the end: " << significant(w.level) << " m (the row's average head "
        << significant(w.row_head) << " m; convergence loss of the row, Muskat 1937)\n";
  if (total > 0.0 && !r.water_sources.empty()) {
    out << "  the pumped water came from:";
    for (std::size_t i = 0; i < r.water_sources.size(); ++i)
      out << (i == 0 ? " " : ", ") << r.water_sources[i].first << " "
          << significant(100 * r.water_sources[i].second, 2) << " %";
    if (r.drained_from_pores)
      out << " (" << significant(*r.drained_from_pores)
          << " m3 of it drained from the pores above the phreatic line)";
    out << "\n";
  }
  if (r.one_way_unsettled_steps > 0)
    out << "  lines that take water only: " << r.one_way_unsettled_steps << " of "
        << r.steps << " steps kept their last solve before it settled which points "
        << "drain; see steps.csv drain_rounds\n";
  if (r.held_feeding_steps > 0)
    out << "  lines that take water only: in " << r.held_feeding_steps << " of "
        << r.steps << " steps points kept held took in more than 1 % of what the "
        << "lines let out (largest " << significant(100 * r.held_inflow_share)
        << " %): a seepage face's exit point unresolved; the discharge is too low\n";
  if (r.mass_balance_steps_off > 0)
    out << "  water balance: " << r.mass_balance_steps_off << " of " << r.steps
        << " steps off by more than " << std::defaultfloat << r.mass_balance_tolerance
        << " (worst " << r.mass_balance << "); see steps.csv\n"
        << std::fixed;
  for (const auto& [label, n] : r.line_notes) {
    const std::string of = " of " + std::to_string(r.steps) + " steps";
    if (n.injecting > 0)
      out << "  " << label << (n.recharge ? " (a recharge well)" : "")
          << " put water into the ground in " << n.injecting << of << "\n";
    if (n.stopped > 0)
      out << "  " << label << " stood stopped, sealed, because it would have put "
          << "water into the ground (its held head above the ground's) in " << n.stopped
          << of << "\n";
    if (n.dry > 0)
      out << "  " << label << " ran dry (its target head below its screen) in " << n.dry
          << of << "\n";
  }
  if (r.suction_steps_over > 0) {
    const auto at = r.where.find("suction_largest");
    out << "  suction: " << r.suction_steps_over << " of " << r.steps
        << " steps hold soil saturated beyond its air-entry suction (largest suction "
        << significant(r.suction_largest) << " kPa"
        << (at != r.where.end() ? " " + at->second : std::string()) << ")\n";
  }
  if (r.head_rise_steps_over > 0) {
    const auto at = r.where.find("head_rise");
    out << "  heads: " << r.head_rise_steps_over << " of " << r.steps
        << " steps raise a head in permeable soil more than "
        << significant(r.head_rise_limit)
        << " m in a stage that only lowers heads (largest "
        << significant(r.head_rise_largest) << " m"
        << (at != r.where.end() ? " " + at->second : std::string())
        << "): check what feeds it (a boundary's head, a recharge)\n";
  }
  if (r.movement_steps_over > 0)
    out << "  movement: " << r.movement_steps_over << " of " << r.steps
        << " steps move the ground more than " << std::defaultfloat << r.movement_limit
        << " m, 5 % of the model's height (largest " << r.largest_movement
        << " m): beyond the small strains the model assumes\n"
        << std::fixed;
  out << "  results: " << r.run_directory
      << " (fields/fields.pvd, points.csv, profiles/, "
      << "steps.csv, manifest.json)\n";
  out << "These results come from a poroelastic model (linear-elastic skeletons; "
         "Modified Cam Clay for materials with model = \"cam_clay\"; unsaturated flow "
         "with Bishop's stress for materials with a retention curve); they must be "
         "reviewed by a qualified geotechnical engineer, and local codes and licensed "
         "practice govern.\n";
}

void write_manifest(const std::string& path,
                    const scenario::Scenario& s,
                    const model::Schedule& schedule,
                    const RunSummary& r,
                    const std::string& started,
                    const std::map<std::string, double>& wall_time_by_part,
                    MPI_Comm comm) {
  if (dealii::Utilities::MPI::this_mpi_process(comm) != 0)
    return;
  toml::array stages;
  for (const auto& st : schedule.stages()) {
    std::size_t n = 0;
    for (const double t : schedule.step_times())
      n += t > st.start && t <= st.end;
    stages.push_back(toml::table{{"name", st.name},
                                 {"start", to_days(st.start)},
                                 {"end", to_days(st.end)},
                                 {"ramp_end", to_days(st.ramp_end)},
                                 {"steps", int64_t(n)}});
  }
  toml::table parts;
  for (const auto& [part, seconds] : wall_time_by_part)
    parts.insert(part, seconds);
  toml::table manifest{
      {"program", "settlewell"},
      {"kind", "run"},
      {"state", r.stopped_by != 0 ? "stopped" : "finished"},
      {"version", version_string},
      {"input", s.source_path},
      {"input_sha256", sha256_of_file(s.source_path)},
      {"title", s.title},
      {"started", started},
      {"finished", utc_now()},
      {"wall_time_s", r.wall_seconds},
      {"wall_time_by_part_s", parts},
      {"processes", int64_t(dealii::Utilities::MPI::n_mpi_processes(comm))},
      {"cells", int64_t(r.cells)},
      {"unknowns", int64_t(r.dofs)},
      {"steps", int64_t(r.steps)},
      {"time_unit", "days"},
      {"stages", stages}};
  if (r.stopped_by != 0) {
    manifest.insert("stopped_by", signal_name(r.stopped_by));
    manifest.insert("stopped_at_days", to_days(r.stopped_at));
    manifest.insert("steps_planned", int64_t(r.steps_planned));
  }
  write_whole_file(
      path, [&](std::ostream& out) { out << toml::json_formatter{manifest} << '\n'; });
}

} // namespace settlewell
