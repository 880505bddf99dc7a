#pragma once

#include "settlewell/mesh/mesh.h"
#include "settlewell/physics/biot_setup.h"

#include <deal.II/base/tensor.h>

#include <optional>
#include <vector>

namespace settlewell {

/// A named line: a boundary (with its id) or an internal line of the mesh.
struct LineRef {
  std::string name;
  bool internal = false;
  dealii::types::boundary_id id = 0; ///< for boundaries
};

/// A prescribed excess pore pressure on a line, already turned from the head or
/// pore pressure the user gave into a change from the initial state, kPa.
struct ExcessPressureBoundary {
  LineRef line;
  FieldFunction excess_pressure;
  TimeWindow window;
  /// Except both_ways, excess_pressure is the limit the pore pressure may reach
  /// (from an absolute one of at least zero), decided by an active set.
  HydraulicCondition::Exchange exchange = HydraulicCondition::Exchange::both_ways;
  /// The absolute pore pressure the line holds, kPa (one-way lines only): zero
  /// all along means the line's target lies below it (a well run dry).
  FieldFunction held_pressure;
  /// Water leaves but does not enter, at each point or in sum.
  bool one_way() const { return exchange != HydraulicCondition::Exchange::both_ways; }
};

struct FluxBoundary {
  LineRef line;
  FieldFunction outflow; ///< m/s (see HydraulicCondition::Kind::normal_flux)
  TimeWindow window;
};

struct FixedBoundary {
  dealii::types::boundary_id id;
  std::array<bool, 2> components;
};

struct TractionBoundary {
  dealii::types::boundary_id id;
  FieldFunction normal_traction; ///< kPa, tension positive
};

struct PlateBoundary {
  dealii::types::boundary_id id;
  TimeFunction compressive_force; ///< kN/m (plane strain) or kN (axisymmetric)
};

/// Boundary conditions with names replaced by ids, checked against the mesh and
/// against each other. Body forces are per material id.
struct ResolvedConditions {
  std::vector<ExcessPressureBoundary> pressures;
  std::vector<FluxBoundary> fluxes;
  std::vector<FixedBoundary> fixed;
  std::vector<TractionBoundary> tractions;
  std::optional<PlateBoundary> plate;
  std::vector<std::pair<dealii::types::material_id, std::array<TimeFunction, 2>>>
      body_forces;

  dealii::Tensor<1, 2> body_force(dealii::types::material_id region, double t) const;
};

/// Throws InputError for unknown names, two hydraulic conditions on one line at
/// the same time, a plate that is also fixed, or more than one plate.
ResolvedConditions resolve_conditions(const BiotSetup& setup, const Mesh& mesh);

} // namespace settlewell
