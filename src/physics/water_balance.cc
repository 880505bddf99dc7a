// The water that crosses boundaries and lines in a step and the water taken into
// storage: the discharges a run reports and the two sides of its water balance.
#include "biot_problem_impl.h"

#include "settlewell/core/errors.h"

#include <deal.II/base/mpi.h>

#include <algorithm>
#include <numeric>

namespace settlewell {

using namespace dealii;

void BiotProblem::Impl::storage_residual(double t,
                                         double dt,
                                         const std::set<types::global_dof_index>& wanted,
                                         LA::MPI::Vector& out) const {
  // Membership through a mask of the relevant dofs: a set lookup for every dof of
  // every cell was most of this function's time.
  std::vector<bool> mask(relevant.n_elements(), false);
  for (const auto d : wanted)
    if (relevant.is_element(d))
      mask[relevant.index_within_set(d)] = true;
  const auto is_wanted = [&](types::global_dof_index d) {
    return bool(mask[relevant.index_within_set(d)]);
  };
  // The consistent flux: at a prescribed-pressure dof, the right-hand side of the
  // unconstrained storage-equation row minus the row times the solution is dt
  // times the water that leaves through that dof's share of the line.
  out.reinit(owned, comm);
  CellKernel kernel(layout, setup.analysis, mapping);
  const unsigned int n = kernel.dofs_per_cell();
  Vector<double> cell_rhs(n), local(n), residual(n), old_state(n);
  FullMatrix<double> flow_matrix(n, n);
  std::vector<types::global_dof_index> dofs(n);
  for (const auto& cell : dof_handler.active_cell_iterators()) {
    if (!cell->is_locally_owned() || !in_model(cell))
      continue;
    cell->get_dof_indices(dofs);
    if (std::none_of(dofs.begin(), dofs.end(), is_wanted))
      continue;
    kernel.reinit(cell);
    cell_rhs = 0.0;
    add_old_state_and_fluxes(kernel, cell, t, dt, old_state, cell_rhs);
    cell->get_dof_values(solution, local);
    cell_matrix_at(kernel, cell, dt).vmult(residual, local);
    // A clay whose conductivity follows its strain: its flow's change, as
    // Newton's last system held it at this state.
    if (conductivity_rate(cell->material_id()) != 0.0) {
      flow_matrix = 0.0;
      add_clay_flow(kernel, cell, local, dt, flow_matrix, cell_rhs);
      flow_matrix.vmult_add(residual, local);
    }
    if (is_unsaturated(cell))
      add_unsaturated_terms(kernel, cell, dt, nullptr, residual);
    residual -= cell_rhs;
    for (unsigned int i = 0; i < n; ++i)
      if (!layout.is_displacement(layout.fe.system_to_component_index(i).first) &&
          is_wanted(dofs[i]))
        out(dofs[i]) += residual(i);
  }
  out.compress(VectorOperation::add);
}

double
BiotProblem::Impl::reaction_outflow(const std::set<types::global_dof_index>& line) const {
  LA::MPI::Vector residual;
  storage_residual(time, effective_dt, line, residual);
  double total = 0.0;
  for (const auto d : line)
    if (owned.is_element(d))
      total += residual(d);
  return 0.0 - Utilities::MPI::sum(total, comm) / effective_dt; // no "-0"
}

double BiotProblem::Impl::prescribed_outflow(const FluxBoundary& flux) const {
  // The p-rows of a face integral of -q sum to minus the integral of q (the Q1
  // shape functions sum to one).
  CellKernel kernel(layout, setup.analysis, mapping);
  Vector<double> face_rhs(kernel.dofs_per_cell());
  double total = 0.0;
  auto add = [&](const DoFHandler<2>::active_cell_iterator& cell, unsigned int f) {
    kernel.reinit(cell);
    face_rhs = 0.0;
    kernel.add_face_outflow(f, 1.0, flux.outflow, time, face_rhs);
    for (unsigned int i = 0; i < face_rhs.size(); ++i)
      total += face_rhs(i);
  };
  if (flux.line.internal) {
    for (const auto& cell : dof_handler.active_cell_iterators()) {
      const auto found = cell->is_locally_owned() && in_model(cell)
                             ? line_flux_faces.find(cell->active_cell_index())
                             : line_flux_faces.end();
      if (found != line_flux_faces.end())
        for (const auto& [face, k] : found->second)
          if (&conditions.fluxes[k] == &flux)
            add(cell, face);
    }
  } else {
    for (const auto& [cell, f] : faces_on_boundary(dof_handler, flux.line.id))
      add(cell, f);
  }
  return -Utilities::MPI::sum(total, comm);
}

namespace {

/// The prescribed pressure dofs of each active condition, a dof going to the first
/// condition that constrains it (as in make_constraints); a one-way line's are
/// those it holds now, among `draining`.
std::vector<std::set<types::global_dof_index>>
active_pressure_dofs(const ResolvedConditions& conditions,
                     const std::vector<LineDofs>& line_dofs,
                     const std::set<types::global_dof_index>& draining,
                     const DoFHandler<2>& dof_handler,
                     const FieldLayout& layout,
                     double t) {
  std::vector<std::set<types::global_dof_index>> sets(conditions.pressures.size());
  std::set<types::global_dof_index> claimed;
  for (std::size_t k = 0; k < conditions.pressures.size(); ++k) {
    const auto& bc = conditions.pressures[k];
    if (!bc.window.contains(t))
      continue;
    std::vector<types::global_dof_index> dofs;
    if (bc.one_way()) {
      for (const auto& [dof, x] : line_dofs[k])
        if (draining.count(dof))
          dofs.push_back(dof);
    } else if (bc.line.internal) {
      for (const auto& [dof, x] : line_dofs[k])
        dofs.push_back(dof);
    } else {
      const IndexSet on = DoFTools::extract_boundary_dofs(
          dof_handler, layout.mask_of(FieldLayout::pressure), {bc.line.id});
      dofs.assign(on.begin(), on.end());
    }
    for (const auto d : dofs)
      if (claimed.insert(d).second)
        sets[k].insert(d);
  }
  return sets;
}

/// A pumped line comes from the model, which checked its name against the mesh.
void require_line(const Mesh& mesh, const std::string& line) {
  if (!mesh.has_line(line))
    throw InternalError("no boundary or internal line named '" + line + "' in the mesh");
}

} // namespace

double BiotProblem::outflow(const std::string& line) const {
  return outflows({line}).front();
}

std::vector<double> BiotProblem::outflows(const std::vector<std::string>& lines) const {
  const Impl& m = *impl_;
  for (const auto& line : lines)
    require_line(m.mesh, line);
  std::vector<double> out(lines.size(), 0.0);
  if (!(m.time > 0.0))
    return out;
  // The lines that hold a pressure now take their consistent flux from one
  // residual over all of their dofs; the others their prescribed flux, if any.
  const auto sets = active_pressure_dofs(m.conditions, m.pressure_line_dofs, m.draining,
                                         m.dof_handler, m.layout, m.time);
  std::vector<const std::set<types::global_dof_index>*> held(lines.size(), nullptr);
  std::set<types::global_dof_index> all;
  for (std::size_t i = 0; i < lines.size(); ++i)
    for (std::size_t k = 0; k < m.conditions.pressures.size() && !held[i]; ++k)
      if (m.conditions.pressures[k].line.name == lines[i] &&
          m.conditions.pressures[k].window.contains(m.time)) {
        held[i] = &sets[k];
        all.insert(sets[k].begin(), sets[k].end());
      }
  // Collective: every process takes part, also one with none of the dofs.
  LA::MPI::Vector residual;
  m.storage_residual(m.time, m.effective_dt, all, residual);
  std::vector<double> sums(lines.size(), 0.0);
  for (std::size_t i = 0; i < lines.size(); ++i)
    if (held[i])
      for (const auto d : *held[i])
        if (m.owned.is_element(d))
          sums[i] += residual(d);
  Utilities::MPI::sum(sums, m.comm, sums);
  for (std::size_t i = 0; i < lines.size(); ++i) {
    if (held[i]) {
      out[i] = 0.0 - sums[i] / m.effective_dt; // no "-0"
      continue;
    }
    for (const auto& flux : m.conditions.fluxes)
      if (flux.line.name == lines[i] && flux.window.contains(m.time)) {
        out[i] = m.prescribed_outflow(flux);
        break;
      }
  }
  return out;
}

BiotProblem::WaterExchange BiotProblem::water_exchange() const {
  const Impl& m = *impl_;
  if (!(m.time > 0.0))
    return {};
  std::set<types::global_dof_index> all;
  for (const auto& set :
       active_pressure_dofs(m.conditions, m.pressure_line_dofs, m.draining, m.dof_handler,
                            m.layout, m.time))
    all.insert(set.begin(), set.end());
  all.insert(m.draining.begin(), m.draining.end());
  LA::MPI::Vector residual;
  m.storage_residual(m.time, m.effective_dt, all, residual);
  WaterExchange local;
  for (const auto d : all)
    if (m.owned.is_element(d)) {
      local.net_outflow -= residual(d) / m.effective_dt;
      local.gross += std::abs(residual(d)) / m.effective_dt;
    }
  WaterExchange total{Utilities::MPI::sum(local.net_outflow, m.comm),
                      Utilities::MPI::sum(local.gross, m.comm)};
  for (const auto& flux : m.conditions.fluxes)
    if (flux.window.contains(m.time)) {
      const double q = m.prescribed_outflow(flux);
      total.net_outflow += q;
      total.gross += std::abs(q);
    }
  return total;
}

double BiotProblem::drained_surface_outflow() const {
  const Impl& m = *impl_;
  return m.time > 0.0 ? m.reaction_outflow(m.draining_of(Impl::dug_surface)) : 0.0;
}

BiotProblem::StorageChange BiotProblem::storage_change() const {
  // The storage terms are (alpha eps_v + S p) phi_i in the p rows; the Q1 shape
  // functions sum to one, so the rows sum to the stored volume. The step's scheme
  // stores s(x_{n+1}) - s(old state) in dt' (step_weights): scaled to the step's
  // length, that is its storage rate times dt, the same measure as the discharges.
  // Partly saturated cells add their water content's change (add_unsaturated_terms
  // at dt = 0 holds storage alone).
  const Impl& m = *impl_;
  const double to_step = m.previous_dt / m.effective_dt;
  CellKernel kernel(m.layout, m.setup.analysis, m.mapping);
  const unsigned int n = m.layout.fe.n_dofs_per_cell();
  Vector<double> change(n), stored(n);
  StorageChange local;
  for (const auto& cell : m.dof_handler.active_cell_iterators()) {
    if (!cell->is_locally_owned() || !m.in_model(cell))
      continue;
    cell->get_dof_values(m.solution, change);
    cell->get_dof_values(m.old_solution, stored);
    change -= stored;
    stored = 0.0;
    m.add_storage_terms(cell, change, stored);
    if (m.is_unsaturated(cell)) {
      kernel.reinit(cell);
      change = 0.0;
      m.add_unsaturated_terms(kernel, cell, 0.0, nullptr, change);
      for (const unsigned int i : m.storage_rows.rows)
        stored(i) += change(i);
    }
    const double cell_change = std::accumulate(stored.begin(), stored.end(), 0.0);
    local.net += cell_change;
    local.gross += std::abs(cell_change);
  }
  return {to_step * Utilities::MPI::sum(local.net, m.comm),
          to_step * Utilities::MPI::sum(local.gross, m.comm)};
}

} // namespace settlewell
