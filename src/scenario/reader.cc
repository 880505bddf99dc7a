#include "reader.h"

#include "settlewell/core/errors.h"
#include "settlewell/core/files.h"
#include "settlewell/scenario/keys.h"

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <sstream>

namespace settlewell::scenario {

std::string format_number(double v) {
  std::ostringstream os;
  os << v;
  return os.str();
}

namespace {

InputError syntax_error(const toml::parse_error& e, const std::string& name) {
  const auto& begin = e.source().begin;
  return InputError(name + ":" + std::to_string(begin.line) + ":" +
                    std::to_string(begin.column) + ": " + std::string(e.description()));
}

} // namespace

toml::table parse_toml(std::string_view text, const std::string& name) {
  try {
    return toml::parse(text, name);
  } catch (const toml::parse_error& e) {
    throw syntax_error(e, name);
  }
}

toml::table parse_toml_file(const std::string& path) {
  if (const auto problem = input_file_problem(path, largest_text_input_bytes);
      !problem.empty())
    throw InputError(path + ": " + problem);
  try {
    return toml::parse_file(path);
  } catch (const toml::parse_error& e) {
    throw syntax_error(e, path);
  }
}

std::string position(const std::string& file, const toml::node& node) {
  const auto& begin = node.source().begin;
  return file + ":" + std::to_string(begin.line) + ":" + std::to_string(begin.column);
}

TableReader::TableReader(const toml::table& table,
                         std::string path,
                         std::string label,
                         const std::string& file)
    : table_(table)
    , path_(std::move(path))
    , label_(std::move(label))
    , file_(file) {
  reject_unknown_keys();
}

const toml::node& TableReader::node_of(const std::string& key) const {
  const toml::node* node = table_.get(key);
  return node != nullptr ? *node : static_cast<const toml::node&>(table_);
}

std::string TableReader::where(const std::string& key) const {
  return position(file_, node_of(key));
}

void TableReader::fail(const std::string& key, const std::string& message) const {
  const std::string name = label_.empty() ? key : label_ + "." + key;
  throw InputError(where(key) + ": " + name + ": " + message);
}

void TableReader::fail_here(const std::string& message) const {
  throw InputError(position(file_, table_) + ": " +
                   (label_.empty() ? std::string() : label_ + ": ") + message);
}

void TableReader::reject_unknown_keys() const {
  if (holds_named_entries(path_))
    return;
  std::vector<std::string> declared = children_of(path_);
  for (auto& d : declared) // an array of tables is declared as "name[]"
    if (d.size() > 2 && d.compare(d.size() - 2, 2, "[]") == 0)
      d.resize(d.size() - 2);
  for (const auto& [key, node] : table_) {
    const std::string k(key.str());
    if (std::find(declared.begin(), declared.end(), k) != declared.end())
      continue;
    const std::string suggestion = nearest(k, declared);
    const std::string where_label =
        label_.empty() ? "at the top level" : "in [" + label_ + "]";
    throw InputError(position(file_, node) + ": unknown key '" + k + "' " + where_label +
                     (suggestion.empty() ? "" : "; did you mean '" + suggestion + "'?"));
  }
}

std::string TableReader::default_of(const std::string& key) const {
  const KeySpec& spec = key_spec(path_.empty() ? key : path_ + "." + key);
  if (spec.has_literal_default())
    return spec.default_value;
  if (spec.required() || spec.default_value == "-")
    fail_here("missing the required key '" + key + "'");
  throw InternalError("the key '" + std::string(spec.path) +
                      "' has no literal default; read it with an optional_ function");
}

double number_value(const toml::node& node) {
  if (const auto* integer = node.as_integer())
    return static_cast<double>(integer->get());
  return node.as_floating_point()->get();
}

std::optional<double> TableReader::optional_number(const std::string& key) const {
  const toml::node* node = table_.get(key);
  if (node == nullptr)
    return std::nullopt;
  if (!node->is_number())
    fail(key, "must be a number");
  const double value = number_value(*node);
  if (!std::isfinite(value))
    fail(key, "must be a finite number");
  return value;
}

double TableReader::number(const std::string& key) const {
  if (const auto value = optional_number(key))
    return *value;
  return std::strtod(default_of(key).c_str(), nullptr);
}

double TableReader::positive(const std::string& key) const {
  const double value = number(key);
  if (!(value > 0.0))
    fail(key, "must be positive (got " + format_number(value) + ")");
  return value;
}

double TableReader::elevation(const std::string& key) const {
  return within(key, -1e4, 1e4, "m", "heads and elevations within 10 km of the datum");
}

double TableReader::within(const std::string& key,
                           double low,
                           double high,
                           const std::string& unit,
                           const std::string& bounds) const {
  const double value = number(key);
  if (!(value >= low && value <= high))
    fail(key, "must lie in [" + format_number(low) + ", " + format_number(high) + "]" +
                  (unit.empty() ? "" : " " + unit) + ", " + bounds + " (got " +
                  format_number(value) + ")");
  return value;
}

std::optional<std::string> TableReader::optional_text(const std::string& key) const {
  const toml::node* node = table_.get(key);
  if (node == nullptr)
    return std::nullopt;
  if (!node->is_string())
    fail(key, "must be a string");
  return std::string(*node->value<std::string_view>());
}

std::string TableReader::text(const std::string& key) const {
  if (const auto value = optional_text(key))
    return *value;
  const std::string quoted = default_of(key);
  return quoted.substr(1, quoted.size() - 2);
}

bool TableReader::boolean(const std::string& key) const {
  const toml::node* node = table_.get(key);
  if (node == nullptr)
    return default_of(key) == "true";
  if (!node->is_boolean())
    fail(key, "must be true or false");
  return *node->value<bool>();
}

long long TableReader::integer(const std::string& key) const {
  const toml::node* node = table_.get(key);
  if (node == nullptr)
    return std::stoll(default_of(key));
  if (!node->is_integer())
    fail(key, "must be a whole number");
  return *node->value<long long>();
}

const toml::table* TableReader::table(const std::string& key) const {
  const toml::node* node = table_.get(key);
  if (node == nullptr)
    return nullptr;
  if (!node->is_table())
    fail(key, "must be a table");
  return node->as_table();
}

const toml::array* TableReader::array(const std::string& key) const {
  const toml::node* node = table_.get(key);
  if (node == nullptr)
    return nullptr;
  if (!node->is_array())
    fail(key, "must be an array");
  return node->as_array();
}

TableReader
sub_table(const TableReader& parent, const std::string& key, const std::string& path) {
  static const toml::table empty;
  const toml::table* table = parent.table(key);
  const std::string label = parent.label().empty() ? key : parent.label() + "." + key;
  return TableReader(table != nullptr ? *table : empty, path, label, parent.file());
}

} // namespace settlewell::scenario
