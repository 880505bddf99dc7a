// The analytical solutions against the check values tabulated in the project's
// verification references, docs/verification-references.md (computed there two
// independent ways). Each block names
// the published source of the solution.
#include "settlewell/analytical/consolidation.h"
#include "settlewell/analytical/cutoff_wall.h"
#include "settlewell/analytical/infiltration.h"
#include "settlewell/analytical/mandel.h"
#include "settlewell/analytical/wells.h"
#include "settlewell/core/units.h"

#include <gtest/gtest.h>

#include <cmath>

namespace a = settlewell::analytical;

// Terzaghi (1925) series: U(Tv) check values (6 significant digits given).
TEST(Terzaghi, AverageDegreeMatchesTabulatedValues) {
  const std::vector<std::pair<double, double>> table{
      {0.005, 0.0797885}, {0.01, 0.112838}, {0.05, 0.252313}, {0.1, 0.356823},
      {0.197, 0.500338},  {0.2, 0.504088},  {0.3, 0.613236},  {0.5, 0.763950},
      {0.848, 0.899979},  {1.0, 0.931260},  {2.0, 0.994170}};
  for (const auto& [Tv, U] : table)
    EXPECT_NEAR(a::terzaghi_average_degree(Tv), U, 1e-6) << "Tv = " << Tv;
}

// Terzaghi (1925): Tv for given U, exact roots.
TEST(Terzaghi, TimeFactorIsTheRootOfTheSeries) {
  EXPECT_NEAR(a::terzaghi_time_factor(0.5), 0.196731, 1e-6);
  EXPECT_NEAR(a::terzaghi_time_factor(0.9), 0.848085, 1e-6);
  EXPECT_NEAR(a::terzaghi_time_factor(0.6), 0.286399, 1e-6);
}

// Terzaghi (1925): isochrone check values u/u0.
TEST(Terzaghi, ExcessRatioMatchesTabulatedValues) {
  EXPECT_NEAR(a::terzaghi_excess_ratio(1.0, 0.05), 0.996869, 1e-6);
  EXPECT_NEAR(a::terzaghi_excess_ratio(1.0, 0.1), 0.949305, 1e-6);
  EXPECT_NEAR(a::terzaghi_excess_ratio(1.0, 0.2), 0.772312, 1e-6);
  EXPECT_NEAR(a::terzaghi_excess_ratio(1.0, 0.5), 0.370777, 1e-6);
  EXPECT_NEAR(a::terzaghi_excess_ratio(1.0, 1.0), 0.107977, 1e-6);
  EXPECT_NEAR(a::terzaghi_excess_ratio(0.5, 0.1), 0.735651, 1e-6);
  EXPECT_NEAR(a::terzaghi_excess_ratio(0.5, 0.5), 0.262188, 1e-6);
  EXPECT_NEAR(a::terzaghi_excess_ratio(0.25, 0.2), 0.302084, 1e-6);
}

// The time-stepped form of the series (implicit-Euler steps, then BDF2) tends to
// the exact one at second order once the first step's error has decayed: four
// times the steps gives about sixteen times less error (20.8 here; implicit Euler
// would give 4).
TEST(Terzaghi, SteppedSeriesTendsToTheExactOneAtSecondOrder) {
  const double exact = a::terzaghi_excess_ratio(0.1, 0.2);
  const double coarse = a::terzaghi_excess_ratio_stepped(0.1, 0.01, 20, 1);
  const double fine = a::terzaghi_excess_ratio_stepped(0.1, 0.0025, 80, 1);
  EXPECT_GT(std::abs(coarse - exact), 12.0 * std::abs(fine - exact));
  EXPECT_NEAR(fine, exact, 1e-5);
  // One step is one implicit-Euler step: each mode falls by 1 / (1 + M^2 dT).
  double one_step = 0.0;
  for (int m = 0; m < 200000; ++m) {
    const double M = 3.14159265358979323846 * (2 * m + 1) / 2;
    one_step += 2.0 / M * std::sin(M * 0.5) / (1.0 + M * M * 0.2);
  }
  EXPECT_NEAR(a::terzaghi_excess_ratio_stepped(0.5, 0.2, 1, 1), one_step, 1e-9);
  EXPECT_NEAR(a::terzaghi_excess_ratio_stepped(0.5, 0.2, 1, 3), one_step, 1e-9);
}

