// Block plans of the parametric excavation section and of the layered box.
#include "section_plan.h"

#include "settlewell/core/errors.h"
#include "settlewell/mesh/gmsh_mesh.h"

#include <cmath>

namespace settlewell {

std::string section_names::well(const std::string& name) {
  return "well_" + name;
}

namespace {

using scenario::Section;

bool near(double a, double b, double tol) {
  return std::abs(a - b) <= tol;
}

const std::string& layer_at(const std::vector<scenario::Layer>& layers, double y) {
  for (std::size_t k = 0; k + 1 < layers.size(); ++k)
    if (y > layers[k + 1].top)
      return layers[k].name;
  return layers.back().name;
}

/// The geometry the section's blocks are classified against.
struct SectionFrame {
  const Section& s;
  bool axisymmetric;
  double x_min, x_max, half_width, outer, tol;
  const scenario::Well* axis_well = nullptr;

  bool wall_at_side(double x) const {
    return s.wall && (x > 0 ? s.wall->right : s.wall->left);
  }
  bool in_wall(double x, double y) const {
    return wall_at_side(x) && std::abs(x) > half_width && std::abs(x) < outer &&
           y > s.wall->toe;
  }
  /// In the interface zone beside either face of the wall, ground to toe.
  bool in_interface(double x, double y) const {
    const double t = s.wall ? s.wall->interface_thickness : 0.0;
    const double a = std::abs(x);
    return t > 0.0 && wall_at_side(x) && y > s.wall->toe &&
           ((a > half_width - t && a < half_width) || (a > outer && a < outer + t));
  }
  bool inside_pit(double x) const { return std::abs(x) < half_width; }
};

SectionFrame frame_of(const Section& s, AnalysisType analysis) {
  SectionFrame f{s, analysis == AnalysisType::axisymmetric, 0, 0, 0, 0, 0};
  f.half_width = s.excavation_width / 2;
  f.outer = f.half_width + (s.wall ? s.wall->thickness : 0.0);
  f.x_max = f.outer + s.far_distance;
  f.x_min = (s.half_model || f.axisymmetric) ? 0.0 : -f.x_max;
  if (f.axisymmetric && !s.wells.empty()) {
    f.axis_well = &s.wells.front();
    f.x_min = f.axis_well->radius;
  }
  f.tol = 1e-7 * (f.x_max - f.x_min + s.ground_surface - s.bottom);
  return f;
}

/// The ends strictly inside (low, high): edges of blocks without a grading of
/// their own.
void add_inside(std::vector<double>& points,
                const std::vector<double>& ends,
                double low,
                double high,
                double tol) {
  for (const double v : ends)
    if (v > low + tol && v < high - tol)
      points.push_back(v);
}

std::vector<AxisInterval> x_intervals(const SectionFrame& f,
                                      const std::vector<double>& x_ends) {
  const Section& s = f.s;
  std::vector<double> points{f.x_min, f.x_max};
  add_inside(points, x_ends, f.x_min, f.x_max, f.tol);
  std::vector<GradingFeature> features;
  for (const double side : {-1.0, 1.0}) {
    const double edge = side * f.half_width;
    if (edge <= f.x_min + f.tol)
      continue;
    points.push_back(edge);
    features.push_back({edge, s.mesh.near_wall});
    if (f.wall_at_side(side)) {
      points.push_back(side * f.outer);
      features.push_back({side * f.outer, s.mesh.near_wall});
      const double t = s.wall->interface_thickness;
      if (t > 0.0) // the interface zone is one column of cells
        for (const double x : {side * (f.half_width - t), side * (f.outer + t)}) {
          points.push_back(x);
          features.push_back({x, t});
        }
    }
  }
  for (const auto& w : s.wells) {
    const double x = f.axisymmetric ? f.x_min : w.x;
    points.push_back(x);
    features.push_back({x, s.mesh.near_well});
  }
  return grade_axis(unique_breakpoints(points, f.tol), features, s.mesh.far,
                    s.mesh.growth);
}

std::vector<AxisInterval> y_intervals(const SectionFrame& f,
                                      const std::vector<double>& dig_levels,
                                      const std::vector<double>& y_ends) {
  const Section& s = f.s;
  std::vector<double> points{s.bottom, s.ground_surface, s.excavation_level()};
  add_inside(points, y_ends, s.bottom, s.ground_surface, f.tol);
  std::vector<GradingFeature> features{{s.ground_surface, s.mesh.near_wall},
                                       {s.excavation_level(), s.mesh.near_wall}};
  for (const double level : dig_levels) {
    points.push_back(level);
    features.push_back({level, s.mesh.near_wall});
  }
  for (const auto& prop : s.props) { // a node of the wall's face at each prop
    points.push_back(prop.level);
    features.push_back({prop.level, s.mesh.near_wall});
  }
  for (const auto& layer : s.layers) {
    points.push_back(layer.top);
    features.push_back({layer.top, s.mesh.near_wall});
  }
  if (s.wall) {
    points.push_back(s.wall->toe);
    features.push_back({s.wall->toe, s.mesh.near_wall});
  }
  for (const auto& w : s.wells)
    for (const double y : {w.screen_top, w.screen_bottom}) {
      points.push_back(y);
      features.push_back({y, s.mesh.near_well});
    }
  return grade_axis(unique_breakpoints(points, f.tol), features, s.mesh.far,
                    s.mesh.growth);
}

} // namespace

GridPlan section_plan(const Section& s,
                      AnalysisType analysis,
                      const std::vector<double>& dig_levels,
                      const std::vector<double>& x_ends,
                      const std::vector<double>& y_ends) {
  const SectionFrame f = frame_of(s, analysis);
  GridPlan plan;
  plan.x = x_intervals(f, x_ends);
  plan.y = y_intervals(f, dig_levels, y_ends);
  const std::vector<double> X = corner_coordinates(plan.x),
                            Y = corner_coordinates(plan.y);
  const double y_exc = s.excavation_level();

  plan.region = [=](std::size_t i, std::size_t j) {
    const double xc = 0.5 * (X[i] + X[i + 1]), yc = 0.5 * (Y[j] + Y[j + 1]);
    if (f.in_wall(xc, yc))
      return section_names::wall_region;
    return f.in_interface(xc, yc) ? section_names::wall_interface
                                  : layer_at(s.layers, yc);
  };
  plan.horizontal_groups = [=](std::size_t i, std::size_t j) {
    const double xc = 0.5 * (X[i] + X[i + 1]), y = Y[j];
    std::vector<std::string> g;
    if (j == 0)
      g.push_back(section_names::model_base);
    else if (j + 1 == Y.size())
      g.push_back(f.inside_pit(xc) ? section_names::pit_surface
                                   : section_names::ground_surface);
    else if (near(y, y_exc, f.tol) && f.inside_pit(xc))
      g.push_back(section_names::excavation_level);
    else if (s.wall && near(y, s.wall->toe, f.tol) && f.in_wall(xc, y + f.tol))
      g.push_back(section_names::wall_toe);
    return g;
  };
  plan.vertical_groups = [=](std::size_t i, std::size_t j) {
    const double x = X[i], yc = 0.5 * (Y[j] + Y[j + 1]);
    std::vector<std::string> g;
    if (i == 0 && f.axis_well != nullptr) {
      const bool screen = yc > f.axis_well->screen_bottom && yc < f.axis_well->screen_top;
      g.push_back(screen ? section_names::well(f.axis_well->name)
                         : section_names::well_casing);
    } else if (i == 0) {
      g.push_back(f.x_min < 0 ? section_names::far_boundary
                              : section_names::symmetry_axis);
    } else if (i + 1 == X.size()) {
      g.push_back(section_names::far_boundary);
    } else if (near(std::abs(x), f.half_width, f.tol) && f.wall_at_side(x) &&
               yc > s.wall->toe) {
      g.push_back(section_names::wall_inner_face);
    } else if (near(std::abs(x), f.outer, f.tol) && f.wall_at_side(x) &&
               yc > s.wall->toe) {
      g.push_back(section_names::wall_outer_face);
    }
    if (!f.axisymmetric)
      for (const auto& w : s.wells)
        if (near(x, w.x, f.tol) && yc > w.screen_bottom && yc < w.screen_top)
          g.push_back(section_names::well(w.name));
    return g;
  };
  return plan;
}

GridPlan box_plan(const scenario::Box& box) {
  GridPlan plan;
  plan.x = {AxisInterval{box.x_origin, box.x_origin + box.width, box.cells_x, 1.0}};
  std::vector<double> tops;
  for (const auto& l : box.layers)
    tops.push_back(l.top);
  tops.push_back(box.bottom);
  for (std::size_t k = tops.size() - 1; k > 0; --k) {
    const double h = tops[k - 1] - tops[k];
    const auto n =
        static_cast<unsigned int>(std::max(1.0, std::ceil(h / box.cell_height - 1e-9)));
    plan.y.push_back({tops[k], tops[k - 1], n, 1.0});
  }
  const std::vector<double> Y = corner_coordinates(plan.y);
  const std::vector<scenario::Layer> layers = box.layers;
  plan.region = [=](std::size_t, std::size_t j) {
    return layer_at(layers, 0.5 * (Y[j] + Y[j + 1]));
  };
  plan.horizontal_groups = [=](std::size_t, std::size_t j) {
    if (j == 0)
      return std::vector<std::string>{"bottom"};
    if (j + 1 == Y.size())
      return std::vector<std::string>{"top"};
    return std::vector<std::string>{};
  };
  plan.vertical_groups = [](std::size_t i, std::size_t) {
    return std::vector<std::string>{i == 0 ? "left" : "right"};
  };
  return plan;
}

} // namespace settlewell
