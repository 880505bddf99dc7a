#pragma once

// Private to src/scenario: reading one TOML table against the key registry.
#include <toml++/toml.h>

#include <optional>
#include <string>

namespace settlewell::scenario {

/// A number as a message shows it (shortest form, "0.5", "1e-09").
std::string format_number(double v);

/// "FILE:LINE:COL" of a node.
std::string position(const std::string& file, const toml::node& node);

/// Reads the keys of one table. `path` is the table's registry path
/// ("section.wall", "stages[].wells.<name>"), `label` how messages name it.
class TableReader {
public:
  TableReader(const toml::table& table,
              std::string path,
              std::string label,
              const std::string& file);

  double number(const std::string& key) const; ///< required
  std::optional<double> optional_number(const std::string& key) const;
  double number_or(const std::string& key, double fallback) const;
  double positive(const std::string& key) const;  ///< required, > 0
  std::string text(const std::string& key) const; ///< required
  std::string text_or(const std::string& key, const std::string& fallback) const;
  bool boolean_or(const std::string& key, bool fallback) const;
  std::optional<long long> optional_integer(const std::string& key) const;
  const toml::table* table(const std::string& key) const;
  const toml::array* array(const std::string& key) const;
  bool has(const std::string& key) const { return table_.contains(key); }

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
  const toml::table& table_;
  std::string path_, label_;
  const std::string& file_;
};

} // namespace settlewell::scenario
