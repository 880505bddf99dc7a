#pragma once

#include "settlewell/physics/field_layout.h"
#include "settlewell/physics/resolved_conditions.h"

#include <deal.II/base/index_set.h>
#include <deal.II/dofs/dof_handler.h>
#include <deal.II/lac/affine_constraints.h>

#include <map>
#include <optional>

namespace settlewell {

/// The degrees of freedom of a rigid plate: the normal displacement of every node
/// on the plate is tied to one master degree of freedom.
struct PlateLink {
  unsigned int normal_component = 0; ///< 0: the plate moves in x, 1: in y
  dealii::types::global_dof_index master = 0;
  dealii::IndexSet locally_relevant_dofs; ///< plate dofs of this process, master included
  double area = 0.0;                      ///< m (plane strain) or m^2 (axisymmetric)
  dealii::Tensor<1, 2> outward_normal;
};

/// Finds the plate's dofs, its normal (which must be one axis) and its area.
/// Collective over the mesh's communicator.
PlateLink link_plate(const dealii::DoFHandler<2>& dof_handler,
                     const FieldLayout& layout,
                     const PlateBoundary& plate,
                     AnalysisType analysis,
                     const std::string& plate_name);

/// Pressure dofs (with positions) of an internal line.
using LineDofs =
    std::vector<std::pair<dealii::types::global_dof_index, dealii::Point<2>>>;

struct ConstraintInputs {
  const dealii::DoFHandler<2>& dof_handler;
  const FieldLayout& layout;
  const ResolvedConditions& conditions;
  const std::optional<PlateLink>& plate;
  bool rigid_skeleton;
  const dealii::IndexSet& locally_owned;
  const dealii::IndexSet& locally_relevant;
  /// One entry per conditions.pressures; filled for internal lines only.
  const std::vector<LineDofs>& pressure_line_dofs;
  /// By active cell index: cells taken out by excavation (empty: none). Their dofs
  /// that no cell in the model shares are held at zero.
  const std::vector<bool>& removed;
  /// Pressure dofs of the lines that take water only (the dug surface, one-way
  /// conditions) held at an excess pressure (kPa) now.
  const std::map<dealii::types::global_dof_index, double>& drained;
};

/// The dofs of this process's removed cells that no cell in the model shares.
std::vector<dealii::types::global_dof_index>
deactivated_dofs(const dealii::DoFHandler<2>& dof_handler,
                 const std::vector<bool>& removed);

/// Which prescribed-pressure conditions apply at time t.
std::vector<bool> active_pressures(const ResolvedConditions& conditions, double t);

/// All constraints at time t: hanging nodes, fixed displacements, the plate, and
/// the prescribed excess pore pressures that apply at t, with their values at t.
/// With `with_pressures` false, only the constraints that never change (for the
/// sparsity pattern).
void make_constraints(const ConstraintInputs& in,
                      double t,
                      dealii::AffineConstraints<double>& constraints,
                      bool with_pressures = true);

/// The constraints that never change, and every excess pore pressure held at
/// zero: a drained response of the skeleton alone.
void make_drained_constraints(const ConstraintInputs& in,
                              dealii::AffineConstraints<double>& constraints);

} // namespace settlewell
