#pragma once

#include <vector>

namespace settlewell {

/// Times t_1 < t_2 < ... (s) evenly spaced in log t from t_first to t_end,
/// with `per_decade` steps in each factor of ten; t_end is included.
std::vector<double> log_spaced_times(double t_first, double t_end, double per_decade);

/// Times after t_begin (exclusive) up to t_end (inclusive): the first step is
/// `first_step`, each next one `growth` times the last, until the step reaches
/// `max_step`; from there on the steps are equal (and no larger than max_step) so
/// that a factorisation is reused, and the last one lands on t_end.
std::vector<double> growing_times(
    double t_begin, double t_end, double first_step, double growth, double max_step);

/// A ladder of time steps: each rung holds one step size for `per_rung` steps, so
/// that one factorisation serves them all, and the next rung is `growth` times
/// longer, up to `largest`. The rungs are counted down from `largest`, so the first
/// step is `first` or up to `growth` times shorter.
struct Ladder {
  double first = 0.0, largest = 0.0; ///< s
  double growth = 2.0;
  unsigned int per_rung = 8;
};

/// Step end times after t_begin up to the last of `must_hit` (sorted, all after
/// t_begin), landing on every must-hit time. A must-hit time is reached by the
/// ladder itself: where it lies within the reach of a new rung, that rung's step is
/// the gap divided into a whole number of steps (no larger than `largest`), so a
/// must-hit time costs no factorisation of its own unless it falls inside a rung.
std::vector<double>
ladder_times(double t_begin, const std::vector<double>& must_hit, const Ladder& ladder);

/// The number of steps `ladder_times` takes over `duration` when nothing else must
/// be hit: enough to refuse a plan that would run for days before it is built.
double ladder_step_count(double duration, const Ladder& ladder);

/// Times from t_begin (exclusive) to t_end (inclusive) with a constant step.
std::vector<double> uniform_times(double t_begin, double t_end, unsigned int n_steps);

/// The sorted union of a grid of times and times that must be hit exactly. A grid
/// time closer to a must-hit time than `closeness` times its own step is dropped,
/// so that merging never leaves a sliver of a step.
std::vector<double> merge_times(const std::vector<double>& grid,
                                const std::vector<double>& must_hit,
                                double closeness = 0.3);

} // namespace settlewell
