// Numbers in the run summary and the report: significant figures, plain decimals.
#include "settlewell/core/number_text.h"

#include <gtest/gtest.h>

using settlewell::place_text;
using settlewell::significant;

TEST(NumberText, KeepsThreeSignificantFiguresWithoutAnExponent) {
  EXPECT_EQ(significant(15.3245), "15.3");
  EXPECT_EQ(significant(0.012345), "0.0123"); // a small discharge keeps its figures
  EXPECT_EQ(significant(5146.38), "5146");    // figures left of the point are kept
  EXPECT_EQ(significant(-17.17), "-17.2");
  EXPECT_EQ(significant(6.0), "6.00");
  EXPECT_EQ(significant(0.0), "0");
  EXPECT_EQ(significant(2.6e-5), "2.6e-05");
  EXPECT_EQ(significant(0.2118, 2), "0.21");
}

TEST(NumberText, DaysGoWithoutTrailingZeros) {
  EXPECT_EQ(settlewell::day_text(60.0), "60");
  EXPECT_EQ(settlewell::day_text(90.0), "90");
  EXPECT_EQ(settlewell::day_text(7.5), "7.5");
  EXPECT_EQ(settlewell::day_text(0.0375), "0.0375");
  EXPECT_EQ(settlewell::day_text(123.456), "123");
  EXPECT_EQ(settlewell::day_text(0.0), "0");
}

TEST(NumberText, PlaceSaysWhereAndWhen) {
  EXPECT_EQ(place_text(14.8, -17.17, "aquifer_sand", 365.0),
            "at x 14.8 m, y -17.2 m (aquifer_sand), day 365");
}
