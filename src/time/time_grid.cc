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

namespace {

void check_ladder(double t_begin, const std::vector<double>& must_hit, const Ladder& l) {
  const bool sorted =
      std::is_sorted(must_hit.begin(), must_hit.end()) &&
      std::adjacent_find(must_hit.begin(), must_hit.end()) == must_hit.end();
  if (must_hit.empty() || !sorted || !(must_hit.front() > t_begin) || !(l.first > 0.0) ||
      !(l.largest >= l.first) || !(l.growth >= 1.0) || l.per_rung == 0)
    throw InternalError("a ladder of steps needs sorted times to hit after its start, "
                        "0 < first <= largest, growth >= 1 and at least one step a rung");
}

/// The first rung: `largest` divided by whole powers of `growth` until no longer
/// than `first`.
double first_rung(const Ladder& l) {
  if (l.growth <= 1.0 + 1e-12)
    return l.first;
  const double powers =
      std::ceil(std::log(l.largest / l.first) / std::log(l.growth) - 1e-9);
  return l.largest / std::pow(l.growth, std::max(0.0, powers));
}

/// The next rung after `step`: `growth` times longer, no longer than `largest`, and
/// only if that grows the step by at least half the ladder's growth (after a step was
/// fitted to a must-hit time near `largest`, staying saves a factorisation).
double next_rung(double step, const Ladder& l) {
  const double grown = std::min(step * l.growth, l.largest);
  return grown >= step * (1.0 + 0.5 * (l.growth - 1.0)) ? grown : step;
}

} // namespace

std::vector<double>
ladder_times(double t_begin, const std::vector<double>& must_hit, const Ladder& l) {
  check_ladder(t_begin, must_hit, l);
  std::vector<double> times;
  double t = t_begin, rung = first_rung(l), step = rung;
  unsigned int held = 0; // steps taken on this rung
  for (const double target : must_hit) {
    while (t < target) {
      const double gap = target - t;
      if (held == 0 || step > gap * (1.0 + 1e-9)) {
        // A new rung (or one that would pass the target): when the target is in
        // its reach, divide the gap into whole steps of about the rung's length.
        const double n = std::max(
            {1.0, std::round(gap / rung), std::ceil(gap / l.largest * (1.0 - 1e-12))});
        step = n <= l.per_rung || step > gap ? gap / n : rung;
      }
      t = t + step >= target * (1.0 - 1e-12) ? target : t + step;
      times.push_back(t);
      if (++held == l.per_rung) {
        held = 0;
        // A step cut short by a close target does not set the ladder back.
        rung = next_rung(std::max(step, rung / l.growth), l);
        step = rung;
      }
    }
  }
  return times;
}

double ladder_step_count(double duration, const Ladder& l) {
  const double rungs =
      l.growth > 1.0 ? std::log(l.largest / l.first) / std::log(l.growth) + 1.0 : 0.0;
  return std::min(rungs * l.per_rung, duration / l.first) + duration / l.largest;
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
