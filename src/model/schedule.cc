#include "settlewell/model/schedule.h"

#include "settlewell/core/errors.h"
#include "settlewell/core/units.h"
#include "settlewell/time/time_grid.h"

#include <algorithm>
#include <cmath>
#include <iomanip>
#include <memory>
#include <sstream>

namespace settlewell::model {

namespace {

/// Refuses a stage whose steps would number in the millions (a step of 1e-7 days
/// over months) before their list is built: it would fill the memory, or run for
/// days, on a slip of the exponent.
void check_step_count(const scenario::Scenario& s,
                      const StageTimes& st,
                      const Ladder& ladder) {
  if (s.numerics.allow_large)
    return;
  const double count = ladder_step_count(st.end - st.start, ladder);
  if (count <= scenario::largest_step_count)
    return;
  std::ostringstream os;
  os << s.location_of("stages." + st.name) << ": stage '" << st.name
     << "' would take about " << std::setprecision(3) << count << " time steps (first "
     << units::to_days(ladder.first) << " days, largest "
     << units::to_days(ladder.largest) << " days, over "
     << units::to_days(st.end - st.start) << " days), more than the "
     << std::size_t(scenario::largest_step_count)
     << " a run may take: raise time_steps.first or time_steps.largest, or run with "
        "--allow-large";
  throw InputError(os.str());
}

/// `n` times log-spaced from the stage's first step to its end, each moved to the
/// step nearest to it in log time (so that they cost no step of their own); the
/// stage end itself is always written.
std::vector<double> stage_output_times(const StageTimes& st,
                                       const std::vector<double>& steps,
                                       unsigned int n) {
  std::vector<double> times;
  if (steps.empty())
    return times;
  const double first = steps.front() - st.start, duration = st.end - st.start;
  for (unsigned int i = 0; i < n; ++i) {
    const double ideal = std::log(first) + std::log(duration / first) * i / n;
    const auto nearest =
        std::min_element(steps.begin(), steps.end(), [&](double a, double b) {
          return std::abs(std::log(a - st.start) - ideal) <
                 std::abs(std::log(b - st.start) - ideal);
        });
    times.push_back(*nearest);
  }
  return times;
}

/// The ladder of a stage, by default from a thousandth of it to a fortieth, and to
/// a hundredth of a ramp inside it (after the ramp, stage_step_times climbs on). They
/// were chosen for implicit Euler, which leads a ramped change by about half a step (with
/// a twentieth of the ramp the layered-column example ran 3 % ahead of the hand solution;
/// with a hundredth, under 1 %; with a tenth of the stage the demo's histories were up
/// to 1.2 % from a run with four times the steps, with a fortieth 0.4 %: tests/smoke/
/// ladder_accuracy.py). BDF2 (physics/step_weights.h) is more accurate on the same
/// steps; fewer steps by default have not been measured yet.
Ladder stage_ladder(const StageTimes& st, const scenario::TimeSteps& steps) {
  const double duration = st.end - st.start, ramp = st.ramp_end - st.start;
  Ladder ladder;
  ladder.first = steps.first > 0.0 ? steps.first : duration / 1000.0;
  const double default_largest =
      ramp > 0.0 ? std::min(duration / 40.0, ramp / 100.0) : duration / 40.0;
  ladder.largest =
      std::max(ladder.first, steps.largest > 0.0 ? steps.largest : default_largest);
  ladder.growth = steps.growth;
  ladder.per_rung = steps.per_rung;
  return ladder;
}

/// The steps of a stage that land on every must-hit time: the stage's ladder up to
/// the end of its ramp, then, unless the scenario caps the step itself, a ladder
/// from the ramp's last step up to a fortieth of the stage. (One ladder for the
/// whole stage kept a hundredth of the ramp to the stage's end: a pit lift dug
/// over 4 days of a 20-day stage took 500 steps.)
std::vector<double> stage_step_times(const StageTimes& st,
                                     const scenario::TimeSteps& steps,
                                     const std::vector<double>& must_hit) {
  const Ladder ladder = stage_ladder(st, steps);
  const bool ramp_inside = st.ramp_end > st.start && st.ramp_end < st.end;
  if (!ramp_inside || steps.largest > 0.0)
    return ladder_times(st.start, must_hit, ladder);
  std::vector<double> in_ramp, after_ramp;
  for (const double t : must_hit)
    (t <= st.ramp_end ? in_ramp : after_ramp).push_back(t);
  std::vector<double> times = ladder_times(st.start, in_ramp, ladder);
  const double last_step =
      times.size() > 1 ? times.back() - times[times.size() - 2] : times.back() - st.start;
  Ladder after = ladder;
  after.first = last_step;
  after.largest = std::max(last_step, (st.end - st.start) / 40.0);
  const auto rest = ladder_times(st.ramp_end, after_ramp, after);
  times.insert(times.end(), rest.begin(), rest.end());
  return times;
}

} // namespace

Schedule::Schedule(const scenario::Scenario& s) {
  double t = 0.0;
  for (const auto& stage : s.stages) {
    const double ramp_end = t + std::min(stage.ramp, stage.duration);
    stages_.push_back({stage.name, t, t + stage.duration, ramp_end});
    t += stage.duration;
  }
  for (std::size_t k = 0; k < stages_.size(); ++k) {
    const StageTimes& st = stages_[k];
    const Ladder ladder = stage_ladder(st, s.stages[k].steps);
    std::vector<double> must_hit{st.end};
    if (st.ramp_end > st.start && st.ramp_end < st.end)
      must_hit.push_back(st.ramp_end);
    for (const double o : s.output.times)
      if (o > st.start && o <= st.end)
        must_hit.push_back(o);
    std::sort(must_hit.begin(), must_hit.end());
    const auto same = [](double a, double b) { return b - a <= 1e-9 * std::abs(b); };
    must_hit.erase(std::unique(must_hit.begin(), must_hit.end(), same), must_hit.end());
    check_step_count(s, st, ladder);
    const auto stage_steps = stage_step_times(st, s.stages[k].steps, must_hit);
    steps_.insert(steps_.end(), stage_steps.begin(), stage_steps.end());
    outputs_.push_back(st.end);
    for (const double o : s.output.times)
      if (o > st.start && o <= st.end)
        outputs_.push_back(o);
    for (const double o : stage_output_times(st, stage_steps, s.output.per_stage))
      outputs_.push_back(o);
  }
  std::sort(outputs_.begin(), outputs_.end());
  outputs_.erase(std::unique(outputs_.begin(), outputs_.end()), outputs_.end());
  std::sort(steps_.begin(), steps_.end());
  steps_.erase(std::unique(steps_.begin(), steps_.end()), steps_.end());
}

std::size_t Schedule::stage_at(double t) const {
  for (std::size_t k = 0; k < stages_.size(); ++k)
    if (t <= stages_[k].end * (1 + 1e-12))
      return k;
  return stages_.size() - 1;
}

bool Schedule::is_output_time(double t) const {
  return std::any_of(outputs_.begin(), outputs_.end(), [t](double o) {
    return std::abs(o - t) <= 1e-9 * std::max(1.0, o);
  });
}

namespace {

using PointFunction = std::function<double(const dealii::Point<2>&)>;

PointFunction constant(double v) {
  return [v](const dealii::Point<2>&) { return v; };
}

FieldFunction phase_value(std::vector<ControlSegment> segments) {
  auto shared = std::make_shared<const std::vector<ControlSegment>>(std::move(segments));
  return [shared](const dealii::Point<2>& x, double t) {
    const auto& segs = *shared;
    const ControlSegment* seg = &segs.back();
    for (const auto& s : segs)
      if (t <= s.end) {
        seg = &s;
        break;
      }
    const double w =
        seg->ramp_end > seg->start
            ? std::clamp((t - seg->start) / (seg->ramp_end - seg->start), 0.0, 1.0)
            : 1.0;
    const double from = seg->from(x);
    return from + w * (seg->to(x) - from);
  };
}

} // namespace

std::vector<ControlPhase>
control_phases(const Schedule& schedule,
               const std::vector<std::optional<scenario::Target>>& targets,
               const std::optional<PointFunction>& initial,
               const PointFunction& initial_head) {
  using Kind = scenario::Target::Kind;
  std::vector<ControlPhase> phases;
  std::vector<ControlSegment> current;
  auto close_phase = [&]() {
    if (current.empty())
      return;
    phases.push_back({current.front().kind,
                      {current.front().start, current.back().end},
                      phase_value(current)});
    current.clear();
  };
  std::optional<Kind> kind;
  PointFunction last_value;
  if (initial) {
    kind = Kind::head;
    last_value = *initial;
  }
  const auto& stages = schedule.stages();
  for (std::size_t k = 0; k < stages.size(); ++k) {
    const StageTimes& st = stages[k];
    const auto& target = k < targets.size() ? targets[k] : std::nullopt;
    if (target) {
      PointFunction from;
      if (kind == target->kind) {
        from = last_value;
      } else {
        close_phase();
        from = target->kind == Kind::head ? initial_head : constant(0.0);
      }
      kind = target->kind;
      last_value = constant(target->value);
      current.push_back({*kind, from, last_value, st.start, st.ramp_end, st.end});
    } else if (kind) {
      current.push_back({*kind, last_value, last_value, st.start, st.start, st.end});
    }
  }
  close_phase();
  if (!phases.empty())
    phases.back().window.until = std::numeric_limits<double>::infinity();
  return phases;
}

} // namespace settlewell::model
