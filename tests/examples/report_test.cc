// The report of the basement-pit example, and the water balance of its run.
#include "example_support.h"

#include "settlewell/output/run_folder.h"
#include "settlewell/report/report.h"

#include <gtest/gtest.h>

#include <cstdlib>
#include <iostream>

using namespace example_support;

namespace {

void coarse(toml::table& s) {
  coarsen_section(s, 1.0, 25.0, 1.4);
}

} // namespace

// With consistent fluxes and a direct solver the water balance of every step is an
// identity of the discrete equations: what leaves plus what is stored is zero to
// round-off (1e-8 relative leaves room for the factorisation's error).
TEST(Checks, WaterBalanceClosesAtEveryStep) {
  const auto run = run_example("basement-pit", "balance", coarse);
  const Csv steps(run.folder / "steps.csv");
  for (const double e : steps.column("water_balance_error_relative"))
    EXPECT_LT(e, 1e-8);
  const auto results = toml::parse_file((run.folder / "results.toml").string());
  EXPECT_TRUE(results["water_balance"]["closes"].value_or(false));
  // The checks of the example are all there.
  EXPECT_TRUE(results["base_stability"]["piping"].is_table());
  EXPECT_EQ(results["base_stability"]["uplift"].as_array()->size(), 1u);
  EXPECT_EQ(results["neighbours"].as_array()->size(), 2u);
  EXPECT_EQ(results["columns"].as_array()->size(), 2u);
  // Each headline value says where and when: the settlement outside the wall is on
  // the ground surface (6 m) beyond the wall's outer face (x 14.8 m), and the
  // largest drawdown outside the wall is the largest of the layers'.
  const auto summary = results["summary"];
  EXPECT_DOUBLE_EQ(summary["settlement_outside_at"]["y_m"].value_or(0.0), 6.0);
  EXPECT_GE(summary["settlement_outside_at"]["x_m"].value_or(0.0), 14.8 - 1e-9);
  EXPECT_GT(summary["settlement_outside_at"]["time_days"].value_or(0.0), 0.0);
  const double outside = summary["drawdown_outside_m"].value_or(0.0);
  double of_layers = 0.0;
  std::string region_of_largest;
  for (const auto& node : *summary["drawdown_outside_by_region"].as_array()) {
    const auto& layer = *node.as_table();
    const double d = layer["drawdown_m"].value_or(0.0);
    EXPECT_LE(d, outside) << layer;
    if (d > of_layers) {
      of_layers = d;
      region_of_largest = layer["region"].value_or(std::string());
    }
  }
  EXPECT_DOUBLE_EQ(of_layers, outside);
  EXPECT_NE(summary["drawdown_outside_at"]["region"]
                .value_or(std::string())
                .find(region_of_largest),
            std::string::npos);
  // A half model says so: the whole pit pumps twice what the model pumps.
  EXPECT_TRUE(results["modelled_half"].value_or(false));
}

// The HTML report opens in headless Chromium with every figure decoded and is not
// blank (tests/report/check_report.py); the Markdown twin is written beside it.
TEST(Report, OpensInHeadlessChromiumWithEveryFigure) {
  const auto run = run_example("basement-pit", "report", coarse);
  settlewell::report::write_report(run.folder.string(), std::cout);
  ASSERT_TRUE(std::filesystem::exists(run.folder / "report.html"));
  ASSERT_TRUE(std::filesystem::exists(run.folder / "report.md"));
  // Everything the run and its report wrote is on the list that --overwrite may
  // remove (else a second run into the folder would be refused).
  for (const auto& entry : std::filesystem::directory_iterator(run.folder))
    EXPECT_TRUE(settlewell::is_folder_entry(settlewell::FolderKind::run,
                                            entry.path().filename().string()))
        << entry.path();
  ASSERT_TRUE(std::filesystem::exists(CHROMIUM)) << "install Debian's chromium";
  const std::string command = "/usr/bin/python3 " + std::string(SETTLEWELL_SOURCE_DIR) +
                              "/tests/report/check_report.py " + run.folder.string() +
                              " " + CHROMIUM;
  EXPECT_EQ(std::system(command.c_str()), 0);
  // What the figures say: units, legends, scales, the wall, neighbours and limits.
  EXPECT_EQ(check_figures(run.folder), 0);
}
