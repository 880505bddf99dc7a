// A problem's state in a checkpoint. What lives on cells and dofs goes through
// deal.II's distributed serialisation (the triangulation's save and load with
// SolutionTransfer and CellDataTransfer), so that a run may resume on another
// number of processes: the solution and the one before it (for BDF2), the drained
// surface's active set (as a dof
// vector of flags), the displacement reported movements start from and, per dug
// cell, the forces it released; per clay cell, its points' committed stress and
// yield size, and the start of the last step (its trend starts the next Newton
// step). The few global
// values go into the run's state archive. Everything else (matrix, factorisation,
// constraints) is rebuilt by the first step after loading.
#include "biot_problem_impl.h"

#include "settlewell/core/errors.h"

// The library instantiates CellDataTransfer for its vector types only.
#include <deal.II/distributed/cell_data_transfer.templates.h>
#include <deal.II/distributed/solution_transfer.h>

#include <algorithm>

namespace settlewell {

namespace {

using DofTransfer = parallel::distributed::SolutionTransfer<2, LA::MPI::Vector>;
/// Per active cell: empty, or for a dug cell of this process its place in the
/// order of release (summed in the same order after loading, so that a resumed
/// run repeats the sums bit for bit), its event, and the two force vectors.
using CellValues = std::vector<std::vector<double>>;
using CellTransfer = parallel::distributed::CellDataTransfer<2, 2, CellValues>;

const parallel::distributed::Triangulation<2>& triangulation_of(const Mesh& mesh) {
  return *mesh.triangulation;
}

} // namespace

void BiotProblem::save_checkpoint(StateArchive& a, const std::string& mesh_file) const {
  const Impl& m = *impl_;
  a.mark("biot problem 3");
  double time = m.time;
  std::vector<bool> excavated = m.excavated, stopped = m.pumped_stopped;
  std::vector<double> fitted = m.spring_fitted_at;
  bool settled = m.settled, has_reference = m.has_reference;
  double previous_dt = m.previous_dt;
  unsigned int euler_steps_left = m.euler_steps_left;
  // Newton's scale: the largest residual a step started with so far.
  double newton_previous_dt = m.newton_previous_dt, drive_u = m.largest_drive.u,
         drive_p = m.largest_drive.p;
  a& time& excavated& fitted& settled& has_reference& previous_dt& euler_steps_left&
      newton_previous_dt& drive_u& drive_p& stopped;

  LA::MPI::Vector owned_flags(m.owned, m.comm);
  for (const auto d : m.draining)
    if (m.owned.is_element(d))
      owned_flags(d) = 1.0;
  owned_flags.compress(VectorOperation::insert);
  LA::MPI::Vector flags(m.owned, m.relevant, m.comm);
  flags = owned_flags;
  LA::MPI::Vector reference(m.owned, m.relevant, m.comm);
  if (m.has_reference)
    reference = m.reference;
  // The step before (for the two-step scheme), zero if there is none.
  LA::MPI::Vector previous(m.owned, m.relevant, m.comm);
  if (m.previous_dt > 0.0)
    previous = m.previous_solution;
  LA::MPI::Vector trend_start(m.owned, m.relevant, m.comm);
  if (m.newton_previous_dt > 0.0)
    trend_start = m.newton_previous;
  DofTransfer dofs(m.dof_handler);
  dofs.prepare_for_serialization(std::vector<const LA::MPI::Vector*>{
      &m.solution, &flags, &reference, &previous, &trend_start});

  const auto& tria = triangulation_of(m.mesh);
  CellValues released(tria.n_active_cells());
  for (std::size_t k = 0; k < m.released.size(); ++k) {
    const auto& r = m.released[k];
    auto& values = released[r.cell];
    values = {double(k), double(r.event)};
    values.insert(values.end(), r.geostatic.begin(), r.geostatic.end());
    values.insert(values.end(), r.carried.begin(), r.carried.end());
  }
  CellTransfer cells(tria, /*transfer_variable_size_data=*/true);
  cells.prepare_for_serialization(released);
  const CellValues clays = m.clay_cell_values();
  CellTransfer clay_cells(tria, /*transfer_variable_size_data=*/true);
  clay_cells.prepare_for_serialization(clays);
  tria.save(mesh_file);
}

void BiotProblem::load_checkpoint(StateArchive& a) {
  Impl& m = *impl_;
  a.mark("biot problem 3");
  std::vector<bool> stopped;
  a& m.time& m.excavated& m.spring_fitted_at& m.settled& m.has_reference& m.previous_dt& m
      .euler_steps_left& m.newton_previous_dt& m.largest_drive.u& m.largest_drive
      .p& stopped;
  if (m.excavated.size() != m.setup.excavation.size() ||
      m.spring_fitted_at.size() != m.setup.springs.size())
    throw InputError("the checkpoint's digging or props do not match the scenario's");

  LA::MPI::Vector solution(m.owned, m.comm), owned_flags(m.owned, m.comm),
      reference(m.owned, m.comm), previous(m.owned, m.comm), trend_start(m.owned, m.comm);
  DofTransfer dofs(m.dof_handler);
  std::vector<LA::MPI::Vector*> vectors{&solution, &owned_flags, &reference, &previous,
                                        &trend_start};
  dofs.deserialize(vectors);
  if (m.newton_previous_dt > 0.0) {
    m.newton_previous.reinit(m.owned, m.comm);
    m.newton_previous = trend_start;
  }
  m.previous_solution.reinit(m.owned, m.comm);
  m.previous_solution = previous;
  m.owned_solution = solution;
  m.solution = solution;
  m.old_solution = m.solution;
  if (m.has_reference) {
    m.reference.reinit(m.owned, m.comm);
    m.reference = reference;
    m.update_reported();
  }

  const auto& tria = triangulation_of(m.mesh);
  CellValues released(tria.n_active_cells());
  CellTransfer cells(tria, /*transfer_variable_size_data=*/true);
  cells.deserialize(released);
  CellValues clays(tria.n_active_cells());
  CellTransfer clay_cells(tria, /*transfer_variable_size_data=*/true);
  clay_cells.deserialize(clays);
  m.load_clay_cell_values(clays);
  if (!m.excavated.empty())
    m.mark_removed_cells();
  std::vector<std::pair<double, Impl::ReleasedCell>> ordered;
  const unsigned int n = m.layout.fe.n_dofs_per_cell();
  for (const auto& cell : m.dof_handler.active_cell_iterators()) {
    const auto& values = released[cell->active_cell_index()];
    if (!cell->is_locally_owned() || values.empty())
      continue;
    if (values.size() != 2 + 2 * n)
      throw InputError("the checkpoint's released forces do not fit the elements");
    Impl::ReleasedCell r{std::size_t(values[1]), cell->active_cell_index(),
                         std::vector<types::global_dof_index>(n), Vector<double>(n),
                         Vector<double>(n)};
    cell->get_dof_indices(r.dofs);
    std::copy(values.begin() + 2, values.begin() + 2 + n, r.geostatic.begin());
    std::copy(values.begin() + 2 + n, values.end(), r.carried.begin());
    ordered.emplace_back(values[0], std::move(r));
  }
  std::stable_sort(ordered.begin(), ordered.end(),
                   [](const auto& x, const auto& y) { return x.first < y.first; });
  m.released.clear();
  for (auto& [order, r] : ordered)
    m.released.push_back(std::move(r));

  LA::MPI::Vector flags(m.owned, m.relevant, m.comm);
  flags = owned_flags;
  m.find_exposed();
  m.one_way_open.clear();
  m.gather_one_way(m.time);
  m.draining.clear();
  for (const auto& [d, at] : m.one_way)
    if (flags(d) > 0.5)
      m.draining.insert(d);
  if (stopped.size() != m.conditions.pressures.size())
    throw InputError("the checkpoint's hydraulic conditions do not match the scenario's");
  m.pumped_stopped = stopped;
}

} // namespace settlewell
