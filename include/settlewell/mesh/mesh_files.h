#pragma once

#include "settlewell/scenario/scenario.h"

#include <mpi.h>

#include <string>

namespace settlewell {

/// Writes the coarse mesh of a scenario into `directory`, on rank 0: mesh.msh
/// (as Gmsh writes it, or a copy of the user's file), mesh_cells.vtu (the cells
/// with their region id as cell data), mesh_lines.vtu (boundary faces and
/// internal-line segments with their line id as point data) and names.toml (the
/// name of every region and line id). The plotting scripts draw the geometry from
/// these files. Collective.
void write_scenario_mesh(const scenario::Scenario& scenario,
                         const std::string& directory,
                         MPI_Comm comm);

} // namespace settlewell
