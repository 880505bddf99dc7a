#pragma once

#include <deal.II/base/types.h>

#include <map>
#include <string>
#include <vector>

namespace settlewell {

/// Names of regions and boundaries, mapped to the ids deal.II stores on cells and
/// faces. Every other module addresses regions and boundaries by name only.
class NameTable {
public:
  dealii::types::material_id add_region(const std::string& name);
  dealii::types::boundary_id add_boundary(const std::string& name);

  /// The id of a name; throws InputError listing the known names if unknown.
  dealii::types::material_id region_id(const std::string& name) const;
  dealii::types::boundary_id boundary_id(const std::string& name) const;
  const std::string& region_name(dealii::types::material_id id) const;
  const std::string& boundary_name(dealii::types::boundary_id id) const;

  bool has_region(const std::string& name) const { return regions_.count(name) != 0; }
  bool has_boundary(const std::string& name) const {
    return boundaries_.count(name) != 0;
  }
  std::vector<std::string> region_names() const;
  std::vector<std::string> boundary_names() const;

private:
  std::map<std::string, dealii::types::material_id> regions_;
  std::map<std::string, dealii::types::boundary_id> boundaries_;
};

} // namespace settlewell
