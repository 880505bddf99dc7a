// Terzaghi's one-dimensional consolidation, reproduced by a 2D column.
//
// Sources: Terzaghi (1925) series for U(Tv) and u(Z, Tv); Taylor (1948); the
// ultimate settlement S = mv * delta sigma' * H; Tv50 = 0.197 (common practice;
// the exact root is 0.19673); the undrained response u0 = q0 for B = 1
// (alpha = 1, S = 0; Skempton 1954).
#include "settlewell/analytical/consolidation.h"
#include "settlewell/core/units.h"
#include "settlewell/time/time_grid.h"
#include "settlewell/verification/case_support.h"
#include "settlewell/verification/column_model.h"

#include <map>

namespace settlewell::verification {

namespace {

const char* const terzaghi_series = "Terzaghi (1925) series";

/// What a Terzaghi column case compares.
struct ColumnChecks {
  std::vector<double> degree_at;                    ///< Tv at which U is checked
  std::vector<std::pair<double, double>> isochrone; ///< (Z, Tv) of u/u0 checks
  bool t50 = true;
  bool undrained = false;
};

// Tolerances, with the reason for each:
//  - U within 1 %: the target; 24 cells per drainage path growing by 12 %
//    from the drained face, and 100 steps per decade of Tv (BDF2), keep the
//    measured error below 0.25 % from Tv = 0.005 on. (With implicit Euler and 30
//    steps per decade the late-time lag reached 0.8 %.)
//  - u/u0 within 0.01 u0: the same resolution; the excess is compared at nodes.
//  - ultimate settlement within 1e-4: after a last step of dTv = 1e4 the excess
//    left is below 1e-6 u0, and Q2 displacement is exact for the drained state.
//  - t50 within 1 %: 0.197 differs from the exact 0.19673 by 0.14 %; the rest is
//    the log-linear interpolation between steps.
//  - undrained ratio within 0.5 %: the first step of dTv = 1e-5 drains a layer of
//    about 0.3 % of H at the top, far from the base where it is checked.
constexpr double degree_tolerance = 0.01;
constexpr double excess_tolerance = 0.01;
constexpr double ultimate_tolerance = 1e-4;
constexpr double t50_tolerance = 0.01;
constexpr double undrained_tolerance = 0.005;
constexpr double Tv_first = 1e-5;
constexpr double Tv_last = 2.0;
constexpr double steps_per_decade = 100.0;

std::vector<CheckRow> run_column(const std::string& name,
                                 const ColumnSpec& spec,
                                 const ColumnChecks& checks,
                                 const CaseSettings& settings,
                                 MPI_Comm comm) {
  ColumnModel column(spec, comm);
  std::vector<double> report_Tv = checks.degree_at;
  for (const auto& [Z, Tv] : checks.isochrone)
    report_Tv.push_back(Tv);
  std::vector<double> report_times;
  for (const double Tv : report_Tv)
    report_times.push_back(column.time_of(Tv));
  const auto times =
      merge_times(log_spaced_times(column.time_of(Tv_first), column.time_of(Tv_last),
                                   steps_per_decade),
                  report_times);

  std::vector<double> history_Tv, history_U;
  std::map<double, double> degree;
  std::map<std::pair<double, double>, double> excess;
  double first_step_ratio = 0.0;
  const double S_ref = column.ultimate_settlement();
  auto observe = [&](const BiotProblem& problem) {
    const double Tv = problem.time() * column.cv() / std::pow(column.drainage_path(), 2);
    const double U = column.settlement() / S_ref;
    if (history_Tv.empty())
      first_step_ratio = column.excess_ratio(1.0);
    history_Tv.push_back(Tv);
    history_U.push_back(U);
    for (const double d : checks.degree_at)
      if (std::abs(Tv - d) < 1e-9 * d)
        degree[d] = U;
    for (const auto& point : checks.isochrone)
      if (std::abs(Tv - point.second) < 1e-9 * point.second)
        excess[point] = column.excess_ratio(point.first);
  };
  auto writer = writer_for(settings, name, comm);
  march(column.problem(), times, observe, writer.get(), report_times);

  std::vector<CheckRow> rows;
  if (checks.undrained)
    rows.push_back(relative_row(
        name, label("p/q0 at base after first step, Tv", Tv_first), first_step_ratio, 1.0,
        undrained_tolerance, "B = 1 undrained response (Skempton 1954)"));
  for (const auto& [Tv, U] : degree)
    rows.push_back(relative_row(name, label("U at Tv", Tv), U,
                                analytical::terzaghi_average_degree(Tv), degree_tolerance,
                                terzaghi_series));
  for (const auto& [point, ratio] : excess)
    rows.push_back(
        scaled_row(name,
                   label("u/u0 at Z", point.first) + label(", Tv", point.second) +
                       " (error rel. to u0)",
                   ratio, analytical::terzaghi_excess_ratio(point.first, point.second),
                   1.0, excess_tolerance, terzaghi_series));
  if (checks.t50) {
    const double t50 = crossing_time(history_Tv, history_U, 0.5) *
                       std::pow(column.drainage_path(), 2) / column.cv();
    rows.push_back(relative_row(name, "t50, days", units::to_days(t50),
                                units::to_days(column.time_of(0.197)), t50_tolerance,
                                "Tv50 = 0.197 (common practice)"));
  }
  column.problem().advance_to(column.time_of(1e4));
  rows.push_back(relative_row(name, "ultimate settlement, m", column.settlement(), S_ref,
                              ultimate_tolerance,
                              "S = mv * delta sigma' * H (Terzaghi 1925)"));
  if (writer)
    writer->write(column.problem());
  return rows;
}

ColumnSpec head_drop_column(bool drained_base) {
  ColumnSpec spec;
  spec.drained_base = drained_base;
  spec.head_drop = 3.5;
  // 24 cells per drainage path: the double-drained column has two.
  spec.n_cells = drained_base ? 48 : 24;
  spec.growth = 1.12;
  return spec;
}

ColumnChecks standard_checks() {
  ColumnChecks checks;
  checks.degree_at = {0.005, 0.01, 0.05, 0.1, 0.197, 0.3, 0.5, 0.848, 1.0, 2.0};
  checks.isochrone = {{1.0, 0.05}, {1.0, 0.1}, {1.0, 0.2}, {1.0, 0.5},
                      {1.0, 1.0},  {0.5, 0.1}, {0.5, 0.5}, {0.25, 0.2}};
  return checks;
}

} // namespace

std::vector<CheckRow> run_terzaghi_head_drop_double(const CaseSettings& settings,
                                                    MPI_Comm comm) {
  return run_column("terzaghi-drop-double", head_drop_column(true), standard_checks(),
                    settings, comm);
}

std::vector<CheckRow> run_terzaghi_head_drop_single(const CaseSettings& settings,
                                                    MPI_Comm comm) {
  return run_column("terzaghi-drop-single", head_drop_column(false), standard_checks(),
                    settings, comm);
}

std::vector<CheckRow> run_terzaghi_surface_load(const CaseSettings& settings,
                                                MPI_Comm comm) {
  ColumnSpec spec = head_drop_column(false);
  spec.head_drop = 0.0;
  spec.surface_load = 45.0;
  ColumnChecks checks = standard_checks();
  checks.undrained = true;
  return run_column("terzaghi-load", spec, checks, settings, comm);
}

std::vector<CheckRow> run_terzaghi_axisymmetric(const CaseSettings& settings,
                                                MPI_Comm comm) {
  // With the radial faces held (ur = 0), the axisymmetric column is in the same
  // one-dimensional state as the plane-strain one: the two must agree to
  // round-off (tolerance 1e-6), and both follow Terzaghi's series (1 %, as above).
  ColumnSpec spec = head_drop_column(false);
  ColumnModel plane(spec, comm);
  spec.analysis = AnalysisType::axisymmetric;
  ColumnModel axisymmetric(spec, comm);
  const std::vector<double> report_Tv{0.02, 0.2, 0.6};
  std::vector<double> report_times;
  for (const double Tv : report_Tv)
    report_times.push_back(axisymmetric.time_of(Tv));
  const auto times = merge_times(log_spaced_times(axisymmetric.time_of(Tv_first),
                                                  report_times.back(), steps_per_decade),
                                 report_times);
  auto writer = writer_for(settings, "terzaghi-axisymmetric", comm);
  std::vector<CheckRow> rows;
  std::size_t next = 0;
  for (const double t : times) {
    plane.problem().advance_to(t);
    axisymmetric.problem().advance_to(t);
    if (std::abs(t - report_times[next]) > 1e-9 * t)
      continue;
    const double Tv = report_Tv[next++];
    rows.push_back(relative_row("terzaghi-axisymmetric",
                                label("settlement axisymmetric/plane strain, Tv", Tv),
                                axisymmetric.settlement() / plane.settlement(), 1.0, 1e-6,
                                "identical 1D state (ur = 0 on both faces)"));
    rows.push_back(relative_row(
        "terzaghi-axisymmetric", label("U at Tv", Tv),
        axisymmetric.settlement() / axisymmetric.ultimate_settlement(),
        analytical::terzaghi_average_degree(Tv), degree_tolerance, terzaghi_series));
    if (writer)
      writer->write(axisymmetric.problem());
  }
  return rows;
}

} // namespace settlewell::verification
