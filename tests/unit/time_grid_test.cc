#include "settlewell/boundary/time_function.h"
#include "settlewell/core/errors.h"
#include "settlewell/model/schedule.h"
#include "settlewell/physics/step_weights.h"
#include "settlewell/time/time_grid.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <vector>

using namespace settlewell;

TEST(TimeGrid, LogSpacedTimesHitBothEndsAndGrowEvenly) {
  const auto t = log_spaced_times(1.0, 1000.0, 10.0);
  ASSERT_EQ(t.size(), 31u);
  EXPECT_DOUBLE_EQ(t.front(), 1.0);
  EXPECT_DOUBLE_EQ(t.back(), 1000.0);
  for (std::size_t i = 2; i < t.size(); ++i)
    EXPECT_NEAR(t[i] / t[i - 1], std::pow(10.0, 0.1), 1e-12);
}

TEST(TimeGrid, MergeKeepsMustHitTimesAndDropsSlivers) {
  const std::vector<double> grid{1.0, 2.0, 3.0, 4.0};
  const auto merged = merge_times(grid, {2.1, 3.5});
  const std::vector<double> expected{1.0, 2.1, 3.0, 3.5, 4.0};
  EXPECT_EQ(merged, expected);
}

namespace {

/// The distinct step sizes of a run of times, in order (a change of step means a
/// new factorisation).
std::vector<double> step_changes(double t_begin, const std::vector<double>& times) {
  std::vector<double> steps;
  double t = t_begin;
  for (const double next : times) {
    const double dt = next - t;
    if (steps.empty() || std::abs(dt - steps.back()) > 1e-9 * dt)
      steps.push_back(dt);
    t = next;
  }
  return steps;
}

} // namespace

TEST(TimeGrid, LadderHoldsEachStepForARungAndGrowsByTheFactor) {
  const Ladder ladder{1.0, 64.0, 2.0, 4};
  const auto t = ladder_times(0.0, {1000.0}, ladder);
  const auto steps = step_changes(0.0, t);
  // Rungs 1, 2, ..., 64 of four steps each (4 * 127 = 508 s), then 64 s steps to
  // 1000 s: the last rung's step is the remaining gap divided into whole steps.
  ASSERT_GE(steps.size(), 7u);
  for (std::size_t i = 1; i < 7; ++i)
    EXPECT_NEAR(steps[i] / steps[i - 1], 2.0, 1e-9);
  EXPECT_NEAR(steps.front(), 1.0, 1e-12);
  EXPECT_LE(steps.size(), 8u);
  EXPECT_DOUBLE_EQ(t.back(), 1000.0);
  for (const double dt : steps)
    EXPECT_LE(dt, 64.0 * (1.0 + 1e-12));
}

TEST(TimeGrid, LadderStartsAtOrBelowTheFirstStep) {
  // 100 / 2^k <= 3: the first rung is 100 / 64 = 1.5625, never longer than asked.
  const auto t = ladder_times(10.0, {500.0}, Ladder{3.0, 100.0, 2.0, 8});
  EXPECT_NEAR(t.front() - 10.0, 1.5625, 1e-12);
}

TEST(TimeGrid, LadderLandsOnEveryMustHitTimeWithoutSlivers) {
  const std::vector<double> must_hit{7.3, 50.0, 51.0, 400.0, 1234.5};
  const Ladder ladder{0.5, 40.0, 2.0, 8};
  const auto t = ladder_times(0.0, must_hit, ladder);
  for (const double target : must_hit)
    EXPECT_TRUE(std::find(t.begin(), t.end(), target) != t.end()) << target;
  EXPECT_TRUE(std::is_sorted(t.begin(), t.end()));
  double previous = 0.0;
  for (const double next : t) {
    EXPECT_LE(next - previous, 40.0 * (1.0 + 1e-9));
    // No step shorter than a fifth of the first: fitting a target divides a gap
    // into whole steps instead of leaving a sliver.
    EXPECT_GE(next - previous, 0.1) << next;
    previous = next;
  }
  // Changes of step grow with the rungs and the targets, not with the steps.
  EXPECT_LT(step_changes(0.0, t).size(), t.size() / 4);
}

