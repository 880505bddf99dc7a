#include "settlewell/simulation/simulation.h"

#include "run_extremes.h"
#include "settlewell/core/errors.h"
#include "settlewell/core/units.h"
#include "settlewell/core/version.h"
#include "settlewell/mesh/gmsh_mesh.h"
#include "settlewell/model/initial_state.h"
#include "settlewell/model/model_builder.h"
#include "settlewell/model/schedule.h"
#include "settlewell/output/field_writer.h"
#include "settlewell/output/samples.h"
#include "settlewell/physics/biot_problem.h"
#include "settlewell/simulation/progress.h"
#include "settlewell/simulation/run_files.h"

#include <deal.II/base/mpi.h>

#include <chrono>
#include <filesystem>
#include <iomanip>
#include <iostream>

namespace settlewell {

using namespace dealii;

namespace {

bool is_root(MPI_Comm comm) {
  return Utilities::MPI::this_mpi_process(comm) == 0;
}

InitialFields initial_fields(const model::InitialState& initial) {
  InitialFields f;
  f.head = [&initial](const Point<2>& x) { return initial.head(x); };
  f.head_gradient = [&initial](const Point<2>& x) { return initial.head_gradient(x); };
  f.effective_stress = [&initial](const Point<2>& x, types::material_id r) {
    return initial.effective_stress(x, r);
  };
  return f;
}

std::vector<Point<2>> line_samples(const scenario::SectionLine& line) {
  // Evenly spaced along the polyline, ends included.
  std::vector<double> cumulative{0.0};
  for (std::size_t i = 1; i < line.points.size(); ++i) {
    const Point<2> a(line.points[i - 1].first, line.points[i - 1].second);
    const Point<2> b(line.points[i].first, line.points[i].second);
    cumulative.push_back(cumulative.back() + a.distance(b));
  }
  std::vector<Point<2>> samples;
  for (unsigned int k = 0; k < line.samples; ++k) {
    const double s = cumulative.back() * k / (line.samples - 1);
    std::size_t i = 1;
    while (i + 1 < cumulative.size() && cumulative[i] < s)
      ++i;
    const double w = cumulative[i] > cumulative[i - 1]
                         ? (s - cumulative[i - 1]) / (cumulative[i] - cumulative[i - 1])
                         : 0.0;
    samples.emplace_back((1 - w) * line.points[i - 1].first + w * line.points[i].first,
                         (1 - w) * line.points[i - 1].second + w * line.points[i].second);
  }
  return samples;
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

} // namespace

struct Simulation::Impl {
  Impl(scenario::Scenario s, MPI_Comm comm);

