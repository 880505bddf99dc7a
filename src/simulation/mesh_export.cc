// `settlewell mesh`: the scenario's mesh as Gmsh writes it, and VTU files of its
// cells and lines with the region and line names, for inspection.
#include "settlewell/core/errors.h"
#include "settlewell/mesh/gmsh_mesh.h"
#include "settlewell/simulation/simulation.h"

#include <deal.II/base/mpi.h>

#include <vtkCellArray.h>
#include <vtkCellData.h>
#include <vtkFieldData.h>
#include <vtkIntArray.h>
#include <vtkPoints.h>
#include <vtkSmartPointer.h>
#include <vtkStringArray.h>
#include <vtkUnstructuredGrid.h>
#include <vtkXMLUnstructuredGridWriter.h>

#include <filesystem>

namespace settlewell {

using namespace dealii;

namespace {

vtkSmartPointer<vtkStringArray> names_array(const char* name,
                                            const std::vector<std::string>& names) {
  auto array = vtkSmartPointer<vtkStringArray>::New();
  array->SetName(name);
  for (const auto& n : names)
    array->InsertNextValue(n);
  return array;
}

void write_grid(vtkUnstructuredGrid* grid, const std::string& path) {
  auto writer = vtkSmartPointer<vtkXMLUnstructuredGridWriter>::New();
  writer->SetFileName(path.c_str());
  writer->SetInputData(grid);
  if (writer->Write() != 1)
    throw InputError(path + ": cannot write");
}

/// Cells with their region id; the field data "region_names" lists names by id.
void write_cells(const Mesh& mesh, const std::string& path) {
  auto grid = vtkSmartPointer<vtkUnstructuredGrid>::New();
  auto points = vtkSmartPointer<vtkPoints>::New();
  for (const auto& v : mesh.triangulation->get_vertices())
    points->InsertNextPoint(v[0], v[1], 0.0);
  grid->SetPoints(points);
  auto region = vtkSmartPointer<vtkIntArray>::New();
  region->SetName("region");
  for (const auto& cell : mesh.triangulation->active_cell_iterators()) {
    // deal.II numbers quadrilateral vertices lexicographically; VTK goes round.
    const vtkIdType ids[4] = {
        vtkIdType(cell->vertex_index(0)), vtkIdType(cell->vertex_index(1)),
        vtkIdType(cell->vertex_index(3)), vtkIdType(cell->vertex_index(2))};
    grid->InsertNextCell(VTK_QUAD, 4, ids);
    region->InsertNextValue(int(cell->material_id()));
  }
  grid->GetCellData()->AddArray(region);
  std::vector<std::string> names(mesh.names.region_names().size());
  for (const auto& n : mesh.names.region_names())
    names.at(mesh.names.region_id(n)) = n;
  grid->GetFieldData()->AddArray(names_array("region_names", names));
  write_grid(grid, path);
}

/// Boundary faces and internal-line segments, each with the id of its line name.
void write_lines(const Mesh& mesh, const std::string& path) {
  auto grid = vtkSmartPointer<vtkUnstructuredGrid>::New();
  auto points = vtkSmartPointer<vtkPoints>::New();
  auto line_id = vtkSmartPointer<vtkIntArray>::New();
  line_id->SetName("line");
  std::vector<std::string> names;
  auto add_segment = [&](const Point<2>& a, const Point<2>& b, int id) {
    const vtkIdType ids[2] = {points->InsertNextPoint(a[0], a[1], 0.0),
                              points->InsertNextPoint(b[0], b[1], 0.0)};
    grid->InsertNextCell(VTK_LINE, 2, ids);
    line_id->InsertNextValue(id);
  };
  for (const auto& name : mesh.names.boundary_names()) {
    const auto id = mesh.names.boundary_id(name);
    names.push_back(name);
    for (const auto& cell : mesh.triangulation->active_cell_iterators())
      for (const unsigned int f : cell->face_indices())
        if (cell->at_boundary(f) && cell->face(f)->boundary_id() == id)
          add_segment(cell->face(f)->vertex(0), cell->face(f)->vertex(1),
                      int(names.size() - 1));
  }
  for (const auto& [name, segments] : mesh.internal_lines) {
    names.push_back(name);
    for (const auto& s : segments)
      add_segment(s.a, s.b, int(names.size() - 1));
  }
  grid->SetPoints(points);
  grid->GetCellData()->AddArray(line_id);
  grid->GetFieldData()->AddArray(names_array("line_names", names));
  write_grid(grid, path);
}

} // namespace

void write_scenario_mesh(const scenario::Scenario& s,
                         const std::string& directory,
                         MPI_Comm comm) {
  const bool root = Utilities::MPI::this_mpi_process(comm) == 0;
  if (root)
    std::filesystem::create_directories(directory);
  const std::string msh = directory + "/mesh.msh";
  // A serial copy of the mesh is enough for inspection; rank 0 writes everything.
  if (!root)
    return;
  const Mesh mesh = s.mesh_file ? read_gmsh_file(s.mesh_file->path, MPI_COMM_SELF)
                                : coarse_scenario_mesh(s, MPI_COMM_SELF, msh);
  if (s.mesh_file)
    std::filesystem::copy_file(s.mesh_file->path, msh,
                               std::filesystem::copy_options::overwrite_existing);
  write_cells(mesh, directory + "/mesh_cells.vtu");
  write_lines(mesh, directory + "/mesh_lines.vtu");
}

} // namespace settlewell
