// Clays with a stress history (Modified Cam Clay): the state of every quadrature
// point of their cells, its update from the current iterate, and the terms that
// Newton's method adds to the cell integrals. The unknowns stay the changes from
// the start; the material sees the absolute stress, the start state included.
#include "biot_problem_impl.h"

#include "settlewell/core/errors.h"

#include <algorithm>
#include <limits>

namespace settlewell {

namespace {
constexpr std::size_t no_points = std::numeric_limits<std::size_t>::max();
/// A point's committed state in a checkpoint: the stress (4) and the yield size.
constexpr unsigned int checkpoint_values_per_point = 5;

PlaneTensor plane(const SymmetricTensor<2, 3>& s) {
  return {{s[0][0], s[1][1], s[2][2], s[0][1]}};
}
} // namespace

template <typename Error>
void BiotProblem::Impl::throw_first_problem(const std::string& problem) const {
  // Every process throws the same error (the lowest rank's), so none waits in a
  // collective call.
  const unsigned int mine = problem.empty() ? numbers::invalid_unsigned_int
                                            : Utilities::MPI::this_mpi_process(comm);
  const unsigned int first = Utilities::MPI::min(mine, comm);
  if (first != numbers::invalid_unsigned_int)
    throw Error(Utilities::MPI::broadcast(comm, problem, first));
}

void BiotProblem::Impl::prepare_clays() {
  if (setup.clays.empty())
    return;
  if (!setup.geostatic.effective_stress)
    throw InternalError("a Cam Clay skeleton needs the start state's effective stress");
  if (setup.gravity_loading || !setup.excavation.empty() || setup.rigid_skeleton)
    throw InternalError("a Cam Clay skeleton does not yet combine with gravity "
                        "loading, excavation or a rigid skeleton");
  clay_by_region.assign(coefficients.size(), nullptr);
  for (const auto& [region, clay] : setup.clays) {
    clay.parameters.validate("the Cam Clay parameters of region '" + region + "'");
    clay_by_region.at(mesh.names.region_id(region)) = &clay;
  }
  clay_offset.assign(mesh.triangulation->n_active_cells(), no_points);
  std::string problem; // the first point of this process without compression
  CellKernel kernel(layout, setup.analysis, mapping);
  for (const auto& cell : dof_handler.active_cell_iterators()) {
    const ClaySkeleton* clay = clay_by_region[cell->material_id()];
    if (!cell->is_locally_owned() || clay == nullptr)
      continue;
    kernel.reinit(cell);
    clay_offset[cell->active_cell_index()] = clay_points.size();
    clay_points_per_cell = kernel.n_quadrature_points();
    for (const Point<2>& x : kernel.quadrature_points()) {
      const auto start = setup.geostatic.effective_stress(x, cell->material_id());
      ClayPoint point;
      point.parameters = &clay->parameters;
      point.start_stress = plane(start);
      if (!(mean_effective_stress(point.start_stress) > 0.0)) {
        if (problem.empty())
          problem = "the Cam Clay region '" +
                    mesh.names.region_name(cell->material_id()) +
                    "' has no compressive effective stress at (" + std::to_string(x[0]) +
                    ", " + std::to_string(x[1]) +
                    ") m at the start (Cam Clay needs p' > 0: a clay at a free, "
                    "submerged surface needs a layer or a load above it)";
        continue;
      }
      // A start outside the ellipse the preconsolidation gives is taken as on
      // the ellipse through it.
      const double m = clay->parameters.critical_state_slope;
      point.committed = {point.start_stress,
                         std::max(clay->yield_size(start, x[1]),
                                  yield_size_through(point.start_stress, m))};
      const auto start_update =
          cam_clay_update(clay->parameters, point.committed, PlaneTensor{});
      point.trial = point.committed;
      point.tangent = start_update.tangent;
      point.start_yield_size = point.committed.yield_size;
      point.x = x;
      point.region = cell->material_id();
      clay_points.push_back(point);
    }
  }
  throw_first_problem<InputError>(problem);
  step_start.reinit(owned, relevant, comm);
}

void BiotProblem::Impl::for_each_clay_cell_strain(
    const LA::MPI::Vector& state,
    const std::function<void(ClayPoint&, const PlaneTensor&)>& visit) {
  CellKernel kernel(layout, setup.analysis, mapping);
  Vector<double> local(kernel.dofs_per_cell());
  std::vector<PlaneTensor> strain;
  for (const auto& cell : dof_handler.active_cell_iterators()) {
    if (!cell->is_locally_owned() || !has_clay_points(cell))
      continue;
    kernel.reinit(cell);
    cell->get_dof_values(state, local);
    kernel.strains(local, strain);
    ClayPoint* point = &clay_points[clay_offset[cell->active_cell_index()]];
    for (unsigned int q = 0; q < strain.size(); ++q, ++point)
      visit(*point, strain[q]);
  }
}

void BiotProblem::Impl::record_step_start_strains() {
  for_each_clay_cell_strain(step_start, [](ClayPoint& point, const PlaneTensor& e) {
    point.start_strain = e;
    point.strain = e;
  });
}

unsigned int BiotProblem::Impl::update_clay_points() {
  unsigned int yielding = 0;
  std::string failure; // the first point of this process whose update failed
  for_each_clay_cell_strain(solution, [&](ClayPoint& point, const PlaneTensor& e) {
    PlaneTensor increment;
    for (unsigned int k = 0; k < 4; ++k)
      increment[k] = e[k] - point.start_strain[k];
    try {
      const auto u = cam_clay_update(*point.parameters, point.committed, increment);
      point.strain = e;
      point.trial = u.state;
      point.tangent = u.tangent;
      yielding += u.yielded;
    } catch (const SolverError& error) {
      if (failure.empty())
        failure = error.what();
    }
  });
  throw_first_problem<SolverError>(failure);
  return Utilities::MPI::sum(yielding, comm);
}

void BiotProblem::Impl::commit_clay_points() {
  for (auto& point : clay_points)
    point.committed = point.trial;
}

std::vector<std::vector<double>> BiotProblem::Impl::clay_cell_values() const {
  std::vector<std::vector<double>> values(mesh.triangulation->n_active_cells());
  for (const auto& cell : dof_handler.active_cell_iterators()) {
    if (!cell->is_locally_owned() || !has_clay_points(cell))
      continue;
    auto& v = values[cell->active_cell_index()];
    v.reserve(checkpoint_values_per_point * clay_points_per_cell);
    const ClayPoint* point = &clay_points[clay_offset[cell->active_cell_index()]];
    for (unsigned int q = 0; q < clay_points_per_cell; ++q, ++point) {
      v.insert(v.end(), point->committed.stress.begin(), point->committed.stress.end());
      v.push_back(point->committed.yield_size);
    }
  }
  return values;
}

void BiotProblem::Impl::load_clay_cell_values(
    const std::vector<std::vector<double>>& values) {
  constexpr unsigned int per_point = checkpoint_values_per_point;
  std::string problem;
  for (const auto& cell : dof_handler.active_cell_iterators()) {
    if (!cell->is_locally_owned())
      continue;
    const auto& v = values[cell->active_cell_index()];
    const std::size_t expected =
        has_clay_points(cell) ? per_point * clay_points_per_cell : 0;
    if (v.size() != expected) {
      problem = "the checkpoint's clay states do not fit the scenario's clay regions";
      continue;
    }
    ClayPoint* point =
        expected == 0 ? nullptr : &clay_points[clay_offset[cell->active_cell_index()]];
    for (std::size_t i = 0; i < expected; i += per_point, ++point) {
      std::copy(v.begin() + i, v.begin() + i + 4, point->committed.stress.begin());
      point->committed.yield_size = v[i + 4];
    }
  }
  throw_first_problem<InputError>(problem);
  reset_clay_trials();
}

void BiotProblem::Impl::reset_clay_trials() {
  for (auto& point : clay_points) {
    point.trial = point.committed;
    point.tangent =
        cam_clay_update(*point.parameters, point.committed, PlaneTensor{}).tangent;
  }
}

void BiotProblem::Impl::add_clay_terms(CellKernel& kernel,
                                       const DoFHandler<2>::active_cell_iterator& cell,
                                       FullMatrix<double>& cell_matrix,
                                       Vector<double>& cell_rhs) const {
  // Newton's step K_k x_{k+1} = F - (f_int(u_k) - A_k u_k): the tangent block A_k
  // goes into the matrix and the right-hand side takes minus the internal force
  // of tau = (sigma'_k - sigma'_0) - D_k eps(u_k) at each point.
  const unsigned int n = kernel.n_quadrature_points();
  std::vector<PlaneTangent> tangents(n);
  std::vector<PlaneTensor> tau(n);
  const ClayPoint* point = &clay_points[clay_offset[cell->active_cell_index()]];
  for (unsigned int q = 0; q < n; ++q, ++point) {
    tangents[q] = point->tangent;
    for (unsigned int r = 0; r < 4; ++r) {
      double tangent_stress = 0.0;
      for (unsigned int k = 0; k < 4; ++k)
        tangent_stress += point->tangent[r][k] * point->strain[k];
      tau[q][r] = point->trial.stress[r] - point->start_stress[r] - tangent_stress;
    }
  }
  kernel.add_tangent_and_force(tangents, tau, cell_matrix, cell_rhs);
}

void BiotProblem::Impl::add_clay_flow(CellKernel& kernel,
                                      const DoFHandler<2>::active_cell_iterator& cell,
                                      const Vector<double>& local,
                                      double dt,
                                      FullMatrix<double>& cell_matrix,
                                      Vector<double>& cell_rhs) const {
  const auto region = cell->material_id();
  kernel.add_strain_dependent_flow(coefficients[region].mobility,
                                   conductivity_rate(region), local, dt, cell_matrix,
                                   cell_rhs);
}

double BiotProblem::conductivity_rate(types::material_id region) const {
  return impl_->conductivity_rate(region);
}

double BiotProblem::Impl::conductivity_rate(types::material_id region) const {
  const ClaySkeleton* clay =
      region < clay_by_region.size() ? clay_by_region[region] : nullptr;
  return clay == nullptr ? 0.0 : clay->conductivity_rate();
}

std::optional<BiotProblem::ClayCellState>
BiotProblem::clay_cell_state(unsigned int active_cell_index) const {
  const Impl& m = *impl_;
  if (m.clay_offset.empty() || m.clay_offset[active_cell_index] == no_points)
    return std::nullopt;
  const std::size_t first = m.clay_offset[active_cell_index];
  const std::size_t end = first + m.clay_points_per_cell;
  ClayCellState mean;
  for (std::size_t i = first; i < end; ++i) {
    const CamClayState& c = m.clay_points[i].committed;
    const double slope = m.clay_points[i].parameters->critical_state_slope;
    for (unsigned int k = 0; k < 4; ++k)
      mean.stress[k] += c.stress[k];
    mean.yield_size += c.yield_size;
    mean.yield_ratio += c.yield_size / yield_size_through(c.stress, slope);
  }
  const double n = static_cast<double>(end - first);
  for (auto& v : mean.stress)
    v /= n;
  mean.yield_size /= n;
  mean.yield_ratio /= n;
  return mean;
}

std::vector<BiotProblem::ClayYield> BiotProblem::clay_yield() const {
  const Impl& m = *impl_;
  const MPI_Comm comm = m.comm;
  constexpr double inf = std::numeric_limits<double>::infinity();
  std::vector<ClayYield> out;
  for (const auto& [name, clay] : m.setup.clays) {
    const types::material_id region = m.mesh.names.region_id(name);
    ClayYield y{name, 0, 0, inf, -inf, inf, -inf, 0.0};
    for (const auto& point : m.clay_points) {
      if (point.region != region)
        continue;
      ++y.points;
      const double change = point.committed.yield_size - point.start_yield_size;
      if (!(std::abs(change) > 1e-9 * point.start_yield_size))
        continue;
      ++y.yielded;
      y.x_from = std::min(y.x_from, point.x[0]);
      y.x_to = std::max(y.x_to, point.x[0]);
      y.y_from = std::min(y.y_from, point.x[1]);
      y.y_to = std::max(y.y_to, point.x[1]);
      if (std::abs(change) > std::abs(y.largest_change))
        y.largest_change = change;
    }
    y.points = Utilities::MPI::sum(y.points, comm);
    y.yielded = Utilities::MPI::sum(y.yielded, comm);
    y.x_from = Utilities::MPI::min(y.x_from, comm);
    y.y_from = Utilities::MPI::min(y.y_from, comm);
    y.x_to = Utilities::MPI::max(y.x_to, comm);
    y.y_to = Utilities::MPI::max(y.y_to, comm);
    // The change of the largest size over all processes, with its sign.
    const double largest = Utilities::MPI::max(std::abs(y.largest_change), comm);
    const double signed_here =
        std::abs(y.largest_change) == largest ? y.largest_change : -inf;
    y.largest_change = Utilities::MPI::max(signed_here, comm);
    out.push_back(y);
  }
  return out;
}

bool BiotProblem::has_clays() const {
  return !impl_->setup.clays.empty();
}

bool BiotProblem::Impl::has_clay_points(
    const DoFHandler<2>::active_cell_iterator& cell) const {
  return !clay_offset.empty() && clay_offset[cell->active_cell_index()] != no_points;
}

} // namespace settlewell