// Olson (1977) ramped load: check values of U and u/q0 at Z = 1.
TEST(Olson, AverageDegreeMatchesTabulatedValues) {
  const std::vector<std::tuple<double, double, double>> table{
      {0.05, 0.2, 0.0420522}, {0.1, 0.2, 0.118942}, {0.2, 0.2, 0.336350},
      {0.5, 0.2, 0.694794},   {1.0, 0.2, 0.911128}, {0.25, 0.5, 0.187922},
      {0.5, 0.5, 0.524667},   {1.0, 0.5, 0.864385}, {0.5, 1.0, 0.262334},
      {1.0, 1.0, 0.694526},   {1.5, 1.0, 0.912446}};
  for (const auto& [T, Tc, U] : table)
    EXPECT_NEAR(a::olson_average_degree(T, Tc), U, 1e-6) << "T = " << T << " Tc = " << Tc;
  EXPECT_NEAR(a::olson_excess_ratio(1.0, 0.2, 0.2), 0.925966, 1e-6);
  EXPECT_NEAR(a::olson_excess_ratio(1.0, 0.5, 0.2), 0.479255, 1e-6);
  EXPECT_NEAR(a::olson_excess_ratio(1.0, 0.5, 0.5), 0.699455, 1e-6);
  EXPECT_NEAR(a::olson_excess_ratio(1.0, 1.0, 0.5), 0.213023, 1e-6);
}

// Mandel (1953), Abousleiman et al. (1996): nu = 0.2, nu_u = 0.5 check values.
TEST(Mandel, RootsAndSeriesMatchTabulatedValues) {
  const a::MandelSolution m(0.2, 0.5);
  const std::vector<double> roots{1.28734, 4.63160, 7.80598, 10.9614, 14.1106};
  for (std::size_t i = 0; i < roots.size(); ++i)
    EXPECT_NEAR(m.roots()[i], roots[i], 1e-4);
  const std::vector<std::tuple<double, double, double>> pressure{
      {0.001, 1.01352, 1.01352}, {0.01, 1.04376, 1.04335},  {0.02, 1.06277, 1.05004},
      {0.05, 1.09888, 0.982236}, {0.1, 1.09541, 0.860903},  {0.2, 0.968114, 0.707444},
      {0.5, 0.592785, 0.428127}, {1.0, 0.258844, 0.186939}, {2.0, 0.0493518, 0.0356422}};
  for (const auto& [t, centre, half] : pressure) {
    EXPECT_NEAR(m.pressure_ratio(0.0, t), centre, 2e-5) << "t* = " << t;
    EXPECT_NEAR(m.pressure_ratio(0.5, t), half, 2e-5) << "t* = " << t;
  }
  EXPECT_NEAR(m.pressure_ratio(0.0, 0.0716445), 1.10690, 1e-5);
  EXPECT_NEAR(m.plate_displacement_ratio(0.01), -0.521881, 1e-6);
  EXPECT_NEAR(m.plate_displacement_ratio(0.1), -0.574616, 1e-6);
  EXPECT_NEAR(m.plate_displacement_ratio(0.5), -0.684920, 1e-6);
  EXPECT_NEAR(m.plate_displacement_ratio(1.0), -0.749751, 1e-6);
  EXPECT_NEAR(m.side_displacement_ratio(0.01), 0.478119, 1e-6);
  EXPECT_NEAR(m.side_displacement_ratio(1.0), 0.250249, 1e-6);
}

// Theis (1935) W(u) check values; Thiem (1906) check value Q = 3.55765e-3 m^3/s.
TEST(Wells, TheisWellFunctionAndThiem) {
  const std::vector<std::pair<double, double>> table{{1e-4, 8.63322}, {1e-3, 6.33154},
                                                     {0.01, 4.03793}, {0.1, 1.82292},
                                                     {0.5, 0.559774}, {1.0, 0.219384}};
  for (const auto& [u, W] : table)
    EXPECT_NEAR(a::theis_well_function(u), W, 1e-5 * W) << "u = " << u;
  // Thiem: k = 1e-4, b = 10, r1 = 0.5, r2 = 100, h2 - h1 = 3 m gives Q; invert it.
  const double T = 1e-4 * 10.0;
  EXPECT_NEAR(a::thiem_drawdown_difference(3.55765e-3, T, 0.5, 100.0), 3.0, 1e-5);
  // Consistency check: T = 1e-3, S = 1e-4, Q = 5e-3: s(10) - s(100) at 1 d is 1.83120 m.
  const double day = 86400.0;
  EXPECT_NEAR(a::theis_drawdown(5e-3, 1e-3, 1e-4, 10.0, day) -
                  a::theis_drawdown(5e-3, 1e-3, 1e-4, 100.0, day),
              1.83120, 1e-5);
}

