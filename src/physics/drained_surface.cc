// The surface excavation exposes (the pit's floor and the faces of the soil left
// beside removed cells) drains to the pit: the pore pressure there may not exceed
// the pit water's, p <= gamma_w max(0, h_pit - y). Where it would, water leaves at
// that pressure; where it is lower, the surface is sealed (no water enters from the
// pit). The set of draining pressure dofs is decided each step by re-solving until
// it settles: a draining dof whose water would flow in is released, a sealed dof
// whose pressure exceeds the limit is held at it (an active set, as for a seepage
// face; Neuman 1973 and Cooley 1983 use the same switching for seepage faces).
#include "biot_problem_impl.h"

#include <deal.II/base/mpi.h>

#include <algorithm>
#include <cmath>

namespace settlewell {

void BiotProblem::Impl::find_exposed() {
  exposed.clear();
  if (!setup.pit_water_head || removed.empty())
    return;
  const FiniteElement<2>& fe = layout.fe;
  std::vector<types::global_dof_index> face_dofs(fe.n_dofs_per_face());
  for (const auto& cell : dof_handler.active_cell_iterators()) {
    if (cell->is_artificial() || !in_model(cell))
      continue;
    for (const unsigned int f : cell->face_indices()) {
      if (cell->at_boundary(f) || cell->neighbor(f)->is_artificial() ||
          in_model(cell->neighbor(f)))
        continue;
      cell->face(f)->get_dof_indices(face_dofs);
      // The Q1 pressure dofs of a face sit at its two vertices.
      for (unsigned int i = 0; i < face_dofs.size(); ++i)
        if (fe.face_system_to_component_index(i).first == FieldLayout::pressure) {
          const unsigned int vertex = i / fe.n_dofs_per_vertex();
          exposed.emplace(face_dofs[i], cell->face(f)->vertex(vertex));
        }
    }
  }
  for (auto it = draining.begin(); it != draining.end();)
    it = exposed.count(*it) ? std::next(it) : draining.erase(it);
}

double BiotProblem::Impl::drain_limit(const Point<2>& x, double t) const {
  const double limit = setup.gamma_w * std::max(0.0, setup.pit_water_head(t) - x[1]);
  return limit - setup.gamma_w * (setup.initial_head(x) - x[1]);
}

void BiotProblem::Impl::set_drain_values(double t) {
  drained_now.clear();
  for (const auto d : draining)
    drained_now[d] = drain_limit(exposed.at(d), t);
}

bool BiotProblem::Impl::update_draining(double t, double dt) {
  if (Utilities::MPI::sum(exposed.size(), comm) == 0)
    return false;
  LA::MPI::Vector residual;
  storage_residual(t, dt, draining, residual);
  // Tolerances: water entering below 1e-9 of the largest outflow of the surface is
  // round-off; so is a pressure within 1e-8 kPa of its limit.
  double largest = 0.0;
  for (const auto d : draining)
    if (owned.is_element(d))
      largest = std::max(largest, std::abs(residual(d)));
  const double inflow_tolerance = 1e-9 * Utilities::MPI::max(largest, comm);
  LA::MPI::Vector decision(owned, comm);
  for (const auto& [d, x] : exposed) {
    if (!owned.is_element(d))
      continue;
    const bool drains = draining.count(d) != 0
                            ? -residual(d) >= -inflow_tolerance // outflow: keep
                            : solution(d) > drain_limit(x, t) + 1e-8;
    decision(d) = drains ? 1.0 : 0.0;
  }
  decision.compress(VectorOperation::insert);
  LA::MPI::Vector shared(owned, relevant, comm);
  shared = decision;
  std::set<types::global_dof_index> next;
  for (const auto& [d, x] : exposed)
    if (shared(d) > 0.5)
      next.insert(d);
  const bool changed = Utilities::MPI::logical_or(next != draining, comm);
  draining = std::move(next);
  return changed;
}

} // namespace settlewell
