// The start of an analysis, and the displacement movements are reported from.
//
// By default the geostatic K0 state is taken as the equilibrium of the start and
// the unknowns are changes from it. With gravity loading (setup.gravity_loading)
// the start state S0 (the geostatic effective stress, usually none, the initial
// pore pressure and the unit weights) is not assumed to balance: its out-of-balance
// force B = sum over cells of [weight - internal force of (sigma'0 - alpha p0 I)]
// stays in the right-hand side of every step, and a drained solve at t = 0,
//   K_uu u_g = B  (excess pore pressure held at zero),
// puts it in equilibrium. The effective stress is then sigma'0 + D eps(u), with u
// measured from S0, and u_g is the reference the reported displacement starts from
// (a drained "gravity turn-on": common practice in finite-element analysis of
// excavations, with no single source; from memory).
//
// Digging releases the same forces in both starts. With B in the right-hand side,
// the remaining cells' share of B stays, and a dug cell k is released as
// (1 - lambda) (H_k - G_k) (excavation.cc).
#include "biot_problem_impl.h"

#include "settlewell/core/errors.h"

#include <deal.II/base/timer.h>

namespace settlewell {

void BiotProblem::Impl::add_start_imbalance(
    CellKernel& kernel,
    const DoFHandler<2>::active_cell_iterator& cell,
    Vector<double>& out) const {
  const auto region = cell->material_id();
  kernel.add_geostatic_imbalance(
      coefficients[region], unit_weights.at(region),
      [&](const Point<2>& x) { return setup.geostatic.effective_stress(x, region); },
      [&](const Point<2>& x) { return setup.gamma_w * (setup.initial_head(x) - x[1]); },
      out);
}

StepReport BiotProblem::settle_under_gravity() {
  Impl& m = *impl_;
  if (!m.setup.gravity_loading || m.settled || m.time != 0.0)
    throw InternalError("gravity loading comes once, before the first step");
  StepReport report;
  Timer timer;
  AffineConstraints<double> held;
  make_drained_constraints(m.constraint_inputs(), held);
  std::swap(m.constraints, held);
  // The displacement rows do not depend on dt and the pressure rows are all held.
  m.assemble_matrix(1.0);
  m.rhs = 0.0;
  CellKernel kernel(m.layout, m.setup.analysis, m.mapping);
  Vector<double> local(kernel.dofs_per_cell());
  std::vector<types::global_dof_index> dofs(kernel.dofs_per_cell());
  for (const auto& cell : m.dof_handler.active_cell_iterators()) {
    if (!cell->is_locally_owned() || !m.in_model(cell))
      continue;
    kernel.reinit(cell);
    cell->get_dof_indices(dofs);
    local = 0.0;
    m.add_start_imbalance(kernel, cell, local);
    m.constraints.distribute_local_to_global(local, dofs, m.rhs);
  }
  m.rhs.compress(VectorOperation::add);
  report.assembly_seconds = timer.wall_time();
  timer.restart();
  m.give_matrix_to_solver();
  report.factorisation_seconds = timer.wall_time();
  report.new_matrix = true;
  timer.restart();
  report.iterations = m.solve_system();
  m.constraints.distribute(m.owned_solution);
  m.solution = m.owned_solution;
  report.solve_seconds = timer.wall_time();
  std::swap(m.constraints, held);
  m.matrix_dt = std::numeric_limits<double>::quiet_NaN(); // the first step assembles
  m.previous_dt = 0.0; // and starts with implicit Euler
  m.settled = true;
  set_displacement_reference();
  return report;
}

void BiotProblem::set_displacement_reference() {
  Impl& m = *impl_;
  m.reference.reinit(m.owned, m.comm);
  m.reference = m.owned_solution;
  const auto& fe = m.layout.fe;
  std::vector<types::global_dof_index> dofs(fe.n_dofs_per_cell());
  for (const auto& cell : m.dof_handler.active_cell_iterators()) {
    if (!cell->is_locally_owned())
      continue;
    cell->get_dof_indices(dofs);
    for (unsigned int i = 0; i < dofs.size(); ++i)
      if (!m.layout.is_displacement(fe.system_to_component_index(i).first) &&
          m.owned.is_element(dofs[i]))
        m.reference(dofs[i]) = 0.0;
  }
  m.reference.compress(VectorOperation::insert);
  m.has_reference = true;
  m.update_reported();
}

void BiotProblem::Impl::update_reported() {
  if (!has_reference)
    return;
  LA::MPI::Vector difference(owned_solution);
  difference -= reference;
  if (reported.size() != owned_solution.size())
    reported.reinit(owned, relevant, comm);
  reported = difference;
}

const LA::MPI::Vector& BiotProblem::reported_solution() const {
  return impl_->has_reference ? impl_->reported : impl_->solution;
}

} // namespace settlewell
