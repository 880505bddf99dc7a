#include "settlewell/simulation/simulation.h"

#include "run_recorder.h"
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
#include "settlewell/solvers/linear_solver.h"
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

/// Every section run has a ground-surface profile (the settlement trough), added
/// when the scenario does not name one.
void add_ground_surface_line(scenario::Scenario& s) {
  if (!s.section)
    return;
  for (const auto& line : s.output.lines)
    if (line.name == "ground_surface")
      return;
  const auto& sec = *s.section;
  const double outer = sec.excavation_width / 2 + (sec.wall ? sec.wall->thickness : 0.0) +
                       sec.far_distance;
  double x0 = (sec.half_model || s.analysis == AnalysisType::axisymmetric) ? 0.0 : -outer;
  if (s.analysis == AnalysisType::axisymmetric && !sec.wells.empty())
    x0 = sec.wells.front().radius;
  const double y = sec.ground_surface;
  s.output.lines.push_back({"ground_surface", {{x0, y}, {outer, y}}, 201});
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
    , mesh((add_petsc_options(scenario.numerics.petsc_options),
            make_scenario_mesh(scenario, comm)))
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
  add_ground_surface_line(scenario);
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
  const RunContext context{m.scenario,    m.schedule, m.model, m.initial, problem,
                           *m.derivation, *m.points,  m.lines, m.comm,    started};
  RunRecorder recorder(context, dir);
  recorder.start();
  const auto& times = m.schedule.step_times();
  Progress progress(std::cerr, options.progress_in_place, times.size(),
                    options.show_progress && is_root(m.comm));
  for (std::size_t n = 0; n < times.size(); ++n) {
    const StepReport report = problem.advance_to(times[n]);
    recorder.step(report, n + 1);
    const std::size_t k = m.schedule.stage_at(report.time);
    progress.step(m.schedule.stages()[k].name, k + 1, m.schedule.stages().size(),
                  units::to_days(report.time), units::to_days(report.dt),
                  report.solve_seconds);
  }
  progress.finish();
  RunSummary summary;
  summary.run_directory = dir;
  summary.cells = problem.mesh().triangulation->n_global_active_cells();
  summary.dofs = problem.dof_handler().n_dofs();
  summary.steps = times.size();
  summary.wall_seconds =
      std::chrono::duration<double>(std::chrono::steady_clock::now() - wall_start)
          .count();
  recorder.finish(summary);
  write_manifest(dir + "/manifest.json", m.scenario, m.schedule, summary, started,
                 m.comm);
  return summary;
}

} // namespace settlewell
