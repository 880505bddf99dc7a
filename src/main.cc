// The command line: parses arguments, starts MPI, runs one command, turns errors
// into one line and an exit status. All the work is in the library.
#include "settlewell/commands/check.h"
#include "settlewell/commands/sweep.h"
#include "settlewell/core/errors.h"
#include "settlewell/core/threads.h"
#include "settlewell/core/units.h"
#include "settlewell/core/version.h"
#include "settlewell/mesh/mesh_files.h"
#include "settlewell/report/report.h"
#include "settlewell/run/checkpoint.h"
#include "settlewell/run/simulation.h"
#include "settlewell/run/stop_request.h"
#include "settlewell/scenario/describe.h"
#include "settlewell/scenario/keys.h"
#include "settlewell/scenario/parse.h"
#include "settlewell/scenario/sweep_file.h"
#include "settlewell/verification/cases.h"

#include <CLI/CLI.hpp>
#include <deal.II/base/conditional_ostream.h>
#include <deal.II/base/exceptions.h>
#include <deal.II/base/mpi.h>
#include <deal.II/base/revision.h>
#include <deal.II/base/timer.h>
#include <petscversion.h>

#include <algorithm>
#include <cstdlib>
#include <filesystem>
#include <iostream>
#include <optional>
#include <sstream>
#include <unistd.h>

namespace {

constexpr int exit_ok = 0;
constexpr int exit_checks_failed = 1;
constexpr int exit_usage = 2;
constexpr int exit_solver = 3;
constexpr int exit_internal = 3;
constexpr int exit_system = 4;

bool is_root() {
  return dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) == 0;
}

/// Standard output and error of rank 0 only (the other ranks compute the same).
dealii::ConditionalOStream& out() {
  static dealii::ConditionalOStream stream(std::cout, is_root());
  return stream;
}
dealii::ConditionalOStream& err() {
  static dealii::ConditionalOStream stream(std::cerr, is_root());
  return stream;
}

std::string version_text() {
  return std::string("settlewell ") + settlewell::version_string + " (deal.II " +
         DEAL_II_PACKAGE_VERSION + ", PETSc " + std::to_string(PETSC_VERSION_MAJOR) +
         "." + std::to_string(PETSC_VERSION_MINOR) + "." +
         std::to_string(PETSC_VERSION_SUBMINOR) + ")";
}

struct VerifyOptions {
  std::vector<std::string> cases;
  std::string vtk_directory;
  bool list = false;
  bool markdown = false;
};

int run_verify(const VerifyOptions& options) {
  namespace v = settlewell::verification;
  if (options.list) {
    for (const auto& c : v::all_cases())
      out() << c.name << "  " << c.summary << '\n';
    return exit_ok;
  }
  std::vector<const v::VerificationCase*> selected;
  if (options.cases.empty())
    for (const auto& c : v::all_cases())
      selected.push_back(&c);
  for (const auto& name : options.cases)
    selected.push_back(&v::find_case(name));

  const v::CaseSettings settings{options.vtk_directory};
  std::vector<v::CheckRow> rows;
  for (const auto* c : selected) {
    const dealii::Timer timer; // started
    err() << "running " << c->name << " (" << c->summary << ") ..." << std::flush;
    const auto case_rows = c->run(settings, MPI_COMM_WORLD);
    rows.insert(rows.end(), case_rows.begin(), case_rows.end());
    err() << " " << timer.wall_time() << " s\n";
  }
  if (out().is_active() && options.markdown) {
    std::vector<v::CaseDescription> descriptions;
    for (const auto* c : selected)
      descriptions.push_back({c->name, c->summary});
    v::print_markdown(out().get_stream(), descriptions, rows);
  } else if (out().is_active()) {
    v::print_table(out().get_stream(), rows);
    if (!options.vtk_directory.empty())
      std::cout << "Fields of each case: " << options.vtk_directory
                << "/<case>/<case>.pvd (times in days)\n";
  }
  return v::all_passed(rows) ? exit_ok : exit_checks_failed;
}

