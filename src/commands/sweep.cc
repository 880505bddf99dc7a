#include "settlewell/commands/sweep.h"

#include "settlewell/core/errors.h"
#include "settlewell/core/python_scripts.h"
#include "settlewell/output/csv_file.h"
#include "settlewell/output/run_folder.h"
#include "settlewell/run/simulation.h"
#include "settlewell/run/stop_request.h"
#include "settlewell/scenario/keys.h"
#include "settlewell/scenario/parse.h"

#include <deal.II/base/mpi.h>

#include <toml++/toml.h>

#include <filesystem>
#include <fstream>
#include <iomanip>
#include <ostream>
#include <sstream>

namespace settlewell {

namespace fs = std::filesystem;

namespace {

std::string variant_folder(const std::string& sweep_folder, std::size_t i) {
  std::ostringstream name;
  name << sweep_folder << "/variant_" << std::setw(3) << std::setfill('0') << i;
  return name.str();
}

/// The least of a factor over a list of check tables (infinite: nothing drives
/// it; words such as "not evaluated" are skipped; none at all: empty).
std::optional<double> least_factor(const toml::array* list, const char* key) {
  std::optional<double> least;
  if (list != nullptr)
    for (const auto& node : *list)
      if (const auto f = (*node.as_table())[key].value<double>())
        least = least ? std::min(*least, *f) : *f;
  return least;
}

/// The headline results of one variant, in the order of sweep_result_columns().
std::vector<std::optional<double>> variant_results(const std::string& run_folder) {
  const toml::table r = toml::parse_file(run_folder + "/results.toml");
  double neighbour_settlement = 0.0, category = 0.0, discharge = 0.0, volume = 0.0;
  if (const auto* ns = r["neighbours"].as_array())
    for (const auto& n : *ns) {
      neighbour_settlement = std::max(
          neighbour_settlement, (*n.as_table())["largest_settlement_m"].value_or(0.0));
      category = std::max(category, (*n.as_table())["category"].value_or(0.0));
    }
  if (const auto* qs = r["discharge"].as_array())
    for (const auto& q : *qs) {
      discharge += (*q.as_table())["final_m3_per_day"].value_or(0.0);
      volume += (*q.as_table())["volume_m3"].value_or(0.0);
    }
  const auto base = r["base_stability"];
  return {neighbour_settlement,
          category,
          base["piping"]["least"].value<double>(),
          least_factor(base["heave"].as_array(), "least"),
          least_factor(base["uplift"].as_array(), "at_end"),
          discharge,
          volume,
          r["summary"]["settlement_outside_m"].value_or(0.0),
          r["summary"]["drawdown_outside_m"].value_or(0.0),
          r["water_budget"]["share_from_lateral_edges"].value<double>()};
}

void write_summary(const scenario::SweepSpec& sweep,
                   const std::string& folder,
                   std::ostream& log) {
  std::vector<std::string> header{"variant"};
  for (const auto& p : sweep.parameters)
    header.push_back(p.key);
  for (const auto& c : scenario::sweep_result_columns())
    header.push_back(c);
  CsvFile table(folder + "/sweep_summary.csv", header, MPI_COMM_SELF);
  for (std::size_t i = 0; i < scenario::variant_count(sweep); ++i) {
    std::vector<std::optional<double>> row{double(i)};
    for (const double v : scenario::variant_values(sweep, i))
      row.push_back(v);
    for (const auto& v : variant_results(variant_folder(folder, i) + "/run"))
      row.push_back(v);
    table.row_with_gaps(row);
  }
  log << "wrote " << folder << "/sweep_summary.csv\n";
  if (sweep.chart_x.empty())
    return;
  const std::string problem = run_postprocess(
      "plot_sweep.py",
      {folder + "/sweep_summary.csv", sweep.chart_x, sweep.chart_y,
       folder + "/sweep_chart.png", "--x-unit", scenario::unit_of(sweep.chart_x)},
      folder + "/sweep_chart.log", log);
  log << (problem.empty() ? "wrote " + folder + "/sweep_chart.png"
                          : "no chart: " + problem)
      << '\n';
}

} // namespace

int run_sweep(const scenario::SweepSpec& sweep,
              const SweepOptions& options,
              MPI_Comm world,
              std::ostream& log) {
  const unsigned int rank = dealii::Utilities::MPI::this_mpi_process(world);
  const unsigned int size = dealii::Utilities::MPI::n_mpi_processes(world);
  if (options.group_size == 0 || options.group_size > size)
    throw InputError("--group-size must lie in 1.." + std::to_string(size));
  prepare_run_folder(options.folder, options.overwrite, FolderKind::sweep,
                     {sweep.source_path, sweep.scenario_path}, world);
  const std::size_t n = scenario::variant_count(sweep);
  if (rank == 0)
    for (std::size_t i = 0; i < n; ++i) {
      fs::create_directories(variant_folder(options.folder, i));
      std::ofstream(variant_folder(options.folder, i) + "/scenario.toml")
          << scenario::variant_scenario_text(sweep, i);
    }
  MPI_Barrier(world);

  const unsigned int groups = size / options.group_size;
  const unsigned int group = rank / options.group_size;
  int stopped = 0;
  MPI_Comm comm;
  MPI_Comm_split(world, group < groups ? int(group) : MPI_UNDEFINED, int(rank), &comm);
  if (comm != MPI_COMM_NULL) {
    const bool group_root = dealii::Utilities::MPI::this_mpi_process(comm) == 0;
    for (std::size_t i = group; i < n; i += groups) {
      const std::string folder = variant_folder(options.folder, i);
      auto variant = scenario::read_scenario(folder + "/scenario.toml");
      variant.numerics.allow_large = options.allow_large;
      Simulation simulation(std::move(variant), comm);
      RunOptions run;
      run.run_directory = folder + "/run";
      run.show_progress = false;
      const RunSummary summary = simulation.run(run);
      if ((stopped = summary.stopped_by) != 0)
        break;
      if (group_root)
        log << "variant " << i << " of " << n << " done in " << std::fixed
            << std::setprecision(1) << summary.wall_seconds << " s (processes " << rank
            << ".." << rank + options.group_size - 1 << ")\n"
            << std::flush;
    }
    MPI_Comm_free(&comm);
  }
  stopped = dealii::Utilities::MPI::max(stopped, world);
  if (stopped != 0) {
    write_folder_state(options.folder, FolderKind::sweep, "stopped", signal_name(stopped),
                       world);
    return stopped;
  }
  if (rank == 0)
    write_summary(sweep, options.folder, log);
  write_folder_state(options.folder, FolderKind::sweep, "finished", "", world);
  return 0;
}

} // namespace settlewell
