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

/// Times from t_begin (exclusive) to t_end (inclusive) with a constant step.
std::vector<double> uniform_times(double t_begin, double t_end, unsigned int n_steps);

/// The sorted union of a grid of times and times that must be hit exactly. A grid
/// time closer to a must-hit time than `closeness` times its own step is dropped,
/// so that merging never leaves a sliver of a step.
std::vector<double> merge_times(const std::vector<double>& grid,
                                const std::vector<double>& must_hit,
                                double closeness = 0.3);

} // namespace settlewell
