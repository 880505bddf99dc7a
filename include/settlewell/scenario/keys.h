#pragma once

#include <iosfwd>
#include <string>
#include <vector>

namespace settlewell::scenario {

/// One key of the scenario file, declared once: the parser only reads declared
/// keys, unknown keys are errors, and `settlewell check --keys` prints this list.
/// In paths, `<name>` stands for a name the user chooses and `[]` for an element
/// of an array of tables.
/// The default is declared here and nowhere else: the parsers read a literal
/// default ("0.5", "true", "\"auto\"") from this registry; a default that depends
/// on other values (the layer's material, a tenth of the stage) is described in
/// words and computed where the value is used.
struct KeySpec {
  const char* path;
  const char* type;
  const char* unit;
  std::string default_value; ///< "required", "-" (optional, no default) or the default
  const char* doc;

  bool required() const { return default_value == "required"; }
  /// Whether the default is a literal value of the key's type (not words).
  bool has_literal_default() const;
};

const std::vector<KeySpec>& all_keys();

/// The declaration of a key path ("materials.<name>.earth_pressure_at_rest");
/// throws InternalError for a path that is not declared.
const KeySpec& key_spec(const std::string& path);

/// The unit of the declared key that a concrete path names
/// ("materials.aquifer_sand.conductivity_x" or "stages[1].wells.W1.head": a user's
/// name stands for `<name>`, an index for `[]`); "" when the key has none or no
/// declared key matches.
std::string unit_of(const std::string& concrete_path);

/// The declared children (keys or sub-tables) of a table path such as
/// "section.wall" or "stages[].wells.<name>".
std::vector<std::string> children_of(const std::string& table_path);

/// Whether the table at this path holds user-named entries ("materials" does).
bool holds_named_entries(const std::string& table_path);

/// The declared key closest to `key` among `candidates` (edit distance), or "".
std::string nearest(const std::string& key, const std::vector<std::string>& candidates);

/// Prints the key reference, one block per table.
void print_key_reference(std::ostream& out);

} // namespace settlewell::scenario