struct ScenarioOptions {
  std::string scenario;
  std::string output;
  bool overwrite = false;
  bool quiet = false;
  bool keys = false;
  bool report = false;
  bool allow_large = false;
  int refine = -1;
  std::string solver;
  std::string resume;               ///< a run folder to resume
  double checkpoint_minutes = 30.0; ///< 0: checkpoints at output times only
};

/// Command-line overrides of the scenario's [numerics].
void apply_overrides(const ScenarioOptions& o, settlewell::scenario::Scenario& s) {
  using Solver = settlewell::SolverChoice;
  if (o.refine >= 0)
    s.numerics.refinements = static_cast<unsigned int>(o.refine);
  s.numerics.allow_large = o.allow_large;
  if (o.solver == "direct")
    s.numerics.solver = Solver::direct;
  else if (o.solver == "iterative")
    s.numerics.solver = Solver::iterative;
  else if (o.solver == "auto")
    s.numerics.solver = Solver::automatic;
}

std::string default_folder(const std::string& scenario, const std::string& suffix) {
  return std::filesystem::path(scenario).stem().string() + suffix;
}

/// One line for a run that SIGINT or SIGTERM stopped; the shell's status for it.
int report_stop(const settlewell::RunSummary& summary) {
  err() << "settlewell: stopped by " << settlewell::signal_name(summary.stopped_by)
        << " after step " << summary.steps << " of " << summary.steps_planned << " (day "
        << settlewell::units::to_days(summary.stopped_at) << "); "
        << summary.run_directory
        << " holds the results of the steps done, marked stopped in manifest.json; "
           "settlewell run --resume "
        << summary.run_directory << " continues it\n";
  return 128 + summary.stopped_by;
}

settlewell::RunOptions run_options(const ScenarioOptions& o, const std::string& folder) {
  settlewell::RunOptions options;
  options.run_directory = folder;
  options.overwrite = o.overwrite;
  options.show_progress = !o.quiet;
  options.progress_in_place = isatty(STDERR_FILENO) != 0;
  options.checkpoint_minutes = o.checkpoint_minutes;
  return options;
}

/// The summary lines and the report of a run that ended, or its stop line.
int after_run(const ScenarioOptions& o,
              const settlewell::RunSummary& summary,
              const settlewell::scenario::Scenario& scenario) {
  if (summary.stopped_by != 0)
    return report_stop(summary);
  if (out().is_active())
    settlewell::print_summary(out().get_stream(), summary, scenario);
  if (o.report && out().is_active())
    settlewell::report::write_report(summary.run_directory, out().get_stream());
  return exit_ok;
}

int resume_run(const ScenarioOptions& o) {
  const std::string checkpoint = settlewell::checkpoint_to_resume(o.resume);
  const auto header = settlewell::read_checkpoint_header(checkpoint, MPI_COMM_WORLD);
  const auto scenario = settlewell::resumed_scenario(o.resume, header);
  settlewell::Simulation simulation(scenario, MPI_COMM_WORLD, checkpoint);
  settlewell::catch_stop_signals();
  return after_run(o, simulation.resume(run_options(o, o.resume)), scenario);
}

int run_run(const ScenarioOptions& o) {
  if (!o.resume.empty())
    return resume_run(o);
  if (o.scenario.empty())
    throw settlewell::InputError("run needs a scenario file (or --resume RUN_FOLDER)");
  auto scenario = settlewell::scenario::read_scenario(o.scenario);
  apply_overrides(o, scenario);
  if (dealii::Utilities::MPI::this_mpi_process(MPI_COMM_WORLD) == 0)
    for (const auto& advice : settlewell::scenario::advisories(scenario))
      std::cerr << "settlewell: warning: " << advice << "\n";
  settlewell::Simulation simulation(scenario, MPI_COMM_WORLD);
  settlewell::catch_stop_signals();
  const auto options =
      run_options(o, o.output.empty() ? default_folder(o.scenario, "-run") : o.output);
  return after_run(o, simulation.run(options), scenario);
}

