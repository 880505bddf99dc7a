#include "example_support.h"

#include "settlewell/scenario/parse.h"

#include <gtest/gtest.h>

#include <cstdlib>
#include <fstream>
#include <sstream>
#include <stdexcept>

namespace example_support {

namespace fs = std::filesystem;

fs::path write_variant(const std::string& example,
                       const std::string& variant,
                       const std::function<void(toml::table&)>& change) {
  toml::table scenario = toml::parse_file(std::string(SETTLEWELL_SOURCE_DIR) +
                                          "/examples/" + example + "/scenario.toml");
  if (change)
    change(scenario);
  // One folder per test: ctest runs the tests of one executable side by side, and
  // two of them writing the same run folder read each other's half-written files.
  fs::path folder = fs::temp_directory_path() / "settlewell_examples";
  if (const auto* test = ::testing::UnitTest::GetInstance()->current_test_info())
    folder /= std::string(test->test_suite_name()) + "." + test->name();
  fs::create_directories(folder);
  const fs::path file = folder / (example + "-" + variant + ".toml");
  int rank = 0;
  MPI_Comm_rank(MPI_COMM_WORLD, &rank);
  if (rank == 0)
    std::ofstream(file) << scenario << '\n';
  MPI_Barrier(MPI_COMM_WORLD);
  return file;
}

ExampleRun
run_scenario_file(const fs::path& file, const fs::path& folder, MPI_Comm comm) {
  settlewell::Simulation simulation(settlewell::scenario::read_scenario(file.string()),
                                    comm);
  settlewell::RunOptions options;
  options.run_directory = folder.string();
  options.overwrite = true;
  options.show_progress = false;
  ExampleRun run;
  run.summary = simulation.run(options);
  run.folder = folder;
  return run;
}

ExampleRun run_example(const std::string& example,
                       const std::string& variant,
                       const std::function<void(toml::table&)>& change) {
  const fs::path file = write_variant(example, variant, change);
  settlewell::Simulation simulation(settlewell::scenario::read_scenario(file.string()),
                                    MPI_COMM_WORLD);
  settlewell::RunOptions options;
  options.run_directory =
      (file.parent_path() / (example + "-" + variant + "-run")).string();
  options.overwrite = true;
  options.show_progress = false;
  ExampleRun run;
  run.summary = simulation.run(options);
  run.folder = options.run_directory;
  return run;
}

namespace {

/// The fields of one CSV line (RFC 4180: a quoted field may hold commas, and a
/// doubled quote stands for one).
std::vector<std::string> csv_fields(const std::string& line) {
  std::vector<std::string> fields(1);
  bool quoted = false;
  for (std::size_t i = 0; i < line.size(); ++i) {
    const char c = line[i];
    if (quoted && c == '"' && i + 1 < line.size() && line[i + 1] == '"')
      fields.back() += '"', ++i;
    else if (c == '"')
      quoted = !quoted;
    else if (c == ',' && !quoted)
      fields.emplace_back();
    else
      fields.back() += c;
  }
  return fields;
}

} // namespace

Csv::Csv(const fs::path& path) {
  std::ifstream in(path);
  if (!in)
    throw std::runtime_error("cannot read " + path.string());
  std::string line;
  std::getline(in, line);
  header_ = csv_fields(line);
  for (const auto& name : header_) // a table without rows still has its columns
    numbers_[name], texts_[name];
  while (std::getline(in, line)) {
    const auto cells = csv_fields(line);
    if (cells.size() != header_.size())
      throw std::runtime_error(path.string() + ": a row has " +
                               std::to_string(cells.size()) + " fields, the header " +
                               std::to_string(header_.size()));
    for (std::size_t c = 0; c < cells.size(); ++c) {
      texts_[header_[c]].push_back(cells[c]);
      char* end = nullptr;
      const double v = std::strtod(cells[c].c_str(), &end);
      numbers_[header_[c]].push_back(end != cells[c].c_str() ? v : 0.0);
    }
    ++n_rows_;
  }
}

const std::vector<double>& Csv::column(const std::string& name) const {
  const auto found = numbers_.find(name);
  if (found == numbers_.end())
    throw std::runtime_error("no column " + name);
  return found->second;
}

const std::vector<std::string>& Csv::text(const std::string& name) const {
  const auto found = texts_.find(name);
  if (found == texts_.end())
    throw std::runtime_error("no column " + name);
  return found->second;
}

std::vector<std::size_t> rows_at(const Csv& csv, double time_days) {
  std::vector<std::size_t> rows;
  const auto& t = csv.column("time_days");
  for (std::size_t i = 0; i < t.size(); ++i)
    if (std::abs(t[i] - time_days) <= 1e-6 * std::max(1.0, time_days))
      rows.push_back(i);
  return rows;
}

void coarsen_section(toml::table& scenario, double near, double far, double growth) {
  auto* mesh = scenario["section"]["mesh"].as_table();
  mesh->insert_or_assign("size_near_wall", near);
  mesh->insert_or_assign("size_near_well", near);
  mesh->insert_or_assign("size_far", far);
  mesh->insert_or_assign("growth", growth);
}

void shorten_pit(toml::table& s, const std::string& solver, double tolerance) {
  coarsen_section(s, 1.0, 25.0, 1.4);
  auto* stages = s["stages"].as_array();
  stages->get(0)->as_table()->insert_or_assign("duration", 20.0);
  stages->get(0)->as_table()->insert_or_assign("ramp", 20.0);
  stages->get(1)->as_table()->insert_or_assign("duration", 20.0);
  s["output"].as_table()->insert_or_assign("times", toml::array{10.0});
  s.insert_or_assign("numerics",
                     toml::table{{"solver", solver}, {"tolerance", tolerance}});
}

int check_figures(const std::filesystem::path& run_folder) {
  const std::string command = "/usr/bin/python3 " + std::string(SETTLEWELL_SOURCE_DIR) +
                              "/tests/report/check_figures.py " + run_folder.string();
  return std::system(command.c_str());
}

} // namespace example_support
