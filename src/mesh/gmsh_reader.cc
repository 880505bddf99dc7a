// Turning the current Gmsh model's mesh into a deal.II distributed triangulation,
// with region, boundary and internal-line names from its physical groups: the model is
// read as plain data (gmsh_model.cc) and checked (gmsh_checks.cc).
#include "gmsh_checks.h"
#include "section_plan.h"

#include "settlewell/core/errors.h"
#include "settlewell/core/files.h"
#include "settlewell/mesh/gmsh_mesh.h"

#include <deal.II/base/mpi.h>

#include <gmsh.h>

#include <cmath>
#include <cstring>
#include <fcntl.h>
#include <filesystem>
#include <iomanip>
#include <iostream>
#include <sstream>
#include <sys/wait.h>
#include <unistd.h>

namespace settlewell {

using namespace dealii;

namespace {

/// Warns (rank 0) of cells far longer than wide: the count, and the worst with its
/// group.
void warn_of_slender_cells(const SlenderCells& slender,
                           const std::string& source,
                           MPI_Comm comm) {
  if (slender.count > 0 && Utilities::MPI::this_mpi_process(comm) == 0)
    std::cerr << "settlewell: warning: " << source << ": " << slender.count
              << " cells are more than " << SlenderCells::slender_limit
              << " times longer than wide (the worst: element " << slender.worst_element
              << " of group '" << slender.worst_group << "', " << std::setprecision(3)
              << slender.worst_ratio
              << "); their fluxes and stresses are less accurate\n";
}

/// `user_file`: a mesh from a user's file, whose slender cells are worth a warning
/// (a generated section's are the grading's, by design).
Mesh mesh_from_current_model(const std::string& source, MPI_Comm comm, bool user_file) {
  CheckedMesh checked = check_gmsh_model(read_current_model(), source);
  if (user_file)
    warn_of_slender_cells(checked.slender, source, comm);
  Mesh mesh(comm);
  mesh.names = checked.names;
  mesh.internal_lines = std::move(checked.internal_lines);
  create_checked_triangulation(checked, *mesh.triangulation);
  return mesh;
}

/// Refuses a model whose estimated memory exceeds the machine's share for runs
/// (scenario::largest_memory_share), before Gmsh or deal.II allocate it.
/// Unknowns: about 9.3 per cell (Q2 displacement, Q1 pressure; the examples give
/// 9.2). Memory: 0.2 GB of libraries and 6 kB per unknown, about twice what the
/// basement-pit example needs beyond the libraries with the LDL^T factorisation:
/// 2.7 and 2.8 kB at 354 495 and 1 414 011 unknowns on one process (peak resident
/// 1153 and 4229 MB), 3.3 kB at 1 414 011 on two. A factorisation fills in faster
/// than the unknowns grow, hence the margin.
void check_model_size(const scenario::Scenario& s, double coarse_cells) {
  if (s.numerics.allow_large)
    return;
  const double cells = coarse_cells * std::pow(4.0, s.numerics.refinements);
  const double unknowns = 9.3 * cells;
  const double bytes = 0.2e9 + 6e3 * unknowns;
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

namespace {

/// Gmsh 4.8's reader crashes on some malformed files (a node tag beyond 2^31, a file
/// cut short in $PhysicalNames: tests/fuzz/gmsh_crashes), taking the run with it.
/// Rank 0 reads the file first in a child process, which touches nothing of MPI and
/// leaves with _exit: a crash there becomes one line for every rank. Collective.
void check_gmsh_survives(const std::string& path, MPI_Comm comm) {
  int signal = 0;
  if (Utilities::MPI::this_mpi_process(comm) == 0) {
    std::cout.flush();
    std::cerr.flush();
    const pid_t child = fork();
    if (child == 0) {
      const int quiet = open("/dev/null", O_WRONLY);
      dup2(quiet, STDOUT_FILENO);
      dup2(quiet, STDERR_FILENO);
      try {
        GmshSession session;
        gmsh::open(path);
      } catch (...) { // Gmsh's own errors are read again, in the parent
      }
      _exit(0);
    }
    int status = 0;
    if (child > 0 && waitpid(child, &status, 0) == child && WIFSIGNALED(status))
      signal = WTERMSIG(status);
  }
  signal = Utilities::MPI::broadcast(comm, signal, 0);
  if (signal != 0)
    throw InputError(path + ": Gmsh's reader crashed on this file (" + strsignal(signal) +
                     "); it is malformed: export it again from Gmsh as MSH 4.1");
}

} // namespace

Mesh read_gmsh_file(const std::string& path, MPI_Comm comm, bool quiet) {
  if (const auto problem = input_file_problem(path, largest_mesh_file_bytes);
      !problem.empty())
    throw InputError(path + ": " + problem);
  check_gmsh_survives(path, comm);
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

namespace {

/// The x and y ends of the boundary parts' windows: lines of nodes in a generated
/// section, so that a part ends where the user put it.
std::pair<std::vector<double>, std::vector<double>>
window_ends(const scenario::Scenario& s) {
  std::vector<double> x, y;
  for (const auto& [name, spec] : s.boundaries)
    if (spec.part) {
      for (const auto& v : {spec.part->x_from, spec.part->x_to})
        if (v)
          x.push_back(*v);
      for (const auto& v : {spec.part->y_from, spec.part->y_to})
        if (v)
          y.push_back(*v);
    }
  return {x, y};
}

Mesh generated_mesh(const scenario::Scenario& s,
                    MPI_Comm comm,
                    const std::string& msh_path) {
  GmshSession session;
  try {
    GridPlan plan;
    if (s.section) {
      std::vector<double> dig_levels;
      for (const auto& stage : s.stages)
        if (stage.dig_level)
          dig_levels.push_back(*stage.dig_level);
      const auto [x_ends, y_ends] = window_ends(s);
      plan = section_plan(*s.section, s.analysis, dig_levels, x_ends, y_ends);
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

} // namespace

Mesh coarse_scenario_mesh(const scenario::Scenario& s,
                          MPI_Comm comm,
                          const std::string& msh_path) {
  Mesh mesh = [&] {
    if (!s.mesh_file)
      return generated_mesh(s, comm, msh_path);
    Mesh file_mesh = read_gmsh_file(s.mesh_file->path, comm);
    check_model_size(s, file_mesh.triangulation->n_global_active_cells());
    return file_mesh;
  }();
  apply_boundary_parts(s, mesh);
  return mesh;
}

MeshSummary summarise(const Mesh& mesh) {
  return {mesh.triangulation->n_global_active_cells(), mesh.triangulation->n_vertices()};
}

} // namespace settlewell
