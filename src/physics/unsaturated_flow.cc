// Soil that drains above the water table: the cells of a region with a retention
// curve add, in each Newton iteration, the terms by which partly saturated soil
// differs from the saturated system (CellKernel::add_unsaturated_terms); the water
// balance adds their water content's change to storage.
#include "biot_problem_impl.h"

#include "settlewell/core/errors.h"

#include <deal.II/base/mpi.h>
#include <deal.II/base/quadrature_lib.h>
#include <deal.II/fe/fe_values.h>

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

double BiotProblem::water_drained_from_pores() const {
  const Impl& m = *impl_;
  if (m.setup.unsaturated.empty())
    return 0.0;
  CellKernel kernel(m.layout, m.setup.analysis, m.mapping);
  FEValues<2> values(m.mapping, m.layout.fe,
                     QGauss<2>(FieldLayout::displacement_degree + 1),
                     update_values | update_quadrature_points | update_JxW_values);
  std::vector<double> p(values.n_quadrature_points);
  const double gw = m.setup.gamma_w;
  double drained = 0.0;
  for (const auto& cell : m.dof_handler.active_cell_iterators()) {
    if (!cell->is_locally_owned() || !m.in_model(cell) || !m.is_unsaturated(cell))
      continue;
    const RetentionCurve& curve = *m.retention_by_region[cell->material_id()];
    values.reinit(cell);
    values[m.layout.excess_pressure].get_function_values(m.solution, p);
    for (unsigned int q = 0; q < p.size(); ++q) {
      const Point<2>& x = values.quadrature_point(q);
      const double start = gw * (m.setup.initial_head(x) - x[1]);
      drained += (curve.at(start / gw).content - curve.at((start + p[q]) / gw).content) *
                 kernel.weight(values, q);
    }
  }
  return Utilities::MPI::sum(drained, m.comm);
}

} // namespace settlewell
