#pragma once

#include "settlewell/mesh/mesh.h"
#include "settlewell/model/initial_state.h"
#include "settlewell/model/schedule.h"
#include "settlewell/physics/biot_setup.h"
#include "settlewell/scenario/scenario.h"

#include <map>
#include <string>
#include <vector>

namespace settlewell::model {

/// Region name -> material name for every region of the mesh. Throws InputError
/// (at the scenario's geometry) for a region without a material.
std::map<std::string, std::string> region_materials(const scenario::Scenario& s,
                                                    const Mesh& mesh);

/// The effective hydraulic and mechanical role of every boundary: the geometry's
/// defaults (far boundary at fixed head on rollers, base fixed and no-flow, ...)
/// overridden by the scenario's [boundaries].
std::map<std::string, scenario::BoundarySpec> boundary_roles(const scenario::Scenario& s,
                                                             const Mesh& mesh);

/// A line whose outflow is pumped water (a well, or the excavation level when a
/// head is held there), with the factor from discharge to outflow density.
struct PumpedLine {
  std::string label;            ///< the well's name, "excavation_level" or "formation"
  std::string line;             ///< the mesh line (none for the formation)
  bool drained_surface = false; ///< the surface excavation exposes, draining to the pit
  bool recharge = false;        ///< a recharge well: may put water into the ground
};

/// The Biot core's setup for a scenario: materials per region, the initial head,
/// and every boundary, well, excavation-level and load condition with its time
/// history from the stages. Names are checked against the mesh, with the
/// scenario's FILE:LINE:COL in the message.
struct Model {
  BiotSetup setup;
  std::vector<PumpedLine> pumped;
};
Model build_model(const scenario::Scenario& s,
                  const Mesh& mesh,
                  const InitialState& initial,
                  const Schedule& schedule);

} // namespace settlewell::model
