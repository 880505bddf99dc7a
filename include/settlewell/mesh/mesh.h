#pragma once

#include "settlewell/mesh/name_table.h"

#include <deal.II/distributed/tria.h>

#include <map>
#include <memory>
#include <string>
#include <vector>

namespace settlewell {

/// A straight piece of an internal line, m.
struct Segment {
  dealii::Point<2> a, b;
  /// Whether point p lies on the segment, within `tolerance` (m).
  bool contains(const dealii::Point<2>& p, double tolerance) const;
};

/// A distributed triangulation together with the names of its regions
/// (material ids), its boundaries (boundary ids) and its internal lines (well
/// screens, the excavation level, wall faces), which are kept as geometry so that
/// they survive refinement and repartitioning.
struct Mesh {
  explicit Mesh(MPI_Comm comm);

  std::unique_ptr<dealii::parallel::distributed::Triangulation<2>> triangulation;
  NameTable names;
  std::map<std::string, std::vector<Segment>> internal_lines;

  bool has_line(const std::string& name) const {
    return names.has_boundary(name) || internal_lines.count(name) != 0;
  }
};

/// The axis a straight boundary is normal to: 0 if its faces are vertical (normal
/// along x), 1 if horizontal. Throws InputError if it is neither. Collective.
unsigned int boundary_normal_axis(const Mesh& mesh, const std::string& boundary);

} // namespace settlewell
