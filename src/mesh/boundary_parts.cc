// Parts of boundaries that take their own conditions (boundaries.<name>.part_of):
// the faces of the parent boundary on the part's side and in its window get a
// boundary id of their own, on the coarse mesh, so that refinement and a resumed
// run's loaded mesh inherit it.
#include "settlewell/core/errors.h"
#include "settlewell/core/number_text.h"
#include "settlewell/mesh/gmsh_mesh.h"
#include "settlewell/scenario/keys.h"
#include "settlewell/scenario/scenario.h"

#include <deal.II/base/mpi.h>

#include <algorithm>
#include <limits>

namespace settlewell {

namespace {

std::string known_boundaries(const Mesh& mesh) {
  std::string known;
  for (const auto& b : mesh.names.boundary_names())
    known += (known.empty() ? "" : ", ") + b;
  return known;
}

/// Moves the faces of `part.of` that the part contains to the new boundary `name`;
/// returns how many moved and how many the parent kept. The coarse mesh is the same
/// on every process, so each process does the same.
std::pair<int, int>
move_faces(Mesh& mesh, const scenario::BoundaryPart& part, const std::string& name) {
  const auto parent = mesh.names.boundary_id(part.of);
  const auto child = mesh.names.add_boundary(name);
  int moved = 0, kept = 0;
  for (const auto& cell : mesh.triangulation->cell_iterators_on_level(0))
    for (const unsigned int f : cell->face_indices()) {
      if (!cell->at_boundary(f) || cell->face(f)->boundary_id() != parent)
        continue;
      const dealii::Point<2> mid = cell->face(f)->center();
      if (part.contains(mid[0], mid[1])) {
        cell->face(f)->set_boundary_id(child);
        ++moved;
      } else
        ++kept;
    }
  return {moved, kept};
}

} // namespace

void apply_boundary_parts(const scenario::Scenario& s, Mesh& mesh) {
  for (const auto& name : s.boundary_parts_parents_first()) {
    const auto& part = *s.boundaries.at(name).part;
    if (!mesh.names.has_boundary(part.of)) {
      const std::string suggestion =
          scenario::nearest(part.of, mesh.names.boundary_names());
      throw InputError(s.location_of("boundaries." + name) + ": boundaries." + name +
                       ".part_of: the mesh has no boundary '" + part.of + "'" +
                       (suggestion.empty() ? " (known: " + known_boundaries(mesh) + ")"
                                           : "; did you mean '" + suggestion + "'?"));
    }
    if (mesh.names.has_boundary(name) || mesh.internal_lines.count(name))
      throw InputError(s.location_of("boundaries." + name) + ": boundaries." + name +
                       ": the mesh already has a line of that name; a part needs a "
                       "new name");
    const auto [moved, kept] = move_faces(mesh, part, name);
    if (moved == 0)
      throw InputError(s.location_of("boundaries." + name) + ": boundaries." + name +
                       ": no face of '" + part.of +
                       "' has its midpoint on the part's side and in its window");
    if (kept == 0)
      throw InputError(s.location_of("boundaries." + name) + ": boundaries." + name +
                       ": the part takes all of '" + part.of +
                       "'; give the conditions to '" + part.of + "' itself");
  }
}

BoundaryExtent boundary_extent(const Mesh& mesh, const std::string& name) {
  const auto id = mesh.names.boundary_id(name);
  constexpr double big = std::numeric_limits<double>::max();
  double low[2] = {big, big}, high[2] = {-big, -big};
  for (const auto& cell : mesh.triangulation->active_cell_iterators())
    if (cell->is_locally_owned())
      for (const unsigned int f : cell->face_indices())
        if (cell->at_boundary(f) && cell->face(f)->boundary_id() == id)
          for (unsigned int v = 0; v < 2; ++v)
            for (unsigned int d = 0; d < 2; ++d) {
              low[d] = std::min(low[d], cell->face(f)->vertex(v)[d]);
              high[d] = std::max(high[d], cell->face(f)->vertex(v)[d]);
            }
  const MPI_Comm comm = mesh.triangulation->get_communicator();
  return {dealii::Utilities::MPI::min(low[0], comm),
          dealii::Utilities::MPI::max(high[0], comm),
          dealii::Utilities::MPI::min(low[1], comm),
          dealii::Utilities::MPI::max(high[1], comm)};
}

std::string BoundaryExtent::text() const {
  const auto range = [](double a, double b) {
    return a == b ? significant(a) : significant(a) + " to " + significant(b);
  };
  return "x " + range(x_min, x_max) + " m, y " + range(y_min, y_max) + " m";
}

} // namespace settlewell
