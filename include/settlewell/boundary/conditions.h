#pragma once

#include "settlewell/boundary/time_function.h"

#include <array>
#include <limits>
#include <string>
#include <vector>

namespace settlewell {

/// When a condition applies: from < t <= until (s). Outside it the line is
/// no-flow. Changing which conditions apply changes the system matrix, so windows
/// should open and close at step ends (stage boundaries).
struct TimeWindow {
  double from = -std::numeric_limits<double>::infinity();
  double until = std::numeric_limits<double>::infinity();
  bool contains(double t) const { return t > from && t <= until; }
  bool overlaps(const TimeWindow& o) const { return from < o.until && o.from < until; }
};

/// Hydraulic conditions, addressed by the name of a boundary or of an internal
/// line (a well screen, the excavation level). A line without one is no-flow.
/// Values are absolute (not changes): the core subtracts the initial state.
struct HydraulicCondition {
  enum class Kind {
    head,          ///< hydraulic head h, m
    pore_pressure, ///< pore pressure p, kPa (compression positive)
    normal_flux    ///< water leaving the soil, m/s: Darcy flux q.n on a boundary; on an
                   ///< internal line, the volume per second per m of line (per m run)
  };
  std::string boundary;
  Kind kind = Kind::head;
  FieldFunction value;
  TimeWindow window{};
  /// How water crosses a line that holds a head or pore pressure. Except both_ways,
  /// the pressure held is at least zero (atmospheric), and each point where it is
  /// zero is a seepage face: water leaves there where the soil's pressure would be
  /// higher, and none enters. Decided each step by an active set.
  enum class Exchange {
    both_ways,    ///< water enters and leaves (a lake, a recharge well)
    seepage_face, ///< each point lets water out only, at the pressure held
    /// A pumped line (a well screen, a drained excavation level): one body of water
    /// from which a pump only takes. Below its water it holds its head all along
    /// while its net outflow is positive (water may pass through it from one depth
    /// to another); where the net would be an inflow the pump stops and the line
    /// is sealed.
    pumped
  };
  Exchange exchange = Exchange::both_ways; ///< head and pore_pressure only
};

/// Mechanical conditions, addressed by boundary name. A boundary without one is
/// traction-free (no change of total stress).
struct MechanicalCondition {
  enum class Kind {
    fixed,           ///< the displacement components in `fixed_components` are zero
    normal_traction, ///< change of total normal stress on the face, kPa, tension positive
    rigid_plate      ///< rigid frictionless plate: one common normal displacement that
                     ///< carries a compressive total force `value` (kN per metre run in
                     ///< plane strain, kN in axisymmetric); the face must be straight
                     ///< and parallel to an axis. Its hydraulic condition is separate.
  };
  std::string boundary;
  Kind kind = Kind::fixed;
  std::array<bool, 2> fixed_components{{false, false}};
  FieldFunction value;
};

/// A change of body force per unit volume in one region (kN/m^3), e.g. a change
/// of unit weight; components in x and y.
struct BodyForceChange {
  std::string region;
  std::array<TimeFunction, 2> components;
};

struct BoundaryConditions {
  std::vector<HydraulicCondition> hydraulic;
  std::vector<MechanicalCondition> mechanical;
  std::vector<BodyForceChange> body_forces;

  // Shorthands for building a set in code (tests, verification cases).
  BoundaryConditions&
  head(const std::string& boundary, FieldFunction h, TimeWindow window = {});
  BoundaryConditions& pore_pressure(const std::string& boundary, FieldFunction p);
  /// A head held by pumping (HydraulicCondition::Exchange::pumped).
  BoundaryConditions&
  pumped_head(const std::string& boundary, FieldFunction h, TimeWindow window = {});
  BoundaryConditions&
  outflow(const std::string& boundary, FieldFunction q, TimeWindow window = {});
  BoundaryConditions& fix(const std::string& boundary, bool x, bool y);
  BoundaryConditions& normal_traction(const std::string& boundary, FieldFunction t);
  BoundaryConditions& rigid_plate(const std::string& boundary, TimeFunction force);
};

} // namespace settlewell
