// Lines through which water leaves but does not enter: the surface excavation
// exposes (the pit's floor and the faces of the soil left beside removed cells),
// draining to the pit, and the one-way conditions (seepage faces, and pumped lines:
// wells and a drained excavation level).
// The pore pressure there may not exceed a limit: the pit water's,
// p <= gamma_w max(0, h_pit - y), or the line's own (ExcessPressureBoundary). Where
// it would, water leaves at that pressure; where it is lower, the line is sealed.
// The set of draining pressure dofs is decided each step by re-solving until it
// settles: a draining dof whose water would flow in is released, a sealed dof whose
// pressure exceeds the limit is held at it (an active set, as for a seepage face;
// Neuman 1973 and Cooley 1983 use the same switching for seepage faces).
//
// A pumped line is one body of water (the well bore, a drainage blanket) from
// which a pump only takes: below its water all of its dofs are held together, so
// water may enter at one depth and leave at another, while the line's net flow
// leaves the ground; where the net would enter, the pump stops and the whole line
// is sealed, until the soil's pressure exceeds the limit somewhere along it. To
// keep a step from cycling, a line that stops in a step stays stopped in it.
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
}

void BiotProblem::Impl::gather_one_way(double t) {
  const std::size_t n = conditions.pressures.size();
  one_way_open.resize(n, false);
  pumped_stopped.resize(n, false);
  stopped_in_step.assign(n, false);
  left_in_step.clear();
  held_in_step.clear();
  // Built afresh from the lines that apply now, so that a dof two sources share
  // goes to the same one whatever opened or closed before (and on resume).
  std::map<types::global_dof_index, OneWayDof> next;
  for (std::size_t k = 0; k < n; ++k) {
    const auto& bc = conditions.pressures[k];
    const bool open = bc.one_way() && bc.window.contains(t);
    if (open && !one_way_open[k])
      pumped_stopped[k] = false; // a line that opens starts pumping
    one_way_open[k] = open;
    if (open)
      for (const auto& [d, x] : pressure_line_dofs[k])
        next.emplace(d, OneWayDof{x, k});
  }
  for (const auto& [d, x] : exposed)
    next.emplace(d, OneWayDof{x, dug_surface});
  std::set<types::global_dof_index> kept;
  for (const auto& [d, at] : next) {
    const auto before = one_way.find(d);
    const bool same = before != one_way.end() && before->second.condition == at.condition;
    if (same ? draining.count(d) != 0 : at.condition != dug_surface)
      kept.insert(d); // a line holds a dof it takes anew; the dug surface seals it
  }
  one_way = std::move(next);
  draining = std::move(kept);
}

bool BiotProblem::Impl::below_pumped_water(const OneWayDof& d, double t) const {
  if (d.condition == dug_surface)
    return false;
  const auto& bc = conditions.pressures[d.condition];
  return bc.exchange == HydraulicCondition::Exchange::pumped &&
         bc.held_pressure(d.x, t) > 0.0;
}

void BiotProblem::Impl::switch_pumped_lines(double t,
                                            const LA::MPI::Vector& residual,
                                            double tolerance) {
  const std::size_t n = conditions.pressures.size();
  // Per line: the net water leaving through its draining dofs (times dt); for a
  // stopped line, how far the soil's pressure stands above the limit at its dofs
  // below its water (summed, and counted), and whether it does at any other.
  std::vector<double> net(n, 0.0), above_wet(n, 0.0), wet(n, 0.0), above_dry(n, 0.0);
  for (const auto& [d, at] : one_way) {
    if (at.condition == dug_surface || !owned.is_element(d) ||
        conditions.pressures[at.condition].exchange !=
            HydraulicCondition::Exchange::pumped)
      continue;
    const std::size_t k = at.condition;
    const double over = solution(d) - drain_limit(at, t);
    if (draining.count(d))
      net[k] -= residual(d);
    else if (below_pumped_water(at, t)) {
      above_wet[k] += over;
      wet[k] += 1.0;
    } else if (over > 1e-8)
      above_dry[k] = 1.0;
  }
  for (auto* v : {&net, &above_wet, &wet, &above_dry})
    Utilities::MPI::sum(*v, comm, *v);
  for (std::size_t k = 0; k < n; ++k) {
    if (!one_way_open[k] ||
        conditions.pressures[k].exchange != HydraulicCondition::Exchange::pumped)
      continue;
    // A stopped line starts again when, held, it would likely take water in net:
    // the soil's pressure above the limit on average below its water (or anywhere,
    // for a line with no water held). The stop rule decides after the next solve.
    const bool would_take =
        wet[k] > 0.0 ? above_wet[k] > 1e-8 * wet[k] : above_dry[k] > 0.0;
    if (!pumped_stopped[k] && net[k] < -tolerance)
      pumped_stopped[k] = stopped_in_step[k] = true;
    else if (pumped_stopped[k] && !stopped_in_step[k] && would_take)
      pumped_stopped[k] = false;
  }
}

