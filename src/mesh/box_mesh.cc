#include "settlewell/mesh/box_mesh.h"

#include "settlewell/core/errors.h"

#include <deal.II/grid/grid_generator.h>
#include <deal.II/grid/tria.h>

#include <algorithm>
#include <cmath>

namespace settlewell {

namespace {

std::vector<double> steps_of(const std::vector<double>& edges, const char* axis) {
  if (edges.size() < 2)
    throw InternalError(std::string("a box needs at least one cell along ") + axis);
  std::vector<double> steps;
  for (std::size_t i = 1; i < edges.size(); ++i) {
    const double h = edges[i] - edges[i - 1];
    if (!(h > 0.0))
      throw InternalError(std::string("box cell edges along ") + axis + " must increase");
    steps.push_back(h);
  }
  return steps;
}

const RegionBand* band_of(const std::vector<RegionBand>& bands, double y) {
  for (const auto& band : bands)
    if (y >= band.bottom && y <= band.top)
      return &band;
  return nullptr;
}

} // namespace

Mesh make_box_mesh(const BoxSpec& spec, MPI_Comm comm) {
  dealii::Triangulation<2> serial;
  const dealii::Point<2> lower(spec.x_edges.front(), spec.y_edges.front());
  const dealii::Point<2> upper(spec.x_edges.back(), spec.y_edges.back());
  dealii::GridGenerator::subdivided_hyper_rectangle(
      serial, {steps_of(spec.x_edges, "x"), steps_of(spec.y_edges, "y")}, lower, upper,
      /*colorize=*/true);

  Mesh mesh(comm);
  // colorize numbers the faces 0..3 as left, right, bottom, top.
  for (const char* name : {"left", "right", "bottom", "top"})
    mesh.names.add_boundary(name);

  std::vector<RegionBand> bands = spec.bands;
  if (bands.empty())
    bands.push_back({"soil", lower[1], upper[1]});
  for (const auto& band : bands)
    mesh.names.add_region(band.region);
  for (auto& cell : serial.active_cell_iterators()) {
    const RegionBand* band = band_of(bands, cell->center()[1]);
    if (band == nullptr)
      throw InternalError("box region bands leave the cells at y = " +
                          std::to_string(cell->center()[1]) + " m without a region");
    cell->set_material_id(mesh.names.region_id(band->region));
  }
  for (const auto& part : spec.parts) {
    const auto side = mesh.names.boundary_id(part.side);
    const auto id = mesh.names.add_boundary(part.name);
    for (auto& cell : serial.active_cell_iterators())
      for (const unsigned int f : cell->face_indices())
        if (cell->at_boundary(f) && cell->face(f)->boundary_id() == side &&
            part.where(cell->face(f)->center()))
          cell->face(f)->set_boundary_id(id);
  }
  mesh.triangulation->copy_triangulation(serial);
  return mesh;
}

} // namespace settlewell
