// Sweep files: the grid of variants, the values they set, and errors before runs.
#include "settlewell/core/errors.h"
#include "settlewell/scenario/parse.h"
#include "settlewell/scenario/sweep_file.h"

#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>

using namespace settlewell::scenario;

namespace {

std::string write_sweep(const std::string& name, const std::string& body) {
  const auto path = std::filesystem::temp_directory_path() / name;
  std::ofstream(path) << "scenario = \"" << SETTLEWELL_SOURCE_DIR
                      << "/examples/basement-pit/scenario.toml\"\n"
                      << body;
  return path.string();
}

} // namespace

TEST(SweepFile, GridOrderAndValues) {
  const auto sweep = read_sweep(write_sweep("grid.toml", R"(
[[parameters]]
key = "section.wall.toe"
values = [-14.0, -18.0]
[[parameters]]
key = "stages[0].wells.W1.head"
values = [-4.0, -5.0, -6.0]
)"));
  ASSERT_EQ(variant_count(sweep), 6u);
  EXPECT_EQ(variant_values(sweep, 0), (std::vector<double>{-14.0, -4.0}));
  EXPECT_EQ(variant_values(sweep, 2), (std::vector<double>{-14.0, -6.0}));
  EXPECT_EQ(variant_values(sweep, 4), (std::vector<double>{-18.0, -5.0}));
  const Scenario s = parse_scenario(variant_scenario_text(sweep, 4), "variant.toml");
  EXPECT_DOUBLE_EQ(s.section->wall->toe, -18.0);
  EXPECT_DOUBLE_EQ(s.stages[0].wells.at("W1").value, -5.0);
}

TEST(SweepFile, AVariantThatIsNotAValidScenarioStopsTheSweep) {
  try {
    read_sweep(write_sweep("bad.toml", R"(
[[parameters]]
key = "section.wall.toe"
values = [-16.0, -40.0]
)"));
    FAIL() << "a wall toe below the model base was accepted";
  } catch (const settlewell::InputError& e) {
    const std::string what = e.what();
    EXPECT_NE(what.find("variant 1 is not a valid scenario"), std::string::npos) << what;
    EXPECT_NE(what.find("toe"), std::string::npos) << what;
  }
  EXPECT_THROW(read_sweep(write_sweep(
                   "unknown.toml", "[[parameters]]\nkey = \"title\"\nvalues = [1.0]\n")),
               settlewell::InputError);
  EXPECT_THROW(
      read_sweep(write_sweep(
          "chart.toml", "[[parameters]]\nkey = \"section.wall.toe\"\nvalues = [-16.0]\n"
                        "[chart]\nx = \"section.wall.toe\"\ny = \"no_such_column\"\n")),
      settlewell::InputError);
}
