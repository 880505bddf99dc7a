#include "settlewell/output/samples.h"

#include "settlewell/core/errors.h"
#include "settlewell/physics/field_layout.h"

#include <deal.II/base/mpi_remote_point_evaluation.h>
#include <deal.II/fe/fe_values.h>

#include <array>
#include <iterator>
#include <limits>
#include <sstream>

namespace settlewell {

using namespace dealii;

struct SamplePoints::Evaluator {
  /// A point on an edge shared by cells is given to one of them: gradients (flux,
  /// stress) jump across cell edges, and one cell's values are a consistent set.
  Utilities::MPI::RemotePointEvaluation<2> remote{1e-10, /*enforce_unique_mapping=*/true};
};

SamplePoints::SamplePoints(const BiotProblem& problem,
                           std::vector<Point<2>> points,
                           const std::string& what)
    : points_(std::move(points))
    , evaluator_(std::make_unique<Evaluator>()) {
  evaluator_->remote.reinit(points_, problem.dof_handler().get_triangulation(),
                            problem.mapping());
  for (std::size_t i = 0; i < points_.size(); ++i)
    if (!evaluator_->remote.point_found(i)) {
      std::ostringstream os;
      os << what << ": the point (" << points_[i][0] << ", " << points_[i][1]
         << ") m lies outside the mesh";
      throw InputError(os.str());
    }
}

SamplePoints::~SamplePoints() = default;
SamplePoints::SamplePoints(SamplePoints&&) noexcept = default;

namespace {

using S = SampleValues;
constexpr double S::*fields[] = {&S::ux,
                                 &S::settlement,
                                 &S::head,
                                 &S::drawdown,
                                 &S::pore_pressure,
                                 &S::excess_pore_pressure,
                                 &S::vertical_effective_stress,
                                 &S::mean_effective_stress,
                                 &S::deviator_stress,
                                 &S::horizontal_effective_stress,
                                 &S::shear_effective_stress,
                                 &S::gradient_x,
                                 &S::gradient_y,
                                 &S::flux_x,
                                 &S::flux_y};
constexpr std::size_t n_fields = std::size(fields);
using Packed = std::array<double, n_fields>;

Packed pack(const S& sample) {
  Packed packed;
  for (std::size_t f = 0; f < n_fields; ++f)
    packed[f] = sample.*fields[f];
  return packed;
}

/// The reported quantities at one point of a cell (its reference coordinates).
S sample_at(const BiotProblem& problem,
            const Derivation& derivation,
            const DoFHandler<2>::active_cell_iterator& cell,
            const Point<2>& reference) {
  FEValues<2> fv(problem.mapping(), problem.dof_handler().get_fe(),
                 Quadrature<2>(reference),
                 update_values | update_gradients | update_quadrature_points);
  fv.reinit(cell);
  std::vector<Vector<double>> values(1, Vector<double>(FieldLayout::n_components));
  std::vector<std::vector<Tensor<1, 2>>> gradients(
      1, std::vector<Tensor<1, 2>>(FieldLayout::n_components));
  fv.get_function_values(problem.solution(), values);
  fv.get_function_gradients(problem.solution(), gradients);
  const DerivedState d =
      derivation.at(fv.quadrature_point(0), cell, values[0], gradients[0]);
  if (&problem.reported_solution() != &problem.solution())
    fv.get_function_values(problem.reported_solution(), values);
  return {values[0][FieldLayout::ux],
          -values[0][FieldLayout::uy],
          d.head,
          d.drawdown,
          d.pore_pressure,
          values[0][FieldLayout::pressure],
          d.vertical_effective_stress,
          d.mean_effective_stress,
          d.deviator_stress,
          -d.effective_stress[0][0],
          d.effective_stress[0][1],
          d.darcy_flux[0],
          d.darcy_flux[1],
          d.head_gradient[0],
          d.head_gradient[1]};
}

} // namespace

std::vector<SampleValues> SamplePoints::evaluate(const BiotProblem& problem,
                                                 const Derivation& derivation) const {
  using CellData = Utilities::MPI::RemotePointEvaluation<2>::CellData;
  const auto& dof_handler = problem.dof_handler();
  auto evaluate_cells = [&](const ArrayView<Packed>& out, const CellData& cells) {
    for (unsigned int c = 0; c < cells.cells.size(); ++c) {
      const DoFHandler<2>::active_cell_iterator cell(&dof_handler.get_triangulation(),
                                                     cells.cells[c].first,
                                                     cells.cells[c].second, &dof_handler);
      // A point in soil that has been dug away has no values.
      const bool removed = problem.is_removed(cell->active_cell_index());
      for (unsigned int q = cells.reference_point_ptrs[c];
           q < cells.reference_point_ptrs[c + 1]; ++q) {
        if (removed)
          out[q].fill(std::numeric_limits<double>::quiet_NaN());
        else
          out[q] =
              pack(sample_at(problem, derivation, cell, cells.reference_point_values[q]));
      }
    }
  };
  std::vector<Packed> packed, buffer;
  evaluator_->remote.evaluate_and_process<Packed>(packed, buffer, evaluate_cells);
  std::vector<S> out(points_.size());
  for (std::size_t i = 0; i < points_.size(); ++i)
    for (std::size_t f = 0; f < n_fields; ++f)
      out[i].*fields[f] = packed[i][f];
  return out;
}

} // namespace settlewell
