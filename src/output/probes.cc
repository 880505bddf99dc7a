#include "settlewell/output/probes.h"

#include "settlewell/core/errors.h"

#include <deal.II/base/mpi_remote_point_evaluation.h>
#include <deal.II/numerics/vector_tools_evaluate.h>

#include <sstream>

namespace settlewell {

using namespace dealii;

PointValues probe(const BiotProblem& problem, const Point<2>& x) {
  // deal.II's remote point evaluation finds the cell on whichever process owns it
  // and sends the values to every process; a point on a cell edge gets the mean
  // of the (continuous) fields of its cells.
  Utilities::MPI::RemotePointEvaluation<2> evaluation;
  const auto values = VectorTools::point_values<FieldLayout::n_components>(
      problem.mapping(), problem.dof_handler(), problem.reported_solution(), {x},
      evaluation);
  if (!evaluation.all_points_found()) {
    std::ostringstream os;
    os << "point (" << x[0] << ", " << x[1] << ") m lies outside the mesh";
    throw InputError(os.str());
  }
  return {values[0][FieldLayout::ux], values[0][FieldLayout::uy],
          values[0][FieldLayout::pressure]};
}

} // namespace settlewell