int run_report(const std::string& folder) {
  if (out().is_active())
    settlewell::report::write_report(folder, out().get_stream());
  return exit_ok;
}

int run_check(const ScenarioOptions& o) {
  if (o.keys) {
    if (out().is_active())
      settlewell::scenario::print_key_reference(out().get_stream());
    return exit_ok;
  }
  if (o.scenario.empty())
    throw settlewell::InputError("check needs a scenario file (or --keys)");
  auto scenario = settlewell::scenario::read_scenario(o.scenario);
  scenario.numerics.allow_large = o.allow_large;
  settlewell::check_scenario(scenario, MPI_COMM_WORLD, out().get_stream());
  return exit_ok;
}

int run_mesh(const ScenarioOptions& o) {
  auto scenario = settlewell::scenario::read_scenario(o.scenario);
  scenario.numerics.allow_large = o.allow_large;
  const std::string folder =
      o.output.empty() ? default_folder(o.scenario, "-mesh") : o.output;
  settlewell::write_scenario_mesh(scenario, folder, MPI_COMM_WORLD);
  out() << "Wrote " << folder << "/mesh.msh, " << folder
        << "/mesh_cells.vtu (cells with their region id), " << folder
        << "/mesh_lines.vtu (boundaries and internal lines with their line id) and "
        << folder << "/names.toml (the names of the ids)\n";
  return exit_ok;
}

struct SweepCommand {
  std::string file, output;
  unsigned int group_size = 1;
  bool overwrite = false;
  bool allow_large = false;
};

int run_sweep_command(const SweepCommand& c) {
  const auto sweep = settlewell::scenario::read_sweep(c.file);
  settlewell::SweepOptions options;
  options.folder = c.output.empty() ? sweep.output : c.output;
  options.group_size = c.group_size;
  options.overwrite = c.overwrite;
  options.allow_large = c.allow_large;
  std::ostringstream discarded; // the other ranks' log
  settlewell::catch_stop_signals();
  const int stopped = settlewell::run_sweep(
      sweep, options, MPI_COMM_WORLD, out().is_active() ? out().get_stream() : discarded);
  if (stopped == 0)
    return exit_ok;
  err() << "settlewell: the sweep stopped on " << settlewell::signal_name(stopped) << "; "
        << options.folder
        << " holds the variants that ran, marked stopped in manifest.json\n";
  return 128 + stopped;
}

CLI::App* add_verify(CLI::App& app, VerifyOptions& o) {
  auto* cmd = app.add_subcommand(
      "verify", "Run the verification cases against published solutions and print a "
                "table; exit status 0 only if every check passes.");
  cmd->add_option("--case", o.cases, "Run only this case (repeatable)");
  cmd->add_option("--vtk", o.vtk_directory,
                  "Also write each case's fields (VTU + PVD) into this folder");
  cmd->add_flag("--list", o.list, "List the cases and exit");
  cmd->add_flag("--markdown", o.markdown,
                "Print a Markdown summary per case and the full table (the README's "
                "verification section)");
  return cmd;
}

/// The override of the bounds on a model's memory and steps.
void add_allow_large(CLI::App* cmd, bool& allow_large) {
  cmd->add_flag("--allow-large", allow_large,
                "Run a model whose estimated memory exceeds 80 % of this machine's, or "
                "a stage of more than 200000 time steps");
}

/// The scenario file of a command, which must exist.
CLI::Option* add_scenario_argument(CLI::App* cmd, std::string& scenario, bool required) {
  auto* option = cmd->add_option("scenario", scenario, "Scenario file (TOML)")
                     ->check(CLI::ExistingFile);
  if (required)
    option->required();
  return option;
}

