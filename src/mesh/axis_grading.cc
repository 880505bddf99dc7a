#include "settlewell/mesh/axis_grading.h"

#include "settlewell/core/errors.h"

#include <algorithm>
#include <cmath>

namespace settlewell {

namespace {

double size_at(double x,
               const std::vector<GradingFeature>& features,
               double size_far,
               double slope) {
  double h = size_far;
  for (const auto& f : features)
    h = std::min(h, f.size + slope * std::abs(x - f.position));
  return h;
}

/// One stretch over which the size changes linearly from h0 to h1 (or is constant).
AxisInterval progression(double a, double b, double h0, double h1, double growth) {
  const double length = b - a;
  AxisInterval interval{a, b, 1, 1.0};
  if (std::abs(h1 - h0) < 1e-9 * std::max(h0, h1) || growth <= 1.0) {
    interval.cells = static_cast<unsigned int>(
        std::max(1.0, std::ceil(length / std::min(h0, h1) - 1e-9)));
    return interval;
  }
  // Sizes growing by `growth` per cell from the small end: n = ln(h_big/h_small)/ln g.
  const double n = std::log(std::max(h0, h1) / std::min(h0, h1)) / std::log(growth);
  interval.cells = static_cast<unsigned int>(std::max(1.0, std::round(n)));
  interval.ratio = interval.cells > 1 ? (h1 > h0 ? growth : 1.0 / growth) : 1.0;
  return interval;
}

void grade_stretch(double a,
                   double b,
                   const std::vector<GradingFeature>& features,
                   double size_far,
                   double growth,
                   std::vector<AxisInterval>& out) {
  const double slope = growth - 1.0;
  const double ha = size_at(a, features, size_far, slope);
  const double hb = size_at(b, features, size_far, slope);
  if (slope <= 0.0) {
    out.push_back(progression(a, b, ha, hb, growth));
    return;
  }
  // The size rises from both ends at the same slope and is capped at size_far.
  std::vector<double> cuts{a};
  const double peak_x = (hb - ha + slope * (a + b)) / (2.0 * slope);
  const double peak_h = ha + slope * (peak_x - a);
  if (peak_h > size_far) {
    cuts.push_back(a + (size_far - ha) / slope);
    cuts.push_back(b - (size_far - hb) / slope);
  } else {
    cuts.push_back(peak_x);
  }
  cuts.push_back(b);
  // Drop cuts that would leave a stretch shorter than the local cell size.
  std::vector<double> kept{a};
  for (std::size_t i = 1; i + 1 < cuts.size(); ++i) {
    const double h = size_at(cuts[i], features, size_far, slope);
    if (cuts[i] - kept.back() > h && b - cuts[i] > h)
      kept.push_back(cuts[i]);
  }
  kept.push_back(b);
  for (std::size_t i = 1; i < kept.size(); ++i)
    out.push_back(progression(kept[i - 1], kept[i],
                              size_at(kept[i - 1], features, size_far, slope),
                              size_at(kept[i], features, size_far, slope), growth));
}

} // namespace

std::vector<AxisInterval> grade_axis(const std::vector<double>& breakpoints,
                                     const std::vector<GradingFeature>& features,
                                     double size_far,
                                     double growth) {
  std::vector<AxisInterval> out;
  for (std::size_t i = 1; i < breakpoints.size(); ++i)
    grade_stretch(breakpoints[i - 1], breakpoints[i], features, size_far, growth, out);
  return out;
}

std::vector<double> cell_edges(const AxisInterval& interval) {
  if (interval.cells == 0 || !(interval.ratio > 0.0))
    throw InternalError("cell edges need at least one cell and a positive ratio");
  double total = 0.0, size = 1.0;
  for (unsigned int i = 0; i < interval.cells; ++i, size *= interval.ratio)
    total += size;
  std::vector<double> edges{interval.start};
  size = (interval.end - interval.start) / total;
  for (unsigned int i = 0; i < interval.cells; ++i, size *= interval.ratio)
    edges.push_back(edges.back() + size);
  edges.back() = interval.end;
  return edges;
}

std::vector<double>
symmetric_cell_edges(double start, double end, unsigned int n_cells, double growth) {
  const double middle = 0.5 * (start + end);
  const unsigned int half = std::max(1u, n_cells / 2);
  std::vector<double> edges = cell_edges({start, middle, half, growth});
  const std::vector<double> lower_half = edges;
  for (auto it = lower_half.rbegin() + 1; it != lower_half.rend(); ++it)
    edges.push_back(start + end - *it);
  return edges;
}

std::vector<double> unique_breakpoints(std::vector<double> points, double tolerance) {
  std::sort(points.begin(), points.end());
  std::vector<double> out;
  for (const double p : points)
    if (out.empty() || p - out.back() > tolerance)
      out.push_back(p);
  return out;
}

} // namespace settlewell
