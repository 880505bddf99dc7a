#include "settlewell/mesh/name_table.h"

#include "settlewell/core/errors.h"

namespace settlewell {

namespace {
template <typename Id>
Id add_name(std::map<std::string, Id>& table, const std::string& name, const char* what) {
  if (name.empty())
    throw InternalError(std::string("a ") + what + " name must not be empty");
  const auto found = table.find(name);
  if (found != table.end())
    return found->second;
  const Id id = static_cast<Id>(table.size());
  table.emplace(name, id);
  return id;
}

template <typename Id>
std::string known_names(const std::map<std::string, Id>& table) {
  std::string list;
  for (const auto& [name, id] : table)
    list += (list.empty() ? "" : ", ") + name;
  return list.empty() ? "none" : list;
}

template <typename Id>
Id find_name(const std::map<std::string, Id>& table,
             const std::string& name,
             const char* what) {
  const auto found = table.find(name);
  if (found == table.end())
    throw InputError(std::string("no ") + what + " named '" + name +
                     "' in the mesh (known: " + known_names(table) + ")");
  return found->second;
}

template <typename Id>
const std::string&
name_of(const std::map<std::string, Id>& table, Id id, const char* what) {
  for (const auto& [name, value] : table)
    if (value == id)
      return name;
  throw InternalError(std::string("no ") + what + " has id " + std::to_string(id));
}

template <typename Id>
std::vector<std::string> names_of(const std::map<std::string, Id>& table) {
  std::vector<std::string> names;
  for (const auto& entry : table)
    names.push_back(entry.first);
  return names;
}
} // namespace

dealii::types::material_id NameTable::add_region(const std::string& name) {
  return add_name(regions_, name, "region");
}
dealii::types::boundary_id NameTable::add_boundary(const std::string& name) {
  return add_name(boundaries_, name, "boundary");
}
dealii::types::material_id NameTable::region_id(const std::string& name) const {
  return find_name(regions_, name, "region");
}
dealii::types::boundary_id NameTable::boundary_id(const std::string& name) const {
  return find_name(boundaries_, name, "boundary");
}
const std::string& NameTable::region_name(dealii::types::material_id id) const {
  return name_of(regions_, id, "region");
}
const std::string& NameTable::boundary_name(dealii::types::boundary_id id) const {
  return name_of(boundaries_, id, "boundary");
}
std::vector<std::string> NameTable::region_names() const {
  return names_of(regions_);
}
std::vector<std::string> NameTable::boundary_names() const {
  return names_of(boundaries_);
}

} // namespace settlewell
