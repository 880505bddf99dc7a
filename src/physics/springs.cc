// Point springs (props): a stiffness on the diagonal of one displacement dof and,
// on the right-hand side, the preload and the stiffness times the displacement at
// fitting, so that a spring fitted to a moving wall takes load only from then on.
#include "biot_problem_impl.h"

#include "settlewell/core/errors.h"

#include <deal.II/base/mpi.h>

#include <cmath>
#include <limits>

namespace settlewell {

void BiotProblem::Impl::locate_springs() {
  const auto none = std::numeric_limits<types::global_dof_index>::max();
  spring_dofs.assign(setup.springs.size(), none);
  const double tol = 1e-9 * (1.0 + mesh.triangulation->get_vertices().front().norm());
  for (std::size_t k = 0; k < setup.springs.size(); ++k) {
    const auto& spring = setup.springs[k];
    types::global_dof_index dof = none;
    for (const auto& cell : dof_handler.active_cell_iterators())
      if (!cell->is_artificial())
        for (const unsigned int v : cell->vertex_indices())
          if (cell->vertex(v).distance(spring.at) <= tol * (1.0 + spring.at.norm()))
            dof = cell->vertex_dof_index(v, spring.direction);
    spring_dofs[k] = Utilities::MPI::min(dof, comm);
    if (spring_dofs[k] == none)
      throw InputError("'" + spring.name + "': no node of the mesh at (" +
                       std::to_string(spring.at[0]) + ", " +
                       std::to_string(spring.at[1]) + ") m");
  }
  spring_fitted_at.assign(setup.springs.size(), std::numeric_limits<double>::quiet_NaN());
}

double BiotProblem::Impl::value_of(types::global_dof_index dof) const {
  return Utilities::MPI::sum(owned.is_element(dof) ? solution(dof) : 0.0, comm);
}

bool BiotProblem::Impl::fit_springs(double t) {
  bool fitted = false;
  for (std::size_t k = 0; k < setup.springs.size(); ++k)
    if (std::isnan(spring_fitted_at[k]) && setup.springs[k].from <= t * (1 + 1e-12)) {
      spring_fitted_at[k] = value_of(spring_dofs[k]);
      fitted = true;
    }
  return fitted;
}

void BiotProblem::Impl::add_spring_stiffness(LA::MPI::SparseMatrix& target) const {
  for (std::size_t k = 0; k < setup.springs.size(); ++k)
    if (!std::isnan(spring_fitted_at[k]) && owned.is_element(spring_dofs[k]))
      target.add(spring_dofs[k], spring_dofs[k], setup.springs[k].stiffness);
  target.compress(VectorOperation::add);
}

void BiotProblem::Impl::add_spring_loads(LA::MPI::Vector& target) const {
  for (std::size_t k = 0; k < setup.springs.size(); ++k) {
    const auto& spring = setup.springs[k];
    if (!std::isnan(spring_fitted_at[k]) && owned.is_element(spring_dofs[k]))
      target(spring_dofs[k]) +=
          spring.sense * spring.preload + spring.stiffness * spring_fitted_at[k];
  }
}

double BiotProblem::spring_force(std::size_t k) const {
  const Impl& m = *impl_;
  const auto& spring = m.setup.springs.at(k);
  if (std::isnan(m.spring_fitted_at[k]))
    return spring.preload;
  const double moved =
      (m.value_of(m.spring_dofs[k]) - m.spring_fitted_at[k]) * spring.sense;
  return spring.preload - spring.stiffness * moved;
}

bool BiotProblem::spring_fitted(std::size_t k) const {
  return !std::isnan(impl_->spring_fitted_at.at(k));
}

} // namespace settlewell
