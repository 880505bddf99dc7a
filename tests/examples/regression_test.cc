// A regression guard: the examples at a coarse setting give the outputs stored in
// tests/reference/<case>/ (every CSV file of the run folder and every value of
// results.toml) to round-off. Refactoring must not change results; a change that
// does must say why and regenerate the references with
//   SETTLEWELL_UPDATE_REFERENCE=1 ./build/tests/example_regression_test
// then show the difference in its commit.
#include "example_support.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <fstream>
#include <functional>
#include <set>

using namespace example_support;
namespace fs = std::filesystem;

namespace {

const fs::path reference_root = fs::path(SETTLEWELL_SOURCE_DIR) / "tests" / "reference";

bool updating() {
  const char* flag = std::getenv("SETTLEWELL_UPDATE_REFERENCE");
  return flag != nullptr && std::string(flag) == "1";
}

/// Wall-clock timings differ from run to run; they are not results.
bool is_timing(const std::string& key) {
  static const std::set<std::string> timings{
      "assembly_s",  "factorisation_s", "solve_s",  "monitors_s", "output_s",
      "wall_time_s", "started",         "finished", "input",      "input_sha256"};
  return timings.count(key) != 0;
}

/// A relative water-balance error is round-off noise near zero: compared absolutely.
bool is_round_off_measure(const std::string& key) {
  return key.find("balance_error") != std::string::npos ||
         key == "largest_relative_error";
}

/// Two printed numbers agree to round-off: 9 significant digits are written, so
/// 1e-7 of the larger of the value and the column's scale covers a last-digit flip
/// after a change of summation order.
bool agree(double a, double b, double scale, const std::string& key) {
  if (is_round_off_measure(key))
    return std::abs(a - b) <= 1e-8;
  return std::abs(a - b) <= 1e-7 * std::max({std::abs(a), std::abs(b), scale}) + 1e-300;
}

/// A text with the checkout's folder and the temporary folder written as
/// "<source>" and "<tmp>", so that results name the same files on every machine.
std::string without_folders(std::string text) {
  for (const auto& [folder, name] :
       {std::pair<std::string, std::string>{SETTLEWELL_SOURCE_DIR, "<source>"},
        {fs::temp_directory_path().string(), "<tmp>"}})
    for (auto at = text.find(folder); at != std::string::npos; at = text.find(folder))
      text.replace(at, folder.size(), name);
  return text;
}

/// results.toml with every text made machine-independent (without_folders).
toml::table read_results(const fs::path& path) {
  toml::table results = toml::parse_file(path.string());
  std::function<void(toml::node&)> visit = [&](toml::node& node) {
    if (auto* table = node.as_table())
      for (auto&& [key, value] : *table)
        visit(value);
    else if (auto* array = node.as_array())
      for (auto& value : *array)
        visit(value);
    else if (auto* text = node.as_string())
      *text = without_folders(text->get());
  };
  visit(results);
  return results;
}

std::set<std::string> csv_files(const fs::path& folder) {
  std::set<std::string> files;
  for (const auto& entry : fs::recursive_directory_iterator(folder))
    if (entry.path().extension() == ".csv")
      files.insert(fs::relative(entry.path(), folder).string());
  return files;
}

/// The largest magnitude in a column, or over both displacement columns for either:
/// a displacement that the problem makes zero (ux in a 1D column) is round-off
/// noise, to be compared against the size of the displacements, not of itself.
double column_scale(const Csv& csv, const std::string& column) {
  static const std::set<std::string> displacements{"ux_m", "settlement_m"};
  std::vector<std::string> columns{column};
  if (displacements.count(column) != 0)
    std::copy_if(csv.header().begin(), csv.header().end(), std::back_inserter(columns),
                 [](const std::string& c) { return displacements.count(c) != 0; });
  double scale = 0.0;
  for (const auto& c : columns)
    for (const double v : csv.column(c))
      scale = std::max(scale, std::abs(v));
  return scale;
}

void compare_csv(const fs::path& run,
                 const fs::path& reference,
                 const std::string& name) {
  const Csv a(run), b(reference);
  ASSERT_EQ(a.rows(), b.rows()) << name;
  ASSERT_EQ(a.header(), b.header()) << name;
  for (const auto& column : b.header()) {
    if (is_timing(column))
      continue;
    const auto& x = a.column(column);
    const auto& y = b.column(column);
    const double scale = column_scale(b, column);
    std::size_t failures = 0;
    for (std::size_t i = 0; i < x.size(); ++i) {
      const bool same_text = a.text(column)[i] == b.text(column)[i];
      if (same_text || agree(x[i], y[i], scale, column))
        continue;
      if (++failures <= 3)
        ADD_FAILURE() << name << " row " << i + 1 << " column " << column << ": "
                      << a.text(column)[i] << " against the reference "
                      << b.text(column)[i];
    }
    EXPECT_EQ(failures, 0u) << name << " column " << column;
  }
}

void compare_nodes(const toml::node& a, const toml::node& b, const std::string& path) {
  const std::string key = path.substr(path.rfind('.') + 1);
  if (is_timing(key))
    return;
  if (b.is_table()) {
    ASSERT_TRUE(a.is_table()) << path;
    std::set<std::string> keys_a, keys_b;
    for (const auto& [k, v] : *a.as_table())
      keys_a.insert(std::string(k.str()));
    for (const auto& [k, v] : *b.as_table())
      keys_b.insert(std::string(k.str()));
    EXPECT_EQ(keys_a, keys_b) << path;
    for (const auto& [k, v] : *b.as_table())
      if (const toml::node* other = a.as_table()->get(k.str()))
        compare_nodes(*other, v, path + "." + std::string(k.str()));
  } else if (b.is_array()) {
    ASSERT_TRUE(a.is_array()) << path;
    ASSERT_EQ(a.as_array()->size(), b.as_array()->size()) << path;
    for (std::size_t i = 0; i < b.as_array()->size(); ++i)
      compare_nodes(*a.as_array()->get(i), *b.as_array()->get(i),
                    path + "[" + std::to_string(i) + "]");
  } else if (b.is_number()) {
    ASSERT_TRUE(a.is_number()) << path;
    const double x = a.value<double>().value(), y = b.value<double>().value();
    EXPECT_TRUE(agree(x, y, 0.0, key)) << path << ": " << x << " against " << y;
  } else if (b.is_string()) {
    EXPECT_EQ(a.value<std::string>(), b.value<std::string>()) << path;
  } else if (b.is_boolean()) {
    EXPECT_EQ(a.value<bool>(), b.value<bool>()) << path;
  }
}

/// Compares a run folder with its stored reference, or stores it when updating.
void check_against_reference(const fs::path& run, const std::string& name) {
  const fs::path reference = reference_root / name;
  const auto files = csv_files(run);
  if (updating()) {
    fs::remove_all(reference);
    for (const auto& f : files) {
      fs::create_directories((reference / f).parent_path());
      fs::copy_file(run / f, reference / f);
    }
    std::ofstream(reference / "results.toml")
        << read_results(run / "results.toml") << '\n';
    std::cout << "stored the reference outputs of " << name << " in " << reference
              << "\n";
    return;
  }
  ASSERT_TRUE(fs::exists(reference)) << "no reference outputs in " << reference;
  EXPECT_EQ(files, csv_files(reference)) << "the run writes other CSV files";
  for (const auto& f : files)
    if (fs::exists(reference / f))
      compare_csv(run / f, reference / f, name + "/" + f);
  compare_nodes(read_results(run / "results.toml"),
                read_results(reference / "results.toml"), name);
}

} // namespace

TEST(Regression, BasementPitCoarseAndShortGivesTheStoredOutputs) {
  const auto run = run_example("basement-pit", "regression",
                               [](toml::table& s) { shorten_pit(s, "direct", 1e-10); });
  check_against_reference(run.folder, "basement-pit");
}

TEST(Regression, ShaftCoarseGivesTheStoredOutputs) {
  const auto run = run_example(
      "shaft", "regression", [](toml::table& s) { coarsen_section(s, 1.0, 20.0, 1.35); });
  check_against_reference(run.folder, "shaft");
}

TEST(Regression, LayeredColumnGivesTheStoredOutputs) {
  const auto run = run_example("layered-column", "regression", nullptr);
  check_against_reference(run.folder, "layered-column");
}

TEST(Regression, UserMeshScenarioGivesTheStoredOutputs) {
  const auto run = run_scenario_file(
      fs::path(SETTLEWELL_SOURCE_DIR) / "tests" / "examples" / "user_mesh.toml",
      fs::temp_directory_path() / "settlewell_regression_user_mesh", MPI_COMM_WORLD);
  check_against_reference(run.folder, "user-mesh");
}