  scenario::Scenario scenario;
  MPI_Comm comm;
  Mesh mesh;
  model::InitialState initial;
  model::Schedule schedule;
  model::Model model;
  std::unique_ptr<BiotProblem> problem;
  std::unique_ptr<Derivation> derivation;
  std::optional<SamplePoints> points;
  std::vector<SamplePoints> lines;
};

Simulation::Impl::Impl(scenario::Scenario s, MPI_Comm comm_)
    : scenario(std::move(s))
    , comm(comm_)
    , mesh(make_scenario_mesh(scenario, comm))
    , initial(scenario, mesh)
    , schedule(scenario)
    , model(model::build_model(scenario, mesh, initial, schedule)) {
  problem = std::make_unique<BiotProblem>(mesh, model.setup);
  derivation = std::make_unique<Derivation>(*problem, initial_fields(initial));
  std::vector<Point<2>> point_list;
  for (const auto& p : scenario.output.points)
    point_list.emplace_back(p.x, p.y);
  points.emplace(*problem, point_list,
                 scenario.location_of("output") + ": output.points");
  for (const auto& line : scenario.output.lines)
    lines.emplace_back(*problem, line_samples(line),
                       scenario.location_of("output") + ": output.lines '" + line.name +
                           "'");
}

Simulation::Simulation(scenario::Scenario scenario, MPI_Comm comm)
    : impl_(std::make_unique<Impl>(std::move(scenario), comm)) {}

Simulation::~Simulation() = default;

RunSummary Simulation::run(const RunOptions& options) {
  Impl& m = *impl_;
  const auto wall_start = std::chrono::steady_clock::now();
  const std::string started = utc_now();
  const std::string dir = options.run_directory;
  prepare_run_folder(dir, options.overwrite, m.comm);
  if (is_root(m.comm)) {
    std::filesystem::create_directories(dir + "/profiles");
    std::filesystem::copy_file(m.scenario.source_path, dir + "/scenario.toml",
                               std::filesystem::copy_options::overwrite_existing);
  }
  write_scenario_mesh(m.scenario, dir + "/mesh", m.comm);

  BiotProblem& problem = *m.problem;
  FieldWriter fields(dir + "/fields", "fields", m.comm, initial_fields(m.initial));
  std::vector<std::string> step_header{
      "step",       "time_days",  "dt_days",         "stage",
      "new_matrix", "assembly_s", "factorisation_s", "solve_s"};
  for (const auto& p : m.model.pumped)
    step_header.push_back("discharge_" + p.label + "_m3_per_day");
  CsvFile steps(dir + "/steps.csv", step_header, m.comm);
  CsvFile point_table(dir + "/points.csv",
                      with({"time_days", "stage", "point", "x_m", "y_m"}, sample_columns),
                      m.comm);
  std::vector<CsvFile> profile_tables;
  for (const auto& line : m.scenario.output.lines)
    profile_tables.emplace_back(
        dir + "/profiles/" + line.name + ".csv",
        with({"time_days", "distance_m", "x_m", "y_m"}, sample_columns), m.comm);

  RunExtremes extremes(problem, m.scenario);
  RunSummary summary;
  summary.run_directory = dir;
  summary.cells = problem.mesh().triangulation->n_global_active_cells();
  summary.dofs = problem.dof_handler().n_dofs();
  for (const auto& p : m.model.pumped)
    summary.pumped_volume[p.label] = 0.0;

  auto write_samples = [&](const std::string& stage) {
    const double t_days = units::to_days(problem.time());
    const auto values = m.points->evaluate(problem, *m.derivation);
    for (std::size_t i = 0; i < values.size(); ++i) {
      const auto& p = m.scenario.output.points[i];
      auto row = sample_row(values[i]);
      row.insert(row.begin(), {p.x, p.y});
      point_table.row(row, {std::to_string(t_days), stage, p.name});
    }
  };
  auto write_profiles = [&]() {
    for (std::size_t l = 0; l < m.lines.size(); ++l) {
      const auto values = m.lines[l].evaluate(problem, *m.derivation);
      const auto& pts = m.lines[l].points();
      double distance = 0.0;
      for (std::size_t i = 0; i < values.size(); ++i) {
        if (i > 0)
          distance += pts[i].distance(pts[i - 1]);
        auto row = sample_row(values[i]);
        row.insert(row.begin(),
                   {units::to_days(problem.time()), distance, pts[i][0], pts[i][1]});
        profile_tables[l].row(row);
      }
    }
  };

  fields.write(problem);
  write_samples(m.schedule.stages().front().name);
  write_profiles();
  const auto& times = m.schedule.step_times();
  Progress progress(std::cerr, options.progress_in_place, times.size(),
                    options.show_progress && is_root(m.comm));
  for (std::size_t n = 0; n < times.size(); ++n) {
    const StepReport report = problem.advance_to(times[n]);
    const std::size_t k = m.schedule.stage_at(report.time);
    const std::string& stage = m.schedule.stages()[k].name;
    std::vector<double> row{double(n + 1),
                            units::to_days(report.time),
                            units::to_days(report.dt),
                            double(k + 1),
                            report.new_matrix ? 1.0 : 0.0,
                            report.assembly_seconds,
                            report.factorisation_seconds,
                            report.solve_seconds};
    for (const auto& p : m.model.pumped) {
      const double q = problem.outflow(p.line);
      summary.pumped_volume[p.label] += q * report.dt;
      row.push_back(q * units::seconds_per_day);
    }
    steps.row(row);
    extremes.update(problem);
    write_samples(stage);
    if (m.schedule.is_output_time(report.time)) {
      fields.write(problem);
      write_profiles();
    }
    progress.step(stage, k + 1, m.schedule.stages().size(), units::to_days(report.time),
                  units::to_days(report.dt), report.solve_seconds);
  }
  progress.finish();
  summary.steps = times.size();
  extremes.fill(summary);
  summary.wall_seconds =
      std::chrono::duration<double>(std::chrono::steady_clock::now() - wall_start)
          .count();
  write_manifest(dir + "/manifest.json", m.scenario, m.schedule, summary, started,
                 m.comm);
  return summary;
}

void Simulation::describe(std::ostream& out) const {
  describe_scenario(impl_->scenario, impl_->mesh, impl_->schedule, out);
}

} // namespace settlewell