double BiotProblem::Impl::drain_limit(const OneWayDof& d, double t) const {
  if (d.condition != dug_surface)
    return conditions.pressures[d.condition].excess_pressure(d.x, t);
  const double limit = setup.gamma_w * std::max(0.0, setup.pit_water_head(t) - d.x[1]);
  return limit - setup.gamma_w * (setup.initial_head(d.x) - d.x[1]);
}

std::set<types::global_dof_index>
BiotProblem::Impl::draining_of(std::size_t condition) const {
  std::set<types::global_dof_index> out;
  for (const auto d : draining)
    if (one_way.at(d).condition == condition)
      out.insert(d);
  return out;
}

void BiotProblem::Impl::set_drain_values(double t) {
  drained_now.clear();
  for (const auto d : draining)
    drained_now[d] = drain_limit(one_way.at(d), t);
}

bool BiotProblem::Impl::point_drains(types::global_dof_index d,
                                     const OneWayDof& at,
                                     double t,
                                     const LA::MPI::Vector& residual,
                                     double inflow_tolerance) {
  if (held_in_step.count(d))
    return true;
  if (draining.count(d)) { // held: it keeps draining while water leaves
    const bool drains = -residual(d) >= -inflow_tolerance;
    if (!drains)
      left_in_step.insert(d);
    return drains;
  }
  const bool drains = solution(d) > drain_limit(at, t) + 1e-8;
  // A point that left the set and would come back has no consistent state (held,
  // water enters; sealed, its pressure stands above the limit: an exit point
  // between nodes, or cells whose Q1 couplings are positive): it stays held for the
  // rest of the step, its small inflow counted in its line's discharge.
  if (drains && left_in_step.count(d))
    held_in_step.insert(d);
  return drains;
}

void BiotProblem::Impl::measure_held_inflow(const LA::MPI::Vector& residual) {
  std::vector<double> in_out(2, 0.0); // entering held points, leaving all
  for (const auto d : draining)
    if (owned.is_element(d)) {
      const double out = -residual(d);
      if (out > 0.0)
        in_out[1] += out;
      else if (held_in_step.count(d))
        in_out[0] -= out;
    }
  Utilities::MPI::sum(in_out, comm, in_out);
  held_inflow_share = in_out[0] > 0.0 ? in_out[0] / std::max(in_out[1], 1e-300) : 0.0;
}

bool BiotProblem::Impl::update_draining(double t, double dt) {
  if (Utilities::MPI::sum(one_way.size(), comm) == 0)
    return false;
  LA::MPI::Vector residual;
  storage_residual(t, dt, draining, residual);
  // Tolerances: water entering below 1e-9 of the largest outflow of the lines is
  // round-off; so is a pressure within 1e-8 kPa of its limit.
  double largest = 0.0;
  for (const auto d : draining)
    if (owned.is_element(d))
      largest = std::max(largest, std::abs(residual(d)));
  const double inflow_tolerance = 1e-9 * Utilities::MPI::max(largest, comm);
  measure_held_inflow(residual);
  const std::vector<bool> stopped_before = pumped_stopped;
  switch_pumped_lines(t, residual, inflow_tolerance);
  LA::MPI::Vector decision(owned, comm);
  for (const auto& [d, at] : one_way) {
    if (!owned.is_element(d))
      continue;
    const bool pumped_line =
        at.condition != dug_surface && conditions.pressures[at.condition].exchange ==
                                           HydraulicCondition::Exchange::pumped;
    bool drains = false;
    if (pumped_line && pumped_stopped[at.condition])
      drains = false; // the pump stands: sealed all along
    else if (below_pumped_water(at, t))
      drains = true; // a running line holds its head below its water
    else if (pumped_line && stopped_before[at.condition])
      drains = solution(d) > drain_limit(at, t) + 1e-8; // it starts again
    else
      drains = point_drains(d, at, t, residual, inflow_tolerance);
    decision(d) = drains ? 1.0 : 0.0;
  }
  decision.compress(VectorOperation::insert);
  LA::MPI::Vector shared(owned, relevant, comm);
  shared = decision;
  std::set<types::global_dof_index> next;
  for (const auto& [d, at] : one_way)
    if (shared(d) > 0.5)
      next.insert(d);
  const bool changed = Utilities::MPI::logical_or(next != draining, comm);
  draining = std::move(next);
  return changed;
}

BiotProblem::OneWayState BiotProblem::one_way_state(const std::string& line) const {
  const Impl& m = *impl_;
  OneWayState state;
  for (std::size_t k = 0; k < m.conditions.pressures.size(); ++k) {
    const auto& bc = m.conditions.pressures[k];
    if (bc.line.name != line || !bc.one_way() || !bc.window.contains(m.time))
      continue;
    state.one_way = true;
    state.stopped = k < m.pumped_stopped.size() && m.pumped_stopped[k];
    bool wet = false;
    for (const auto& [d, x] : m.pressure_line_dofs[k])
      wet = wet || bc.held_pressure(x, m.time) > 0.0;
    state.dry = !Utilities::MPI::logical_or(wet, m.comm);
  }
  return state;
}

} // namespace settlewell
