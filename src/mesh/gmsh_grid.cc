#include "gmsh_grid.h"

#include <gmsh.h>

#include <array>
#include <map>

namespace settlewell {

GmshSession::GmshSession() {
  gmsh::initialize(0, nullptr, false);
  gmsh::option::setNumber("General.Terminal", 0);
  gmsh::option::setNumber("General.Verbosity", 1);
}

GmshSession::~GmshSession() {
  gmsh::finalize();
}

std::vector<double> corner_coordinates(const std::vector<AxisInterval>& intervals) {
  std::vector<double> c{intervals.front().start};
  for (const auto& i : intervals)
    c.push_back(i.end);
  return c;
}

namespace {

void add_groups(int dim, const std::map<std::string, std::vector<int>>& groups) {
  for (const auto& [name, tags] : groups) {
    const int id = gmsh::model::addPhysicalGroup(dim, tags);
    gmsh::model::setPhysicalName(dim, id, name);
  }
}

} // namespace

void build_grid_model(const GridPlan& plan, const std::string& model_name) {
  namespace geo = gmsh::model::geo;
  gmsh::model::add(model_name);
  const std::vector<double> X = corner_coordinates(plan.x),
                            Y = corner_coordinates(plan.y);
  const std::size_t nx = X.size(), ny = Y.size();
  std::vector<int> point(nx * ny), hline((nx - 1) * ny), vline(nx * (ny - 1));
  auto P = [&](std::size_t i, std::size_t j) -> int& { return point[j * nx + i]; };
  auto H = [&](std::size_t i, std::size_t j) -> int& { return hline[j * (nx - 1) + i]; };
  auto V = [&](std::size_t i, std::size_t j) -> int& { return vline[j * nx + i]; };
  for (std::size_t j = 0; j < ny; ++j)
    for (std::size_t i = 0; i < nx; ++i)
      P(i, j) = geo::addPoint(X[i], Y[j], 0.0);
  for (std::size_t j = 0; j < ny; ++j)
    for (std::size_t i = 0; i + 1 < nx; ++i)
      H(i, j) = geo::addLine(P(i, j), P(i + 1, j));
  for (std::size_t j = 0; j + 1 < ny; ++j)
    for (std::size_t i = 0; i < nx; ++i)
      V(i, j) = geo::addLine(P(i, j), P(i, j + 1));

  std::map<std::string, std::vector<int>> regions, curves;
  std::vector<std::pair<int, std::array<int, 4>>> surfaces;
  for (std::size_t j = 0; j + 1 < ny; ++j)
    for (std::size_t i = 0; i + 1 < nx; ++i) {
      const int loop = geo::addCurveLoop({H(i, j), V(i + 1, j), -H(i, j + 1), -V(i, j)});
      const int surface = geo::addPlaneSurface({loop});
      surfaces.push_back(
          {surface, {{P(i, j), P(i + 1, j), P(i + 1, j + 1), P(i, j + 1)}}});
      regions[plan.region(i, j)].push_back(surface);
    }
  geo::synchronize();

  for (std::size_t j = 0; j < ny; ++j)
    for (std::size_t i = 0; i + 1 < nx; ++i) {
      gmsh::model::mesh::setTransfiniteCurve(H(i, j), int(plan.x[i].cells) + 1,
                                             "Progression", plan.x[i].ratio);
      for (const auto& g : plan.horizontal_groups(i, j))
        curves[g].push_back(H(i, j));
    }
  for (std::size_t j = 0; j + 1 < ny; ++j)
    for (std::size_t i = 0; i < nx; ++i) {
      gmsh::model::mesh::setTransfiniteCurve(V(i, j), int(plan.y[j].cells) + 1,
                                             "Progression", plan.y[j].ratio);
      for (const auto& g : plan.vertical_groups(i, j))
        curves[g].push_back(V(i, j));
    }
  for (const auto& [surface, corners] : surfaces) {
    gmsh::model::mesh::setTransfiniteSurface(
        surface, "Left", {corners[0], corners[1], corners[2], corners[3]});
    gmsh::model::mesh::setRecombine(2, surface);
  }
  add_groups(2, regions);
  add_groups(1, curves);
  gmsh::model::mesh::generate(2);
}

} // namespace settlewell
