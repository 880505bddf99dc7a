#pragma once

// Running the examples (or variants of them) from tests, and reading their run
// folders back.
#include "settlewell/run/simulation.h"

#include <toml++/toml.h>

#include <filesystem>
#include <functional>
#include <map>
#include <string>
#include <vector>

namespace example_support {

struct ExampleRun {
  std::filesystem::path folder;
  settlewell::RunSummary summary;
};

/// Reads examples/<example>/scenario.toml, lets `change` edit it, writes the
/// variant next to its run folder and runs it quietly. Both go into
/// <tmp>/settlewell_examples/<suite>.<test>/ (without the last part outside a test),
/// so tests that ctest runs side by side never share a folder.
ExampleRun run_example(const std::string& example,
                       const std::string& variant,
                       const std::function<void(toml::table&)>& change);

/// Runs a scenario file into `folder` on `comm`, quietly.
ExampleRun run_scenario_file(const std::filesystem::path& file,
                             const std::filesystem::path& folder,
                             MPI_Comm comm);

/// The same scenario variant as run_example would write, without running it.
std::filesystem::path write_variant(const std::string& example,
                                    const std::string& variant,
                                    const std::function<void(toml::table&)>& change);

/// A CSV file as columns of numbers (non-numeric cells are kept as text).
class Csv {
public:
  explicit Csv(const std::filesystem::path& path);
  const std::vector<double>& column(const std::string& name) const;
  const std::vector<std::string>& text(const std::string& name) const;
  std::size_t rows() const { return n_rows_; }
  const std::vector<std::string>& header() const { return header_; }

private:
  std::vector<std::string> header_;
  std::map<std::string, std::vector<double>> numbers_;
  std::map<std::string, std::vector<std::string>> texts_;
  std::size_t n_rows_ = 0;
};

/// Rows of a profile or point table at one time (days), as indices.
std::vector<std::size_t> rows_at(const Csv& csv, double time_days);

/// Coarser mesh sizes for a section example (tests run at a coarse setting).
void coarsen_section(toml::table& scenario, double near, double far, double growth);

/// The basement pit coarsened and shortened to two 20-day stages (an output at
/// day 10), solved with `solver` ("direct" or "iterative") to `tolerance`.
void shorten_pit(toml::table& scenario, const std::string& solver, double tolerance);

/// The exit status of tests/report/check_figures.py on a run folder: 0 when its
/// figures label their axes with units, have legends for what they draw, and state
/// their scales (it prints each failure).
int check_figures(const std::filesystem::path& run_folder);

} // namespace example_support