CLI::App* add_run(CLI::App& app, ScenarioOptions& o) {
  auto* cmd = app.add_subcommand(
      "run", "Run a scenario through all its stages and write a run folder (fields, "
             "time histories, profiles, manifest).");
  auto* scenario = add_scenario_argument(cmd, o.scenario, false);
  auto* output =
      cmd->add_option("-o,--output", o.output,
                      "Run folder (default: <scenario name>-run in the current folder)");
  auto* overwrite = cmd->add_flag("--overwrite", o.overwrite,
                                  "Replace the results in an existing run folder");
  cmd->add_flag("-q,--quiet", o.quiet, "No progress lines");
  cmd->add_flag("--report", o.report, "Write the report into the run folder at the end");
  add_allow_large(cmd, o.allow_large);
  auto* refine =
      cmd->add_option("--refine", o.refine,
                      "Global refinements of the mesh (overrides numerics.refinements)")
          ->check(CLI::Range(0, 8));
  auto* solver = cmd->add_option("--solver", o.solver,
                                 "direct, iterative or auto (overrides numerics.solver)")
                     ->check(CLI::IsMember({"direct", "iterative", "auto"}));
  cmd->add_option(
         "--checkpoint-minutes", o.checkpoint_minutes,
         "Also write a checkpoint after a step that ends this many minutes after "
         "the last (they are written at output times and on a stop; 0: only "
         "then)")
      ->check(CLI::Range(0.0, 1e6));
  cmd->add_option("--resume", o.resume,
                  "Continue a stopped or killed run from its last checkpoint, with the "
                  "scenario and choices it was started with")
      ->check(CLI::ExistingDirectory)
      ->excludes(scenario, output, overwrite, refine, solver);
  return cmd;
}

CLI::App* add_sweep(CLI::App& app, SweepCommand& o) {
  auto* cmd = app.add_subcommand(
      "sweep",
      "Run every variant of a parameter grid (each in its own run folder), spread "
      "over groups of MPI processes, and summarise them in one CSV and a chart.");
  cmd->add_option("sweep_file", o.file, "Sweep file (TOML)")
      ->required()
      ->check(CLI::ExistingFile);
  cmd->add_option("-o,--output", o.output, "Sweep folder (default: from the file)");
  cmd->add_option("--group-size", o.group_size, "Processes per variant")
      ->check(CLI::Range(1, 100000));
  cmd->add_flag("--overwrite", o.overwrite, "Replace an existing sweep folder");
  add_allow_large(cmd, o.allow_large);
  return cmd;
}

CLI::App* add_report(CLI::App& app, std::string& folder) {
  auto* cmd = app.add_subcommand(
      "report", "Write report.html (self-contained, plots embedded) and report.md into a "
                "run folder.");
  cmd->add_option("run_folder", folder, "A finished run folder")
      ->required()
      ->check(CLI::ExistingDirectory);
  return cmd;
}

CLI::App* add_check(CLI::App& app, ScenarioOptions& o) {
  auto* cmd = app.add_subcommand(
      "check", "Validate a scenario and print what it describes; writes nothing.");
  add_scenario_argument(cmd, o.scenario, false);
  cmd->add_flag("--keys", o.keys, "Print every scenario key with its unit and default");
  add_allow_large(cmd, o.allow_large);
  return cmd;
}

CLI::App* add_mesh(CLI::App& app, ScenarioOptions& o) {
  auto* cmd = app.add_subcommand(
      "mesh", "Write the scenario's mesh (.msh) and VTU files of its regions and lines.");
  add_scenario_argument(cmd, o.scenario, true);
  cmd->add_option("-o,--output", o.output,
                  "Folder for the files (default: <scenario name>-mesh)");
  add_allow_large(cmd, o.allow_large);
  return cmd;
}