TEST(TimeGrid, LadderStepCountBoundsTheSteps) {
  const Ladder ladder{0.01, 10.0, 2.0, 8};
  const double n = ladder_times(0.0, {1000.0}, ladder).size();
  const double estimate = ladder_step_count(1000.0, ladder);
  EXPECT_GE(estimate, n);
  EXPECT_LE(estimate, 1.5 * n);
}

TEST(TimeGrid, BadLaddersAreInternalErrors) {
  EXPECT_THROW(ladder_times(0.0, {}, Ladder{1.0, 2.0}), InternalError);
  EXPECT_THROW(ladder_times(0.0, {2.0, 1.0}, Ladder{1.0, 2.0}), InternalError);
  EXPECT_THROW(ladder_times(5.0, {5.0}, Ladder{1.0, 2.0}), InternalError);
  EXPECT_THROW(ladder_times(0.0, {5.0}, Ladder{3.0, 2.0}), InternalError);
  EXPECT_THROW(ladder_times(0.0, {5.0}, Ladder{1.0, 2.0, 0.5}), InternalError);
  EXPECT_THROW(ladder_times(0.0, {5.0}, Ladder{1.0, 2.0, 2.0, 0}), InternalError);
}

TEST(TimeGrid, BadArgumentsAreInternalErrors) {
  EXPECT_THROW(log_spaced_times(0.0, 1.0, 10.0), InternalError);
  EXPECT_THROW(uniform_times(1.0, 1.0, 3), InternalError);
}

namespace {

/// The step's defect for x(t) = t^power, with t_{n+1} = 0: x_{n+1} - dt' x'(t_{n+1})
/// minus the weighted old state. Zero when the step is exact for that power.
double defect(const StepWeights& w, double h, double h_previous, int power) {
  const auto x = [power](double t) { return std::pow(t, power); };
  const double slope_now = power == 1 ? 1.0 : 0.0; // d/dt t^power at t = 0
  return x(0.0) - w.effective_dt * slope_now -
         ((1.0 - w.previous_weight) * x(-h) + w.previous_weight * x(-h - h_previous));
}

} // namespace

TEST(StepWeights, EulerWithoutHistoryAndBdf2OnEqualSteps) {
  const StepWeights first = step_weights(3.0, 0.0);
  EXPECT_DOUBLE_EQ(first.effective_dt, 3.0);
  EXPECT_DOUBLE_EQ(first.previous_weight, 0.0);
  EXPECT_FALSE(first.second_order);
  const StepWeights equal = step_weights(3.0, 3.0);
  EXPECT_DOUBLE_EQ(equal.effective_dt, 2.0);
  EXPECT_DOUBLE_EQ(equal.previous_weight, -1.0 / 3.0);
  EXPECT_TRUE(equal.second_order);
}

// Every step is consistent (exact for x = t); BDF2's are exact for x = t^2 too,
// and so is no rung change unless its steps are equal.
TEST(StepWeights, ConsistentAlwaysAndSecondOrderWhereBdf2) {
  for (const double h_previous : {0.0, 1.0})
    for (const double h : {0.1, 0.3, 0.5, 0.95, 1.0, 1.05, 2.0, 2.5, 4.0}) {
      const StepWeights w = step_weights(h, h_previous);
      EXPECT_NEAR(defect(w, h, h_previous, 1), 0.0, 1e-14)
          << h << " after " << h_previous;
      if (w.second_order)
        EXPECT_NEAR(defect(w, h, h_previous, 2), 0.0, 1e-14) << h;
      else
        EXPECT_GT(std::abs(defect(w, h, h_previous, 2)), 1e-3) << h;
    }
}

// The first step of a rung twice as long uses the rung's matrix (dt' = 2h/3) and
// a sixth of implicit Euler's local error; a ladder starting again far below the
// last step, or jumping far above it, takes implicit Euler.
TEST(StepWeights, RungChangesKeepTheRungsMatrix) {
  const StepWeights up = step_weights(2.0, 1.0);
  EXPECT_DOUBLE_EQ(up.effective_dt, step_weights(2.0, 2.0).effective_dt);
  EXPECT_NEAR(std::abs(defect(up, 2.0, 1.0, 2)),
              std::abs(defect(step_weights(2.0, 0.0), 2.0, 0.0, 2)) / 6.0, 1e-14);
  EXPECT_DOUBLE_EQ(step_weights(0.2, 1.0).previous_weight, 0.0);
  EXPECT_DOUBLE_EQ(step_weights(3.0, 1.0).previous_weight, 0.0);
  EXPECT_THROW(step_weights(0.0, 1.0), InternalError);
}

