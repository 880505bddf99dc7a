#pragma once

#include <functional>
#include <utility>
#include <vector>

#include <deal.II/base/point.h>

namespace settlewell {

/// A value that depends on time t (s).
using TimeFunction = std::function<double(double t)>;
/// A value that depends on position (m) and time t (s).
using FieldFunction = std::function<double(const dealii::Point<2>& x, double t)>;

/// Piecewise-linear history through (t_i, v_i), constant before the first and
/// after the last point. Times must increase strictly.
class PiecewiseLinear {
public:
  explicit PiecewiseLinear(std::vector<std::pair<double, double>> points);
  double operator()(double t) const;

private:
  std::vector<std::pair<double, double>> points_;
};

/// `value` for every t > 0 and 0 at t <= 0: a change applied at the start.
TimeFunction step_at_start(double value);
/// A linear ramp from 0 at t = 0 to `value` at t = ramp_time, then held.
TimeFunction linear_ramp(double value, double ramp_time);
/// A value that is the same everywhere on the boundary.
FieldFunction uniform(TimeFunction f);

} // namespace settlewell
