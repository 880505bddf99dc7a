// Per-cell integrals kept between steps: they depend only on a cell and its
// material. The storage terms of the Biot system, alpha div u + S p tested with
// the pressure shape functions, give the old state's part of each step's
// right-hand side and the water taken into storage: each owned cell's rows are
// integrated once and every step applies them to its local values, with no
// quadrature. Cells that need their whole matrix every step keep its two parts.
#include "biot_problem_impl.h"

#include "settlewell/core/errors.h"

namespace settlewell {

using namespace dealii;

void BiotProblem::Impl::build_storage_rows() {
  CellKernel kernel(layout, setup.analysis, mapping);
  const unsigned int n = kernel.dofs_per_cell();
  storage_rows = {};
  for (unsigned int i = 0; i < n; ++i)
    if (!layout.is_displacement(layout.fe.system_to_component_index(i).first))
      storage_rows.rows.push_back(i);
  storage_rows.offset.assign(mesh.triangulation->n_active_cells(),
                             numbers::invalid_size_type);
  FullMatrix<double> cell_matrix(n, n);
  for (const auto& cell : dof_handler.active_cell_iterators()) {
    if (!cell->is_locally_owned())
      continue;
    // The matrix at dt = 0 holds (alpha B, S M) in its pressure rows.
    kernel.reinit(cell);
    cell_matrix = 0.0;
    kernel.add_matrix(coefficients[cell->material_id()], 0.0, cell_matrix);
    storage_rows.offset[cell->active_cell_index()] = storage_rows.values.size();
    for (const unsigned int i : storage_rows.rows)
      for (unsigned int j = 0; j < n; ++j)
        storage_rows.values.push_back(cell_matrix(i, j));
  }
  storage_rows.values.shrink_to_fit();
}

void BiotProblem::Impl::add_storage_terms(const DoFHandler<2>::active_cell_iterator& cell,
                                          const Vector<double>& local_state,
                                          Vector<double>& out) const {
  const std::size_t offset = storage_rows.offset.at(cell->active_cell_index());
  if (offset == numbers::invalid_size_type)
    throw InternalError("storage terms asked of a cell this process does not own");
  const unsigned int n = local_state.size();
  const double* row = storage_rows.values.data() + offset;
  for (const unsigned int i : storage_rows.rows) {
    double sum = 0.0;
    for (unsigned int j = 0; j < n; ++j)
      sum += row[j] * local_state(j);
    out(i) += sum;
    row += n;
  }
}

const FullMatrix<double>&
BiotProblem::Impl::cell_matrix_at(CellKernel& kernel,
                                  const DoFHandler<2>::active_cell_iterator& cell,
                                  double dt) const {
  auto [entry, is_new] = cell_matrix_parts.try_emplace(cell->active_cell_index());
  auto& [at_zero, per_dt] = entry->second;
  if (is_new) {
    const unsigned int n = kernel.dofs_per_cell();
    const CellCoefficients& c = coefficients[cell->material_id()];
    at_zero.reinit(n, n);
    kernel.add_matrix(c, 0.0, at_zero);
    per_dt.reinit(n, n);
    kernel.add_matrix(c, 1.0, per_dt);
    per_dt.add(-1.0, at_zero);
  }
  cell_matrix_now = at_zero;
  cell_matrix_now.add(dt, per_dt);
  return cell_matrix_now;
}

} // namespace settlewell