/// Parses the command line; returns an exit status when the program should stop
/// here (help, version, a mistake), nothing when a command is to run.
std::optional<int> parse(CLI::App& app, int argc, char** argv) {
  try {
    app.parse(argc, argv);
  } catch (const CLI::CallForHelp&) {
    out() << app.help();
    return exit_ok;
  } catch (const CLI::CallForAllHelp&) {
    out() << app.help("", CLI::AppFormatMode::All);
    return exit_ok;
  } catch (const CLI::CallForVersion&) {
    out() << version_text() << '\n';
    return exit_ok;
  } catch (const CLI::ParseError& e) {
    err() << "settlewell: " << e.what() << " (see settlewell --help)\n";
    return exit_usage;
  }
  return std::nullopt;
}

int dispatch(int argc, char** argv) {
  CLI::App app{
      "Settlewell: 2D coupled seepage-consolidation (Biot) analysis of dewatered "
      "excavations."};
  app.set_version_flag("--version", version_text());
  VerifyOptions verify;
  ScenarioOptions run, check, mesh;
  SweepCommand sweep;
  std::string report_folder;
  auto* verify_cmd = add_verify(app, verify);
  auto* run_cmd = add_run(app, run);
  auto* sweep_cmd = add_sweep(app, sweep);
  auto* report_cmd = add_report(app, report_folder);
  auto* check_cmd = add_check(app, check);
  auto* mesh_cmd = add_mesh(app, mesh);
  if (const auto stop = parse(app, argc, argv))
    return *stop;
  if (verify_cmd->parsed())
    return run_verify(verify);
  if (run_cmd->parsed())
    return run_run(run);
  if (check_cmd->parsed())
    return run_check(check);
  if (mesh_cmd->parsed())
    return run_mesh(mesh);
  if (report_cmd->parsed())
    return run_report(report_folder);
  if (sweep_cmd->parsed())
    return run_sweep_command(sweep);
  err() << "settlewell: a command is required (run, check, mesh, report, sweep, "
           "verify); see settlewell --help\n";
  return exit_usage;
}

} // namespace

int main(int argc, char** argv) {
  // One thread per MPI process unless the user says otherwise: hypre's threads
  // otherwise compete with the processes for the cores. OpenBLAS has read its
  // variable before main(); limit_blas_threads() below sets it through its own call.
  setenv("OMP_NUM_THREADS", "1", 0);
  // PETSc reads its own options from argv; give it only the program name so that
  // our options (--help among them) reach CLI11 alone. Experts can still pass
  // PETSc options through the PETSC_OPTIONS environment variable.
  int petsc_argc = 1;
  char** petsc_argv = argv;
  dealii::Utilities::MPI::MPI_InitFinalize mpi(petsc_argc, petsc_argv, 1);
  settlewell::limit_blas_threads();
  try {
    return dispatch(argc, argv);
  } catch (const settlewell::InputError& e) {
    err() << "settlewell: error: " << e.what() << '\n';
    return exit_usage;
  } catch (const settlewell::SolverError& e) {
    err() << "settlewell: solver error: " << e.what() << '\n';
    return exit_solver;
  } catch (const settlewell::SystemError& e) {
    err() << "settlewell: system error: " << e.what() << '\n';
    return exit_system;
  } catch (const std::filesystem::filesystem_error& e) {
    err() << "settlewell: system error: " << e.path1().string() << ": "
          << e.code().message() << '\n';
    return exit_system;
  } catch (const dealii::ExceptionBase& e) {
    // A failed assertion (AssertThrow) in the library or in deal.II: its message,
    // on one line, without deal.II's multi-line frame.
    std::ostringstream info;
    e.print_info(info);
    std::string line = info.str();
    std::replace(line.begin(), line.end(), '\n', ' ');
    err() << "settlewell: internal error (please report it): " << e.get_exc_name() << ": "
          << line << '\n';
    return exit_internal;
  } catch (const std::exception& e) {
    err() << "settlewell: internal error (please report it): " << e.what() << '\n';
    return exit_internal;
  }
}
