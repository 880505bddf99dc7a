#include "settlewell/boundary/time_function.h"

#include "settlewell/core/errors.h"

#include <algorithm>

namespace settlewell {

PiecewiseLinear::PiecewiseLinear(std::vector<std::pair<double, double>> points)
    : points_(std::move(points)) {
  if (points_.empty())
    throw InternalError("a piecewise-linear history needs at least one point");
  for (std::size_t i = 1; i < points_.size(); ++i)
    if (!(points_[i].first > points_[i - 1].first))
      throw InternalError("the times of a piecewise-linear history must increase");
}

double PiecewiseLinear::operator()(double t) const {
  if (t <= points_.front().first)
    return points_.front().second;
  if (t >= points_.back().first)
    return points_.back().second;
  const auto upper =
      std::upper_bound(points_.begin(), points_.end(), t,
                       [](double v, const auto& p) { return v < p.first; });
  const auto lower = upper - 1;
  const double w = (t - lower->first) / (upper->first - lower->first);
  return (1.0 - w) * lower->second + w * upper->second;
}

TimeFunction step_at_start(double value) {
  return [value](double t) { return t > 0.0 ? value : 0.0; };
}

TimeFunction linear_ramp(double value, double ramp_time) {
  if (!(ramp_time > 0.0))
    throw InternalError("a ramp time must be positive");
  return [value, ramp_time](double t) {
    return value * std::clamp(t / ramp_time, 0.0, 1.0);
  };
}

FieldFunction uniform(TimeFunction f) {
  return [f = std::move(f)](const dealii::Point<2>&, double t) { return f(t); };
}

} // namespace settlewell
