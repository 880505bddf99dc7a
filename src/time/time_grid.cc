#include "settlewell/time/time_grid.h"

#include "settlewell/core/errors.h"

#include <algorithm>
#include <cmath>

namespace settlewell {

std::vector<double> log_spaced_times(double t_first, double t_end, double per_decade) {
  if (!(t_first > 0.0) || !(t_end >= t_first) || !(per_decade > 0.0))
    throw InternalError(
        "log-spaced times need 0 < t_first <= t_end and a positive density");
  const double decades = std::log10(t_end / t_first);
  const auto n = static_cast<unsigned int>(std::ceil(decades * per_decade - 1e-9));
  std::vector<double> times{t_first};
  for (unsigned int i = 1; i <= n; ++i)
    times.push_back(t_first * std::pow(10.0, decades * i / n));
  if (n > 0)
    times.back() = t_end;
  return times;
}

std::vector<double> growing_times(
    double t_begin, double t_end, double first_step, double growth, double max_step) {
  if (!(t_end > t_begin) || !(first_step > 0.0) || !(growth >= 1.0) ||
      !(max_step >= first_step))
    throw InternalError("growing time steps need t_end > t_begin, a positive first step, "
                        "growth >= 1 and a largest step no smaller than the first");
  std::vector<double> times;
  double t = t_begin, dt = first_step;
  while (dt < max_step && t + dt < t_end * (1.0 - 1e-12)) {
    t += dt;
    times.push_back(t);
    dt = std::min(dt * growth, max_step);
  }
  const double rest = t_end - t;
  const auto n = static_cast<unsigned int>(std::ceil(rest / max_step - 1e-9));
  for (unsigned int i = 1; i <= std::max(1u, n); ++i)
    times.push_back(t + rest * i / std::max(1u, n));
  times.back() = t_end;
  return times;
}

std::vector<double> uniform_times(double t_begin, double t_end, unsigned int n_steps) {
  if (n_steps == 0 || !(t_end > t_begin))
    throw InternalError("uniform times need at least one step and t_end > t_begin");
  std::vector<double> times;
  for (unsigned int i = 1; i <= n_steps; ++i)
    times.push_back(t_begin + (t_end - t_begin) * i / n_steps);
  times.back() = t_end;
  return times;
}

std::vector<double> merge_times(const std::vector<double>& grid,
                                const std::vector<double>& must_hit,
                                double closeness) {
  std::vector<double> merged = must_hit;
  for (std::size_t i = 0; i < grid.size(); ++i) {
    const double step = i == 0 ? grid[0] : grid[i] - grid[i - 1];
    const bool near_hit = std::any_of(must_hit.begin(), must_hit.end(), [&](double h) {
      return std::abs(grid[i] - h) < closeness * step;
    });
    if (!near_hit)
      merged.push_back(grid[i]);
  }
  std::sort(merged.begin(), merged.end());
  merged.erase(std::unique(merged.begin(), merged.end()), merged.end());
  return merged;
}

} // namespace settlewell
