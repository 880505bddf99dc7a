#include "settlewell/mesh/mesh.h"

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

Mesh::Mesh(MPI_Comm comm)
    : triangulation(std::make_unique<dealii::parallel::distributed::Triangulation<2>>(
          comm, dealii::Triangulation<2>::MeshSmoothing::smoothing_on_refinement)) {}

} // namespace settlewell
