#pragma once

// Private to src/mesh: block plans of the scenario geometries.
#include "gmsh_grid.h"

#include "settlewell/scenario/scenario.h"

namespace settlewell {

/// The parametric excavation section: layers, the wall, the pit edge, well screens,
/// the excavation level, every dig level and the given x and y ends (of boundary
/// parts' windows, where they lie inside the section) are block edges; physical
/// groups as in section_names.
GridPlan section_plan(const scenario::Section& section,
                      AnalysisType analysis,
                      const std::vector<double>& dig_levels,
                      const std::vector<double>& x_ends = {},
                      const std::vector<double>& y_ends = {});

/// The layered box: boundaries left, right, bottom, top; one block row per layer.
GridPlan box_plan(const scenario::Box& box);

} // namespace settlewell
