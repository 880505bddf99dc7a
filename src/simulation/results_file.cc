// results.toml and the 1D-against-2D tables: the run's answers in files that the
// report and the plotting scripts read.
#include "run_recorder.h"

#include "settlewell/core/units.h"
#include "settlewell/core/version.h"

#include <deal.II/base/mpi.h>

#include <toml++/toml.h>

#include <cmath>
#include <fstream>

namespace settlewell {

using units::to_days;

namespace {

/// TOML has no infinity that every reader takes; a factor with nothing driving
/// the failure is written as -1 and read as "not applicable".
double factor_value(double f) {
  return std::isfinite(f) ? f : -1.0;
}

/// A factor of safety over the output times: its least value, its value at the
/// end, and the first time after which it stays at or above its limit (the time
/// from which the base could be dug to the final level as far as this check goes).
toml::table factor_history(const std::vector<double>& times,
                           const std::vector<double>& factors,
                           double limit) {
  std::size_t worst = 0;
  for (std::size_t i = 1; i < factors.size(); ++i)
    if (factors[i] < factors[worst])
      worst = i;
  double holds_from = -1.0;
  for (std::size_t i = factors.size(); i-- > 0;) {
    if (factors[i] < limit)
      break;
    holds_from = to_days(times[i]);
  }
  return toml::table{{"least", factor_value(factors[worst])},
                     {"least_at_days", to_days(times[worst])},
                     {"at_end", factor_value(factors.back())},
                     {"limit", limit},
                     {"holds_from_days", holds_from}};
}

toml::table base_table(const checks::RunChecks& checks,
                       const scenario::CheckLimits& limits) {
  const auto& history = checks.base_stability();
  std::vector<double> times, piping;
  for (const auto& b : history)
    times.push_back(b.time), piping.push_back(b.piping_factor);
  const auto& last = history.back();
  toml::table t{{"piping", factor_history(times, piping, limits.piping_factor)},
                {"exit_gradient_at_end", last.exit_gradient},
                {"exit_x_at_end_m", last.exit_x},
                {"critical_gradient", last.critical_gradient}};
  // The history of the i-th entry of a per-time list (heave sides, uplift layers).
  auto history_of = [&](auto member, std::size_t i, double limit) {
    std::vector<double> f;
    for (const auto& b : history)
      f.push_back(((b.*member)[i]).factor);
    return factor_history(times, f, limit);
  };
  toml::array heave, uplift;
  for (std::size_t i = 0; i < last.heave.size(); ++i) {
    toml::table h = history_of(&checks::BaseStability::heave, i, limits.heave_factor);
    h.insert("side", last.heave[i].side);
    h.insert("depth_m", last.heave[i].depth);
    h.insert("mean_excess_head_at_end_m", last.heave[i].mean_excess_head);
    heave.push_back(h);
  }
  for (std::size_t i = 0; i < last.uplift.size(); ++i) {
    toml::table u = history_of(&checks::BaseStability::uplift, i, limits.uplift_factor);
    u.insert("layer", last.uplift[i].layer);
    u.insert("underside_m", last.uplift[i].underside);
    u.insert("overburden_kPa", last.uplift[i].overburden);
    u.insert("pore_pressure_at_end_kPa", last.uplift[i].pore_pressure);
    uplift.push_back(u);
  }
  t.insert("heave", heave);
  t.insert("uplift", uplift);
  return t;
}

toml::array neighbour_array(const checks::RunChecks& checks,
                            const scenario::Scenario& s) {
  toml::array out;
  for (const auto& spec : s.neighbours) {
    const checks::NeighbourState* w = nullptr;
    for (const auto& st : checks.neighbours())
      if (st.name == spec.name &&
          (w == nullptr || st.category.category > w->category.category ||
           (st.category.category == w->category.category &&
            st.principal_strain > w->principal_strain)))
        w = &st;
    double largest_settlement = 0.0, largest_distortion = 0.0;
    for (const auto& st : checks.neighbours())
      if (st.name == spec.name) {
        largest_settlement = std::max(largest_settlement, st.distortion.max_settlement);
        largest_distortion =
            std::max(largest_distortion, st.distortion.angular_distortion);
      }
    const auto& d = w->distortion;
    toml::table t{{"name", spec.name},
                  {"x_from_m", spec.x_from},
                  {"x_to_m", spec.x_to},
                  {"foundation_level_m", spec.foundation_level},
                  {"largest_settlement_m", largest_settlement},
                  {"largest_angular_distortion", largest_distortion},
                  {"time_days", to_days(w->time)},
                  {"max_settlement_m", d.max_settlement},
                  {"differential_m", d.differential},
                  {"tilt", d.tilt},
                  {"angular_distortion", d.angular_distortion},
                  {"deflection_ratio", d.deflection_ratio},
                  {"hogging", d.hogging},
                  {"horizontal_strain", d.horizontal_strain},
                  {"principal_strain", w->principal_strain},
                  {"category", w->category.category},
                  {"degree", w->category.degree},
                  {"crack_width", w->category.crack_width}};
    if (w->beam) {
      t.insert("beam_bending_strain", w->beam->bending);
      t.insert("beam_diagonal_strain", w->beam->diagonal);
    }
    out.push_back(t);
  }
  return out;
}

toml::table estimate_table(const checks::OneDEstimate& e, double ramp) {
  toml::array layers;
  for (const auto& l : e.layers) {
    toml::table t{{"name", l.name},
                  {"consolidating", l.consolidating},
                  {"settlement_m", l.settlement}};
    if (l.consolidating)
      t.insert_or_assign("drainage_path_m", l.drainage_path),
          t.insert_or_assign("drained_faces", l.drained_faces),
          t.insert_or_assign("cv_m2_per_year", l.cv * units::seconds_per_year),
          t.insert_or_assign("t50_days", to_days(l.t50)),
          t.insert_or_assign("t90_days", to_days(l.t90));
    layers.push_back(t);
  }
  return toml::table{{"ultimate_m", e.ultimate},
                     {"t50_days_instant", to_days(e.t50(0.0))},
                     {"t50_days_ramped", to_days(e.t50(ramp))},
                     {"layers", layers}};
}

/// The time the 2D curve first reaches half of its final value.
double half_time(const checks::ColumnComparison& c) {
  const double half = 0.5 * c.settlement_2d.back();
  for (std::size_t i = 1; i < c.times.size(); ++i)
    if (c.settlement_2d[i] >= half && c.settlement_2d[i - 1] < half) {
      const double w =
          (half - c.settlement_2d[i - 1]) / (c.settlement_2d[i] - c.settlement_2d[i - 1]);
      return c.times[i - 1] + w * (c.times[i] - c.times[i - 1]);
    }
  return 0.0;
}

toml::array column_array(const checks::RunChecks& checks) {
  toml::array out;
  for (const auto& c : checks.columns()) {
    const double end = c.times.back();
    const double s1d_end = c.computed.settlement_at(end, c.ramp);
    toml::array notes;
    for (const auto& n : c.notes)
      notes.push_back(n);
    toml::table t{{"name", c.name},
                  {"x_m", c.x},
                  {"ramp_days", to_days(c.ramp)},
                  {"end_days", to_days(end)},
                  {"settlement_2d_end_m", c.settlement_2d.back()},
                  {"settlement_1d_computed_end_m", s1d_end},
                  {"ratio_2d_to_1d_computed_end",
                   s1d_end > 0 ? c.settlement_2d.back() / s1d_end : 0.0},
                  {"t50_2d_days", to_days(half_time(c))},
                  {"t50_1d_days", to_days(c.computed.t50(c.ramp, s1d_end))},
                  {"computed", estimate_table(c.computed, c.ramp)},
                  {"notes", notes}};
    if (c.design_known) {
      const double design_end = c.design.settlement_at(end, c.ramp);
      t.insert("design", estimate_table(c.design, c.ramp));
      t.insert("settlement_1d_design_end_m", design_end);
      t.insert("ratio_2d_to_1d_design_end",
               design_end > 0 ? c.settlement_2d.back() / design_end : 0.0);
    }
    out.push_back(t);
  }
  return out;
}

} // namespace

void write_results(const std::string& path,
                   const RunContext& c,
                   const RunSummary& r,
                   const checks::RunChecks& checks) {
  if (dealii::Utilities::MPI::this_mpi_process(c.comm) != 0)
    return;
  toml::table root{
      {"program", "settlewell"},
      {"version", version_string},
      {"input", c.scenario.source_path},
      {"input_sha256", sha256_of_file(c.scenario.source_path)},
      {"started", c.started},
      {"finished", utc_now()},
      {"processes", int64_t(dealii::Utilities::MPI::n_mpi_processes(c.comm))},
      {"title", c.scenario.title},
      {"analysis", c.scenario.analysis == AnalysisType::axisymmetric ? "axisymmetric"
                                                                     : "plane_strain"},
      {"cells", int64_t(r.cells)},
      {"unknowns", int64_t(r.dofs)},
      {"steps", int64_t(r.steps)},
      {"wall_time_s", r.wall_seconds}};
  toml::table summary{{"settlement_anywhere_m", r.settlement_anywhere},
                      {"drawdown_anywhere_m", r.drawdown_anywhere}};
  if (r.settlement_inside)
    summary.insert("settlement_inside_m", *r.settlement_inside);
  if (r.settlement_outside)
    summary.insert("settlement_outside_m", *r.settlement_outside);
  if (r.drawdown_outside)
    summary.insert("drawdown_outside_m", *r.drawdown_outside);
  root.insert("summary", summary);
  root.insert("inputs", inputs_table(c.scenario, c.problem.mesh(), c.schedule));
  toml::array stages;
  for (const auto& st : c.schedule.stages())
    stages.push_back(toml::table{{"name", st.name},
                                 {"start_days", to_days(st.start)},
                                 {"end_days", to_days(st.end)}});
  root.insert("stages", stages);
  toml::array discharge;
  for (const auto& p : c.model.pumped) {
    toml::array per_stage;
    for (const double v : r.stage_volume.at(p.label))
      per_stage.push_back(v);
    discharge.push_back(toml::table{
        {"line", p.label},
        {"final_m3_per_day", r.final_discharge.count(p.label)
                                 ? r.final_discharge.at(p.label) * units::seconds_per_day
                                 : 0.0},
        {"volume_m3", r.pumped_volume.at(p.label)},
        {"stage_volumes_m3", per_stage}});
  }
  root.insert("discharge", discharge);
  root.insert("discharge_unit", c.scenario.analysis == AnalysisType::axisymmetric
                                    ? "per well"
                                    : "per metre run");
  root.insert("water_balance",
              toml::table{{"largest_relative_error", r.mass_balance},
                          {"tolerance", r.mass_balance_tolerance},
                          {"closes", r.mass_balance <= r.mass_balance_tolerance}});
  if (checks.has_base_checks() && !checks.base_stability().empty())
    root.insert("base_stability", base_table(checks, c.scenario.limits));
  if (!c.scenario.neighbours.empty())
    root.insert("neighbours", neighbour_array(checks, c.scenario));
  root.insert("neighbour_limits",
              toml::table{{"settlement_m", c.scenario.limits.settlement},
                          {"angular_distortion", c.scenario.limits.angular_distortion}});
  if (!checks.columns().empty())
    root.insert("columns", column_array(checks));
  std::ofstream(path) << root << '\n';
}

void write_column_tables(const std::string& folder,
                         const checks::RunChecks& checks,
                         MPI_Comm comm) {
  for (const auto& c : checks.columns()) {
    std::vector<std::string> header{"time_days", "settlement_2d_m",
                                    "settlement_1d_computed_instant_m",
                                    "settlement_1d_computed_ramped_m"};
    if (c.design_known)
      header.insert(header.end(),
                    {"settlement_1d_design_instant_m", "settlement_1d_design_ramped_m"});
    CsvFile table(folder + "/" + c.name + ".csv", header, comm);
    for (std::size_t i = 0; i < c.times.size(); ++i) {
      const double t = c.times[i];
      std::vector<double> row{to_days(t), c.settlement_2d[i],
                              c.computed.settlement_at(t, 0.0),
                              c.computed.settlement_at(t, c.ramp)};
      if (c.design_known)
        row.insert(row.end(),
                   {c.design.settlement_at(t, 0.0), c.design.settlement_at(t, c.ramp)});
      table.row(row);
    }
  }
}

} // namespace settlewell
