#pragma once

// Private to src/scenario: the parts of the scenario parser, one per top-level table.
#include "reader.h"

#include "settlewell/core/errors.h"

#include "settlewell/scenario/scenario.h"

namespace settlewell::scenario {

void parse_materials(const TableReader& top, Scenario& s);
void parse_geometry(const TableReader& top, Scenario& s);
void parse_groundwater(const TableReader& top, Scenario& s);
void parse_boundaries(const TableReader& top, Scenario& s);
void parse_stages(const TableReader& top, Scenario& s);
void parse_output(const TableReader& top, Scenario& s);
void parse_checks(const TableReader& top, Scenario& s);

/// The layers (or mesh regions) by name, whichever geometry was given.
std::vector<std::string> region_names(const Scenario& s);
/// Lateral extent [x_min, x_max] and vertical extent [y_min, y_max] of a
/// section or box model (not known for a mesh file: returns false).
bool model_extent(
    const Scenario& s, double& x_min, double& x_max, double& y_min, double& y_max);

/// Each element of an array of tables, with its own reader.
template <typename F>
void for_each_table(const TableReader& parent, const std::string& key, F&& f) {
  const toml::array* array = parent.array(key);
  if (array == nullptr)
    return;
  std::size_t index = 0;
  for (const auto& element : *array) {
    const std::string label = parent.label().empty() ? key : parent.label() + "." + key;
    if (!element.is_table())
      throw InputError(position(parent.file(), element) + ": " + label +
                       ": each entry must be a table");
    const std::string path =
        parent.path().empty() ? key + "[]" : parent.path() + "." + key + "[]";
    f(TableReader(*element.as_table(), path, label + "[" + std::to_string(index++) + "]",
                  parent.file()));
  }
}

/// Each entry of a table of user-named tables (materials.<name>, ...).
template <typename F>
void for_each_named(const TableReader& parent, const std::string& key, F&& f) {
  const toml::table* table = parent.table(key);
  if (table == nullptr)
    return;
  const std::string label = parent.label().empty() ? key : parent.label() + "." + key;
  const std::string path = parent.path().empty() ? key : parent.path() + "." + key;
  for (const auto& [name, node] : *table) {
    const std::string entry(name.str());
    if (!node.is_table())
      throw InputError(position(parent.file(), node) + ": " + label + "." + entry +
                       ": must be a table");
    f(entry, TableReader(*node.as_table(), path + ".<name>", label + "." + entry,
                         parent.file()));
  }
}

} // namespace settlewell::scenario
