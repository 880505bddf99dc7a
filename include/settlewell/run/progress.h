#pragma once

#include <deal.II/base/timer.h>

#include <iosfwd>
#include <string>

namespace settlewell {

/// One progress line per step: updated in place on a terminal, plain lines when
/// the output goes to a file or a pipe.
class Progress {
public:
  /// `done_before`: steps a resumed run did before (the time left is estimated
  /// from the steps of this session).
  Progress(std::ostream& out,
           bool in_place,
           std::size_t total_steps,
           bool enabled,
           std::size_t done_before = 0);

  /// `detail`: more about the step (a clay's Newton iterations), shown before the
  /// time left.
  void step(const std::string& stage,
            std::size_t stage_number,
            std::size_t n_stages,
            double time_days,
            double dt_days,
            double solve_seconds,
            const std::string& detail = "");
  void finish();

private:
  std::ostream& out_;
  bool in_place_, enabled_;
  std::size_t total_, done_, before_;
  dealii::Timer timer_; ///< started with the first line
};

} // namespace settlewell
