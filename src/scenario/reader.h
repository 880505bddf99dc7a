#pragma once

// Private to src/scenario: reading one TOML table against the key registry.
#include <toml++/toml.h>

#include <optional>
#include <string>

namespace settlewell::scenario {

/// A number as a message shows it (shortest form, "0.5", "1e-09").
std::string format_number(double v);

/// Parses TOML text; a syntax error is an InputError "NAME:LINE:COL: what".
toml::table parse_toml(std::string_view text, const std::string& name);
/// The same for a file.
toml::table parse_toml_file(const std::string& path);

/// "FILE:LINE:COL" of a node.
std::string position(const std::string& file, const toml::node& node);

/// A TOML number (integer or float) as a double: an integer too large to be one
/// exactly is rounded, where toml++'s value<double>() would give nothing.
double number_value(const toml::node& node);

/// Reads the keys of one table. `path` is the table's registry path
/// ("section.wall", "stages[].wells.<name>"), `label` how messages name it.
class TableReader {
public:
  TableReader(const toml::table& table,
              std::string path,
              std::string label,
              const std::string& file);

  // number(), positive(), text(), boolean() and integer() return the value given,
  // or the key's literal default from the registry (keys.cc); a missing key
  // without one is an error at the table. A default that depends on other values
  // is read with optional_*() and computed by the caller.
  double number(const std::string& key) const;
  double positive(const std::string& key) const; ///< number(key), > 0
  /// number(key) in [low, high], else an error naming the range, its `unit` and
  /// what bounds it (values outside are typing slips, not ground).
  /// A head or elevation, m: within(key, -1e4, 1e4, ...), ten kilometres of the datum.
  double elevation(const std::string& key) const;
  double within(const std::string& key,
                double low,
                double high,
                const std::string& unit,
                const std::string& bounds) const;
  std::string text(const std::string& key) const;
  bool boolean(const std::string& key) const;
  long long integer(const std::string& key) const;
  std::optional<double> optional_number(const std::string& key) const;
  std::optional<std::string> optional_text(const std::string& key) const;
  const toml::table* table(const std::string& key) const;
  const toml::array* array(const std::string& key) const;
  bool has(const std::string& key) const { return table_.contains(key); }
  /// Whether the key is given as an array (where a number or an array may be).
  bool has_array(const std::string& key) const {
    const toml::node* node = table_.get(key);
    return node != nullptr && node->is_array();
  }

  /// "FILE:LINE:COL" of a key's value (or of the table if absent).
  std::string where(const std::string& key) const;
  /// Throws InputError "FILE:LINE:COL: <label>.<key>: message" at the key's value.
  [[noreturn]] void fail(const std::string& key, const std::string& message) const;
  /// Throws at the table itself.
  [[noreturn]] void fail_here(const std::string& message) const;
  /// Every key of the table must be declared; suggests the nearest one if not.
  void reject_unknown_keys() const;

  const std::string& file() const { return file_; }
  const std::string& label() const { return label_; }
  const std::string& path() const { return path_; }

private:
  const toml::node& node_of(const std::string& key) const;
  /// The registry's literal default of an absent key, as written there.
  std::string default_of(const std::string& key) const;
  const toml::table& table_;
  std::string path_, label_;
  const std::string& file_;
};

/// A reader of the sub-table `key` of `parent`, or of an empty table when the
/// scenario leaves it out, so that every key takes its registry default.
TableReader
sub_table(const TableReader& parent, const std::string& key, const std::string& path);

} // namespace settlewell::scenario
