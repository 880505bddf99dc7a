#pragma once

#include "settlewell/output/field_writer.h"
#include "settlewell/physics/biot_problem.h"
#include "settlewell/verification/cases.h"

#include <functional>
#include <memory>
#include <string>
#include <vector>

namespace settlewell::verification {

/// Advances `problem` through `times` (s), calling `after_step` after each step
/// and writing fields at the times in `write_times` when a writer is given.
void march(BiotProblem& problem,
           const std::vector<double>& times,
           const std::function<void(const BiotProblem&)>& after_step,
           FieldWriter* writer = nullptr,
           const std::vector<double>& write_times = {});

/// A writer into <vtk_directory>/<case_name>, or none if no directory was asked for.
std::unique_ptr<FieldWriter>
writer_for(const CaseSettings& settings, const std::string& case_name, MPI_Comm comm);

/// The time at which a rising history first reaches `level`, interpolated linearly
/// in log t between the bracketing samples; NaN if it never does.
double crossing_time(const std::vector<double>& t,
                     const std::vector<double>& value,
                     double level);

/// Formats a number for a quantity label ("Tv=0.197").
std::string label(const std::string& name, double value);

/// A column of one clay region, "soil": its Cam Clay skeleton `clay`, conductivity
/// (m/s) and unit weight (kN/m3), and its start, a vertical effective stress
/// vertical_start(elevation) (kPa, compression positive) with sigma'h = k0 sigma'v.
void set_clay_column(BiotSetup& setup,
                     const ClaySkeleton& clay,
                     double conductivity,
                     double unit_weight,
                     const std::function<double(double)>& vertical_start,
                     double k0);

/// Newton's observed order near the solution over a run's steps: each triple of
/// successive residuals whose middle one is below 1e-2 (of the step's scale) and
/// whose last is above 1e-12 (above round-off) gives log(r3/r2)/log(r2/r1).
class NewtonOrders {
public:
  void add(const StepReport& step);
  /// The median over all triples so far; NaN if there are none.
  double median() const;

private:
  std::vector<double> orders_;
};

/// The water balance of a run's steps as a run reports it (monitors/
/// water_account.cc): each step's |stored + net outflow dt| over the most water
/// that moved in any step so far (in plus out, or the cells' storage changes
/// whatever their sign).
class WaterBalance {
public:
  void add(const BiotProblem& problem, const StepReport& step);
  /// The largest over the steps so far.
  double worst() const { return worst_; }

private:
  double largest_moved_ = 0.0, worst_ = 0.0;
};

/// The row of a case with a retention curve: WaterBalance::worst() within 1e-6.
CheckRow water_balance_row(const std::string& case_name, double worst);

/// Settings that let Newton's own convergence show, not the stopping rules': a
/// tight tolerance, exact corrections, and each step started from the last one's
/// state (with the trend carried on most steps converge in two iterations, too few
/// to measure an order).
void show_newton_order(NewtonSettings& newton);

/// The source of the Newton-order rows: quadratic convergence of Newton's method
/// with the exact Jacobian, which the consistent tangent of an implicit return
/// provides.
inline const char* const newton_source =
    "Dennis & Schnabel (1983) thm 5.2.1, from memory; tangent: Simo & Taylor (1985)";

} // namespace settlewell::verification
