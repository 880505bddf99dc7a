#include "settlewell/run/progress.h"

#include <iomanip>
#include <ostream>
#include <sstream>

namespace settlewell {

Progress::Progress(std::ostream& out,
                   bool in_place,
                   std::size_t total_steps,
                   bool enabled,
                   std::size_t done_before)
    : out_(out)
    , in_place_(in_place)
    , enabled_(enabled)
    , total_(total_steps)
    , done_(done_before)
    , before_(done_before) {}

namespace {
std::string duration_text(double seconds) {
  std::ostringstream os;
  if (seconds < 90)
    os << std::fixed << std::setprecision(0) << seconds << " s";
  else if (seconds < 5400)
    os << std::fixed << std::setprecision(1) << seconds / 60 << " min";
  else
    os << std::fixed << std::setprecision(1) << seconds / 3600 << " h";
  return os.str();
}
} // namespace

void Progress::step(const std::string& stage,
                    std::size_t stage_number,
                    std::size_t n_stages,
                    double time_days,
                    double dt_days,
                    double solve_seconds,
                    const std::string& detail) {
  ++done_;
  if (!enabled_)
    return;
  const double elapsed = timer_.wall_time();
  const double left = elapsed / double(done_ - before_) * double(total_ - done_);
  std::ostringstream line;
  line << "stage " << stage_number << "/" << n_stages << " " << stage << " | t "
       << std::fixed << std::setprecision(2) << time_days << " d | dt "
       << std::setprecision(3) << dt_days << " d | step " << done_ << "/" << total_
       << " | solve " << std::setprecision(3) << solve_seconds << " s";
  if (!detail.empty())
    line << " | " << detail;
  line << " | left ~" << duration_text(left);
  if (in_place_)
    out_ << '\r' << std::left << std::setw(100) << line.str() << std::flush;
  else
    out_ << line.str() << '\n';
}

void Progress::finish() {
  if (enabled_ && in_place_)
    out_ << '\n';
  out_ << std::flush;
}

} // namespace settlewell
