#pragma once

#include <string>
#include <vector>

namespace settlewell::scenario {

/// One swept parameter: a scenario key (dotted path; `[i]` picks an element of
/// an array of tables, e.g. "stages[0].wells.W1.head") and the values it takes.
struct SweepParameter {
  std::string key;
  std::vector<double> values;
};

/// A sweep file: a base scenario and a grid of parameter values.
struct SweepSpec {
  std::string source_path;
  std::string scenario_path; ///< resolved relative to the sweep file
  std::string output;        ///< default run folder of the sweep
  std::vector<SweepParameter> parameters;
  std::string chart_x, chart_y; ///< a parameter and a summary column to plot
};

/// Reads and checks a sweep file; every variant of the grid is parsed as a
/// scenario so that errors show before anything runs. Throws InputError with
/// "FILE:LINE:COL: message".
SweepSpec read_sweep(const std::string& path);

/// The number of variants (the product of the value counts).
std::size_t variant_count(const SweepSpec& sweep);
/// The parameter values of variant `index` (the last parameter varies fastest).
std::vector<double> variant_values(const SweepSpec& sweep, std::size_t index);

/// The base scenario's TOML with the variant's values set, as text; relative
/// mesh paths are made absolute so that the text can live anywhere.
std::string variant_scenario_text(const SweepSpec& sweep, std::size_t index);

/// The summary columns a sweep can chart.
const std::vector<std::string>& sweep_result_columns();

} // namespace settlewell::scenario
