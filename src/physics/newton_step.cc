// A step with a nonlinear skeleton (a Cam Clay region): Newton's method on the
// coupled system, a new tangent and factorisation per iteration.
#include "biot_problem_impl.h"

#include "settlewell/core/errors.h"

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
  LA::MPI::Vector r(owned, comm), scratch(owned, comm);
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

void BiotProblem::Impl::solve_newton_step(double t_new, double dt, StepReport& report) {
  Timer timer;
  set_drain_values(t_new);
  make_constraints(constraint_inputs(), t_new, constraints);
  // Start from the step's start with the step's prescribed values.
  owned_solution = step_start;
  constraints.distribute(owned_solution);
  solution = owned_solution;
  const auto& newton = setup.newton;
  for (unsigned int k = 0;; ++k) {
    timer.restart();
    report.yielding_points = update_clay_points();
    assemble_matrix(dt);
    assemble_rhs(t_new, dt);
    const FieldNorms r = newton_residual();
    report.assembly_seconds += timer.wall_time();
    if (k == 0) {
      largest_drive.u = std::max(largest_drive.u, r.u);
      largest_drive.p = std::max(largest_drive.p, r.p);
    }
    const double relative = std::max(largest_drive.u > 0.0 ? r.u / largest_drive.u : 0.0,
                                     largest_drive.p > 0.0 ? r.p / largest_drive.p : 0.0);
    report.newton_residuals.push_back(relative);
    if (k > 0 && relative <= newton.tolerance)
      break;
    if (k == newton.max_iterations) {
      std::ostringstream os;
      os << "Newton's method did not converge in the step to t = " << t_new / 86400.0
         << " days: after " << k << " iterations the residual is " << relative
         << " of the largest step's (tolerance " << newton.tolerance << ")";
      throw SolverError(os.str());
    }
    timer.restart();
    give_matrix_to_solver();
    report.factorisation_seconds += timer.wall_time();
    timer.restart();
    report.iterations += solve_system();
    constraints.distribute(owned_solution);
    solution = owned_solution;
    report.solve_seconds += timer.wall_time();
    ++report.newton_iterations;
  }
  report.new_matrix = true;
  matrix_dt = std::numeric_limits<double>::quiet_NaN();
  ++report.drain_rounds;
}

} // namespace settlewell
