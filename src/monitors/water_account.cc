#include "water_account.h"

#include "settlewell/core/number_text.h"
#include "settlewell/core/units.h"
#include "settlewell/mesh/gmsh_mesh.h"

#include <deal.II/base/conditional_ostream.h>
#include <deal.II/base/mpi.h>

#include <cmath>
#include <iostream>

namespace settlewell::monitors {

namespace {

/// The boundaries that stand for the ground beyond the model (a section's far
/// boundary, a box's sides) and the parts of them.
std::set<std::string> lateral_edges(const scenario::Scenario& s) {
  std::set<std::string> edges;
  if (s.section)
    edges.insert(section_names::far_boundary);
  if (s.box)
    edges.insert({"left", "right"});
  for (const auto& name : s.boundary_parts_parents_first()) // parents come first
    if (edges.count(s.boundaries.at(name).part->of))
      edges.insert(name);
  return edges;
}

/// A warning on the first process's standard error.
void warn(const RunView& view, const std::string& text) {
  dealii::ConditionalOStream(std::cerr,
                             dealii::Utilities::MPI::this_mpi_process(view.comm()) == 0)
      << "settlewell: warning: at day " << units::to_days(view.time()) << " " << text
      << " (the run's last lines count such steps)\n";
}

double share(double part, double whole) {
  return whole > 0.0 ? part / whole : 0.0;
}

} // namespace

WaterAccount::WaterAccount(const RunContext& run)
    : pumped_(run.model.pumped)
    , tolerance_(run.scenario.limits.mass_balance) {
  for (const auto& p : pumped_) {
    volume_[p.label] = 0.0;
    line_steps_[p.label] = {};
    stage_volume_[p.label].assign(run.schedule.stages().size(), 0.0);
  }
  std::set<std::string> lines;
  for (const auto& c : run.problem.setup().conditions.hydraulic)
    lines.insert(c.boundary);
  for (const auto& p : pumped_)
    lines.erase(p.line);
  sources_.assign(lines.begin(), lines.end());
  for (const auto& edge : lateral_edges(run.scenario))
    if (lines.count(edge))
      far_.insert(edge);
  for (const auto& line : sources_)
    inflow_volume_[line] = final_inflow_[line] = 0.0;
}

std::vector<std::string> WaterAccount::step_columns() const {
  std::vector<std::string> columns;
  for (const auto& p : pumped_)
    columns.push_back("discharge_" + p.label + "_m3_per_day");
  for (const auto& line : sources_)
    columns.push_back("inflow_" + line + "_m3_per_day");
  columns.insert(columns.end(), {"net_outflow_m3_per_day", "storage_gain_m3",
                                 "water_balance_error_relative"});
  return columns;
}

std::vector<double> WaterAccount::after_step(const RunView& view) {
  const BiotProblem& problem = view.run.problem;
  const double dt = view.step.dt;
  std::vector<double> values;
  // Every line's outflow from one residual: the pumped lines', then the sources'.
  std::vector<std::string> lines;
  for (const auto& p : pumped_)
    if (!p.drained_surface)
      lines.push_back(p.line);
  lines.insert(lines.end(), sources_.begin(), sources_.end());
  const std::vector<double> outflow = problem.outflows(lines);
  std::size_t next = 0;
  std::vector<double> pumped_rates;
  for (const auto& p : pumped_) {
    const double q =
        p.drained_surface ? problem.drained_surface_outflow() : outflow[next++];
    pumped_rates.push_back(q);
    volume_[p.label] += q * dt;
    stage_volume_[p.label][view.stage()] += q * dt;
    final_discharge_[p.label] = q;
    values.push_back(q * units::seconds_per_day);
  }
  for (const auto& line : sources_) {
    const double q_in = -outflow[next++];
    inflow_volume_[line] += q_in * dt;
    final_inflow_[line] = q_in;
    values.push_back(q_in * units::seconds_per_day);
  }
  // Water balance of the step: what left plus what was stored must vanish, relative
  // to the water that moved: in plus out through the boundaries, and the storage
  // change of every cell whatever its sign, in this step or in the run's largest
  // step so far. With net values as the scale, a steady through-flow would turn
  // round-off into a large relative error; with this step's alone, so would the
  // round-off of a model that has come to rest.
  const auto exchange = problem.water_exchange();
  const double net_outflow = exchange.net_outflow;
  const double out = net_outflow * dt;
  // The storage change of the step's last sub-step, as a rate over the step (like
  // the discharges).
  const auto storage = problem.storage_change();
  const double to_step = view.step.last_dt > 0.0 ? dt / view.step.last_dt : 1.0;
  const double stored = to_step * storage.net;
  storage_release_ -= stored;
  final_storage_release_ = -stored / dt;
  largest_moved_ =
      std::max({largest_moved_, exchange.gross * dt, to_step * storage.gross});
  const double scale = std::max(largest_moved_, 1e-30);
  const double error = std::abs(out + stored) / scale;
  worst_balance_ = std::max(worst_balance_, error);
  if (error > tolerance_ && steps_off_++ == 0)
    dealii::ConditionalOStream(std::cerr,
                               dealii::Utilities::MPI::this_mpi_process(view.comm()) == 0)
        << "settlewell: warning: the water balance of step at day "
        << units::to_days(view.time()) << " is off by " << error
        << " (relative); see steps.csv (the run's last lines count such steps)\n";
  // A point kept held because it would leave and come back takes in a little water
  // where the exit point falls between nodes; a hundredth of what the lines let
  // out is more than that (a chosen bound, not a published one): the held points
  // then feed the ground, as a seepage face in drained soil can.
  constexpr double held_inflow_limit = 0.01;
  largest_held_inflow_ = std::max(largest_held_inflow_, view.step.held_inflow_share);
  if (view.step.held_inflow_share > held_inflow_limit && held_inflow_steps_++ == 0)
    warn(view, "points of the lines that take water only, kept held for the step "
               "because they would leave and come back, took in " +
                   significant(100 * view.step.held_inflow_share) +
                   " % of the water the lines let out: the exit point of a seepage "
                   "face (in drained soil, above a well's water) is not resolved "
                   "there and the face feeds the ground; the discharge is too low");
  if (!view.step.drains_settled && unsettled_steps_++ == 0)
    warn(view, "the lines that take water only (wells, seepage faces, the dug "
               "surface) had not settled which of their points drain after " +
                   std::to_string(view.step.drain_rounds) +
                   " solves; the step keeps the last (steps.csv drain_rounds)");
  for (std::size_t i = 0; i < pumped_.size(); ++i) {
    note_injection(view, pumped_[i], pumped_rates[i]);
    if (!pumped_[i].drained_surface)
      note_one_way(view, pumped_[i]);
  }
  values.insert(values.end(), {net_outflow * units::seconds_per_day, stored, error});
  return values;
}

void WaterAccount::note_injection(const RunView& view,
                                  const model::PumpedLine& line,
                                  double q) {
  // Water put into the ground: more than round-off of the largest step's
  // exchange (a line held at the head around it passes about nothing either way).
  // A recharge well is meant to; any other line does only by a discharge target
  // below zero.
  if (!(-q * view.step.dt > 1e-6 * largest_moved_) ||
      line_steps_[line.label].injecting++ > 0 || line.recharge)
    return;
  warn(view, "'" + line.label + "' puts water into the ground (" +
                 significant(-q * units::seconds_per_day) + " m3/day)");
}

void WaterAccount::note_one_way(const RunView& view, const model::PumpedLine& line) {
  const auto state = view.run.problem.one_way_state(line.line);
  auto& steps = line_steps_[line.label];
  if (state.stopped && steps.stopped++ == 0)
    warn(view, "'" + line.label +
                   "' would put water into the ground: its held head is above the "
                   "ground's around it, so its pump stands and it is sealed (only a "
                   "recharge well, section.wells[].recharge, injects)");
  // A held excavation level at its own elevation is a drain at atmospheric
  // pressure, not a well run dry.
  if (state.dry && line.label != section_names::excavation_level && steps.dry++ == 0)
    warn(view, "'" + line.label +
                   "' has run dry: its target head is at or below its screen, which "
                   "drains at atmospheric pressure");
}

void WaterAccount::finish(const RunView& view, toml::table& results) {
  toml::array discharge;
  for (const auto& p : pumped_) {
    toml::array per_stage;
    for (const double v : stage_volume_.at(p.label))
      per_stage.push_back(v);
    const auto q = final_discharge_.find(p.label);
    discharge.push_back(toml::table{
        {"line", p.label},
        {"final_m3_per_day",
         q != final_discharge_.end() ? q->second * units::seconds_per_day : 0.0},
        {"volume_m3", volume_.at(p.label)},
        {"stage_volumes_m3", per_stage},
        {"recharge", p.recharge},
        {"steps_injecting", int64_t(line_steps_.at(p.label).injecting)},
        {"steps_stopped", int64_t(line_steps_.at(p.label).stopped)},
        {"steps_dry", int64_t(line_steps_.at(p.label).dry)}});
  }
  results.insert("discharge", discharge);
  results.insert("discharge_unit",
                 view.run.scenario.analysis == AnalysisType::axisymmetric
                     ? "per well"
                     : "per metre run");
  // A half model (symmetry line at x = 0) pumps half of what the whole pit pumps:
  // the report and the summary give both.
  const auto& sc = view.run.scenario;
  results.insert("modelled_half", sc.analysis == AnalysisType::plane_strain &&
                                      sc.section && sc.section->half_model);
  write_budget(view, results);
  results.insert("water_balance",
                 toml::table{{"largest_relative_error", worst_balance_},
                             {"tolerance", tolerance_},
                             {"steps_over_tolerance", int64_t(steps_off_)},
                             {"steps_one_way_unsettled", int64_t(unsettled_steps_)},
                             {"steps_held_points_feeding", int64_t(held_inflow_steps_)},
                             {"largest_held_inflow_share", largest_held_inflow_},
                             {"closes", worst_balance_ <= tolerance_}});
}

/// Where the pumped water came from, over the run and at its end: the inflow through
/// each line that holds a head or a flux, and the water released from storage, each
/// as a share of what was pumped; a warning when the model's lateral edges supply
/// most of it (their fixed head then feeds the pit, and the distance to them
/// matters).
void WaterAccount::write_budget(const RunView& view, toml::table& results) const {
  double pumped = 0.0, pumped_rate = 0.0;
  for (const auto& p : pumped_) {
    pumped += volume_.at(p.label);
    const auto q = final_discharge_.find(p.label);
    pumped_rate += q != final_discharge_.end() ? q->second : 0.0;
  }
  toml::array sources;
  double from_edges = 0.0;
  auto add = [&](const std::string& name, const std::string& kind, double volume,
                 double rate) {
    sources.push_back(
        toml::table{{"name", name},
                    {"kind", kind},
                    {"volume_m3", volume},
                    {"share_of_pumped_volume", share(volume, pumped)},
                    {"final_m3_per_day", rate * units::seconds_per_day},
                    {"share_of_final_discharge", share(rate, pumped_rate)}});
  };
  for (const auto& line : sources_) {
    const bool edge = far_.count(line) != 0;
    add(line, edge ? "lateral edge" : "boundary or line", inflow_volume_.at(line),
        final_inflow_.at(line));
    if (edge)
      from_edges += inflow_volume_.at(line);
  }
  add("storage", "storage", storage_release_, final_storage_release_);
  toml::table budget{{"pumped_volume_m3", pumped},
                     {"final_discharge_m3_per_day", pumped_rate * units::seconds_per_day},
                     {"sources", sources},
                     {"share_from_lateral_edges", share(from_edges, pumped)}};
  if (!view.run.problem.setup().unsaturated.empty()) // part of the storage's share
    budget.insert("drained_from_pores_m3", view.run.problem.water_drained_from_pores());
  if (share(from_edges, pumped) > 0.5) {
    const std::string warning =
        "the model's lateral edges (held at a fixed head) supply " +
        std::to_string(std::lround(100 * share(from_edges, pumped))) +
        " % of the pumped water: the distance to them sets the discharge and the "
        "drawdown outside the wall; unless they stand for a real source (a river, a "
        "lake), run again with them farther away" +
        std::string(view.run.scenario.section ? " (section.far_distance)" : "") +
        " and compare";
    budget.insert("warning", warning);
    dealii::ConditionalOStream(std::cerr,
                               dealii::Utilities::MPI::this_mpi_process(view.comm()) == 0)
        << "settlewell: warning: " << warning << "\n";
  }
  results.insert("water_budget", budget);
}

void WaterAccount::visit_state(StateArchive& a) {
  a.mark("water account 4");
  a& volume_& final_discharge_& stage_volume_& worst_balance_& largest_moved_& steps_off_;
  for (auto& [label, steps] : line_steps_)
    a& steps.injecting& steps.stopped& steps.dry;
  a& inflow_volume_& final_inflow_& storage_release_& final_storage_release_;
  a& unsettled_steps_& held_inflow_steps_& largest_held_inflow_;
}

} // namespace settlewell::monitors
