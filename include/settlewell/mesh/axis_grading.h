#pragma once

#include <vector>

namespace settlewell {

/// A place along an axis that wants small cells (a wall face, a well, a layer
/// interface) and the cell size it wants there, m.
struct GradingFeature {
  double position = 0.0;
  double size = 0.0;
};

/// A stretch of an axis meshed with `cells` cells whose sizes change by `ratio`
/// from one cell to the next in the direction of increasing coordinate.
struct AxisInterval {
  double start = 0.0, end = 0.0;
  unsigned int cells = 1;
  double ratio = 1.0;
};

/// The cell edges of an interval: `cells` cells whose sizes grow by `ratio` from
/// `start` to `end` (ratio < 1: finest at the end). Throws InternalError for no
/// cells or a ratio that is not positive.
std::vector<double> cell_edges(const AxisInterval& interval);

/// Edges from `start` to `end` that are finest at both ends and symmetric about the
/// middle: half the cells (at least one) growing by `growth` towards the middle.
std::vector<double>
symmetric_cell_edges(double start, double end, unsigned int n_cells, double growth);

/// Cuts an axis at every breakpoint and grades it: the cell size is
/// min(size_far, h_f + (growth - 1) |x - x_f|) over the features f, so cells grow
/// by `growth` per cell away from each feature and never exceed size_far. Extra
/// cuts are made where the size stops growing, so that each interval is one
/// geometric progression. Breakpoints must be sorted; pure function.
std::vector<AxisInterval> grade_axis(const std::vector<double>& breakpoints,
                                     const std::vector<GradingFeature>& features,
                                     double size_far,
                                     double growth);

/// Sorted breakpoints with any two closer than `tolerance` merged.
std::vector<double> unique_breakpoints(std::vector<double> points, double tolerance);

} // namespace settlewell
