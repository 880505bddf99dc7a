#pragma once

// Private to src/mesh (and to the mesh fuzz targets in tests/fuzz/): the checks of a
// Gmsh model's mesh on plain data. gmsh_model.cc copies what the Gmsh API gives into
// GmshModelData, gmsh_checks.cc checks that. Kept apart from the API, the checks can
// be fed values that Gmsh's parser would refuse or repair first (NaN, repeated or
// missing tags, wrong element types) and fuzzed without Gmsh in the build
// (tests/fuzz/mesh_fuzz.cc).
#include "settlewell/mesh/mesh.h"

#include <deal.II/grid/tria.h>
#include <deal.II/grid/tria_description.h>

#include <map>
#include <string>
#include <vector>

namespace settlewell {

/// Elements of one Gmsh element type on one entity, as
/// gmsh::model::mesh::getElements gives them.
struct GmshElementBlock {
  int type = 0;                   ///< Gmsh element type (3: 4-node quadrangle, 1: line)
  std::vector<std::size_t> tags;  ///< element tags
  std::vector<std::size_t> nodes; ///< node tags, element after element
};

/// A physical group and the elements of its entities (dimensions 1 and 2 only).
struct GmshGroup {
  int dim = 0;
  int tag = 0;
  std::string name;
  std::vector<GmshElementBlock> blocks;
};

/// A Gmsh model's mesh as plain data: nodes as gmsh::model::mesh::getNodes gives
/// them (x, y, z per node) and the physical groups in Gmsh's order.
struct GmshModelData {
  std::vector<std::size_t> node_tags;
  std::vector<double> node_coords;
  std::vector<GmshGroup> groups;
};

/// The current Gmsh model's nodes and physical groups (gmsh_model.cc, which calls
/// the Gmsh API); only groups of dimension 1 and 2 carry elements.
GmshModelData read_current_model();

/// Cells more than `slender_limit` times longer than wide: how many, and the worst.
struct SlenderCells {
  static constexpr double slender_limit = 50.0;
  std::size_t count = 0;
  double worst_ratio = 0.0;
  std::size_t worst_element = 0; ///< Gmsh element tag
  std::string worst_group;
};

/// A mesh that passed the checks, in the form deal.II creates a triangulation from:
/// material ids and boundary ids are those of `names`.
struct CheckedMesh {
  std::vector<dealii::Point<2>> vertices;
  std::vector<dealii::CellData<2>> cells;
  dealii::SubCellData faces; ///< every boundary edge, "unnamed_boundary" if no group
  NameTable names;
  std::map<std::string, std::vector<Segment>> internal_lines;
  SlenderCells slender;
};

/// Checks a model's mesh (`source` is the file or scenario named in messages):
/// coordinates, named groups, element types, nodes, cell shapes and orientation,
/// boundary groups. Throws a one-line InputError for the first problem found.
CheckedMesh check_gmsh_model(const GmshModelData& model, const std::string& source);

/// Gives a checked mesh to `triangulation` (serial or distributed) after deal.II's
/// own preparation: unused vertices removed, cells turned counter-clockwise and
/// ordered consistently. Consumes the vertices, cells and faces of `mesh`.
void create_checked_triangulation(CheckedMesh& mesh,
                                  dealii::Triangulation<2>& triangulation);

} // namespace settlewell
