// The checks of a Gmsh model's mesh, on the plain data gmsh_model.cc reads through
// the Gmsh API, and the step from a checked mesh to a deal.II triangulation.
#include "gmsh_checks.h"

#include "settlewell/core/errors.h"

#include <deal.II/grid/grid_tools.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <limits>

namespace settlewell {

using namespace dealii;

namespace {

using Edge = std::pair<std::size_t, std::size_t>; // node indices, smaller first

Edge edge_of(std::size_t a, std::size_t b) {
  return {std::min(a, b), std::max(a, b)};
}

/// The model's cells in Gmsh's terms, before names become deal.II ids.
struct GmshMeshData {
  std::vector<Point<2>> vertices;
  std::vector<std::size_t> vertex_tag; ///< Gmsh node tag
  std::vector<CellData<2>> cells;
  std::vector<std::string> cell_region;
  std::vector<std::size_t> cell_element; ///< Gmsh element tag
  std::vector<int> cell_turn;            ///< +1 counter-clockwise, -1 clockwise
  std::map<std::string, std::vector<Edge>> curve_groups;
  std::map<std::array<std::size_t, 4>, std::size_t> cell_of_nodes; ///< sorted nodes
};

/// Coordinates (x, y, z) of node `tag`: numbers within the program's range, in the
/// plane z = 0.
void check_coordinates(const double* xyz, std::size_t tag, const std::string& source) {
  for (int c = 0; c < 3; ++c)
    if (!std::isfinite(xyz[c]) || std::abs(xyz[c]) > 1e7)
      throw InputError(source + ": node " + std::to_string(tag) +
                       " has a coordinate that is not a number within 1e7 m of the "
                       "origin (coordinates are metres)");
  if (std::abs(xyz[2]) > 1e-9 * (1 + std::abs(xyz[0])))
    throw InputError(source + ": the mesh must lie in the plane z = 0");
}

/// The model's nodes as vertices, with a map from Gmsh node tags to indices.
std::map<std::size_t, std::size_t>
read_nodes(const GmshModelData& model, GmshMeshData& data, const std::string& source) {
  const auto& tags = model.node_tags;
  const auto& coords = model.node_coords;
  if (coords.size() != 3 * tags.size())
    throw InternalError(source + ": Gmsh gave " + std::to_string(coords.size()) +
                        " coordinates for " + std::to_string(tags.size()) + " nodes");
  std::map<std::size_t, std::size_t> index;
  for (std::size_t n = 0; n < tags.size(); ++n) {
    check_coordinates(&coords[3 * n], tags[n], source);
    // Gmsh passes on both nodes of a tag a file defines twice; which is meant is
    // not known (keeping one would move the cells of the other without a word).
    if (!index.emplace(tags[n], data.vertices.size()).second)
      throw InputError(source + ": node " + std::to_string(tags[n]) +
                       " is defined twice");
    data.vertices.emplace_back(coords[3 * n], coords[3 * n + 1]);
    data.vertex_tag.push_back(tags[n]);
  }
  return index;
}

/// An element of a physical group: its Gmsh tag and node tags.
struct Element {
  std::size_t tag;
  std::vector<std::size_t> nodes;
};

/// The elements of a physical group of dimension 1 or 2, which must be 2-node
/// lines or 4-node quadrilaterals.
std::vector<Element> group_elements(const GmshGroup& group, const std::string& source) {
  const int expected = group.dim == 2 ? 3 : 1; // 4-node quadrangle, 2-node line
  const std::size_t per = group.dim == 2 ? 4 : 2;
  std::vector<Element> elements;
  for (const auto& block : group.blocks) {
    if (block.type != expected)
      throw InputError(source + ": physical group '" + group.name + "' holds " +
                       (group.dim == 2
                            ? "cells that are not 4-node quadrilaterals (recombine "
                              "the mesh and use first-order elements)"
                            : "curve elements that are not 2-node lines"));
    if (block.nodes.size() != per * block.tags.size())
      throw InternalError(source + ": Gmsh gave " + std::to_string(block.nodes.size()) +
                          " node tags for " + std::to_string(block.tags.size()) +
                          " elements of group '" + group.name + "'");
    for (std::size_t e = 0; e < block.tags.size(); ++e)
      elements.push_back(
          {block.tags[e], std::vector<std::size_t>(block.nodes.begin() + e * per,
                                                   block.nodes.begin() + (e + 1) * per)});
  }
  return elements;
}

std::size_t node_index(const std::map<std::size_t, std::size_t>& index,
                       std::size_t tag,
                       const std::string& where) {
  const auto found = index.find(tag);
  if (found == index.end())
    throw InputError(where + " uses node " + std::to_string(tag) +
                     ", which the file does not define");
  return found->second;
}

/// (b - a) x (c - a), positive when a, b, c turn counter-clockwise.
double turn(const Point<2>& a, const Point<2>& b, const Point<2>& c) {
  return (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]);
}

/// The sense in which a quadrilateral's nodes (Gmsh's order, round the cell) turn:
/// +1 or -1. Throws InputError for a node used twice, three nodes in a line, or a
/// twisted (bow-tie) or re-entrant cell, whose corners turn both ways: none of
/// these maps onto a square without a zero or negative Jacobian.
int quad_turn(const Element& element,
              const std::map<std::size_t, std::size_t>& index,
              const std::vector<Point<2>>& vertices,
              const std::string& where) {
  const auto& n = element.nodes;
  for (std::size_t i = 0; i < 4; ++i)
    for (std::size_t j = i + 1; j < 4; ++j)
      if (n[i] == n[j])
        throw InputError(where + " uses node " + std::to_string(n[i]) + " twice");
  Point<2> p[4];
  double size = 0.0;
  for (std::size_t i = 0; i < 4; ++i)
    p[i] = vertices[node_index(index, n[i], where)];
  for (std::size_t i = 0; i < 4; ++i)
    size = std::max(size, p[i].distance(p[(i + 1) % 4]));
  // Below this the area test's square of the size could underflow to zero, and
  // deal.II's Jacobians would be denormal: no soil model has such cells.
  if (size < 1e-6)
    throw InputError(where +
                     " is less than a micrometre across (coordinates are metres)");
  int positive = 0, negative = 0;
  for (std::size_t i = 0; i < 4; ++i) {
    const double corner = turn(p[i], p[(i + 1) % 4], p[(i + 3) % 4]);
    if (std::abs(corner) <= 1e-12 * size * size)
      throw InputError(where + " has no area at node " + std::to_string(n[i]) +
                       " (three of its nodes lie in a line)");
    (corner > 0 ? positive : negative) += 1;
  }
  if (positive != 0 && negative != 0)
    throw InputError(where + " is twisted or turned in on itself: its corners turn " +
                     "both ways (nodes " + std::to_string(n[0]) + " " +
                     std::to_string(n[1]) + " " + std::to_string(n[2]) + " " +
                     std::to_string(n[3]) + ")");
  return positive != 0 ? 1 : -1;
}

/// A cell over the same four nodes as an earlier one: a surface in two physical
/// groups, or an element given twice. deal.II would take both, one on the other.
void check_not_repeated(const CellData<2>& cell,
                        GmshMeshData& data,
                        const std::string& where) {
  std::array<std::size_t, 4> nodes;
  std::copy(cell.vertices.begin(), cell.vertices.end(), nodes.begin());
  std::sort(nodes.begin(), nodes.end());
  const auto [earlier, added] = data.cell_of_nodes.emplace(nodes, data.cells.size());
  if (!added)
    throw InputError(where + " has the same four nodes as element " +
                     std::to_string(data.cell_element[earlier->second]) + " of group '" +
                     data.cell_region[earlier->second] +
                     "'; each cell must be in one physical surface, once");
}

/// How an error names an element: "FILE: element N of group 'NAME'".
std::string
element_place(const std::string& source, const Element& element, const GmshGroup& group) {
  return source + ": element " + std::to_string(element.tag) + " of group '" +
         group.name + "'";
}

/// Adds the cells of a physical surface.
void add_cells(const GmshGroup& group,
               const std::map<std::size_t, std::size_t>& index,
               GmshMeshData& data,
               const std::string& source) {
  for (const auto& element : group_elements(group, source)) {
    const std::string where = element_place(source, element, group);
    data.cell_turn.push_back(quad_turn(element, index, data.vertices, where));
    CellData<2> cell;
    // Gmsh numbers quadrilateral nodes round the cell, deal.II lexicographically.
    const std::size_t order[4] = {0, 1, 3, 2};
    for (unsigned int v = 0; v < 4; ++v)
      cell.vertices[v] = node_index(index, element.nodes[order[v]], where);
    check_not_repeated(cell, data, where);
    data.cells.push_back(cell);
    data.cell_region.push_back(group.name);
    data.cell_element.push_back(element.tag);
  }
}

/// Adds the edges of a physical curve.
void add_curve(const GmshGroup& group,
               const std::map<std::size_t, std::size_t>& index,
               GmshMeshData& data,
               const std::string& source) {
  for (const auto& element : group_elements(group, source)) {
    const std::string where = element_place(source, element, group);
    data.curve_groups[group.name].push_back(
        edge_of(node_index(index, element.nodes[0], where),
                node_index(index, element.nodes[1], where)));
  }
}

/// Cells whose nodes run the other way round from most of the mesh's lie folded
/// over their neighbours.
void check_no_folded_cells(const GmshMeshData& data, const std::string& source) {
  const auto counter_clockwise =
      std::count(data.cell_turn.begin(), data.cell_turn.end(), 1);
  const int usual =
      2 * counter_clockwise >= std::ptrdiff_t(data.cell_turn.size()) ? 1 : -1;
  for (std::size_t c = 0; c < data.cells.size(); ++c)
    if (data.cell_turn[c] != usual)
      throw InputError(source + ": element " + std::to_string(data.cell_element[c]) +
                       " of group '" + data.cell_region[c] +
                       "' is inverted: its nodes run the other way round from the "
                       "mesh's other cells, so it lies folded over its neighbours");
}

GmshMeshData read_model(const GmshModelData& model, const std::string& source) {
  GmshMeshData data;
  const auto index = read_nodes(model, data, source);
  for (const auto& group : model.groups) {
    if (group.name.empty())
      throw InputError(source + ": physical group " + std::to_string(group.tag) +
                       " of dimension " + std::to_string(group.dim) +
                       " has no name; Settlewell addresses groups by name");
    if (group.dim == 2)
      add_cells(group, index, data, source);
    else if (group.dim == 1)
      add_curve(group, index, data, source);
  }
  if (data.cells.empty())
    throw InputError(source + ": the mesh has no physical surface naming its regions");
  check_no_folded_cells(data, source);
  return data;
}

/// Cells far longer than wide, which a file may hold but whose gradients (flux,
/// stress) are poor; the reader warns of them.
SlenderCells slender_cells(const GmshMeshData& data) {
  SlenderCells slender;
  for (std::size_t c = 0; c < data.cells.size(); ++c) {
    const auto& v = data.cells[c].vertices;
    double shortest = std::numeric_limits<double>::max(), longest = 0.0;
    for (const auto& [a, b] : {std::pair{0, 1}, {1, 3}, {3, 2}, {2, 0}}) {
      const double length = data.vertices[v[a]].distance(data.vertices[v[b]]);
      shortest = std::min(shortest, length);
      longest = std::max(longest, length);
    }
    const double ratio = longest / shortest;
    if (ratio > SlenderCells::slender_limit)
      ++slender.count;
    if (ratio > slender.worst_ratio) {
      slender.worst_ratio = ratio;
      slender.worst_element = data.cell_element[c];
      slender.worst_group = data.cell_region[c];
    }
  }
  return slender;
}

/// The cells on each side (edge of a cell), in the order of the cells.
using SideCells = std::map<Edge, std::vector<std::size_t>>;

SideCells cells_of_sides(const GmshMeshData& data) {
  SideCells sides;
  for (std::size_t c = 0; c < data.cells.size(); ++c) {
    const auto& v = data.cells[c].vertices;
    for (const auto& [a, b] : {std::pair{0, 1}, {1, 3}, {3, 2}, {2, 0}})
      sides[edge_of(v[a], v[b])].push_back(c);
  }
  return sides;
}

/// A side belongs to two cells at most: of three, two lie on one side of it, one
/// over the other (all turning the same way, the orientation test passes them).
/// p4est's forest refuses such a mesh.
void check_sides(const SideCells& sides,
                 const GmshMeshData& data,
                 const std::string& source) {
  for (const auto& [edge, cells] : sides) {
    if (cells.size() <= 2)
      continue;
    const std::size_t c = cells[2];
    throw InputError(
        source + ": element " + std::to_string(data.cell_element[c]) + " of group '" +
        data.cell_region[c] + "' has the side between nodes " +
        std::to_string(data.vertex_tag[edge.first]) + " and " +
        std::to_string(data.vertex_tag[edge.second]) +
        ", which two other cells have already (elements " +
        std::to_string(data.cell_element[cells[0]]) + " and " +
        std::to_string(data.cell_element[cells[1]]) + "); the cells overlap");
  }
}

/// Boundary edges (on one cell only) and the curve group of each, if any.
std::map<Edge, std::string>
boundary_edges(const GmshMeshData& data,
               const SideCells& sides,
               const std::string& source,
               std::map<std::string, std::vector<Segment>>& internal) {
  std::map<Edge, std::string> boundary;
  for (const auto& [edge, cells] : sides)
    if (cells.size() == 1)
      boundary[edge] = "";
  for (const auto& [name, edges] : data.curve_groups) {
    std::size_t on_boundary = 0;
    for (const auto& e : edges) {
      const auto found = boundary.find(e);
      if (found == boundary.end())
        continue;
      if (!found->second.empty() && found->second != name)
        throw InputError(source + ": boundary groups '" + found->second + "' and '" +
                         name +
                         "' share an edge; each boundary edge may belong to one group");
      found->second = name;
      ++on_boundary;
    }
    if (on_boundary == 0)
      for (const auto& e : edges)
        internal[name].push_back({data.vertices[e.first], data.vertices[e.second]});
    else if (on_boundary != edges.size())
      throw InputError(
          source + ": physical curve '" + name +
          "' lies partly on the boundary and partly inside; split it in two");
  }
  return boundary;
}

} // namespace

