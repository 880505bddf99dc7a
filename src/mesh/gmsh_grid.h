#pragma once

// Private to src/mesh: a structured (tensor-product) block model in Gmsh.
#include "settlewell/mesh/axis_grading.h"

#include <functional>
#include <string>
#include <vector>

namespace settlewell {

/// Starts the Gmsh SDK for the lifetime of the object (quietly) and stops it after.
class GmshSession {
public:
  GmshSession();
  ~GmshSession();
  GmshSession(const GmshSession&) = delete;
  GmshSession& operator=(const GmshSession&) = delete;
};

/// A rectangle grid of blocks: block (i, j) spans x-interval i and y-interval j.
/// Every block is one transfinite, recombined surface, so the quadrilateral mesh
/// conforms to every block edge (layer interfaces, wall faces, well screens).
struct GridPlan {
  std::vector<AxisInterval> x, y;
  /// Region of block (i, j).
  std::function<std::string(std::size_t i, std::size_t j)> region;
  /// Physical curve groups of the horizontal edge at y-node j over x-interval i.
  std::function<std::vector<std::string>(std::size_t i, std::size_t j)> horizontal_groups;
  /// Physical curve groups of the vertical edge at x-node i over y-interval j.
  std::function<std::vector<std::string>(std::size_t i, std::size_t j)> vertical_groups;
};

/// Builds the plan as the current Gmsh model and meshes it (2D, quadrilaterals).
void build_grid_model(const GridPlan& plan, const std::string& model_name);

/// The coordinates of the nodes between intervals (the block corners).
std::vector<double> corner_coordinates(const std::vector<AxisInterval>& intervals);

} // namespace settlewell
