// Soil taken out of the model. A removed cell stops being assembled, the dofs that
// no remaining cell shares are held at zero (the same algebra as giving it
// FE_Nothing, without renumbering the dofs or transferring the state), and the
// forces it carried on the remaining cells are released: in the total form of the
// displacement rows,
//   K u = f(t) - sum_k [ lambda_k(t) H_k + (1 - lambda_k(t)) G_k ],
// with H_k the removed cells' geostatic out-of-balance force (weight minus the
// internal force of the absolute total stress at t = 0) and G_k the internal force
// of their stress change at the moment of removal. At lambda = 0 the state at
// removal is still in equilibrium; at lambda = 1 the remaining body carries no
// force from the removed soil: its absolute stress is released (Brown & Booker
// 1985 give the same nodal excavation forces for the linear case).
#include "biot_problem_impl.h"

#include "settlewell/core/errors.h"

#include <algorithm>

namespace settlewell {

namespace {

double release_fraction(const ExcavationEvent& e, double t) {
  if (!(e.release_end > e.start))
    return 1.0;
  return std::clamp((t - e.start) / (e.release_end - e.start), 0.0, 1.0);
}

} // namespace

bool BiotProblem::Impl::excavate(double t) {
  std::vector<std::size_t> due;
  for (std::size_t k = 0; k < setup.excavation.size(); ++k)
    if (!excavated[k] && setup.excavation[k].start <= t * (1 + 1e-12))
      due.push_back(k);
  if (due.empty())
    return false;
  CellKernel kernel(layout, setup.analysis, mapping);
  const unsigned int n = kernel.dofs_per_cell();
  FullMatrix<double> cell_matrix(n, n);
  Vector<double> local(n);
  for (const auto& cell : dof_handler.active_cell_iterators()) {
    if (cell->is_artificial() || !in_model(cell))
      continue;
    const auto event = std::find_if(due.begin(), due.end(), [&](std::size_t k) {
      return setup.excavation[k].removes(cell->center(), cell->material_id());
    });
    if (event == due.end())
      continue;
    removed[cell->active_cell_index()] = true;
    if (!cell->is_locally_owned())
      continue;
    ReleasedCell r{*event, cell->active_cell_index(),
                   std::vector<types::global_dof_index>(n), Vector<double>(n),
                   Vector<double>(n)};
    cell->get_dof_indices(r.dofs);
    kernel.reinit(cell);
    const CellCoefficients& c = coefficients[cell->material_id()];
    add_start_imbalance(kernel, cell, r.geostatic);
    // The rows of the displacement equations do not depend on dt.
    cell_matrix = 0.0;
    kernel.add_matrix(c, 1.0, cell_matrix);
    cell->get_dof_values(solution, local);
    cell_matrix.vmult(r.carried, local);
    for (unsigned int i = 0; i < n; ++i)
      if (!layout.is_displacement(layout.fe.system_to_component_index(i).first))
        r.carried(i) = r.geostatic(i) = 0.0;
    released.push_back(std::move(r));
  }
  for (const auto k : due)
    excavated[k] = true;
  return true;
}

void BiotProblem::Impl::add_release_loads(double t, LA::MPI::Vector& target) const {
  Vector<double> load;
  for (const auto& r : released) {
    const double lambda = release_fraction(setup.excavation[r.event], t);
    load = r.carried;
    // With gravity loading the right-hand side keeps every cell's start imbalance
    // H (initial_equilibrium.cc), which releases the dug cell's H already.
    load.sadd(-(1.0 - lambda), setup.gravity_loading ? 1.0 - lambda : -lambda,
              r.geostatic);
    constraints.distribute_local_to_global(load, r.dofs, target);
  }
}

namespace {

/// 0 for a cell no event removes, else 1 + the first event that removes it.
double removal_tag(const std::vector<ExcavationEvent>& events,
                   const Point<2>& centre,
                   types::material_id region) {
  for (std::size_t k = 0; k < events.size(); ++k)
    if (events[k].removes(centre, region))
      return double(k + 1);
  return 0.0;
}

} // namespace

IndexSet BiotProblem::Impl::dug_boundary_dofs() const {
  // A dof where cells of different removal tags meet has count * sum of squares >
  // sum^2 (the tags' variance is positive).
  LA::MPI::Vector count(owned, comm), sum(owned, comm), squares(owned, comm);
  std::vector<types::global_dof_index> dofs(layout.fe.n_dofs_per_cell());
  for (const auto& cell : dof_handler.active_cell_iterators()) {
    if (!cell->is_locally_owned() || !in_model(cell))
      continue;
    cell->get_dof_indices(dofs);
    const double tag = removal_tag(setup.excavation, cell->center(), cell->material_id());
    for (const auto i : dofs) {
      count(i) += 1.0;
      sum(i) += tag;
      squares(i) += tag * tag;
    }
  }
  for (auto* v : {&count, &sum, &squares})
    v->compress(VectorOperation::add);
  IndexSet meeting(owned.size());
  for (const auto i : owned)
    if (double(count(i)) * double(squares(i)) > double(sum(i)) * double(sum(i)) + 0.5)
      meeting.add_index(i);
  return meeting;
}

BiotProblem::OutOfBalance BiotProblem::geostatic_out_of_balance() const {
  const Impl& m = *impl_;
  if (!m.setup.geostatic.effective_stress)
    throw InternalError("no geostatic state to check");
  // force: the summed imbalance; released: the size of what the dug cells carry.
  LA::MPI::Vector force(m.owned, m.comm), released(m.owned, m.comm);
  CellKernel kernel(m.layout, m.setup.analysis, m.mapping);
  const unsigned int n = kernel.dofs_per_cell();
  Vector<double> local(n), state(n), internal(n);
  FullMatrix<double> cell_matrix(n, n);
  std::vector<types::global_dof_index> dofs(n);
  for (const auto& cell : m.dof_handler.active_cell_iterators()) {
    if (!cell->is_locally_owned() || !m.in_model(cell))
      continue;
    kernel.reinit(cell);
    cell->get_dof_indices(dofs);
    const auto region = cell->material_id();
    local = 0.0;
    m.add_start_imbalance(kernel, cell, local);
    // Less the internal force of the displacement now (that of gravity loading).
    cell_matrix = 0.0;
    kernel.add_matrix(m.coefficients[region], 1.0, cell_matrix);
    cell->get_dof_values(m.solution, state);
    cell_matrix.vmult(internal, state);
    for (unsigned int i = 0; i < local.size(); ++i)
      if (m.layout.is_displacement(m.layout.fe.system_to_component_index(i).first))
        local(i) -= internal(i);
    m.constraints.distribute_local_to_global(local, dofs, force);
    if (removal_tag(m.setup.excavation, cell->center(), region) > 0.0) {
      for (auto& v : local)
        v = std::abs(v);
      m.constraints.distribute_local_to_global(local, dofs, released);
    }
  }
  force.compress(VectorOperation::add);
  released.compress(VectorOperation::add);
  OutOfBalance local_result;
  for (const auto i : m.dug_boundary_dofs())
    if (!m.constraints.is_constrained(i)) {
      const double f = std::abs(double(force(i)));
      local_result.largest = std::max(local_result.largest, f);
      local_result.summed += f;
      local_result.released += double(released(i));
    }
  return {Utilities::MPI::max(local_result.largest, m.comm),
          Utilities::MPI::sum(local_result.summed, m.comm),
          Utilities::MPI::sum(local_result.released, m.comm)};
}

void BiotProblem::Impl::set_deactivated_diagonals(LA::MPI::SparseMatrix& target) const {
  const auto dead = deactivated_dofs(dof_handler, removed);
  // A diagonal of the size of the others keeps the matrix well scaled.
  double sum = 0.0;
  std::size_t count = 0;
  for (const auto i : owned)
    if (!constraints.is_constrained(i))
      sum += std::abs(target.diag_element(i)), ++count;
  const double mean = Utilities::MPI::sum(sum, comm) /
                      std::max<double>(1.0, Utilities::MPI::sum(double(count), comm));
  for (const auto i : dead)
    if (owned.is_element(i))
      target.set(i, i, mean > 0.0 ? mean : 1.0);
  target.compress(VectorOperation::insert);
}

void BiotProblem::Impl::mark_removed_cells() {
  for (const auto& cell : dof_handler.active_cell_iterators())
    if (!cell->is_artificial())
      for (std::size_t k = 0; k < excavated.size(); ++k)
        if (excavated[k] &&
            setup.excavation[k].removes(cell->center(), cell->material_id()))
          removed[cell->active_cell_index()] = true;
}

} // namespace settlewell
