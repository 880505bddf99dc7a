#include "settlewell/mesh/mesh.h"

#include "settlewell/core/errors.h"

#include <deal.II/base/mpi.h>

#include <algorithm>
#include <cmath>

namespace settlewell {

bool Segment::contains(const dealii::Point<2>& p, double tolerance) const {
  const dealii::Tensor<1, 2> ab = b - a;
  const double length2 = ab.norm_square();
  const double s = length2 > 0.0 ? ((p - a) * ab) / length2 : 0.0;
  if (s < -tolerance / std::sqrt(length2) || s > 1.0 + tolerance / std::sqrt(length2))
    return false;
  const dealii::Point<2> nearest = a + std::clamp(s, 0.0, 1.0) * ab;
  return nearest.distance(p) <= tolerance;
}

unsigned int boundary_normal_axis(const Mesh& mesh, const std::string& boundary) {
  const auto id = mesh.names.boundary_id(boundary);
  int vertical = 0, horizontal = 0, other = 0;
  for (const auto& cell : mesh.triangulation->active_cell_iterators()) {
    if (!cell->is_locally_owned())
      continue;
    for (const unsigned int f : cell->face_indices()) {
      if (!cell->at_boundary(f) || cell->face(f)->boundary_id() != id)
        continue;
      const dealii::Tensor<1, 2> d = cell->face(f)->vertex(1) - cell->face(f)->vertex(0);
      const double tol = 1e-8 * d.norm();
      (std::abs(d[0]) <= tol   ? vertical
       : std::abs(d[1]) <= tol ? horizontal
                               : other) += 1;
    }
  }
  const MPI_Comm comm = mesh.triangulation->get_communicator();
  vertical = dealii::Utilities::MPI::sum(vertical, comm);
  horizontal = dealii::Utilities::MPI::sum(horizontal, comm);
  other = dealii::Utilities::MPI::sum(other, comm);
  if (other > 0 || (vertical > 0 && horizontal > 0) || vertical + horizontal == 0)
    throw InputError(
        "boundary '" + boundary +
        "' is not one straight vertical or horizontal line, so 'roller' has no "
        "single normal direction; use fixed or free");
  return vertical > 0 ? 0u : 1u;
}

Mesh::Mesh(MPI_Comm comm)
    : triangulation(std::make_unique<dealii::parallel::distributed::Triangulation<2>>(
          comm, dealii::Triangulation<2>::MeshSmoothing::smoothing_on_refinement)) {}

} // namespace settlewell
