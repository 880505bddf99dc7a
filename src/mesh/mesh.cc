#include "settlewell/mesh/mesh.h"

namespace settlewell {

Mesh::Mesh(MPI_Comm comm)
    : triangulation(std::make_unique<dealii::parallel::distributed::Triangulation<2>>(
          comm, dealii::Triangulation<2>::MeshSmoothing::smoothing_on_refinement)) {}

} // namespace settlewell
