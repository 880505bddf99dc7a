#include "run_recorder.h"

#include "settlewell/core/units.h"

#include <deal.II/base/mpi.h>

#include <cmath>
#include <filesystem>
#include <iostream>

namespace settlewell {

using namespace dealii;

namespace {

bool is_root(MPI_Comm comm) {
  return Utilities::MPI::this_mpi_process(comm) == 0;
}

const std::vector<std::string> sample_columns{"head_m",
                                              "drawdown_m",
                                              "settlement_m",
                                              "ux_m",
                                              "excess_pore_pressure_kPa",
                                              "pore_pressure_kPa",
                                              "vertical_effective_stress_kPa"};

std::vector<double> sample_row(const SampleValues& v) {
  return {v.head,
          v.drawdown,
          v.settlement,
          v.ux,
          v.excess_pore_pressure,
          v.pore_pressure,
          v.vertical_effective_stress};
}

std::vector<std::string> with(std::vector<std::string> head,
                              const std::vector<std::string>& tail) {
  head.insert(head.end(), tail.begin(), tail.end());
  return head;
}

std::vector<std::string> step_header(const model::Model& model) {
  std::vector<std::string> h{"step",       "time_days",  "dt_days",         "stage",
                             "new_matrix", "assembly_s", "factorisation_s", "solve_s",
                             "iterations"};
  for (const auto& p : model.pumped)
    h.push_back("discharge_" + p.label + "_m3_per_day");
  h.push_back("net_outflow_m3_per_day");
  h.push_back("storage_gain_m3");
  h.push_back("water_balance_error_relative");
  return h;
}

std::vector<std::string> base_header(const checks::BaseStability& b) {
  std::vector<std::string> h{"time_days", "exit_gradient", "exit_x_m",
                             "critical_gradient", "piping_factor"};
  for (const auto& heave : b.heave) {
    h.push_back("heave_excess_head_" + heave.side + "_m");
    h.push_back("heave_factor_" + heave.side);
  }
  for (const auto& u : b.uplift) {
    h.push_back("uplift_pore_pressure_" + u.layer + "_kPa");
    h.push_back("uplift_factor_" + u.layer);
  }
  return h;
}

std::vector<double> base_row(const checks::BaseStability& b) {
  std::vector<double> row{units::to_days(b.time), b.exit_gradient, b.exit_x,
                          b.critical_gradient, b.piping_factor};
  for (const auto& heave : b.heave)
    row.insert(row.end(), {heave.mean_excess_head, heave.factor});
  for (const auto& u : b.uplift)
    row.insert(row.end(), {u.pore_pressure, u.factor});
  return row;
}

const std::vector<std::string> neighbour_header{
    "neighbour",        "time_days", "max_settlement_m",
    "differential_m",   "tilt",      "angular_distortion",
    "deflection_ratio", "hogging",   "horizontal_strain",
    "principal_strain", "category"};

} // namespace

InitialFields initial_fields(const model::InitialState& initial) {
  InitialFields f;
  f.head = [&initial](const Point<2>& x) { return initial.head(x); };
  f.head_gradient = [&initial](const Point<2>& x) { return initial.head_gradient(x); };
  f.effective_stress = [&initial](const Point<2>& x, types::material_id r) {
    return initial.effective_stress(x, r);
  };
  return f;
}

RunRecorder::RunRecorder(const RunContext& context, const std::string& folder)
    : c_(context)
    , folder_(folder)
    , fields_(folder + "/fields", "fields", context.comm, initial_fields(context.initial))
    , steps_(folder + "/steps.csv", step_header(context.model), context.comm)
    , points_(folder + "/points.csv",
              with({"time_days", "stage", "point", "x_m", "y_m"}, sample_columns),
              context.comm)
    , extremes_(context.problem, context.scenario)
    , checks_(
          context.problem,
          context.scenario,
          [&initial = context.initial](const Point<2>& x) { return initial.head(x); }) {
  if (is_root(c_.comm)) {
    std::filesystem::create_directories(folder + "/checks");
    std::filesystem::create_directories(folder + "/one_d");
  }
  MPI_Barrier(c_.comm);
  for (const auto& line : c_.scenario.output.lines)
    profiles_.emplace_back(
        folder + "/profiles/" + line.name + ".csv",
        with({"time_days", "distance_m", "x_m", "y_m"}, sample_columns), c_.comm);
  if (!c_.scenario.neighbours.empty())
    neighbour_table_ = std::make_unique<CsvFile>(folder + "/checks/neighbours.csv",
                                                 neighbour_header, c_.comm);
  for (const auto& p : c_.model.pumped) {
    partial_.pumped_volume[p.label] = 0.0;
    partial_.stage_volume[p.label].assign(c_.schedule.stages().size(), 0.0);
  }
  partial_.mass_balance_tolerance = c_.scenario.limits.mass_balance;
}

RunRecorder::~RunRecorder() = default;

void RunRecorder::write_samples(const std::string& stage) {
  const double t_days = units::to_days(c_.problem.time());
  const auto values = c_.points.evaluate(c_.problem, c_.derivation);
  for (std::size_t i = 0; i < values.size(); ++i) {
    const auto& p = c_.scenario.output.points[i];
    auto row = sample_row(values[i]);
    row.insert(row.begin(), {p.x, p.y});
    points_.row(row, {std::to_string(t_days), stage, p.name});
  }
}

void RunRecorder::write_output_time() {
  fields_.write(c_.problem);
  for (std::size_t l = 0; l < c_.lines.size(); ++l) {
    const auto values = c_.lines[l].evaluate(c_.problem, c_.derivation);
    const auto& pts = c_.lines[l].points();
    double distance = 0.0;
    for (std::size_t i = 0; i < values.size(); ++i) {
      if (i > 0)
        distance += pts[i].distance(pts[i - 1]);
      auto row = sample_row(values[i]);
      row.insert(row.begin(),
                 {units::to_days(c_.problem.time()), distance, pts[i][0], pts[i][1]});
      profiles_[l].row(row);
    }
  }
  checks_.evaluate(c_.problem, c_.derivation);
  if (checks_.has_base_checks()) {
    if (!base_table_)
      base_table_ = std::make_unique<CsvFile>(
          folder_ + "/checks/base_stability.csv",
          base_header(checks_.base_stability().back()), c_.comm);
    base_table_->row(base_row(checks_.base_stability().back()));
  }
  const std::size_t n = c_.scenario.neighbours.size();
  for (std::size_t i = checks_.neighbours().size() - n; i < checks_.neighbours().size();
       ++i) {
    const auto& st = checks_.neighbours()[i];
    const auto& d = st.distortion;
    neighbour_table_->row({units::to_days(st.time), d.max_settlement, d.differential,
                           d.tilt, d.angular_distortion, d.deflection_ratio,
                           d.hogging ? 1.0 : 0.0, d.horizontal_strain,
                           st.principal_strain, double(st.category.category)},
                          {st.name});
  }
}

void RunRecorder::start() {
  write_samples(c_.schedule.stages().front().name);
  write_output_time();
  checks_.record_columns(c_.problem, c_.derivation);
}

std::vector<double> RunRecorder::discharges_and_balance(const StepReport& report,
                                                        std::size_t stage) {
  std::vector<double> values;
  for (const auto& p : c_.model.pumped) {
    const double q = c_.problem.outflow(p.line);
    partial_.pumped_volume[p.label] += q * report.dt;
    partial_.stage_volume[p.label][stage] += q * report.dt;
    partial_.final_discharge[p.label] = q;
    values.push_back(q * units::seconds_per_day);
  }
  // Water balance of the step: what left plus what was stored must vanish.
  const double out = c_.problem.net_outflow() * report.dt;
  const double stored = c_.problem.storage_gain();
  const double scale = std::max({std::abs(out), std::abs(stored), 1e-30});
  const double error = std::abs(out + stored) / scale;
  partial_.mass_balance = std::max(partial_.mass_balance, error);
  if (error > c_.scenario.limits.mass_balance && !warned_balance_ && is_root(c_.comm)) {
    std::cerr << "settlewell: warning: the water balance of step at day "
              << units::to_days(report.time) << " is off by " << error
              << " (relative); see steps.csv\n";
    warned_balance_ = true;
  }
  values.insert(values.end(),
                {c_.problem.net_outflow() * units::seconds_per_day, stored, error});
  return values;
}

void RunRecorder::step(const StepReport& report, std::size_t number) {
  const std::size_t k = c_.schedule.stage_at(report.time);
  std::vector<double> row{double(number),
                          units::to_days(report.time),
                          units::to_days(report.dt),
                          double(k + 1),
                          report.new_matrix ? 1.0 : 0.0,
                          report.assembly_seconds,
                          report.factorisation_seconds,
                          report.solve_seconds,
                          double(report.iterations)};
  const auto more = discharges_and_balance(report, k);
  row.insert(row.end(), more.begin(), more.end());
  steps_.row(row);
  extremes_.update(c_.problem);
  write_samples(c_.schedule.stages()[k].name);
  checks_.record_columns(c_.problem, c_.derivation);
  if (c_.schedule.is_output_time(report.time))
    write_output_time();
}

void RunRecorder::finish(RunSummary& summary) {
  extremes_.fill(summary);
  summary.pumped_volume = partial_.pumped_volume;
  summary.stage_volume = partial_.stage_volume;
  summary.final_discharge = partial_.final_discharge;
  summary.mass_balance = partial_.mass_balance;
  summary.mass_balance_tolerance = partial_.mass_balance_tolerance;
  checks_.finish_columns(c_.problem, c_.derivation);
  write_column_tables(folder_ + "/one_d", checks_, c_.comm);
  write_results(folder_ + "/results.toml", c_, summary, checks_);
}

} // namespace settlewell
