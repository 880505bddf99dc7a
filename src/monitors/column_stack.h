#pragma once

// Private to src/monitors: the layers a vertical column crosses, read from the
// mesh itself, so that a user's mesh (sloping layers, any region names) gets the
// same 1D comparison as a generated section.
#include "settlewell/physics/biot_problem.h"

#include <string>
#include <vector>

namespace settlewell::monitors {

/// A run of cells of one region along the column.
struct StackLayer {
  std::string region;
  double top = 0.0, bottom = 0.0; ///< elevations, m
};

struct ColumnStack {
  std::vector<StackLayer> layers; ///< top down; empty when the line misses the mesh
  std::string top_boundary;       ///< the boundary the column starts at
};

/// The regions a vertical line at `x` crosses, from the mesh's cells (excavated
/// ones included: the stack at the start). Where the line runs along a cell edge,
/// the cell whose centre lies nearer it is taken (the lower region id on a tie).
/// Collective.
ColumnStack column_stack(const BiotProblem& problem, double x);

/// The middle of a mesh line (the mean of its segments' midpoints). Collective.
dealii::Point<2> line_middle(const BiotProblem& problem, const std::string& line);

/// The region of the cell that holds `p` (the lowest id where cells meet).
/// Collective; throws std::logic_error when no process holds it.
std::string region_at(const BiotProblem& problem, const dealii::Point<2>& p);

} // namespace settlewell::monitors
