// The one-sided riverside example: parts of boundaries (boundaries.<name>.part_of)
// hold the river's head on the left far boundary's gravel and on the channel
// only; the land side and the rest of the far boundary are no flow.
#include "example_support.h"

#include <gtest/gtest.h>

#include <string>

using namespace example_support;

namespace {

void coarse_with_probes(toml::table& s) {
  coarsen_section(s, 1.0, 10.0, 1.3);
  auto* points = s["output"]["points"].as_array();
  // On the river bank's part of the far boundary, and below it in the mudstone,
  // where the far boundary keeps its own no-flow setting.
  points->push_back(toml::table{{"name", "bank_gravel"}, {"x", -68.4}, {"y", -9.0}});
  points->push_back(toml::table{{"name", "below_bank"}, {"x", -68.4}, {"y", -22.0}});
}

double drawdown_at_end(const Csv& points, const std::string& name) {
  double value = 0.0;
  for (std::size_t i = 0; i < points.rows(); ++i)
    if (points.text("point")[i] == name)
      value = points.column("drawdown_m")[i]; // the rows are in time order
  return value;
}

} // namespace

TEST(RiversideExample, TheRiverSideFeedsThePitThroughItsPartsOfTheBoundaries) {
  const auto run = run_example("riverside-box", "coarse", coarse_with_probes);
  const Csv points(run.folder / "points.csv");
  // The river's head (the initial 3 m) holds on its part of the far boundary.
  EXPECT_NEAR(drawdown_at_end(points, "bank_gravel"), 0.0, 1e-6);
  // Below the bank the far boundary is no flow: the head there falls (0.28 m in
  // the slow mudstone at day 180 on this mesh; a held head would give 0).
  EXPECT_GT(drawdown_at_end(points, "below_bank"), 0.1);
  // The land side has no source: its gravel is drawn down more than the river
  // side's, and the well on the river side pumps most of the water (3.8 times the
  // land-side well's volume on the example's mesh).
  EXPECT_GT(drawdown_at_end(points, "gravel_landward"),
            drawdown_at_end(points, "gravel_riverward") + 1.0);
  EXPECT_GT(run.summary.pumped_volume.at("W1"), 2.0 * run.summary.pumped_volume.at("W2"));
  EXPECT_EQ(check_figures(run.folder), 0);
}
