#pragma once

#include "settlewell/boundary/conditions.h"
#include "settlewell/scenario/scenario.h"

#include <functional>
#include <optional>
#include <string>
#include <vector>

namespace settlewell::model {

/// When each stage runs, s. Stages are contiguous from t = 0.
struct StageTimes {
  std::string name;
  double start = 0.0, end = 0.0, ramp_end = 0.0;
};

/// What applies at time t (the stages) and which times are computed and written.
/// The time stepper only asks it for times; it knows nothing of the physics.
class Schedule {
public:
  explicit Schedule(const scenario::Scenario& s);

  const std::vector<StageTimes>& stages() const { return stages_; }
  /// The index of the stage that contains t, for start < t <= end.
  std::size_t stage_at(double t) const;
  /// Every step's end time: per stage the steps start at the stage's first step
  /// (the undrained response) and grow to its largest step, hitting the ramp end,
  /// the stage end and every output time exactly.
  const std::vector<double>& step_times() const { return steps_; }
  /// Times at which fields and profiles are written (0 is written too).
  const std::vector<double>& output_times() const { return outputs_; }
  bool is_output_time(double t) const;

private:
  std::vector<StageTimes> stages_;
  std::vector<double> steps_, outputs_;
};

/// One item a stage controls (a well, a boundary head, the excavation level).
/// `from(x)` is the value at the stage start, `to(x)` the value after the ramp.
struct ControlSegment {
  scenario::Target::Kind kind;
  std::function<double(const dealii::Point<2>&)> from, to;
  double start = 0.0, ramp_end = 0.0, end = 0.0;
};

/// A run of consecutive stages in which an item is controlled the same way
/// (by head or by discharge): one hydraulic condition with a time window.
struct ControlPhase {
  scenario::Target::Kind kind;
  TimeWindow window;
  FieldFunction value; ///< head (m) or discharge (m^3/s) at (x, t), ramped linearly
};

/// The phases of one item. `targets[k]` is what stage k asks for (nothing: keep the
/// last); `initial`, if set, applies from t = 0 (a fixed-head boundary), given as
/// a function of position; `initial_head` is the head a head ramp starts from when
/// the item was not head-controlled before.
std::vector<ControlPhase> control_phases(
    const Schedule& schedule,
    const std::vector<std::optional<scenario::Target>>& targets,
    const std::optional<std::function<double(const dealii::Point<2>&)>>& initial,
    const std::function<double(const dealii::Point<2>&)>& initial_head);

} // namespace settlewell::model