CheckedMesh check_gmsh_model(const GmshModelData& model, const std::string& source) {
  GmshMeshData data = read_model(model, source);
  const SideCells sides = cells_of_sides(data);
  check_sides(sides, data, source);
  CheckedMesh mesh;
  mesh.slender = slender_cells(data);
  for (std::size_t c = 0; c < data.cells.size(); ++c)
    data.cells[c].material_id = mesh.names.add_region(data.cell_region[c]);
  for (const auto& [edge, name] :
       boundary_edges(data, sides, source, mesh.internal_lines)) {
    CellData<1> line;
    line.vertices[0] = edge.first;
    line.vertices[1] = edge.second;
    line.boundary_id = mesh.names.add_boundary(name.empty() ? "unnamed_boundary" : name);
    mesh.faces.boundary_lines.push_back(line);
  }
  mesh.vertices = std::move(data.vertices);
  mesh.cells = std::move(data.cells);
  return mesh;
}

void create_checked_triangulation(CheckedMesh& mesh,
                                  dealii::Triangulation<2>& triangulation) {
  GridTools::delete_unused_vertices(mesh.vertices, mesh.cells, mesh.faces);
  GridTools::invert_all_negative_measure_cells(mesh.vertices, mesh.cells);
  GridTools::consistently_order_cells(mesh.cells);
  triangulation.create_triangulation(mesh.vertices, mesh.cells, mesh.faces);
}

} // namespace settlewell
