// Soil that drains above the water table: the cells of a region with a retention
// curve add, in each Newton iteration, the terms by which partly saturated soil
// differs from the saturated system (CellKernel::add_unsaturated_terms); the water
// balance adds their water content's change to storage.
#include "biot_problem_impl.h"

#include "settlewell/core/errors.h"

namespace settlewell {

void BiotProblem::Impl::prepare_unsaturated() {
  retention_by_region.assign(coefficients.size(), nullptr);
  for (const auto& [region, curve] : setup.unsaturated) {
    curve.validate("the retention curve of region '" + region + "'");
    retention_by_region.at(mesh.names.region_id(region)) = &curve;
  }
}

void BiotProblem::Impl::add_unsaturated_terms(
    CellKernel& kernel,
    const DoFHandler<2>::active_cell_iterator& cell,
    double dt,
    FullMatrix<double>* tangent,
    Vector<double>& residual) const {
  const unsigned int n = kernel.dofs_per_cell();
  Vector<double> local(n), old(n);
  cell->get_dof_values(solution, local);
  cell->get_dof_values(old_solution, old);
  UnsaturatedCoefficients u;
  u.curve = retention_by_region[cell->material_id()];
  u.gamma_w = setup.gamma_w;
  u.start_pressure = [this](const Point<2>& x) {
    return setup.gamma_w * (setup.initial_head(x) - x[1]);
  };
  kernel.add_unsaturated_terms(coefficients[cell->material_id()], u, local, old, dt,
                               tangent, residual);
}

} // namespace settlewell