// Three implicit-Euler steps from the start and from each restart (a ladder
// starting again far below the last step), BDF2 after them.
TEST(StepWeights, ThreeEulerStepsAfterEachRestart) {
  unsigned int left = 0;
  const auto is_euler = [](const StepWeights& w) { return w.previous_weight == 0.0; };
  EXPECT_TRUE(is_euler(next_step_weights(1.0, 0.0, left)));
  for (int restart = 0; restart < 2; ++restart) {
    EXPECT_TRUE(is_euler(next_step_weights(1.0, 1.0, left)));
    EXPECT_TRUE(is_euler(next_step_weights(1.0, 1.0, left)));
    EXPECT_TRUE(next_step_weights(1.0, 1.0, left).second_order);
    EXPECT_TRUE(next_step_weights(1.0, 1.0, left).second_order);
    EXPECT_TRUE(is_euler(next_step_weights(1.0, 10.0, left)));
  }
  EXPECT_EQ(left, euler_steps_after_restart - 1);
}

TEST(TimeFunction, PiecewiseLinearInterpolatesAndHoldsEnds) {
  const PiecewiseLinear f({{0.0, 0.0}, {10.0, -5.0}, {20.0, -5.0}});
  EXPECT_DOUBLE_EQ(f(-1.0), 0.0);
  EXPECT_DOUBLE_EQ(f(5.0), -2.5);
  EXPECT_DOUBLE_EQ(f(15.0), -5.0);
  EXPECT_DOUBLE_EQ(f(99.0), -5.0);
  EXPECT_THROW(PiecewiseLinear({{1.0, 0.0}, {1.0, 2.0}}), InternalError);
  const auto ramp = linear_ramp(4.0, 2.0);
  EXPECT_DOUBLE_EQ(ramp(1.0), 2.0);
  EXPECT_DOUBLE_EQ(ramp(3.0), 4.0);
  EXPECT_DOUBLE_EQ(step_at_start(3.0)(0.0), 0.0);
  EXPECT_DOUBLE_EQ(step_at_start(3.0)(1e-9), 3.0);
}

// A ramp shorter than its stage caps the steps at a hundredth of the ramp inside
// it only; after it the ladder climbs on to a fortieth of the stage. (One cap for
// the whole stage made a 90-day stage with a 14-day ramp take 647 steps.)
TEST(Schedule, StepsClimbAgainAfterARampShorterThanTheStage) {
  settlewell::scenario::Scenario s;
  settlewell::scenario::Stage stage;
  stage.name = "pump";
  stage.duration = 90.0 * 86400.0;
  stage.ramp = 14.0 * 86400.0;
  s.stages.push_back(stage);
  const settlewell::model::Schedule schedule(s);
  const auto& t = schedule.step_times();
  const double ramp_end = stage.ramp, hundredth = stage.ramp / 100;
  EXPECT_TRUE(std::any_of(t.begin(), t.end(),
                          [&](double v) { return std::abs(v - ramp_end) < 1e-6; }));
  double largest_in_ramp = 0.0, largest_after = 0.0;
  for (std::size_t i = 0; i < t.size(); ++i) {
    const double step = t[i] - (i == 0 ? 0.0 : t[i - 1]);
    (t[i] <= ramp_end + 1e-6 ? largest_in_ramp : largest_after) =
        std::max(t[i] <= ramp_end + 1e-6 ? largest_in_ramp : largest_after, step);
  }
  EXPECT_LE(largest_in_ramp, hundredth * (1 + 1e-9));
  EXPECT_NEAR(largest_after, stage.duration / 40, 1e-6 * stage.duration);
  EXPECT_LT(t.size(), 200u); // 171: the ramp's ~110 and the climb to 90/40 days
  EXPECT_DOUBLE_EQ(t.back(), stage.duration);
}
