#include "settlewell/physics/constraints.h"
#include "settlewell/physics/internal_lines.h"

#include "settlewell/core/errors.h"
#include "settlewell/core/units.h"

#include <deal.II/base/function.h>
#include <deal.II/base/mpi.h>
#include <deal.II/base/quadrature_lib.h>
#include <deal.II/dofs/dof_tools.h>
#include <deal.II/fe/fe_values.h>
#include <deal.II/fe/mapping_q1.h>
#include <deal.II/numerics/vector_tools_boundary.h>

#include <algorithm>
#include <iterator>
#include <limits>
#include <set>

namespace settlewell {

using namespace dealii;

namespace {

/// Throws the same InputError on every process if any process saw the problem,
/// so that no process is left waiting in a collective call.
void throw_if_any(bool local_problem, const std::string& message, MPI_Comm comm) {
  if (Utilities::MPI::logical_or(local_problem, comm))
    throw InputError(message);
}

/// Outward normal and area of a boundary; the normal must be the same everywhere.
std::pair<Tensor<1, 2>, double> face_geometry(const DoFHandler<2>& dof_handler,
                                              types::boundary_id id,
                                              AnalysisType analysis,
                                              bool& curved) {
  FEFaceValues<2> fv(StaticMappingQ1<2>::mapping, dof_handler.get_fe(), QGauss<1>(2),
                     update_normal_vectors | update_JxW_values |
                         update_quadrature_points);
  Tensor<1, 2> normal;
  double area = 0.0;
  bool have_normal = false;
  for (const auto& [cell, f] : faces_on_boundary(dof_handler, id)) {
    fv.reinit(cell, f);
    for (unsigned int q = 0; q < fv.n_quadrature_points; ++q) {
      const double r = fv.quadrature_point(q)[0];
      area +=
          fv.JxW(q) * (analysis == AnalysisType::axisymmetric ? 2 * units::pi * r : 1.0);
      if (!have_normal)
        normal = fv.normal_vector(q), have_normal = true;
      else if ((normal - fv.normal_vector(q)).norm() > 1e-8)
        curved = true;
    }
  }
  return {normal, area};
}

} // namespace

PlateLink link_plate(const DoFHandler<2>& dof_handler,
                     const FieldLayout& layout,
                     const PlateBoundary& plate,
                     AnalysisType analysis,
                     const std::string& name) {
  const MPI_Comm comm = dof_handler.get_communicator();
  bool curved = false;
  auto [normal, area] = face_geometry(dof_handler, plate.id, analysis, curved);
  // Share one normal: take it from any process that has plate faces.
  Tensor<1, 2> summed = Utilities::MPI::sum(area > 0 ? normal : Tensor<1, 2>(), comm);
  area = Utilities::MPI::sum(area, comm);
  throw_if_any(curved, "rigid plate '" + name + "' must be one straight face", comm);
  throw_if_any(!(area > 0.0), "rigid plate '" + name + "' has no faces in the mesh",
               comm);
  const double length = summed.norm();
  summed /= length;
  const bool along_x = std::abs(std::abs(summed[0]) - 1.0) < 1e-8;
  const bool along_y = std::abs(std::abs(summed[1]) - 1.0) < 1e-8;
  throw_if_any(!along_x && !along_y,
               "rigid plate '" + name + "' must be parallel to the x or y axis", comm);

  PlateLink link;
  link.normal_component = along_x ? FieldLayout::ux : FieldLayout::uy;
  link.outward_normal = summed;
  link.area = area;
  link.locally_relevant_dofs = DoFTools::extract_boundary_dofs(
      dof_handler, layout.mask_of(link.normal_component), {plate.id});
  const types::global_dof_index none =
      std::numeric_limits<types::global_dof_index>::max();
  const types::global_dof_index local_first = link.locally_relevant_dofs.n_elements() > 0
                                                  ? *link.locally_relevant_dofs.begin()
                                                  : none;
  link.master = Utilities::MPI::min(local_first, comm);
  return link;
}

namespace {

class ExcessPressureValues : public Function<2> {
public:
  ExcessPressureValues(const FieldFunction& f, double t)
      : Function<2>(FieldLayout::n_components)
      , f_(f)
      , t_(t) {}
  double value(const Point<2>& x, unsigned int component) const override {
    return component == FieldLayout::pressure ? f_(x, t_) : 0.0;
  }

private:
  const FieldFunction& f_;
  double t_;
};

void add_fixed(const ConstraintInputs& in, AffineConstraints<double>& constraints) {
  const Functions::ZeroFunction<2> zero(FieldLayout::n_components);
  for (const auto& fixed : in.conditions.fixed)
    for (unsigned int c = 0; c < 2; ++c)
      if (fixed.components[c])
        VectorTools::interpolate_boundary_values(in.dof_handler, fixed.id, zero,
                                                 constraints, in.layout.mask_of(c));
}

void add_rigid_skeleton(const ConstraintInputs& in,
                        AffineConstraints<double>& constraints) {
  // Every locally relevant displacement dof, ghosts included, so that each process
  // holds the lines it needs.
  std::vector<types::global_dof_index> dof_indices(in.layout.fe.n_dofs_per_cell());
  for (const auto& cell : in.dof_handler.active_cell_iterators()) {
    if (cell->is_artificial())
      continue;
    cell->get_dof_indices(dof_indices);
    for (unsigned int i = 0; i < dof_indices.size(); ++i)
      if (in.layout.is_displacement(in.layout.fe.system_to_component_index(i).first) &&
          !constraints.is_constrained(dof_indices[i]))
        constraints.add_line(dof_indices[i]);
  }
}

void add_plate(const ConstraintInputs& in, AffineConstraints<double>& constraints) {
  const PlateLink& link = *in.plate;
  bool clash = false;
  for (const auto dof : link.locally_relevant_dofs) {
    if (constraints.is_constrained(dof)) {
      clash = true;
      continue;
    }
    if (dof == link.master)
      continue;
    constraints.add_line(dof);
    constraints.add_entry(dof, link.master, 1.0);
  }
  throw_if_any(clash,
               "the rigid plate shares nodes with a fixed displacement in its own "
               "direction; fix the neighbouring boundary in the other direction only",
               in.dof_handler.get_communicator());
}

void add_deactivated(const ConstraintInputs& in, AffineConstraints<double>& constraints) {
  for (const auto dof : deactivated_dofs(in.dof_handler, in.removed))
    if (!constraints.is_constrained(dof))
      constraints.add_line(dof); // held at zero: it belongs to no cell of the model
}

void add_pressures(const ConstraintInputs& in,
                   double t,
                   AffineConstraints<double>& constraints) {
  const auto& pressures = in.conditions.pressures;
  for (std::size_t k = 0; k < pressures.size(); ++k) {
    const auto& bc = pressures[k];
    if (!bc.window.contains(t) || bc.one_way()) // one-way lines: in `drained`
      continue;
    if (!bc.line.internal) {
      const ExcessPressureValues values(bc.excess_pressure, t);
      VectorTools::interpolate_boundary_values(in.dof_handler, bc.line.id, values,
                                               constraints,
                                               in.layout.mask_of(FieldLayout::pressure));
      continue;
    }
    for (const auto& [dof, x] : in.pressure_line_dofs[k]) {
      if (constraints.is_constrained(dof))
        continue;
      constraints.add_line(dof);
      constraints.set_inhomogeneity(dof, bc.excess_pressure(x, t));
    }
  }
}

} // namespace

std::vector<types::global_dof_index> deactivated_dofs(const DoFHandler<2>& dof_handler,
                                                      const std::vector<bool>& removed) {
  if (removed.empty())
    return {};
  std::set<types::global_dof_index> live, dead;
  std::vector<types::global_dof_index> dofs(dof_handler.get_fe().n_dofs_per_cell());
  // Every dof an owned cell touches is shared only with owned or ghost cells, so
  // the removed owned cells and the cells in the model that this process sees
  // decide it.
  for (const auto& cell : dof_handler.active_cell_iterators()) {
    if (cell->is_artificial())
      continue;
    const bool gone = removed[cell->active_cell_index()];
    if (gone && !cell->is_locally_owned())
      continue;
    cell->get_dof_indices(dofs);
    (gone ? dead : live).insert(dofs.begin(), dofs.end());
  }
  std::vector<types::global_dof_index> out;
  std::set_difference(dead.begin(), dead.end(), live.begin(), live.end(),
                      std::back_inserter(out));
  return out;
}

std::vector<bool> active_pressures(const ResolvedConditions& conditions, double t) {
  std::vector<bool> active;
  for (const auto& bc : conditions.pressures)
    active.push_back(bc.window.contains(t));
  return active;
}

namespace {

/// Starts `constraints` afresh with those that never change.
void start_constraints(const ConstraintInputs& in,
                       AffineConstraints<double>& constraints) {
  constraints.clear();
  constraints.reinit(in.locally_relevant);
  DoFTools::make_hanging_node_constraints(in.dof_handler, constraints);
  add_fixed(in, constraints);
  if (in.rigid_skeleton)
    add_rigid_skeleton(in, constraints);
  if (in.plate)
    add_plate(in, constraints);
  add_deactivated(in, constraints);
}

} // namespace

void make_drained_constraints(const ConstraintInputs& in,
                              AffineConstraints<double>& constraints) {
  start_constraints(in, constraints);
  const auto& fe = in.dof_handler.get_fe();
  std::vector<types::global_dof_index> dofs(fe.n_dofs_per_cell());
  for (const auto& cell : in.dof_handler.active_cell_iterators()) {
    if (cell->is_artificial())
      continue;
    cell->get_dof_indices(dofs);
    for (unsigned int i = 0; i < dofs.size(); ++i)
      if (!in.layout.is_displacement(fe.system_to_component_index(i).first) &&
          !constraints.is_constrained(dofs[i]))
        constraints.add_line(dofs[i]);
  }
  constraints.close();
}

void make_constraints(const ConstraintInputs& in,
                      double t,
                      AffineConstraints<double>& constraints,
                      bool with_pressures) {
  start_constraints(in, constraints);
  if (with_pressures) {
    add_pressures(in, t, constraints);
    for (const auto& [dof, value] : in.drained)
      if (!constraints.is_constrained(dof)) {
        constraints.add_line(dof);
        constraints.set_inhomogeneity(dof, value);
      }
  }
  constraints.close();
}

} // namespace settlewell
