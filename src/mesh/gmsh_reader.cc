// Turning the current Gmsh model's mesh into a deal.II distributed triangulation,
// with region, boundary and internal-line names from its physical groups.
#include "section_plan.h"

#include "settlewell/core/errors.h"
#include "settlewell/core/files.h"
#include "settlewell/mesh/gmsh_mesh.h"

#include <deal.II/base/mpi.h>
#include <deal.II/grid/grid_tools.h>
#include <deal.II/grid/tria_description.h>

#include <gmsh.h>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <iomanip>
#include <iostream>
#include <limits>
#include <map>
#include <set>
#include <sstream>
#include <unistd.h>

namespace settlewell {

using namespace dealii;

namespace {

using Edge = std::pair<std::size_t, std::size_t>; // node indices, smaller first

Edge edge_of(std::size_t a, std::size_t b) {
  return {std::min(a, b), std::max(a, b)};
}

struct GmshMeshData {
  std::vector<Point<2>> vertices;
  std::vector<CellData<2>> cells;
  std::vector<std::string> cell_region;
  std::vector<std::size_t> cell_element; ///< Gmsh element tag
  std::vector<int> cell_turn;            ///< +1 counter-clockwise, -1 clockwise
  std::map<std::string, std::vector<Edge>> curve_groups;
};

/// Nodes of the current model, with a map from Gmsh node tags to indices.
std::map<std::size_t, std::size_t> read_nodes(std::vector<Point<2>>& vertices,
                                              const std::string& source) {
  std::vector<std::size_t> tags;
  std::vector<double> coords, parametric;
  gmsh::model::mesh::getNodes(tags, coords, parametric);
  std::map<std::size_t, std::size_t> index;
  for (std::size_t n = 0; n < tags.size(); ++n) {
    for (int c = 0; c < 3; ++c)
      if (!std::isfinite(coords[3 * n + c]) || std::abs(coords[3 * n + c]) > 1e7)
        throw InputError(source + ": node " + std::to_string(tags[n]) +
                         " has a coordinate that is not a number within 1e7 m of the "
                         "origin (coordinates are metres)");
    if (std::abs(coords[3 * n + 2]) > 1e-9 * (1 + std::abs(coords[3 * n])))
      throw InputError(source + ": the mesh must lie in the plane z = 0");
    index[tags[n]] = vertices.size();
    vertices.emplace_back(coords[3 * n], coords[3 * n + 1]);
  }
  return index;
}

/// An element of a physical group: its Gmsh tag and node tags.
struct Element {
  std::size_t tag;
  std::vector<std::size_t> nodes;
};

/// Elements of one type on the entities of a physical group.
std::vector<Element>
group_elements(int dim, int group, const std::string& name, const std::string& source) {
  std::vector<int> entities;
  gmsh::model::getEntitiesForPhysicalGroup(dim, group, entities);
  std::vector<Element> elements;
  for (const int entity : entities) {
    std::vector<int> types;
    std::vector<std::vector<std::size_t>> element_tags, node_tags;
    gmsh::model::mesh::getElements(types, element_tags, node_tags, dim, entity);
    for (std::size_t t = 0; t < types.size(); ++t) {
      const int expected = dim == 2 ? 3 : 1; // 4-node quadrangle, 2-node line
      if (types[t] != expected)
        throw InputError(source + ": physical group '" + name + "' holds " +
                         (dim == 2
                              ? "cells that are not 4-node quadrilaterals (recombine "
                                "the mesh and use first-order elements)"
                              : "curve elements that are not 2-node lines"));
      const std::size_t per = dim == 2 ? 4 : 2;
      for (std::size_t e = 0; e < element_tags[t].size(); ++e)
        elements.push_back(
            {element_tags[t][e],
             std::vector<std::size_t>(node_tags[t].begin() + e * per,
                                      node_tags[t].begin() + (e + 1) * per)});
    }
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

/// Warns (rank 0) of cells far longer than wide, which a file may hold but whose
/// gradients (flux, stress) are poor: the count, and the worst with its group.
void warn_of_slender_cells(const GmshMeshData& data,
                           const std::string& source,
                           MPI_Comm comm) {
  constexpr double slender = 50.0;
  std::size_t count = 0, worst = 0;
  double worst_ratio = 0.0;
  for (std::size_t c = 0; c < data.cells.size(); ++c) {
    const auto& v = data.cells[c].vertices;
    double shortest = std::numeric_limits<double>::max(), longest = 0.0;
    for (const auto& [a, b] : {std::pair{0, 1}, {1, 3}, {3, 2}, {2, 0}}) {
      const double length = data.vertices[v[a]].distance(data.vertices[v[b]]);
      shortest = std::min(shortest, length);
      longest = std::max(longest, length);
    }
    const double ratio = longest / shortest;
    if (ratio > slender)
      ++count;
    if (ratio > worst_ratio)
      worst_ratio = ratio, worst = c;
  }
  if (count > 0 && Utilities::MPI::this_mpi_process(comm) == 0)
    std::cerr << "settlewell: warning: " << source << ": " << count
              << " cells are more than " << slender
              << " times longer than wide (the worst: element "
              << data.cell_element[worst] << " of group '" << data.cell_region[worst]
              << "', " << std::setprecision(3) << worst_ratio
              << "); their fluxes and stresses are less accurate\n";
}

GmshMeshData read_current_model(const std::string& source) {
  GmshMeshData data;
  const auto index = read_nodes(data.vertices, source);
  gmsh::vectorpair groups;
  gmsh::model::getPhysicalGroups(groups);
  std::set<std::size_t> seen_elements;
  for (const auto& [dim, tag] : groups) {
    std::string name;
    gmsh::model::getPhysicalName(dim, tag, name);
    if (name.empty())
      throw InputError(source + ": physical group " + std::to_string(tag) +
                       " of dimension " + std::to_string(dim) +
                       " has no name; Settlewell addresses groups by name");
    if (dim == 2) {
      for (const auto& element : group_elements(2, tag, name, source)) {
        const std::string where = source + ": element " + std::to_string(element.tag) +
                                  " of group '" + name + "'";
        data.cell_turn.push_back(quad_turn(element, index, data.vertices, where));
        CellData<2> cell;
        // Gmsh numbers quadrilateral nodes round the cell, deal.II lexicographically.
        const std::size_t order[4] = {0, 1, 3, 2};
        for (unsigned int v = 0; v < 4; ++v)
          cell.vertices[v] = node_index(index, element.nodes[order[v]], where);
        data.cells.push_back(cell);
        data.cell_region.push_back(name);
        data.cell_element.push_back(element.tag);
      }
    } else if (dim == 1) {
      for (const auto& element : group_elements(1, tag, name, source)) {
        const std::string where = source + ": element " + std::to_string(element.tag) +
                                  " of group '" + name + "'";
        data.curve_groups[name].push_back(
            edge_of(node_index(index, element.nodes[0], where),
                    node_index(index, element.nodes[1], where)));
      }
    }
  }
  if (data.cells.empty())
    throw InputError(source + ": the mesh has no physical surface naming its regions");
  check_no_folded_cells(data, source);
  return data;
}

/// Boundary edges (on one cell only) and the curve group of each, if any.
std::map<Edge, std::string>
boundary_edges(const GmshMeshData& data,
               const std::string& source,
               std::map<std::string, std::vector<Segment>>& internal) {
  std::map<Edge, int> count;
  for (const auto& cell : data.cells)
    for (const auto& [a, b] : {std::pair{0, 1}, {1, 3}, {3, 2}, {2, 0}})
      ++count[edge_of(cell.vertices[a], cell.vertices[b])];
  std::map<Edge, std::string> boundary;
  for (const auto& [edge, n] : count)
    if (n == 1)
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

/// `user_file`: a mesh from a user's file, whose slender cells are worth a warning
/// (a generated section's are the grading's, by design).
Mesh mesh_from_current_model(const std::string& source, MPI_Comm comm, bool user_file) {
  GmshMeshData data = read_current_model(source);
  if (user_file)
    warn_of_slender_cells(data, source, comm);
  Mesh mesh(comm);
  for (std::size_t c = 0; c < data.cells.size(); ++c)
    data.cells[c].material_id = mesh.names.add_region(data.cell_region[c]);
  SubCellData faces;
  for (const auto& [edge, name] : boundary_edges(data, source, mesh.internal_lines)) {
    CellData<1> line;
    line.vertices[0] = edge.first;
    line.vertices[1] = edge.second;
    line.boundary_id = mesh.names.add_boundary(name.empty() ? "unnamed_boundary" : name);
    faces.boundary_lines.push_back(line);
  }
  GridTools::delete_unused_vertices(data.vertices, data.cells, faces);
  GridTools::invert_all_negative_measure_cells(data.vertices, data.cells);
  GridTools::consistently_order_cells(data.cells);
  mesh.triangulation->create_triangulation(data.vertices, data.cells, faces);
  return mesh;
}

/// Refuses a model whose estimated memory exceeds the machine's share for runs
/// (scenario::largest_memory_share), before Gmsh or deal.II allocate it.
/// Unknowns: about 9.3 per cell (Q2 displacement, Q1 pressure; the examples give
/// 9.2). Memory: 0.2 GB of libraries and 8 kB per unknown, twice the 4.0 kB
/// measured on the basement-pit example between 22 530 and 89 121 unknowns (peak
/// resident 268 and 533 MB), as a direct factorisation fills in faster than the
/// unknowns grow.
void check_model_size(const scenario::Scenario& s, double coarse_cells) {
  if (s.numerics.allow_large)
    return;
  const double cells = coarse_cells * std::pow(4.0, s.numerics.refinements);
  const double unknowns = 9.3 * cells;
  const double bytes = 0.2e9 + 8e3 * unknowns;
  const double memory = double(sysconf(_SC_PHYS_PAGES)) * double(sysconf(_SC_PAGE_SIZE));
  if (!(memory > 0.0) || bytes <= scenario::largest_memory_share * memory)
    return;
  std::ostringstream os;
  os << std::setprecision(3)
     << s.location_of(s.section ? "section" : (s.box ? "box" : "mesh_file")) << ": about "
     << cells << " cells (" << unknowns << " unknowns) would need about " << bytes / 1e9
     << " GB, more than " << 100 * scenario::largest_memory_share
     << " % of this machine's memory: use larger cells or fewer refinements, or run "
        "with --allow-large";
  throw InputError(os.str());
}

double planned_cells(const GridPlan& plan) {
  double nx = 0.0, ny = 0.0;
  for (const auto& i : plan.x)
    nx += i.cells;
  for (const auto& j : plan.y)
    ny += j.cells;
  return nx * ny;
}

} // namespace

Mesh read_gmsh_file(const std::string& path, MPI_Comm comm, bool quiet) {
  if (const auto problem = input_file_problem(path, largest_mesh_file_bytes);
      !problem.empty())
    throw InputError(path + ": " + problem);
  GmshSession session;
  try {
    gmsh::open(path);
  } catch (const std::exception& e) {
    throw InputError(path + ": Gmsh cannot read it (" + e.what() + ")");
  } catch (const std::string& e) { // Gmsh 4.8 throws strings
    throw InputError(path + ": Gmsh cannot read it (" + e + ")");
  } catch (...) {
    throw InputError(path + ": Gmsh cannot read it");
  }
  return mesh_from_current_model(path, comm, !quiet);
}

Mesh make_scenario_mesh(const scenario::Scenario& s,
                        MPI_Comm comm,
                        const std::string& msh_path) {
  Mesh mesh = coarse_scenario_mesh(s, comm, msh_path);
  // The Gmsh mesh is the coarse mesh; refining keeps regions, boundary ids and
  // (as geometry) the internal lines.
  if (s.numerics.refinements > 0)
    mesh.triangulation->refine_global(s.numerics.refinements);
  return mesh;
}

Mesh coarse_scenario_mesh(const scenario::Scenario& s,
                          MPI_Comm comm,
                          const std::string& msh_path) {
  if (s.mesh_file) {
    Mesh mesh = read_gmsh_file(s.mesh_file->path, comm);
    check_model_size(s, mesh.triangulation->n_global_active_cells());
    return mesh;
  }
  GmshSession session;
  try {
    GridPlan plan;
    if (s.section) {
      std::vector<double> dig_levels;
      for (const auto& stage : s.stages)
        if (stage.dig_level)
          dig_levels.push_back(*stage.dig_level);
      plan = section_plan(*s.section, s.analysis, dig_levels);
    } else
      plan = box_plan(*s.box);
    check_model_size(s, planned_cells(plan));
    build_grid_model(plan, s.section ? "section" : "box");
  } catch (const std::string& e) { // Gmsh 4.8 throws strings
    throw InputError(s.location_of(s.section ? "section" : "box") +
                     ": the mesh generator failed: " + e);
  }
  if (!msh_path.empty() && Utilities::MPI::this_mpi_process(comm) == 0) {
    const auto folder = std::filesystem::path(msh_path).parent_path();
    if (!folder.empty())
      std::filesystem::create_directories(folder);
    gmsh::write(msh_path);
  }
  return mesh_from_current_model(s.source_path, comm, false);
}

MeshSummary summarise(const Mesh& mesh) {
  return {mesh.triangulation->n_global_active_cells(), mesh.triangulation->n_vertices()};
}

} // namespace settlewell
