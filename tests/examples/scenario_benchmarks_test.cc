// Published benchmarks written as scenario files, run through the whole chain
// (scenario, mesh, model, run, outputs), so that a scenario can say what the
// verification code sets up by hand.
#include "example_support.h"

#include "settlewell/analytical/mandel.h"

#include <gtest/gtest.h>

#include <cmath>
#include <iostream>

using namespace example_support;

namespace {

std::filesystem::path verification_file(const std::string& name) {
  return std::filesystem::path(SETTLEWELL_SOURCE_DIR) / "tests" / "verification" / name;
}

} // namespace

// Mandel's problem (Mandel 1953; the series of Abousleiman et al. 1996) from
// tests/verification/mandel_scenario.toml: a rigid frictionless plate
// (boundaries.top.mechanical = "rigid_plate", plate_pressure) on a specimen
// drained at its free side. The excess pore pressure at the centre against
// p0 (p/p0)(x = 0, t*), p0 = F (1 + nu_u) / (3 a), with alpha = 1 and S = 0 (nu_u =
// 1/2) and c = k (K + 4G/3) / gamma_w (Detournay & Cheng 1993). Tolerance 2 %, the
// verification case's: here 80 uniform cells across a (0.05 m) and steps of at
// most 0.05 day (t* 0.0037), from t* = 0.05 on, where the drained side's boundary
// layer is resolved.
TEST(ScenarioBenchmarks, MandelFromAScenarioWithARigidPlate) {
  const auto run = run_scenario_file(verification_file("mandel_scenario.toml"),
                                     std::filesystem::temp_directory_path() /
                                         "settlewell_mandel_scenario",
                                     MPI_COMM_WORLD);
  const double a = 4.0, E = 6000.0, nu = 0.2, k = 2e-8, gamma_w = 9.81;
  const double K = E / (3 * (1 - 2 * nu)), G = E / (2 * (1 + nu));
  const double c = k * (K + 4 * G / 3) / gamma_w;
  const double force = 37.5 * a, nu_u = 0.5;
  const double p0 = force * (1 + nu_u) / (3 * a);
  const settlewell::analytical::MandelSolution exact(nu, nu_u);
  const Csv points(run.folder / "points.csv");
  const auto& time = points.column("time_days");
  const auto& excess = points.column("excess_pore_pressure_kPa");
  int compared = 0;
  for (const double t_star : {0.05, 0.1, 0.2, 0.5}) {
    const double day = t_star * a * a / c / 86400.0;
    for (std::size_t r = 0; r < points.rows(); ++r)
      if (std::abs(time[r] - day) < 1e-5) {
        const double expected = p0 * exact.pressure_ratio(0.0, t_star);
        EXPECT_NEAR(excess[r], expected, 0.02 * expected) << "t* = " << t_star;
        std::cout << "Mandel t* = " << t_star << ": centre " << excess[r]
                  << " kPa, exact " << expected << " kPa ("
                  << 100 * (excess[r] / expected - 1) << " %)\n";
        ++compared;
      }
  }
  EXPECT_EQ(compared, 4);
}
