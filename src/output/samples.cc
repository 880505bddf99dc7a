#include "settlewell/output/samples.h"

#include "settlewell/core/errors.h"
#include "settlewell/physics/field_layout.h"

#include <deal.II/base/mpi.h>
#include <deal.II/fe/fe_values.h>
#include <deal.II/grid/grid_tools.h>
#include <deal.II/grid/grid_tools_cache.h>

#include <iterator>
#include <limits>
#include <sstream>

namespace settlewell {

using namespace dealii;

struct SamplePoints::Located {
  DoFHandler<2>::active_cell_iterator cell;
  Point<2> reference;
};

namespace {

/// The locally owned cell holding p, if any, with p's reference coordinates.
std::unique_ptr<SamplePoints::Located>
locate(const BiotProblem& problem, const GridTools::Cache<2>& cache, const Point<2>& p);

} // namespace

SamplePoints::SamplePoints(const BiotProblem& problem,
                           std::vector<Point<2>> points,
                           const std::string& what)
    : points_(std::move(points)) {
  const GridTools::Cache<2> cache(problem.dof_handler().get_triangulation(),
                                  problem.mapping());
  const MPI_Comm comm = problem.communicator();
  const unsigned int rank = Utilities::MPI::this_mpi_process(comm);
  std::vector<unsigned int> owner(points_.size()), first_owner(points_.size());
  for (std::size_t i = 0; i < points_.size(); ++i) {
    located_.push_back(locate(problem, cache, points_[i]));
    owner[i] = located_.back() ? rank : std::numeric_limits<unsigned int>::max();
  }
  MPI_Allreduce(owner.data(), first_owner.data(), int(owner.size()), MPI_UNSIGNED,
                MPI_MIN, comm);
  for (std::size_t i = 0; i < points_.size(); ++i) {
    if (first_owner[i] == std::numeric_limits<unsigned int>::max()) {
      std::ostringstream os;
      os << what << ": the point (" << points_[i][0] << ", " << points_[i][1]
         << ") m lies outside the mesh";
      throw InputError(os.str());
    }
    if (first_owner[i] != rank) // a point on a partition edge is evaluated once
      located_[i].reset();
  }
}

SamplePoints::~SamplePoints() = default;
SamplePoints::SamplePoints(SamplePoints&&) noexcept = default;

namespace {

std::unique_ptr<SamplePoints::Located>
locate(const BiotProblem& problem, const GridTools::Cache<2>& cache, const Point<2>& p) {
  std::vector<std::pair<DoFHandler<2>::active_cell_iterator, Point<2>>> cells;
  try {
    const auto first = GridTools::find_active_cell_around_point(cache, p);
    if (first.first.state() != IteratorState::valid)
      return nullptr;
    const DoFHandler<2>::active_cell_iterator dof_cell(
        &problem.dof_handler().get_triangulation(), first.first->level(),
        first.first->index(), &problem.dof_handler());
    cells = GridTools::find_all_active_cells_around_point(
        problem.mapping(), problem.dof_handler(), p, 1e-10, {dof_cell, first.second});
  } catch (const std::exception&) {
    return nullptr; // not in this process's part of the mesh
  }
  for (const auto& [cell, reference] : cells)
    if (cell->is_locally_owned())
      return std::make_unique<SamplePoints::Located>(
          SamplePoints::Located{cell, reference});
  return nullptr;
}

} // namespace

std::vector<SampleValues> SamplePoints::evaluate(const BiotProblem& problem,
                                                 const Derivation& derivation) const {
  using S = SampleValues;
  static constexpr double S::*fields[] = {&S::ux,
                                          &S::settlement,
                                          &S::head,
                                          &S::drawdown,
                                          &S::pore_pressure,
                                          &S::excess_pore_pressure,
                                          &S::vertical_effective_stress,
                                          &S::mean_effective_stress,
                                          &S::deviator_stress,
                                          &S::gradient_x,
                                          &S::gradient_y,
                                          &S::flux_x,
                                          &S::flux_y};
  constexpr std::size_t n_fields = std::size(fields);
  // Each point has one owner: sum the packed values over processes.
  std::vector<double> local(points_.size() * n_fields, 0.0), total(local.size());
  std::vector<Vector<double>> values(1, Vector<double>(FieldLayout::n_components));
  std::vector<std::vector<Tensor<1, 2>>> gradients(
      1, std::vector<Tensor<1, 2>>(FieldLayout::n_components));
  for (std::size_t i = 0; i < points_.size(); ++i) {
    if (!located_[i])
      continue;
    const Quadrature<2> at(located_[i]->reference);
    FEValues<2> fv(problem.mapping(), problem.dof_handler().get_fe(), at,
                   update_values | update_gradients);
    fv.reinit(located_[i]->cell);
    fv.get_function_values(problem.solution(), values);
    fv.get_function_gradients(problem.solution(), gradients);
    const DerivedState d = derivation.at(points_[i], located_[i]->cell->material_id(),
                                         values[0], gradients[0]);
    const S sample{values[0][FieldLayout::ux],
                   d.settlement,
                   d.head,
                   d.drawdown,
                   d.pore_pressure,
                   values[0][FieldLayout::pressure],
                   d.vertical_effective_stress,
                   d.mean_effective_stress,
                   d.deviator_stress,
                   d.darcy_flux[0],
                   d.darcy_flux[1],
                   d.head_gradient[0],
                   d.head_gradient[1]};
    for (std::size_t f = 0; f < n_fields; ++f)
      local[i * n_fields + f] = sample.*fields[f];
  }
  MPI_Allreduce(local.data(), total.data(), int(local.size()), MPI_DOUBLE, MPI_SUM,
                problem.communicator());
  std::vector<S> out(points_.size());
  for (std::size_t i = 0; i < points_.size(); ++i)
    for (std::size_t f = 0; f < n_fields; ++f)
      out[i].*fields[f] = total[i * n_fields + f];
  return out;
}

} // namespace settlewell
