#include "settlewell/run/simulation.h"

#include "results.h"

#include "settlewell/core/errors.h"
#include "settlewell/core/file_writing.h"
#include "settlewell/core/units.h"
#include "settlewell/mesh/gmsh_mesh.h"
#include "settlewell/mesh/mesh_files.h"
#include "settlewell/model/initial_state.h"
#include "settlewell/model/model_builder.h"
#include "settlewell/model/schedule.h"
#include "settlewell/monitors/monitor.h"
#include "settlewell/output/csv_file.h"
#include "settlewell/output/run_folder.h"
#include "settlewell/physics/biot_problem.h"
#include "settlewell/run/checkpoint.h"
#include "settlewell/run/progress.h"
#include "settlewell/run/stop_request.h"
#include "settlewell/solvers/linear_solver.h"

#include <deal.II/base/mpi.h>
#include <deal.II/base/timer.h>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <functional>
#include <iomanip>
#include <iostream>
#include <iterator>
#include <limits>
#include <optional>
#include <sstream>

namespace settlewell {

using namespace dealii;

namespace {

bool is_root(MPI_Comm comm) {
  return Utilities::MPI::this_mpi_process(comm) == 0;
}

/// Whether a step may re-solve until the one-way lines' active set settles: a dug
/// surface, a well that takes water only, a seepage face.
bool has_one_way_lines(const BiotSetup& setup) {
  const auto& lines = setup.conditions.hydraulic;
  return !setup.excavation.empty() ||
         std::any_of(lines.begin(), lines.end(), [](const auto& c) {
           return c.exchange != HydraulicCondition::Exchange::both_ways;
         });
}

std::vector<std::string>
step_header(const std::vector<std::unique_ptr<monitors::Monitor>>& monitors,
            bool one_way,
            bool clays) {
  std::vector<std::string> h{"step",       "time_days",  "dt_days",         "stage",
                             "new_matrix", "assembly_s", "factorisation_s", "solve_s",
                             "iterations", "monitors_s", "output_s"};
  if (one_way) // solves of the step until the one-way lines' active set settled
    h.push_back("drain_rounds");
  if (clays) // Newton's method: solves, new factors, halved corrections, sub-steps,
             // yielding points, residual
    h.insert(h.end(), {"newton_iterations", "factorisations", "line_search_cuts",
                       "sub_steps", "yielding_points", "newton_residual_relative"});
  for (const auto& m : monitors)
    for (const auto& column : m->step_columns())
      h.push_back(column);
  return h;
}

/// `monitors_s`: the step columns of every monitor (discharges, balance, extremes,
/// points); `output_s`: what is written at an output time (fields, profiles).
std::vector<double> step_row(const StepReport& r,
                             std::size_t number,
                             std::size_t stage,
                             bool one_way,
                             bool clays,
                             double monitors_seconds,
                             double output_seconds) {
  std::vector<double> row{double(number),
                          units::to_days(r.time),
                          units::to_days(r.dt),
                          double(stage + 1),
                          r.new_matrix ? 1.0 : 0.0,
                          r.assembly_seconds,
                          r.factorisation_seconds,
                          r.solve_seconds,
                          double(r.iterations),
                          monitors_seconds,
                          output_seconds};
  if (one_way)
    row.push_back(double(r.drain_rounds));
  if (clays)
    row.insert(row.end(), {double(r.newton_iterations), double(r.factorisations),
                           double(r.line_search_cuts), double(r.sub_steps),
                           double(r.yielding_points),
                           r.newton_residuals.empty() ? 0.0 : r.newton_residuals.back()});
  return row;
}

/// A clay step's Newton iterations for the progress line ("Newton 3, residual
/// 2.1e-09"; the halvings, the sub-steps), empty for a linear step.
std::string newton_text(const StepReport& r) {
  if (r.newton_residuals.empty())
    return "";
  std::ostringstream os;
  os << "Newton " << r.newton_iterations << ", residual " << std::setprecision(2)
     << std::scientific << r.newton_residuals.back();
  if (r.line_search_cuts > 0)
    os << ", " << r.line_search_cuts << " halved";
  if (r.sub_steps > 1)
    os << ", in " << r.sub_steps << " sub-steps";
  return os.str();
}

/// Stops the run before a step whose solution is not finite reaches the outputs:
/// those of the steps before stay as they are. A sum carries NaN and infinity
/// where PETSc's max-norm would skip a NaN.
void check_finite(const BiotProblem& problem, std::size_t step) {
  if (std::isfinite(problem.solution().mean_value()))
    return;
  std::ostringstream os;
  os << "step " << step << " (day " << units::to_days(problem.time())
     << "): the solution is not finite (NaN or infinite); check the scenario's "
        "conductivities, stiffnesses and heads for values out of range. The outputs "
        "of the steps before are kept";
  throw SolverError(os.str());
}

std::string text_of(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  return std::string((std::istreambuf_iterator<char>(in)),
                     std::istreambuf_iterator<char>());
}

/// Runs `act` on rank 0; a file-system failure there becomes a SystemError on every
/// rank (the others would wait for rank 0 forever). Collective.
void on_root(MPI_Comm comm, const std::function<void()>& act) {
  std::string failure;
  if (is_root(comm)) {
    try {
      act();
    } catch (const std::filesystem::filesystem_error& e) {
      failure = e.path1().string() + ": " + e.code().message();
    } catch (const SystemError& e) {
      failure = e.what();
    }
  }
  failure = Utilities::MPI::broadcast(comm, failure, 0);
  if (!failure.empty())
    throw SystemError(failure);
}

/// The mesh of a resumed run: the scenario's, with the checkpoint's partition loaded.
/// The mesh must have the checkpoint's cells: a scenario or mesh file changed since
/// the run started is refused.
Mesh resumed_mesh(Mesh mesh,
                  const scenario::Scenario& s,
                  const std::string& checkpoint,
                  MPI_Comm comm) {
  if (checkpoint.empty())
    return mesh;
  const CheckpointHeader header = read_checkpoint_header(checkpoint, comm);
  const bool same_file =
      !s.mesh_file || sha256_of_file(s.mesh_file->path) == header.mesh_sha256;
  if (!same_file || mesh.triangulation->n_global_active_cells() != header.cells)
    throw InputError(checkpoint + ": was written for another mesh (" +
                     std::to_string(header.cells) + " cells" +
                     (same_file ? "" : ", another mesh file") +
                     "): the scenario or its mesh changed since the run started");
  mesh.triangulation->load(checkpoint + "/mesh");
  return mesh;
}

} // namespace

static void visit(StateArchive& a, BiotProblem::OutOfBalance& b) {
  a& b.largest& b.summed& b.released;
}

struct Simulation::Impl {
  Impl(scenario::Scenario s, MPI_Comm comm, const std::string& checkpoint);
  void prepare_folder(const RunOptions& options) const;
  RunSummary run(const RunOptions& options);
  RunSummary resume(const RunOptions& options);
  RunSummary run_steps(const RunOptions& options,
                       monitors::RunView& view,
                       StepReport& report,
                       CsvFile& steps,
                       CheckpointHeader& header);
  CheckpointHeader new_header() const;
  void write_checkpoint(const std::string& dir,
                        const CheckpointHeader& header,
                        CsvFile& steps);
  void start(const monitors::RunView& view);
  void step(const monitors::RunView& view, CsvFile& steps);
  /// After a step failed: the outputs of the last accepted state (`stepped`: a
  /// step of this run was accepted), unless that was an output time.
  void keep_last_state(const monitors::RunView& view, bool stepped);
  void settle_under_gravity(bool show_progress);
  void check_initial_balance();
  void add_initial_state(toml::table& results) const;
  /// Before the step from time(): at the start of the stage displacements are
  /// reported from, that is where they start.
  void reference_displacements();

