#pragma once

#include "settlewell/mesh/mesh.h"

#include <functional>
#include <string>
#include <vector>

namespace settlewell {

/// A horizontal band of the box that belongs to one region.
struct RegionBand {
  std::string region;
  double bottom = 0.0; ///< elevation of the band's underside, m
  double top = 0.0;    ///< elevation of the band's top, m
};

/// A part of one of the box's sides that gets a name of its own: the faces of
/// `side` whose centre satisfies `where`.
struct BoxSidePart {
  std::string side;
  std::string name;
  std::function<bool(const dealii::Point<2>&)> where;
};

/// A rectangle meshed by the given cell edges (graded as the caller likes), with
/// boundaries named "left", "right", "bottom", "top" and regions in horizontal bands.
struct BoxSpec {
  std::vector<double> x_edges;   ///< increasing x (or r) coordinates of cell edges, m
  std::vector<double> y_edges;   ///< increasing y (or z) coordinates of cell edges, m
  std::vector<RegionBand> bands; ///< empty: one region named "soil"
  std::vector<BoxSidePart> parts;
};

/// Builds the box on `comm`. Throws InternalError for edges that do not increase or
/// bands that do not cover every cell.
Mesh make_box_mesh(const BoxSpec& spec, MPI_Comm comm);

} // namespace settlewell
