// A step with a nonlinear skeleton (a Cam Clay region): Newton's method on the
// coupled system, a new tangent per iteration, solved with a kept LU factor as
// GMRES's preconditioner while it serves.
#include "biot_problem_impl.h"

#include "settlewell/core/errors.h"

#include <deal.II/base/mpi.h>
#include <deal.II/base/timer.h>

#include <algorithm>
#include <sstream>

namespace settlewell {

namespace {
/// `v` with the entries outside `mask` (0/1 per owned dof) set to zero, its norm.
double masked_norm(const LA::MPI::Vector& v,
                   const LA::MPI::Vector& mask,
                   LA::MPI::Vector& scratch) {
  scratch = v;
  scratch.scale(mask);
  return scratch.l2_norm();
}
} // namespace

BiotProblem::Impl::FieldNorms BiotProblem::Impl::newton_residual() {
  // r = b - K x with the matrix before the solver's row signs; the constrained
  // rows hold the constraints, which the iterate already satisfies.
  if (newton_r.size() == 0)
    newton_r.reinit(owned, comm);
  LA::MPI::Vector& r = newton_r;
  LA::MPI::Vector scratch(owned, comm);
  matrix.vmult(r, owned_solution);
  r.sadd(-1.0, 1.0, rhs);
  constraints.set_zero(r);
  if (pressure_mask.size() == 0) {
    pressure_mask.reinit(owned, comm);
    for (const auto d :
         DoFTools::extract_dofs(dof_handler, layout.mask_of(FieldLayout::pressure)))
      pressure_mask(d) = 1.0;
    pressure_mask.compress(VectorOperation::insert);
    displacement_mask.reinit(owned, comm);
    displacement_mask = 1.0;
    displacement_mask -= pressure_mask;
  }
  return {masked_norm(r, displacement_mask, scratch),
          masked_norm(r, pressure_mask, scratch)};
}

void BiotProblem::Impl::assemble_newton_system(double t_new,
                                               double dt,
                                               bool first_iteration) {
  if (first_iteration) {
    const std::vector<bool> pressures_now = active_pressures(conditions, t_new);
    if (!(std::abs(dt - fixed_dt) <= 1e-12 * dt) || pressures_now != fixed_pressures ||
        Utilities::MPI::logical_or(draining != fixed_draining, comm)) {
      assemble_matrix(dt);
      if (fixed_matrix.m() == 0) {
        Table<2, DoFTools::Coupling> all(FieldLayout::n_components,
                                         FieldLayout::n_components);
        all.fill(DoFTools::always);
        reinit_distributed(fixed_matrix, all);
      }
      fixed_matrix.copy_from(matrix);
      fixed_dt = dt;
      fixed_pressures = pressures_now;
      fixed_draining = draining;
    }
    assemble_rhs(t_new, dt);
    fixed_rhs = rhs;
  }
  matrix.copy_from(fixed_matrix);
  rhs = fixed_rhs;
  add_clay_terms(dt);
}

void BiotProblem::Impl::add_clay_terms(double dt) {
  CellKernel kernel(layout, setup.analysis, mapping);
  const unsigned int n = kernel.dofs_per_cell();
  FullMatrix<double> cell_matrix(n, n), tangent(n, n);
  Vector<double> cell_rhs(n), local(n), terms(n);
  std::vector<types::global_dof_index> dofs(n);
  for (const auto& cell : dof_handler.active_cell_iterators()) {
    if (!cell->is_locally_owned() || !in_model(cell))
      continue;
    const bool clay = has_clay_points(cell), unsaturated = is_unsaturated(cell);
    if (!clay && !unsaturated)
      continue;
    kernel.reinit(cell);
    cell->get_dof_indices(dofs);
    cell_matrix = 0.0;
    cell_rhs = 0.0;
    cell->get_dof_values(solution, local);
    if (clay)
      add_clay_terms(kernel, cell, cell_matrix, cell_rhs);
    if (clay && conductivity_rate(cell->material_id()) != 0.0)
      add_clay_flow(kernel, cell, local, dt, cell_matrix, cell_rhs);
    if (unsaturated) {
      // Terms N(x) with tangent J enter as J in the matrix and J x - N(x) in the
      // right-hand side, so that b - K x holds -N(x).
      tangent = 0.0;
      terms = 0.0;
      add_unsaturated_terms(kernel, cell, dt, &tangent, terms);
      tangent.vmult_add(cell_rhs, local);
      cell_rhs -= terms;
      cell_matrix.add(1.0, tangent);
    }
    // The right-hand side holds J x_k: with a prescribed value g in x_k, the
    // constrained columns' J g must leave it, as the condensed matrix drops them.
    constraints.distribute_local_to_global(cell_matrix, cell_rhs, dofs, matrix, rhs,
                                           true);
  }
  matrix.compress(VectorOperation::add);
  rhs.compress(VectorOperation::add);
}

void BiotProblem::Impl::add_newton_correction(StepReport& report) {
  // The correction solves K delta = r. A factor of an earlier tangent serves as
  // the preconditioner of GMRES while it takes few iterations; a new one is made
  // when it no longer does (the tangent moved too far) or none exists yet.
  // About the cost of a new factorisation in solves with the kept one (measured
  // on the demo: an LU took as long as about 9 GMRES iterations).
  constexpr unsigned int krylov_limit = 8;
  if (row_signs.size() > 0)
    throw InternalError("a Newton step needs the system without row signs");
  if (newton_delta.size() == 0)
    newton_delta.reinit(owned, comm);
  LA::MPI::Vector& delta = newton_delta;
  Timer timer;
  unsigned int krylov = 0;
  if (newton_factor_ready)
    krylov = solver->solve_with_kept_factor(matrix, newton_r, delta,
                                            setup.newton.linear_tolerance, krylov_limit);
  // A factor that needed many iterations will need more as the tangent moves on:
  // the next correction makes a new one.
  newton_factor_ready = krylov > 0 && krylov <= krylov_limit / 2;
  if (krylov == 0) {
    timer.restart();
    give_matrix_to_solver();
    newton_factor_ready = true;
    report.new_matrix = true;
    ++report.factorisations;
    report.factorisation_seconds += timer.wall_time();
    timer.restart();
    krylov = solver->solve(newton_r, delta);
  }
  report.iterations += krylov;
  owned_solution += delta;
  constraints.distribute(owned_solution);
  solution = owned_solution;
  report.solve_seconds += timer.wall_time();
}

double BiotProblem::Impl::newton_iterate_residual(double t_new,
                                                  double dt,
                                                  bool first_iteration,
                                                  bool update_points,
                                                  StepReport& report) {
  Timer timer;
  if (update_points)
    report.yielding_points = update_clay_points();
  assemble_newton_system(t_new, dt, first_iteration);
  const FieldNorms r = newton_residual();
  report.assembly_seconds += timer.wall_time();
  if (first_iteration) {
    largest_drive.u = std::max(largest_drive.u, r.u);
    largest_drive.p = std::max(largest_drive.p, r.p);
  }
  return std::max(largest_drive.u > 0.0 ? r.u / largest_drive.u : 0.0,
                  largest_drive.p > 0.0 ? r.p / largest_drive.p : 0.0);
}

double BiotProblem::Impl::searched_residual(double t_new,
                                            double dt,
                                            double previous,
                                            StepReport& report) {
  // Backtracking with the sufficient decrease |r(x + s delta)| <= (1 - 1e-4 s)
  // |r(x)| (Dennis & Schnabel 1983 sec. 6.3, from memory). Past the last cut the
  // shortest correction is kept, or its failure raised: the step's cut-back
  // takes over.
  const unsigned int cuts = setup.newton.line_search_cuts;
  double share = 1.0; // of the correction in the iterate
  for (unsigned int cut = 0;; ++cut) {
    try {
      const double relative = newton_iterate_residual(t_new, dt, false, true, report);
      if (relative <= (1.0 - 1e-4 * share) * previous || cut == cuts)
        return relative;
    } catch (const SolverError&) { // a point's return failed, on every process
      if (cut == cuts)
        throw;
    }
    owned_solution.add(-0.5 * share, newton_delta);
    share *= 0.5;
    constraints.distribute(owned_solution);
    solution = owned_solution;
    ++report.line_search_cuts;
  }
}

bool BiotProblem::Impl::at_round_off(double relative) const {
  // Within a hundred times the tolerance, a correction below 1e-10 of the iterate
  // changes nothing the residual could show: what is left is round-off in b - K x
  // (its terms are far larger than their difference near a still state).
  return relative <= 100.0 * setup.newton.tolerance &&
         newton_delta.l2_norm() <= 1e-10 * owned_solution.l2_norm();
}

void BiotProblem::Impl::solve_newton_step(double t_new, double dt, StepReport& report) {
  set_drain_values(t_new);
  make_constraints(constraint_inputs(), t_new, constraints);
  // The first iterate carries the last step's trend on, x_n + r (x_n - x_{n-1})
  // with r = dt/dt_n (measured on the demo: a quarter fewer iterations), with the
  // step's prescribed values.
  owned_solution = step_start;
  const bool predicted = setup.newton.carry_trend && newton_previous_dt > 0.0;
  if (predicted) {
    const double r = (t_new - time) / newton_previous_dt;
    owned_solution.sadd(1.0 + r, -r, newton_previous);
  }
  constraints.distribute(owned_solution);
  solution = owned_solution;
  record_step_start_strains();
  const auto& newton = setup.newton;
  for (unsigned int k = 0;; ++k) {
    // Without a trend, the first iteration keeps the committed states and the
    // tangents of the last step's end (elastoplastic where the clay was
    // yielding): the strain has not moved yet, and an elastic tangent there would
    // overshoot.
    const double relative =
        k == 0 ? newton_iterate_residual(t_new, dt, true, predicted, report)
               : searched_residual(t_new, dt, report.newton_residuals.back(), report);
    report.newton_residuals.push_back(relative);
    if (k > 0 && (relative <= newton.tolerance || at_round_off(relative)))
      break;
    // Far above the step's start and above the largest drive (or not a number):
    // diverging, no use going on.
    const bool diverging =
        !(relative <= std::max(1.0, 1e4 * report.newton_residuals.front()));
    if (k == newton.max_iterations || diverging) {
      std::ostringstream os;
      os << "Newton's method " << (diverging ? "diverged" : "did not converge")
         << " in the step to t = " << t_new / 86400.0 << " days: after " << k
         << " iterations the residual is " << relative
         << " of the largest step's (tolerance " << newton.tolerance << ")";
      throw SolverError(os.str());
    }
    add_newton_correction(report);
    ++report.newton_iterations;
  }
  ++report.drain_rounds;
}

} // namespace settlewell
