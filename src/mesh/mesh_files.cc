// The mesh of a scenario as files for inspection and for the plotting scripts,
// written as deal.II patches with the region and line ids and names as cell data.
#include "settlewell/mesh/mesh_files.h"

#include "settlewell/core/errors.h"
#include "settlewell/core/file_writing.h"
#include "settlewell/core/vtu_extras.h"
#include "settlewell/mesh/gmsh_mesh.h"

#include <deal.II/base/data_out_base.h>
#include <deal.II/base/mpi.h>

#include <toml++/toml.h>

#include <filesystem>
#include <fstream>
#include <sstream>

namespace settlewell {

using namespace dealii;

namespace {

/// The region names "id: name", for the files' field data.
std::vector<std::string> region_list(const Mesh& mesh) {
  std::vector<std::string> out;
  for (const auto& name : mesh.names.region_names())
    out.push_back(std::to_string(mesh.names.region_id(name)) + ": " + name);
  return out;
}

/// Cells with their region's id and name as cell data.
void write_cells(const Mesh& mesh, const std::string& path) {
  std::vector<DataOutBase::Patch<2, 2>> patches;
  VtuExtras extras;
  extras.cell_integers = {{"region", {}}};
  extras.cell_texts = {{"region_name", {}}};
  extras.field_texts = {{"region_names", region_list(mesh)}};
  for (const auto& cell : mesh.triangulation->active_cell_iterators()) {
    DataOutBase::Patch<2, 2> patch;
    for (const unsigned int v : cell->vertex_indices())
      patch.vertices[v] = cell->vertex(v);
    patch.patch_index = patches.size();
    patch.reference_cell = cell->reference_cell();
    patches.push_back(patch);
    extras.cell_integers[0].values.push_back(cell->material_id());
    extras.cell_texts[0].values.push_back(mesh.names.region_name(cell->material_id()));
  }
  std::ostringstream vtu;
  DataOutBase::write_vtu(patches, {}, {}, DataOutBase::VtkFlags(), vtu);
  write_whole_file(path,
                   [&](std::ostream& out) { out << with_vtu_extras(vtu.str(), extras); });
}

/// Every boundary face and internal-line segment as a two-point patch carrying the
/// id of its line (the boundaries first, in name order, then the internal lines).
std::vector<std::string> write_lines(const Mesh& mesh, const std::string& path) {
  std::vector<DataOutBase::Patch<1, 2>> patches;
  std::vector<std::string> names;
  VtuExtras extras;
  extras.cell_integers = {{"line", {}}};
  extras.cell_texts = {{"line_name", {}}};
  auto add_segment = [&](const Point<2>& a, const Point<2>& b) {
    DataOutBase::Patch<1, 2> patch;
    patch.vertices[0] = a;
    patch.vertices[1] = b;
    patch.patch_index = patches.size();
    patch.reference_cell = ReferenceCells::Line;
    patches.push_back(patch);
    extras.cell_integers[0].values.push_back(static_cast<int>(names.size() - 1));
    extras.cell_texts[0].values.push_back(names.back());
  };
  for (const auto& name : mesh.names.boundary_names()) {
    names.push_back(name);
    const auto id = mesh.names.boundary_id(name);
    for (const auto& cell : mesh.triangulation->active_cell_iterators())
      for (const unsigned int f : cell->face_indices())
        if (cell->at_boundary(f) && cell->face(f)->boundary_id() == id)
          add_segment(cell->face(f)->vertex(0), cell->face(f)->vertex(1));
  }
  for (const auto& [name, segments] : mesh.internal_lines) {
    names.push_back(name);
    for (const auto& s : segments)
      add_segment(s.a, s.b);
  }
  std::ostringstream vtu;
  DataOutBase::write_vtu(patches, {}, {}, DataOutBase::VtkFlags(), vtu);
  write_whole_file(path,
                   [&](std::ostream& out) { out << with_vtu_extras(vtu.str(), extras); });
  return names;
}

void write_names(const Mesh& mesh,
                 const std::vector<std::string>& lines,
                 const std::string& path) {
  toml::table regions, line_names;
  for (const auto& name : mesh.names.region_names())
    regions.insert(std::to_string(mesh.names.region_id(name)), name);
  for (std::size_t id = 0; id < lines.size(); ++id)
    line_names.insert(std::to_string(id), lines[id]);
  write_whole_file(path, [&](std::ostream& out) {
    out << "# The names of the region ids of mesh_cells.vtu and the line ids of\n"
           "# mesh_lines.vtu.\n"
        << toml::table{{"regions", regions}, {"lines", line_names}} << '\n';
  });
}

} // namespace

void write_scenario_mesh(const scenario::Scenario& s,
                         const std::string& directory,
                         MPI_Comm comm) {
  // A serial copy of the coarse mesh is enough for inspection; rank 0 writes it.
  if (Utilities::MPI::this_mpi_process(comm) != 0)
    return;
  std::filesystem::create_directories(directory);
  const std::string msh = directory + "/mesh.msh";
  Mesh mesh = s.mesh_file ? read_gmsh_file(s.mesh_file->path, MPI_COMM_SELF, true)
                          : coarse_scenario_mesh(s, MPI_COMM_SELF, msh);
  if (s.mesh_file) {
    apply_boundary_parts(s, mesh); // a generated mesh has its parts already
    std::filesystem::copy_file(s.mesh_file->path, msh,
                               std::filesystem::copy_options::overwrite_existing);
  }
  write_cells(mesh, directory + "/mesh_cells.vtu");
  write_names(mesh, write_lines(mesh, directory + "/mesh_lines.vtu"),
              directory + "/names.toml");
}

} // namespace settlewell
