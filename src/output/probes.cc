#include "settlewell/output/probes.h"

#include "settlewell/core/errors.h"
#include "settlewell/core/units.h"
#include "settlewell/physics/internal_lines.h"

#include <deal.II/base/mpi.h>
#include <deal.II/base/quadrature_lib.h>
#include <deal.II/fe/fe_values.h>
#include <deal.II/grid/grid_tools.h>

#include <sstream>

namespace settlewell {

using namespace dealii;

PointValues probe(const BiotProblem& problem, const Point<2>& x) {
  const auto& dof_handler = problem.dof_handler();
  const auto& fe = dof_handler.get_fe();
  std::vector<double> local{0.0, 0.0, 0.0, 0.0}; // ux, uy, p, found
  std::vector<std::pair<DoFHandler<2>::active_cell_iterator, Point<2>>> cells;
  try {
    cells = GridTools::find_all_active_cells_around_point(problem.mapping(), dof_handler,
                                                          x, 1e-10);
  } catch (const std::exception&) {
    // Not in this process's part of the mesh; another process will find it.
  }
  for (const auto& [cell, reference_point] : cells) {
    if (!cell->is_locally_owned())
      continue;
    const Quadrature<2> at_point(reference_point);
    FEValues<2> fv(problem.mapping(), fe, at_point, update_values);
    fv.reinit(cell);
    std::vector<Vector<double>> values(1, Vector<double>(FieldLayout::n_components));
    fv.get_function_values(problem.solution(), values);
    local = {values[0][FieldLayout::ux], values[0][FieldLayout::uy],
             values[0][FieldLayout::pressure], 1.0};
    break;
  }
  std::vector<double> total(local.size());
  MPI_Allreduce(local.data(), total.data(), int(local.size()), MPI_DOUBLE, MPI_SUM,
                problem.communicator());
  if (total[3] < 0.5) {
    std::ostringstream os;
    os << "point (" << x[0] << ", " << x[1] << ") m lies outside the mesh";
    throw InputError(os.str());
  }
  // A point on a boundary between processes may be found by more than one.
  return {total[0] / total[3], total[1] / total[3], total[2] / total[3]};
}

} // namespace settlewell
