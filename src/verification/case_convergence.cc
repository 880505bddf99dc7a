// Observed orders of convergence for Terzaghi's column under a sudden load.
//
// Mesh: the time-discrete reference (Terzaghi's series with each mode advanced by
// the same steps as the model, three implicit-Euler steps then BDF2 [derived here])
// removes the time error, so what is left is the spatial error of the Q1 pressure:
// order 2 in L2. Time: a fine mesh against Terzaghi's exact series: BDF2 is second
// order (its three implicit-Euler steps at the start add a fixed number of
// second-order local errors). 512 cells: by the mesh rows' order 2 its L2 error is
// about 6e-7, 1 % of the time error at the most steps (6.1e-5 at 80).
#include "settlewell/analytical/consolidation.h"
#include "settlewell/mesh/box_mesh.h"
#include "settlewell/physics/step_weights.h"
#include "settlewell/time/time_grid.h"
#include "settlewell/verification/case_support.h"
#include "settlewell/verification/column_model.h"

#include <deal.II/base/function.h>
#include <deal.II/base/quadrature_lib.h>
#include <deal.II/numerics/vector_tools_integrate_difference.h>

#include <cmath>
#include <functional>
#include <iomanip>
#include <sstream>

namespace settlewell::verification {

namespace {

constexpr double Tv_end = 0.2;
constexpr double load = 45.0; // kPa

/// The reference excess pressure as a field with the layout's three components.
class ReferencePressure : public dealii::Function<2> {
public:
  ReferencePressure(std::function<double(double)> ratio_of_Z, double H)
      : dealii::Function<2>(FieldLayout::n_components)
      , ratio_(std::move(ratio_of_Z))
      , H_(H) {}
  double value(const dealii::Point<2>& x, unsigned int component) const override {
    return component == FieldLayout::pressure ? load * ratio_(-x[1] / H_) : 0.0;
  }

private:
  std::function<double(double)> ratio_;
  double H_;
};

/// ||p_h - p_ref|| / ||p_ref|| in L2 over the column at Tv_end.
double relative_pressure_error(unsigned int n_cells,
                               unsigned int n_steps,
                               bool time_discrete_reference,
                               MPI_Comm comm) {
  ColumnSpec spec;
  spec.surface_load = load;
  spec.n_cells = n_cells;
  ColumnModel column(spec, comm);
  for (const double t : uniform_times(0.0, column.time_of(Tv_end), n_steps))
    column.problem().advance_to(t);

  const double dT = Tv_end / n_steps;
  const ReferencePressure reference(
      [=](double Z) {
        return time_discrete_reference ? analytical::terzaghi_excess_ratio_stepped(
                                             Z, dT, n_steps, euler_steps_after_restart)
                                       : analytical::terzaghi_excess_ratio(Z, Tv_end);
      },
      spec.height);
  const auto& problem = column.problem();
  const auto& tria = problem.dof_handler().get_triangulation();
  const dealii::ComponentSelectFunction<2> pressure_only(FieldLayout::pressure,
                                                         FieldLayout::n_components);
  auto l2 = [&](const LA::MPI::Vector& field) {
    dealii::Vector<float> cellwise(tria.n_active_cells());
    dealii::VectorTools::integrate_difference(
        problem.mapping(), problem.dof_handler(), field, reference, cellwise,
        dealii::QGauss<2>(5), dealii::VectorTools::L2_norm, &pressure_only);
    return dealii::VectorTools::compute_global_error(tria, cellwise,
                                                     dealii::VectorTools::L2_norm);
  };
  LA::MPI::Vector zero(problem.solution());
  zero = 0.0;
  return l2(problem.solution()) / l2(zero);
}

std::string scientific(double v) {
  std::ostringstream os;
  os << std::setprecision(3) << std::scientific << v;
  return os.str();
}

/// Rows for the two finest pairs; the coarsest pair is pre-asymptotic. Each label
/// carries the two errors the order comes from.
std::vector<CheckRow> order_rows(const std::string& what,
                                 const std::vector<unsigned int>& n,
                                 const std::vector<double>& errors,
                                 double expected,
                                 double tolerance,
                                 const std::string& source) {
  std::vector<CheckRow> rows;
  for (std::size_t i = errors.size() - 3; i + 1 < errors.size(); ++i)
    rows.push_back(scaled_row(
        "convergence",
        what + " order, n " + std::to_string(n[i]) + "->" + std::to_string(n[i + 1]) +
            " (errors " + scientific(errors[i]) + ", " + scientific(errors[i + 1]) +
            "; error absolute)",
        std::log2(errors[i] / errors[i + 1]), expected, 1.0, tolerance, source));
  return rows;
}

} // namespace

std::vector<CheckRow> run_convergence(const CaseSettings&, MPI_Comm comm) {
  const std::vector<unsigned int> cells{4, 8, 16, 32};
  std::vector<double> space_errors;
  for (const unsigned int n : cells)
    space_errors.push_back(relative_pressure_error(n, 20, true, comm));

  const std::vector<unsigned int> steps{10, 20, 40, 80};
  std::vector<double> time_errors;
  for (const unsigned int n : steps)
    time_errors.push_back(relative_pressure_error(512, n, false, comm));

  // Tolerances on the orders: +-0.2 for the mesh (Q1 in L2 is 2 asymptotically; the
  // initial jump at the drained face slows the coarsest pairs), +-0.15 for time
  // (BDF2 is 2 asymptotically; the stepped series alone, exact in space, gives 2.004
  // and 2.001 for these pairs, 2.014 for 10->20 [derived here]).
  auto rows = order_rows("p L2 mesh", cells, space_errors, 2.0, 0.2,
                         "Q1 order 2 (Thomee 2006) [from memory]");
  auto time_rows = order_rows("p L2 time", steps, time_errors, 2.0, 0.15,
                              "BDF2 order 2 (Hairer & Wanner 1996) [from memory]");
  rows.insert(rows.end(), time_rows.begin(), time_rows.end());
  return rows;
}

} // namespace settlewell::verification