// The row formula (Muskat 1937) against the superposition of 2N + 1 Thiem (1906)
// wells, j = -N..N, each at x = j a: the head at well 0's face against the mean
// head along the row, taken over x in [0, a], where the mean of ln|x - j a| over the
// period sums to the integral of ln|u| from -N a to (N + 1) a. The sums converge
// as 1/N (1.4e-6 relative at N = 1e5 for these numbers).
TEST(Wells, RowConvergenceLossIsThatOfThiemWellsSuperposed) {
  const double Q = 2e-3, T = 5e-4, a = 10.0, rw = 0.15;
  const long N = 100000;
  double at_face = -std::log(rw);
  for (long j = 1; j <= N; ++j)
    at_face -= 2.0 * std::log(j * a);
  auto F = [](double u) { return u * std::log(std::abs(u)) - u; }; // of ln|u|
  const double mean_on_row = -((F((N + 1) * a)) - F(-N * a)) / a;
  const double superposed =
      Q / (2.0 * settlewell::units::pi * T) * (at_face - mean_on_row);
  const double row = a::well_row_convergence_loss(Q, T, a, rw);
  EXPECT_NEAR(row,
              Q / (2.0 * settlewell::units::pi * T) *
                  std::log(a / (2.0 * settlewell::units::pi * rw)),
              1e-12);
  EXPECT_NEAR(superposed, row, 1e-5 * row);
}

// Harr (1962) single wall in a layer of finite depth: check values of the
// docs/verification-references.md, section 5 (closed form and independent quadrature).
TEST(Harr, DischargeAndExitGradientMatchTabulatedValues) {
  const std::vector<std::tuple<double, double, double>> table{{0.1, 1.02981, 3.17652},
                                                              {0.25, 0.734609, 1.25634},
                                                              {0.5, 0.500000, 0.599070},
                                                              {0.75, 0.340317, 0.354198},
                                                              {0.9, 0.242764, 0.244275}};
  for (const auto& [dT, q, i] : table) {
    EXPECT_NEAR(a::harr_discharge_ratio(dT), q, 1e-5) << "d/T = " << dT;
    EXPECT_NEAR(a::harr_exit_gradient_ratio(dT), i, 1e-5) << "d/T = " << dT;
  }
  // q(d/T) q(1 - d/T) = 1/4 (the map's symmetry).
  EXPECT_NEAR(a::harr_discharge_ratio(0.3) * a::harr_discharge_ratio(0.7), 0.25, 1e-12);
}

// Srivastava & Yeh (1991) infiltration toward a water table in a Gardner soil
// (ks 1e-5 m/s, a 2/m, theta 0.40/0.06, a 2 m column, q = ks/2). The check values
// were computed apart from this code: the same series in a separate script, and
// a Crank-Nicolson finite-difference solution of the linear equation in k (800
// cells, Richardson-extrapolated), which agreed with it to 1.2e-9 m in psi and
// 6.5e-11 m in stored water. Given to 8 significant digits.
TEST(Infiltration, GardnerColumnMatchesAnIndependentSolution) {
  const a::GardnerInfiltration column({1e-5, 2.0, 0.40, 0.06}, 2.0, 0.5e-5, 200);
  struct Value {
    double t, z, psi;
  };
  const std::vector<Value> table{
      {1e4, 0.25, -0.24934889}, {1e4, 1.0, -0.90541455},  {1e4, 2.0, -0.56215521},
      {3e4, 0.5, -0.38006197},  {3e4, 1.5, -0.50714789},  {1e5, 1.0, -0.30306062},
      {1e5, 2.0, -0.34418043},  {3e5, 0.25, -0.10954527}, {3e5, 2.0, -0.33750606}};
  for (const auto& v : table)
    EXPECT_NEAR(column.pressure_head(v.z, v.t), v.psi, 1e-8)
        << v.t << " s, " << v.z << " m";
  EXPECT_NEAR(column.relative_conductivity(1.0, 1e4), 0.16351851, 1e-8);
  EXPECT_NEAR(column.stored_water(1e4), 4.9985315e-2, 1e-9);
  EXPECT_NEAR(column.stored_water(1e5), 0.24538887, 1e-8);
  EXPECT_NEAR(column.stored_water(3e5), 0.25654431, 1e-8);
  // At the start: hydrostatic (psi = -z) and nothing stored, to the series's
  // slow convergence there (2000 terms).
  const a::GardnerInfiltration fine({1e-5, 2.0, 0.40, 0.06}, 2.0, 0.5e-5, 2000);
  EXPECT_NEAR(fine.pressure_head(1.0, 0.0), -1.0, 1e-3);
}
