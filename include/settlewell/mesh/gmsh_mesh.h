#pragma once

#include "settlewell/mesh/mesh.h"
#include "settlewell/scenario/scenario.h"

#include <string>

namespace settlewell {

/// Names the section generator gives its physical groups.
namespace section_names {
inline const std::string ground_surface = "ground_surface";
inline const std::string pit_surface = "pit_surface";
inline const std::string far_boundary = "far_boundary";
inline const std::string model_base = "model_base";
inline const std::string symmetry_axis = "symmetry_axis";
inline const std::string well_casing = "well_casing";
inline const std::string excavation_level = "excavation_level";
inline const std::string wall_region = "wall";
inline const std::string wall_interface = "wall_interface";
inline const std::string wall_inner_face = "wall_inner_face";
inline const std::string wall_outer_face = "wall_outer_face";
inline const std::string wall_toe = "wall_toe";
/// "well_<name>": a well screen (an internal line in plane strain, a boundary in
/// axisymmetric).
std::string well(const std::string& name);
} // namespace section_names

/// Size of a generated or read mesh, before any degrees of freedom exist.
struct MeshSummary {
  std::size_t n_cells = 0;
  std::size_t n_vertices = 0;
  /// Taylor-Hood Q2^2 x Q1 unknowns: 2 (V + E + C) + V, with E = V + C - 1.
  std::size_t estimated_dofs() const {
    return 2 * (2 * n_vertices + 2 * n_cells - 1) + n_vertices;
  }
};

/// Builds the section or box of a scenario with the Gmsh SDK and loads it, or
/// loads the scenario's Gmsh file, then refines it `numerics.refinements` times.
/// When `msh_path` is not empty, rank 0 writes the generated (coarse) mesh there.
/// Collective on `comm`.
Mesh make_scenario_mesh(const scenario::Scenario& s,
                        MPI_Comm comm,
                        const std::string& msh_path = "");
/// The same without the refinement.
Mesh coarse_scenario_mesh(const scenario::Scenario& s,
                          MPI_Comm comm,
                          const std::string& msh_path = "");

/// Gives each part of a boundary (boundaries.<name>.part_of) its own boundary id:
/// the parent's faces whose midpoints the part contains. On the coarse mesh, before
/// refinement. Throws InputError naming the key if the parent is unknown, the part
/// takes no face or every face, or its name is taken.
void apply_boundary_parts(const scenario::Scenario& s, Mesh& mesh);

/// The smallest box holding a boundary's faces, for `check`. Collective.
struct BoundaryExtent {
  double x_min, x_max, y_min, y_max; ///< m
  std::string text() const;          ///< "x -120 m, y -4 to 3.5 m"
};
BoundaryExtent boundary_extent(const Mesh& mesh, const std::string& name);

/// Reads a Gmsh file whose physical groups name the regions (surfaces) and the
/// boundaries or internal lines (curves). Collective. Warns of slender cells
/// unless `quiet` (a second reading of the same file).
Mesh read_gmsh_file(const std::string& path, MPI_Comm comm, bool quiet = false);

/// Cells and vertices of a mesh, for `settlewell check` (no dofs are made).
MeshSummary summarise(const Mesh& mesh);

} // namespace settlewell
