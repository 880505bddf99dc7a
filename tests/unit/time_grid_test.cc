#include "settlewell/boundary/time_function.h"
#include "settlewell/core/errors.h"
#include "settlewell/time/time_grid.h"

#include <gtest/gtest.h>

#include <cmath>

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

TEST(TimeGrid, BadArgumentsAreInternalErrors) {
  EXPECT_THROW(log_spaced_times(0.0, 1.0, 10.0), InternalError);
  EXPECT_THROW(uniform_times(1.0, 1.0, 3), InternalError);
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
