#include "settlewell/scenario/sweep_file.h"

#include "reader.h"

#include "settlewell/core/errors.h"
#include "settlewell/scenario/parse.h"

#include <toml++/toml.h>

#include <algorithm>
#include <filesystem>
#include <sstream>

namespace settlewell::scenario {

namespace fs = std::filesystem;

namespace {

/// The table that holds the value at a dotted path (made if missing), and the
/// value's name; "name[i]" indexes an array of tables. Returns nullptr (and why)
/// when the path cannot name a number.
toml::table* find_or_make(toml::table& root,
                          const std::string& key,
                          std::string& name_out,
                          std::string& problem) {
  toml::table* table = &root;
  std::stringstream parts(key);
  std::string part;
  std::vector<std::string> segments;
  while (std::getline(parts, part, '.'))
    segments.push_back(part);
  for (std::size_t s = 0; s < segments.size(); ++s) {
    std::string name = segments[s];
    std::optional<std::size_t> index;
    if (const auto open = name.find('['); open != std::string::npos) {
      index = std::stoul(name.substr(open + 1));
      name = name.substr(0, open);
    }
    const bool last = s + 1 == segments.size();
    if (index) {
      toml::array* array = table->get_as<toml::array>(name);
      if (array == nullptr || *index >= array->size() || !(*array)[*index].is_table()) {
        problem = "'" + name + "[" + std::to_string(*index) + "]' is not in the scenario";
        return nullptr;
      }
      table = (*array)[*index].as_table();
      if (last) {
        problem = "a swept key must name a value, not a table";
        return nullptr;
      }
      continue;
    }
    if (last) {
      if (table->contains(name) && !table->get(name)->is_number()) {
        problem = "'" + name + "' is not a number in the scenario";
        return nullptr;
      }
      name_out = name;
      return table;
    }
    if (!table->contains(name))
      table->insert(name, toml::table{});
    table = table->get_as<toml::table>(name);
    if (table == nullptr) {
      problem = "'" + name + "' is not a table in the scenario";
      return nullptr;
    }
  }
  return nullptr;
}

void absolute_mesh_path(toml::table& scenario, const std::string& scenario_path) {
  auto* mesh = scenario.get_as<toml::table>("mesh_file");
  if (mesh == nullptr || !mesh->contains("path"))
    return;
  const fs::path path(std::string(*(*mesh)["path"].value<std::string>()));
  if (path.is_relative())
    mesh->insert_or_assign(
        "path", fs::absolute(fs::path(scenario_path).parent_path() / path).string());
}

} // namespace

const std::vector<std::string>& sweep_result_columns() {
  static const std::vector<std::string> columns{"largest_neighbour_settlement_m",
                                                "worst_neighbour_category",
                                                "least_piping_factor",
                                                "least_heave_factor",
                                                "uplift_factor_at_end",
                                                "final_discharge_m3_per_day",
                                                "pumped_volume_m3",
                                                "settlement_outside_m",
                                                "drawdown_outside_m",
                                                "share_from_lateral_edges"};
  return columns;
}

std::size_t variant_count(const SweepSpec& sweep) {
  std::size_t n = 1;
  for (const auto& p : sweep.parameters)
    n *= p.values.size();
  return n;
}

std::vector<double> variant_values(const SweepSpec& sweep, std::size_t index) {
  std::vector<double> values(sweep.parameters.size());
  for (std::size_t k = sweep.parameters.size(); k-- > 0;) {
    const auto& p = sweep.parameters[k];
    values[k] = p.values[index % p.values.size()];
    index /= p.values.size();
  }
  return values;
}

std::string variant_scenario_text(const SweepSpec& sweep, std::size_t index) {
  toml::table scenario = parse_toml_file(sweep.scenario_path);
  absolute_mesh_path(scenario, sweep.scenario_path);
  const auto values = variant_values(sweep, index);
  for (std::size_t k = 0; k < values.size(); ++k) {
    std::string problem, name;
    toml::table* parent = find_or_make(scenario, sweep.parameters[k].key, name, problem);
    if (parent == nullptr)
      throw InputError(sweep.source_path + ": parameter '" + sweep.parameters[k].key +
                       "': " + problem);
    parent->insert_or_assign(name, values[k]);
  }
  std::ostringstream text;
  text << scenario << '\n';
  return text.str();
}

namespace {

void read_base(const toml::table& root, const std::string& path, SweepSpec& sweep) {
  for (const auto& [key, node] : root) {
    const std::string k(key.str());
    if (k != "scenario" && k != "output" && k != "parameters" && k != "chart")
      throw InputError(
          position(path, node) + ": unknown key '" + k +
          "' (a sweep file has scenario, output, [[parameters]] and [chart])");
  }
  const auto scenario = root["scenario"].value<std::string>();
  if (!scenario)
    throw InputError(path + ":1:1: a sweep needs scenario = \"path/to/scenario.toml\"");
  sweep.scenario_path = (fs::path(path).parent_path() / *scenario).string();
  if (!fs::exists(sweep.scenario_path))
    throw InputError(position(path, *root.get("scenario")) + ": scenario: cannot read '" +
                     sweep.scenario_path + "'");
  sweep.output = root["output"].value_or(fs::path(path).stem().string() + "-sweep");
}

void read_parameters(const toml::table& root, const std::string& path, SweepSpec& sweep) {
  const toml::array* parameters = root["parameters"].as_array();
  if (parameters == nullptr || parameters->empty())
    throw InputError(path + ":1:1: a sweep needs at least one [[parameters]] entry");
  for (const auto& entry : *parameters) {
    const toml::table* t = entry.as_table();
    if (t == nullptr || !(*t)["key"].is_string() || !(*t)["values"].is_array())
      throw InputError(position(path, entry) +
                       ": each [[parameters]] needs key and values");
    SweepParameter p{std::string(*(*t)["key"].value<std::string>()), {}};
    for (const auto& v : *(*t)["values"].as_array()) {
      if (!v.is_number())
        throw InputError(position(path, v) + ": parameter '" + p.key +
                         "': values must be numbers");
      p.values.push_back(number_value(v));
    }
    if (p.values.empty())
      throw InputError(position(path, entry) + ": parameter '" + p.key +
                       "' has no values");
    sweep.parameters.push_back(p);
  }
}

void read_chart(const toml::table& root, const std::string& path, SweepSpec& sweep) {
  const toml::table* chart = root["chart"].as_table();
  if (chart == nullptr)
    return;
  sweep.chart_x = (*chart)["x"].value_or(std::string());
  sweep.chart_y = (*chart)["y"].value_or(std::string());
  const auto& columns = sweep_result_columns();
  if (std::find(columns.begin(), columns.end(), sweep.chart_y) == columns.end())
    throw InputError(position(path, *chart) +
                     ": chart.y must be one of the summary columns "
                     "(e.g. largest_neighbour_settlement_m)");
  const bool swept = std::any_of(sweep.parameters.begin(), sweep.parameters.end(),
                                 [&](const auto& p) { return p.key == sweep.chart_x; });
  if (!swept)
    throw InputError(position(path, *chart) + ": chart.x must be one of the swept keys");
}

/// Every variant must be a valid scenario before anything runs.
void check_variants(const SweepSpec& sweep, const std::string& path) {
  for (std::size_t i = 0; i < variant_count(sweep); ++i) {
    const std::string name =
        sweep.output + "/variant_" + std::to_string(i) + "/scenario.toml";
    try {
      parse_scenario(variant_scenario_text(sweep, i), name);
    } catch (const InputError& e) {
      throw InputError(path + ": variant " + std::to_string(i) +
                       " is not a valid scenario: " + e.what());
    }
  }
}

} // namespace

SweepSpec read_sweep(const std::string& path) {
  const toml::table root = parse_toml_file(path);
  SweepSpec sweep;
  sweep.source_path = path;
  read_base(root, path, sweep);
  read_parameters(root, path, sweep);
  read_chart(root, path, sweep);
  check_variants(sweep, path);
  return sweep;
}

} // namespace settlewell::scenario
