#include "settlewell/physics/internal_lines.h"

#include "settlewell/physics/field_layout.h"

#include <set>

namespace settlewell {

using namespace dealii;

namespace {

bool face_on_line(const DoFHandler<2>::face_iterator& face,
                  const std::vector<Segment>& line) {
  const double tol = 1e-6 * face->diameter();
  for (const auto& segment : line)
    if (segment.contains(face->vertex(0), tol) &&
        segment.contains(face->vertex(1), tol) && segment.contains(face->center(), tol))
      return true;
  return false;
}

/// The pressure dofs at the vertices of the faces `on` picks, each once.
template <typename Picks>
std::vector<std::pair<types::global_dof_index, Point<2>>>
pressure_dofs_on_faces(const DoFHandler<2>& dof_handler, const Picks& on) {
  // Vertex dofs of the FESystem come in base-element order: ux, uy, then p.
  const unsigned int p_index_at_vertex = FieldLayout::pressure;
  std::set<types::global_dof_index> seen;
  std::vector<std::pair<types::global_dof_index, Point<2>>> dofs;
  for (const auto& cell : dof_handler.active_cell_iterators()) {
    if (cell->is_artificial())
      continue;
    for (const unsigned int f : cell->face_indices()) {
      if (!on(cell, f))
        continue;
      const auto face = cell->face(f);
      for (unsigned int v = 0; v < 2; ++v) {
        const auto dof = face->vertex_dof_index(v, p_index_at_vertex);
        if (seen.insert(dof).second)
          dofs.emplace_back(dof, face->vertex(v));
      }
    }
  }
  return dofs;
}

} // namespace

std::vector<std::pair<types::global_dof_index, Point<2>>>
pressure_dofs_on_line(const DoFHandler<2>& dof_handler,
                      const std::vector<Segment>& line) {
  return pressure_dofs_on_faces(dof_handler, [&](const auto& cell, unsigned int f) {
    return face_on_line(cell->face(f), line);
  });
}

std::vector<std::pair<types::global_dof_index, Point<2>>>
pressure_dofs_on_boundary(const DoFHandler<2>& dof_handler, types::boundary_id id) {
  return pressure_dofs_on_faces(dof_handler, [&](const auto& cell, unsigned int f) {
    return cell->at_boundary(f) && cell->face(f)->boundary_id() == id;
  });
}

std::vector<LineFace> faces_on_boundary(const DoFHandler<2>& dof_handler,
                                        types::boundary_id id) {
  std::vector<LineFace> faces;
  for (const auto& cell : dof_handler.active_cell_iterators())
    if (cell->is_locally_owned())
      for (const unsigned int f : cell->face_indices())
        if (cell->at_boundary(f) && cell->face(f)->boundary_id() == id)
          faces.push_back({cell, f});
  return faces;
}

std::vector<LineFace> faces_on_line(const DoFHandler<2>& dof_handler,
                                    const std::vector<Segment>& line) {
  std::vector<LineFace> faces;
  for (const auto& cell : dof_handler.active_cell_iterators()) {
    if (!cell->is_locally_owned())
      continue;
    for (const unsigned int f : cell->face_indices()) {
      if (!face_on_line(cell->face(f), line))
        continue;
      const bool interior = !cell->at_boundary(f);
      if (interior && !(cell->id() < cell->neighbor(f)->id()))
        continue;
      faces.push_back({cell, f});
    }
  }
  return faces;
}

} // namespace settlewell
