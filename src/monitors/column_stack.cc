#include "column_stack.h"

#include <deal.II/base/geometry_info.h>
#include <deal.II/base/mpi.h>
#include <deal.II/fe/mapping.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <limits>
#include <stdexcept>
#include <tuple>
#include <utility>

namespace settlewell::monitors {

using dealii::Point;

namespace {

/// Where one cell meets the line: its elevation range, its region and how far its
/// centre lies from the line.
struct Crossing {
  double top = 0.0, bottom = 0.0, offset = 0.0;
  unsigned int region = 0;
};

/// The elevation range over which the line x crosses a cell with straight edges
/// (deal.II's vertex order: the outline is 0, 1, 3, 2), if it crosses it.
bool crossing(const std::vector<Point<2>>& outline, double x, double& low, double& high) {
  low = std::numeric_limits<double>::infinity();
  high = -low;
  for (std::size_t i = 0; i < outline.size(); ++i) {
    const Point<2>& a = outline[i];
    const Point<2>& b = outline[(i + 1) % outline.size()];
    if (x < std::min(a[0], b[0]) || x > std::max(a[0], b[0]))
      continue;
    const double y =
        a[0] == b[0] ? a[1] : a[1] + (b[1] - a[1]) * (x - a[0]) / (b[0] - a[0]);
    const double y_other = a[0] == b[0] ? b[1] : y;
    low = std::min({low, y, y_other});
    high = std::max({high, y, y_other});
  }
  return high > low;
}

/// This process's crossings, four numbers each (top, bottom, offset, region), to
/// be gathered.
std::vector<double> local_crossings(const BiotProblem& problem, double x) {
  std::vector<double> out;
  for (const auto& cell : problem.dof_handler().active_cell_iterators()) {
    if (!cell->is_locally_owned())
      continue;
    std::vector<Point<2>> outline;
    for (const unsigned int v : {0u, 1u, 3u, 2u})
      outline.push_back(cell->vertex(v));
    double low, high;
    if (crossing(outline, x, low, high))
      out.insert(out.end(), {high, low, std::abs(cell->center()[0] - x),
                             double(cell->material_id())});
  }
  return out;
}

/// The crossing that holds elevation y: the nearest cell centre, then the lower id.
const Crossing* holding(const std::vector<Crossing>& all, double y) {
  const Crossing* best = nullptr;
  for (const auto& c : all)
    if (y > c.bottom && y < c.top &&
        (best == nullptr ||
         std::tie(c.offset, c.region) < std::tie(best->offset, best->region)))
      best = &c;
  return best;
}

/// The boundary face the line x meets highest: its elevation there and its id.
std::pair<double, unsigned int> local_top_face(const BiotProblem& problem, double x) {
  std::pair<double, unsigned int> best{-std::numeric_limits<double>::infinity(), 0};
  for (const auto& cell : problem.dof_handler().active_cell_iterators())
    if (cell->is_locally_owned())
      for (const unsigned int f : cell->face_indices()) {
        if (!cell->at_boundary(f))
          continue;
        const Point<2> a = cell->face(f)->vertex(0), b = cell->face(f)->vertex(1);
        if (x < std::min(a[0], b[0]) || x > std::max(a[0], b[0]))
          continue;
        const double y = a[0] == b[0] ? std::max(a[1], b[1])
                                      : a[1] + (b[1] - a[1]) * (x - a[0]) / (b[0] - a[0]);
        if (y > best.first)
          best = {y, cell->face(f)->boundary_id()};
      }
  return best;
}

} // namespace

ColumnStack column_stack(const BiotProblem& problem, double x) {
  std::vector<Crossing> all;
  for (const auto& part : dealii::Utilities::MPI::all_gather(problem.communicator(),
                                                             local_crossings(problem, x)))
    for (std::size_t i = 0; i + 3 < part.size(); i += 4)
      all.push_back(
          {part[i], part[i + 1], part[i + 2], static_cast<unsigned int>(part[i + 3])});
  std::vector<double> levels;
  for (const auto& c : all)
    levels.insert(levels.end(), {c.top, c.bottom});
  std::sort(levels.begin(), levels.end(), std::greater<>());
  const auto& names = problem.mesh().names;
  ColumnStack stack;
  auto& layers = stack.layers;
  for (std::size_t i = 0; i + 1 < levels.size(); ++i) {
    if (!(levels[i] - levels[i + 1] > 1e-9 * (1.0 + std::abs(levels[i]))))
      continue;
    const Crossing* c = holding(all, 0.5 * (levels[i] + levels[i + 1]));
    if (c == nullptr)
      continue; // a gap in the mesh along the line
    const std::string& region = names.region_name(c->region);
    if (!layers.empty() && layers.back().region == region &&
        std::abs(layers.back().bottom - levels[i]) < 1e-9 * (1.0 + std::abs(levels[i])))
      layers.back().bottom = levels[i + 1];
    else
      layers.push_back({region, levels[i], levels[i + 1]});
  }
  std::pair<double, unsigned int> top{-std::numeric_limits<double>::infinity(), 0};
  for (const auto& face : dealii::Utilities::MPI::all_gather(problem.communicator(),
                                                             local_top_face(problem, x)))
    if (face.first > top.first)
      top = face;
  if (std::isfinite(top.first))
    stack.top_boundary = names.boundary_name(top.second);
  return stack;
}

Point<2> line_middle(const BiotProblem& problem, const std::string& line) {
  const Mesh& mesh = problem.mesh();
  const auto internal = mesh.internal_lines.find(line);
  if (internal != mesh.internal_lines.end()) {
    Point<2> sum;
    for (const auto& s : internal->second)
      sum += 0.5 * (s.a + s.b);
    return sum / double(internal->second.size());
  }
  const auto id = mesh.names.boundary_id(line);
  std::array<double, 3> sum{{0.0, 0.0, 0.0}}; // x, y, faces
  for (const auto& cell : problem.dof_handler().active_cell_iterators())
    if (cell->is_locally_owned())
      for (const unsigned int f : cell->face_indices())
        if (cell->at_boundary(f) && cell->face(f)->boundary_id() == id) {
          sum[0] += cell->face(f)->center()[0];
          sum[1] += cell->face(f)->center()[1];
          sum[2] += 1.0;
        }
  dealii::Utilities::MPI::sum(dealii::ArrayView<const double>(sum.data(), 3),
                              problem.communicator(),
                              dealii::ArrayView<double>(sum.data(), 3));
  return Point<2>(sum[0] / sum[2], sum[1] / sum[2]);
}

std::string region_at(const BiotProblem& problem, const Point<2>& p) {
  unsigned int region = std::numeric_limits<unsigned int>::max();
  for (const auto& cell : problem.dof_handler().active_cell_iterators()) {
    if (!cell->is_locally_owned() || !cell->bounding_box().point_inside(p, 1e-9))
      continue;
    const Point<2> unit = problem.mapping().transform_real_to_unit_cell(cell, p);
    if (dealii::GeometryInfo<2>::is_inside_unit_cell(unit, 1e-9))
      region = std::min<unsigned int>(region, cell->material_id());
  }
  region = dealii::Utilities::MPI::min(region, problem.communicator());
  if (region == std::numeric_limits<unsigned int>::max())
    throw std::logic_error("region_at: no cell holds the point");
  return problem.mesh().names.region_name(region);
}

} // namespace settlewell::monitors
