#include "settlewell/core/errors.h"
#include "settlewell/mesh/name_table.h"

#include <gtest/gtest.h>

using namespace settlewell;

TEST(NameTable, NamesMapToStableIds) {
  NameTable names;
  const auto clay = names.add_region("clay");
  const auto sand = names.add_region("sand");
  EXPECT_NE(clay, sand);
  EXPECT_EQ(names.add_region("clay"), clay);
  EXPECT_EQ(names.region_id("sand"), sand);
  EXPECT_EQ(names.region_name(clay), "clay");
  const auto wall = names.add_boundary("wall_face");
  EXPECT_EQ(names.boundary_id("wall_face"), wall);
}

TEST(NameTable, UnknownNameListsTheKnownOnes) {
  NameTable names;
  names.add_boundary("far_field");
  names.add_boundary("model_base");
  try {
    names.boundary_id("far_feld");
    FAIL();
  } catch (const InputError& e) {
    const std::string what = e.what();
    EXPECT_NE(what.find("far_feld"), std::string::npos);
    EXPECT_NE(what.find("far_field, model_base"), std::string::npos);
  }
}