  scenario::Scenario scenario;
  MPI_Comm comm;
  Mesh mesh;
  model::InitialState initial;
  model::Schedule schedule;
  model::Model model;
  std::unique_ptr<BiotProblem> problem;
  std::unique_ptr<Derivation> derivation;
  std::unique_ptr<monitors::RunContext> context;
  std::vector<std::unique_ptr<monitors::Monitor>> monitors;
  TimerOutput timer; ///< wall time of the parts of a run, for the manifest
  std::optional<BiotProblem::OutOfBalance> initial_balance; ///< when digging
  std::optional<double> gravity_movement; ///< m: the largest of the gravity loading
  std::optional<double> reference_start;  ///< s: start of output.displacements_from
  std::string checkpoint;                 ///< to resume from; empty for a new run
};

Simulation::Impl::Impl(scenario::Scenario s,
                       MPI_Comm comm_,
                       const std::string& checkpoint_)
    : scenario(std::move(s))
    , comm(comm_)
    , mesh(resumed_mesh((add_petsc_options(scenario.numerics.petsc_options),
                         make_scenario_mesh(scenario, comm)),
                        scenario,
                        checkpoint_,
                        comm))
    , initial(scenario, mesh)
    , schedule(scenario)
    , model(model::build_model(scenario, mesh, initial, schedule))
    // MPI_COMM_SELF: with a communicator, deal.II prints a page of warnings when the
    // timer is destroyed while an error (a one-line InputError) is on its way out.
    , timer(MPI_COMM_SELF, std::cout, TimerOutput::never, TimerOutput::wall_times)
    , checkpoint(checkpoint_) {
  problem = std::make_unique<BiotProblem>(mesh, model.setup);
  derivation = std::make_unique<Derivation>(*problem, initial.fields());
  context = std::make_unique<monitors::RunContext>(
      monitors::RunContext{scenario, schedule, model, initial, *problem, *derivation});
  monitors = monitors::make_monitors(*context);
  for (std::size_t k = 0; k < scenario.stages.size(); ++k)
    if (scenario.stages[k].name == scenario.output.displacements_from)
      reference_start = schedule.stages()[k].start;
}

void Simulation::Impl::prepare_folder(const RunOptions& options) const {
  const std::string& dir = options.run_directory;
  std::vector<std::string> inputs{scenario.source_path};
  if (scenario.mesh_file)
    inputs.push_back(scenario.mesh_file->path);
  prepare_run_folder(dir, options.overwrite, FolderKind::run, inputs, comm);
  if (is_root(comm))
    std::filesystem::copy_file(scenario.source_path, dir + "/scenario.toml",
                               std::filesystem::copy_options::overwrite_existing);
  write_scenario_mesh(scenario, dir + "/mesh", comm);
}

void Simulation::Impl::start(const monitors::RunView& view) {
  TimerOutput::Scope part(timer, "monitors and output");
  for (auto& m : monitors)
    m->start(view);
  for (auto& m : monitors)
    m->at_output_time(view);
}

void Simulation::Impl::step(const monitors::RunView& view, CsvFile& steps) {
  TimerOutput::Scope part(timer, "monitors and output");
  Timer clock; // this process's wall time
  std::vector<double> columns;
  for (auto& m : monitors)
    for (const double v : m->after_step(view))
      columns.push_back(v);
  const double monitors_seconds = clock.wall_time();
  clock.restart();
  if (schedule.is_output_time(view.step.time))
    for (auto& m : monitors)
      m->at_output_time(view);
  std::vector<double> row =
      step_row(view.step, view.step_number, view.stage(), has_one_way_lines(model.setup),
               model.setup.solved_by_newton(), monitors_seconds, clock.wall_time());
  row.insert(row.end(), columns.begin(), columns.end());
  steps.row(row);
}

void Simulation::Impl::keep_last_state(const monitors::RunView& view, bool stepped) {
  if (!stepped || schedule.is_output_time(view.step.time))
    return;
  TimerOutput::Scope part(timer, "monitors and output");
  for (auto& m : monitors)
    m->at_output_time(view);
}

// A gravity-loading start: its solve balances the start state; its movement is the
// origin of the reported displacements, and its size is said once.
void Simulation::Impl::settle_under_gravity(bool show_progress) {
  if (!model.setup.gravity_loading)
    return;
  TimerOutput::Scope part(timer, "time steps (assembly and solve)");
  const StepReport r = problem->settle_under_gravity();
  LA::MPI::Vector u(problem->dof_handler().locally_owned_dofs(), comm);
  u = problem->solution(); // the excess pore pressure is held at zero
  gravity_movement = u.linfty_norm();
  if (is_root(comm) && show_progress)
    std::cerr << "settlewell: gravity loading balanced the start state ("
              << std::setprecision(2)
              << r.assembly_seconds + r.factorisation_seconds + r.solve_seconds
              << " s); its largest movement, " << std::setprecision(3)
              << *gravity_movement << " m, is not reported\n"
              << std::setprecision(6);
}

void Simulation::Impl::reference_displacements() {
  const double t = problem->time();
  if (reference_start && std::abs(t - *reference_start) <= 1e-9 * (1.0 + t))
    problem->set_displacement_reference();
}

// Digging releases the geostatic stress, so a geostatic state far from equilibrium
// (a wall, sloping layers with their own K0) moves the ground at the first lift for
// reasons that are not the dig. Say so, with the size, rather than hide it.
void Simulation::Impl::check_initial_balance() {
  if (model.setup.excavation.empty())
    return;
  initial_balance = problem->geostatic_out_of_balance();
  const auto& b = *initial_balance;
  const double ratio = b.released > 0.0 ? b.summed / b.released : 0.0;
  if (is_root(comm) && ratio > 0.01)
    std::cout << "note: where the lifts meet the ground that stays, the initial "
                 "stresses are out of balance by "
              << std::setprecision(2) << 100.0 * ratio
              << " % of the force digging releases (up to " << b.largest
              << " kN/m at a node, from K0 or unit weight that differ across the "
                 "wall face); the movements the digging causes carry that as an "
                 "error (initial_state.method = \"gravity\" starts in balance)\n"
              << std::setprecision(6);
}

void Simulation::Impl::add_initial_state(toml::table& results) const {
  toml::table t{{"method", model.setup.gravity_loading ? "gravity" : "k0"}};
  if (gravity_movement)
    t.insert("gravity_loading_largest_movement_m", *gravity_movement);
  if (!scenario.output.displacements_from.empty())
    t.insert("displacements_from_stage", scenario.output.displacements_from);
  if (initial_balance) {
    const auto& b = *initial_balance;
    t.insert("largest_out_of_balance_kN_per_m", b.largest);
    t.insert("summed_out_of_balance_kN_per_m", b.summed);
    t.insert("summed_released_force_kN_per_m", b.released);
  }
  results.insert_or_assign("initial_state", std::move(t));
}

Simulation::Simulation(scenario::Scenario scenario, MPI_Comm comm)
    : impl_(std::make_unique<Impl>(std::move(scenario), comm, "")) {}

Simulation::Simulation(scenario::Scenario scenario,
                       MPI_Comm comm,
                       const std::string& checkpoint)
    : impl_(std::make_unique<Impl>(std::move(scenario), comm, checkpoint)) {}

Simulation::~Simulation() = default;

namespace {

/// The folder says how the run ended, also when it stopped on an error.
RunSummary marking_failure(const RunOptions& options,
                           MPI_Comm comm,
                           const std::function<RunSummary()>& run) {
  try {
    return run();
  } catch (const std::exception& e) {
    write_folder_state(options.run_directory, FolderKind::run, "failed", e.what(), comm);
    throw;
  }
}

} // namespace

RunSummary Simulation::run(const RunOptions& options) {
  impl_->prepare_folder(options);
  return marking_failure(options, impl_->comm, [&] { return impl_->run(options); });
}

RunSummary Simulation::resume(const RunOptions& options) {
  return marking_failure(options, impl_->comm, [&] { return impl_->resume(options); });
}

CheckpointHeader Simulation::Impl::new_header() const {
  CheckpointHeader h;
  h.scenario_path = std::filesystem::absolute(scenario.source_path).string();
  h.refinements = scenario.numerics.refinements;
  h.solver = static_cast<int>(scenario.numerics.solver);
  h.allow_large = scenario.numerics.allow_large;
  if (scenario.mesh_file)
    h.mesh_sha256 = sha256_of_file(scenario.mesh_file->path);
  h.cells = mesh.triangulation->n_global_active_cells();
  h.steps_planned = schedule.step_times().size();
  h.started = utc_now();
  return h;
}

RunSummary Simulation::Impl::run(const RunOptions& options) {
  settle_under_gravity(options.show_progress);
  check_initial_balance();
  StepReport report; // t = 0: no step yet
  monitors::RunView view{*context, options.run_directory, report, 0};
  start(view);
  CsvFile steps(options.run_directory + "/steps.csv",
                step_header(monitors, has_one_way_lines(model.setup),
                            model.setup.solved_by_newton()),
                comm);
  CheckpointHeader header = new_header();
  return run_steps(options, view, report, steps, header);
}

RunSummary Simulation::Impl::resume(const RunOptions& options) {
  const std::string source = checkpoint + "/state.bin";
  std::istringstream in(text_of(source));
  StateArchive a(in, source, options.run_directory, comm);
  CheckpointHeader header;
  a& header;
  if (header.steps_planned != schedule.step_times().size())
    throw InputError(
        source + ": the run planned " + std::to_string(header.steps_planned) +
        " steps; its scenario now gives " + std::to_string(schedule.step_times().size()));
  problem->load_checkpoint(a);
  for (auto& m : monitors)
    m->visit_state(a);
  CsvFile steps;
  a& steps& initial_balance& gravity_movement;
  write_folder_state(options.run_directory, FolderKind::run, "running", "", comm);
  if (is_root(comm) && options.show_progress)
    std::cerr << "settlewell: resuming " << options.run_directory << " after step "
              << header.step << " of " << header.steps_planned << " (day "
              << units::to_days(header.time) << ")\n";
  StepReport report;
  monitors::RunView view{*context, options.run_directory, report, header.step};
  return run_steps(options, view, report, steps, header);
}

void Simulation::Impl::write_checkpoint(const std::string& dir,
                                        const CheckpointHeader& header,
                                        CsvFile& steps) {
  TimerOutput::Scope part(timer, "checkpoints");
  namespace fs = std::filesystem;
  const std::string partial = dir + "/checkpoint.partial";
  on_root(comm, [&] {
    fs::remove_all(partial);
    fs::create_directories(partial);
  });
  std::ostringstream bytes;
  StateArchive a(bytes, dir, comm);
  CheckpointHeader h = header;
  a& h;
  problem->save_checkpoint(a, partial + "/mesh");
  for (auto& m : monitors)
    m->visit_state(a);
  a& steps& initial_balance& gravity_movement;
  // At every moment `checkpoint` or `checkpoint.old` holds a complete checkpoint.
  on_root(comm, [&] {
    write_whole_file(partial + "/state.bin",
                     [&](std::ostream& out) { out << bytes.str(); });
    const fs::path current = dir + "/checkpoint", old = dir + "/checkpoint.old";
    if (fs::exists(current)) {
      fs::remove_all(old);
      fs::rename(current, old);
    }
    fs::rename(partial, current);
    fs::remove_all(old);
  });
}

RunSummary Simulation::Impl::run_steps(const RunOptions& options,
                                       monitors::RunView& view,
                                       StepReport& report,
                                       CsvFile& steps,
                                       CheckpointHeader& header) {
  Impl& m = *this;
  Timer wall(m.comm), since_checkpoint;
  const std::string& dir = options.run_directory;
  RunSummary summary;
  const auto& times = m.schedule.step_times();
  Progress progress(std::cerr, options.progress_in_place, times.size(),
                    options.show_progress && is_root(m.comm), header.step);
  for (std::size_t n = header.step; n < times.size(); ++n) {
    try {
      TimerOutput::Scope part(m.timer, "time steps (assembly and solve)");
      m.reference_displacements();
      report = m.problem->advance_to(times[n]);
    } catch (const SolverError&) {
      m.keep_last_state(view, n > header.step);
      throw;
    }
    check_finite(*m.problem, n + 1);
    view.step_number = n + 1;
    m.step(view, steps);
    const std::size_t k = view.stage();
    progress.step(m.schedule.stages()[k].name, k + 1, m.schedule.stages().size(),
                  units::to_days(report.time), units::to_days(report.dt),
                  report.solve_seconds, newton_text(report));
    summary.stopped_by = stop_signal(m.comm);
    const bool overdue =
        options.checkpoint_minutes > 0.0 &&
        Utilities::MPI::logical_or(
            since_checkpoint.wall_time() > 60.0 * options.checkpoint_minutes, m.comm);
    if (n + 1 < times.size() &&
        (summary.stopped_by != 0 || overdue || m.schedule.is_output_time(report.time))) {
      header.step = n + 1;
      header.time = report.time;
      header.wall_seconds_before += wall.wall_time();
      wall.restart();
      m.write_checkpoint(dir, header, steps);
      since_checkpoint.restart();
    }
    if (summary.stopped_by != 0) {
      summary.stopped_at = report.time;
      break;
    }
  }
  progress.finish();

  summary.run_directory = dir;
  summary.cells = m.mesh.triangulation->n_global_active_cells();
  summary.dofs = m.problem->dof_handler().n_dofs();
  summary.steps = view.step_number;
  summary.steps_planned = times.size();
  summary.wall_seconds = header.wall_seconds_before + wall.wall_time();
  toml::table results =
      run_results(m.scenario, m.mesh, m.schedule, summary, header.started, m.comm);
  {
    TimerOutput::Scope part(m.timer, "monitors and output");
    for (auto& monitor : m.monitors)
      monitor->finish(view, results);
  }
  m.add_initial_state(results);
  read_summary(results, summary);
  if (is_root(m.comm))
    write_whole_file(dir + "/results.toml",
                     [&](std::ostream& out) { out << results << '\n'; });
  write_manifest(dir + "/manifest.json", m.scenario, m.schedule, summary, header.started,
                 m.timer.get_summary_data(TimerOutput::total_wall_time), m.comm);
  // A finished run needs no checkpoint; a stopped one resumes from it.
  if (summary.stopped_by == 0)
    on_root(m.comm, [&] {
      for (const char* name : {"/checkpoint", "/checkpoint.old", "/checkpoint.partial"})
        std::filesystem::remove_all(dir + name);
    });
  return summary;
}

} // namespace settlewell
