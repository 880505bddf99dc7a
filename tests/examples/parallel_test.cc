// Run under mpirun -np 2: the basement-pit example on two processes gives the
// heads and displacements of the same run on one process, to 1e-8 relative (the
// direct solver's round-off: the discrete problem is the same, only its
// partition differs).
#include "example_support.h"

#include <gtest/gtest.h>

#include <cmath>

using namespace example_support;

namespace {

void coarse_short(toml::table& s) {
  coarsen_section(s, 1.0, 25.0, 1.4);
  auto* stages = s["stages"].as_array();
  stages->get(0)->as_table()->insert_or_assign("duration", 20.0);
  stages->get(0)->as_table()->insert_or_assign("ramp", 20.0);
  stages->get(1)->as_table()->insert_or_assign("duration", 20.0);
  s["output"].as_table()->insert_or_assign("times", toml::array{10.0});
}

/// Largest difference between two numeric columns, relative to the larger values.
double relative_difference(const Csv& a, const Csv& b, const std::string& column) {
  const auto& x = a.column(column);
  const auto& y = b.column(column);
  double scale = 0.0, difference = 0.0;
  for (std::size_t i = 0; i < x.size(); ++i) {
    scale = std::max({scale, std::abs(x[i]), std::abs(y[i])});
    difference = std::max(difference, std::abs(x[i] - y[i]));
  }
  return scale > 0.0 ? difference / scale : difference;
}

} // namespace

TEST(Parallel, TwoProcessesGiveTheOneProcessResults) {
  int size = 0, rank = 0;
  MPI_Comm_size(MPI_COMM_WORLD, &size);
  MPI_Comm_rank(MPI_COMM_WORLD, &rank);
  ASSERT_EQ(size, 2) << "run this test with mpirun -np 2";
  const auto file = write_variant("basement-pit", "parallel", coarse_short);
  const auto base = file.parent_path();
  const auto parallel = run_scenario_file(file, base / "pit-two-processes", MPI_COMM_WORLD);
  if (rank == 0) {
    const auto serial = run_scenario_file(file, base / "pit-one-process", MPI_COMM_SELF);
    const Csv a(serial.folder / "points.csv"), b(parallel.folder / "points.csv");
    ASSERT_EQ(a.rows(), b.rows());
    for (const char* c : {"head_m", "drawdown_m", "settlement_m", "ux_m",
                          "excess_pore_pressure_kPa", "vertical_effective_stress_kPa"})
      EXPECT_LT(relative_difference(a, b, c), 1e-8) << "points.csv " << c;
    for (const char* line : {"ground_surface", "aquifer_mid", "vertical_20m_behind_wall"}) {
      const Csv pa(serial.folder / "profiles" / (std::string(line) + ".csv"));
      const Csv pb(parallel.folder / "profiles" / (std::string(line) + ".csv"));
      ASSERT_EQ(pa.rows(), pb.rows()) << line;
      for (const char* c : {"head_m", "settlement_m", "ux_m"})
        EXPECT_LT(relative_difference(pa, pb, c), 1e-8) << line << " " << c;
    }
    EXPECT_NEAR(parallel.summary.pumped_volume.at("W1"), serial.summary.pumped_volume.at("W1"),
                1e-8 * serial.summary.pumped_volume.at("W1"));
    EXPECT_EQ(parallel.summary.dofs, serial.summary.dofs);
  }
  MPI_Barrier(MPI_COMM_WORLD);
}
