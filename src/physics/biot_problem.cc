#include "settlewell/physics/biot_problem.h"

#include "biot_problem_impl.h"

#include "settlewell/core/errors.h"
#include "settlewell/physics/step_weights.h"

#include <deal.II/base/mpi.h>
#include <deal.II/base/timer.h>
#include <deal.II/lac/dynamic_sparsity_pattern.h>
#include <deal.II/lac/sparsity_tools.h>

#include <algorithm>
#include <cmath>
#include <map>

namespace settlewell {

using namespace dealii;

namespace {

std::vector<CellCoefficients> coefficients_by_region(const BiotSetup& setup,
                                                     const NameTable& names) {
  for (const auto& [region, material] : setup.materials)
    if (!names.has_region(region))
      (void)names.region_id(region); // throws, listing the regions that exist
  std::vector<CellCoefficients> by_id;
  for (const auto& region : names.region_names()) {
    const auto found = setup.materials.find(region);
    if (found == setup.materials.end())
      throw InputError("region '" + region + "' has no material");
    found->second.validate("material of region '" + region + "'");
    const auto id = names.region_id(region);
    if (by_id.size() <= id)
      by_id.resize(id + 1);
    by_id[id] = CellCoefficients::from(found->second, setup.gamma_w);
    by_id[id].skeleton_from_history = setup.clays.count(region) > 0;
  }
  return by_id;
}

void check_axisymmetric_domain(const Mesh& mesh) {
  bool negative_radius = false;
  for (const auto& v : mesh.triangulation->get_vertices())
    negative_radius = negative_radius || v[0] < -1e-10;
  if (negative_radius)
    throw InputError("an axisymmetric mesh must lie at r = x >= 0");
}

} // namespace

BiotProblem::Impl::Impl(const Mesh& mesh_, BiotSetup setup_)
    : mesh(mesh_)
    , setup(std::move(setup_))
    , comm(mesh_.triangulation->get_communicator())
    , dof_handler(*mesh_.triangulation)
    , conditions(resolve_conditions(setup, mesh_))
    , coefficients(coefficients_by_region(setup, mesh_.names)) {
  if (!(setup.gamma_w > 0.0))
    throw InputError("the unit weight of water must be positive, kN/m^3");
  if (setup.analysis == AnalysisType::axisymmetric)
    check_axisymmetric_domain(mesh);
  if (setup.rigid_skeleton && conditions.plate)
    throw InputError("a rigid plate cannot load a rigid skeleton");
  if (setup.geostatic.effective_stress)
    map_unit_weights();
  if (!setup.excavation.empty())
    prepare_excavation();
  if (setup.gravity_loading && !setup.geostatic.effective_stress)
    throw InternalError("gravity loading needs the unit weights of the geostatic state");
  settled = !setup.gravity_loading;
  setup_dofs();
  build_storage_rows();
  choose_solver();
  prepare_clays();
  prepare_unsaturated();
}

void BiotProblem::Impl::map_unit_weights() {
  for (const auto& region : mesh.names.region_names()) {
    const auto found = setup.geostatic.unit_weights.find(region);
    if (found == setup.geostatic.unit_weights.end())
      throw InternalError("the geostatic state needs the unit weight of region '" +
                          region + "'");
    const auto id = mesh.names.region_id(region);
    if (unit_weights.size() <= id)
      unit_weights.resize(id + 1);
    unit_weights[id] = found->second;
  }
}

void BiotProblem::Impl::prepare_excavation() {
  if (!setup.geostatic.effective_stress)
    throw InternalError("excavation needs the geostatic state it releases");
  removed.assign(mesh.triangulation->n_active_cells(), false);
  excavated.assign(setup.excavation.size(), false);
}

void BiotProblem::Impl::choose_solver() {
  const bool iterative = setup.solver == SolverChoice::iterative ||
                         (setup.solver == SolverChoice::automatic &&
                          dof_handler.n_dofs() > setup.direct_limit);
  if (iterative && setup.solved_by_newton())
    throw InputError(
        std::string(setup.clays.empty() ? "a retention curve" : "a Cam Clay material") +
        " needs the direct solver (numerics.solver = \"direct\"): its "
        "tangent is not symmetric");
  if (!iterative) {
    solver = make_direct_solver(comm, !setup.solved_by_newton());
    set_row_signs();
    return;
  }
  const IndexSet u = DoFTools::extract_dofs(dof_handler, layout.displacement_mask());
  const IndexSet p =
      DoFTools::extract_dofs(dof_handler, layout.mask_of(FieldLayout::pressure));
  solver = make_iterative_solver(comm, u, p, displacement_node_coordinates(u),
                                 setup.solver_tolerance);
  // The Schur approximation couples pressures only.
  Table<2, DoFTools::Coupling> coupling(FieldLayout::n_components,
                                        FieldLayout::n_components);
  coupling.fill(DoFTools::none);
  coupling(FieldLayout::pressure, FieldLayout::pressure) = DoFTools::always;
  reinit_distributed(schur, coupling);
}

void BiotProblem::Impl::set_row_signs() {
  if (!solver->wants_symmetric_form())
    return;
  row_signs.reinit(owned, comm);
  row_signs = 1.0;
  for (const auto d :
       DoFTools::extract_dofs(dof_handler, layout.mask_of(FieldLayout::pressure)))
    row_signs(d) = -1.0;
  row_signs.compress(VectorOperation::insert);
}

void BiotProblem::Impl::give_matrix_to_solver() {
  if (row_signs.size() > 0)
    scale_rows(matrix, row_signs);
  solver->set_matrix(matrix, solver->needs_schur_approximation() ? &schur : nullptr);
}

unsigned int BiotProblem::Impl::solve_system() {
  if (row_signs.size() > 0)
    rhs.scale(row_signs);
  return solver->solve(rhs, owned_solution);
}

std::vector<double>
BiotProblem::Impl::displacement_node_coordinates(const IndexSet& u) const {
  std::map<types::global_dof_index, Point<2>> support;
  DoFTools::map_dofs_to_support_points(mapping, dof_handler, support,
                                       layout.displacement_mask());
  std::vector<double> coordinates; // (x, y) per node: once for each ux, uy pair
  bool first_of_pair = true;
  for (const auto d : u) {
    if (first_of_pair) {
      const Point<2>& x = support.at(d);
      coordinates.insert(coordinates.end(), {x[0], x[1]});
    }
    first_of_pair = !first_of_pair;
  }
  return coordinates;
}

void BiotProblem::Impl::reinit_distributed(
    LA::MPI::SparseMatrix& target, const Table<2, DoFTools::Coupling>& coupling) const {
  DynamicSparsityPattern dsp(relevant);
  DoFTools::make_sparsity_pattern(dof_handler, coupling, dsp, constraints, true);
  SparsityTools::distribute_sparsity_pattern(dsp, owned, comm, relevant);
  target.reinit(owned, owned, dsp, comm);
}

void BiotProblem::Impl::setup_dofs() {
  dof_handler.distribute_dofs(layout.fe);
  owned = dof_handler.locally_owned_dofs();
  DoFTools::extract_locally_relevant_dofs(dof_handler, relevant);
  if (conditions.plate) {
    plate = link_plate(dof_handler, layout, *conditions.plate, setup.analysis,
                       mesh.names.boundary_name(conditions.plate->id));
    relevant.add_index(plate->master);
  }
  find_internal_lines();
  locate_springs();
  // The pattern keeps the rows of prescribed pressures, so that conditions can be
  // switched on and off (wells that start pumping) without a new pattern.
  make_constraints(constraint_inputs(), 0.0, constraints, false);
  Table<2, DoFTools::Coupling> all(FieldLayout::n_components, FieldLayout::n_components);
  all.fill(DoFTools::always);
  reinit_distributed(matrix, all);
  rhs.reinit(owned, comm);
  owned_solution.reinit(owned, comm);
  solution.reinit(owned, relevant, comm);
  old_solution.reinit(owned, relevant, comm);
}

void BiotProblem::Impl::find_internal_lines() {
  pressure_line_dofs.assign(conditions.pressures.size(), {});
  for (std::size_t k = 0; k < conditions.pressures.size(); ++k) {
    const LineRef& line = conditions.pressures[k].line;
    if (line.internal)
      pressure_line_dofs[k] =
          pressure_dofs_on_line(dof_handler, mesh.internal_lines.at(line.name));
    else if (conditions.pressures[k].one_way())
      pressure_line_dofs[k] = pressure_dofs_on_boundary(dof_handler, line.id);
  }
  line_flux_faces.clear();
  for (std::size_t k = 0; k < conditions.fluxes.size(); ++k)
    if (conditions.fluxes[k].line.internal)
      for (const auto& lf : faces_on_line(
               dof_handler, mesh.internal_lines.at(conditions.fluxes[k].line.name)))
        line_flux_faces[lf.cell->active_cell_index()].emplace_back(lf.face, k);
}

void BiotProblem::Impl::assemble_matrix(double dt) {
  const bool with_schur = solver->needs_schur_approximation();
  matrix = 0.0;
  if (with_schur)
    schur = 0.0;
  CellKernel kernel(layout, setup.analysis, mapping);
  FullMatrix<double> cell_matrix(kernel.dofs_per_cell(), kernel.dofs_per_cell());
  std::vector<types::global_dof_index> dofs(kernel.dofs_per_cell());
  for (const auto& cell : dof_handler.active_cell_iterators()) {
    if (!cell->is_locally_owned() || !in_model(cell))
      continue;
    kernel.reinit(cell);
    cell->get_dof_indices(dofs);
    const CellCoefficients& c = coefficients[cell->material_id()];
    cell_matrix = 0.0;
    kernel.add_matrix(c, dt, cell_matrix);
    constraints.distribute_local_to_global(cell_matrix, dofs, matrix);
    if (with_schur) {
      cell_matrix = 0.0;
      kernel.add_schur_approximation(c, dt, cell_matrix);
      constraints.distribute_local_to_global(cell_matrix, dofs, schur);
    }
  }
  matrix.compress(VectorOperation::add);
  if (with_schur)
    schur.compress(VectorOperation::add);
  if (!setup.springs.empty())
    add_spring_stiffness(matrix);
  if (!removed.empty()) {
    set_deactivated_diagonals(matrix);
    if (with_schur)
      set_deactivated_diagonals(schur);
  }
}

void BiotProblem::Impl::add_face_terms(CellKernel& kernel,
                                       const DoFHandler<2>::active_cell_iterator& cell,
                                       double t_new,
                                       double dt,
                                       Vector<double>& cell_rhs) const {
  for (const unsigned int f : cell->face_indices()) {
    if (!cell->face(f)->at_boundary())
      continue;
    const auto id = cell->face(f)->boundary_id();
    for (const auto& tb : conditions.tractions)
      if (tb.id == id)
        kernel.add_face_traction(
            f,
            [&](const Point<2>& x, const Tensor<1, 2>& n) {
              return tb.normal_traction(x, t_new) * n;
            },
            cell_rhs);
    if (plate && conditions.plate->id == id) {
      // A compressive total force spread evenly: after the plate's dofs are tied,
      // the master carries exactly the total.
      const double pressure = conditions.plate->compressive_force(t_new) / plate->area;
      kernel.add_face_traction(
          f, [&](const Point<2>&, const Tensor<1, 2>& n) { return -pressure * n; },
          cell_rhs);
    }
    for (const auto& fb : conditions.fluxes)
      if (!fb.line.internal && fb.line.id == id && fb.window.contains(t_new))
        kernel.add_face_outflow(f, dt, fb.outflow, t_new, cell_rhs);
  }
}

void BiotProblem::Impl::add_line_fluxes(CellKernel& kernel,
                                        const DoFHandler<2>::active_cell_iterator& cell,
                                        double t,
                                        double dt,
                                        Vector<double>& cell_rhs) const {
  const auto found = line_flux_faces.find(cell->active_cell_index());
  if (found == line_flux_faces.end())
    return;
  for (const auto& [face, k] : found->second)
    if (conditions.fluxes[k].window.contains(t))
      kernel.add_face_outflow(face, dt, conditions.fluxes[k].outflow, t, cell_rhs);
}

void BiotProblem::Impl::add_old_state_and_fluxes(
    CellKernel& kernel,
    const DoFHandler<2>::active_cell_iterator& cell,
    double t,
    double dt,
    Vector<double>& old_state,
    Vector<double>& cell_rhs) const {
  cell->get_dof_values(old_solution, old_state);
  add_storage_terms(cell, old_state, cell_rhs);
  if (cell->at_boundary())
    add_face_terms(kernel, cell, t, dt, cell_rhs);
  add_line_fluxes(kernel, cell, t, dt, cell_rhs);
}

bool BiotProblem::Impl::has_inhomogeneity(
    const std::vector<types::global_dof_index>& dofs) const {
  for (const auto dof : dofs)
    if (constraints.is_inhomogeneously_constrained(dof))
      return true;
  return false;
}

void BiotProblem::Impl::assemble_rhs(double t_new, double dt) {
  rhs = 0.0;
  CellKernel kernel(layout, setup.analysis, mapping);
  const unsigned int n = kernel.dofs_per_cell();
  Vector<double> cell_rhs(n), old_state(n);
  std::vector<types::global_dof_index> dofs(n);
  for (const auto& cell : dof_handler.active_cell_iterators()) {
    if (!cell->is_locally_owned() || !in_model(cell))
      continue;
    kernel.reinit(cell);
    cell->get_dof_indices(dofs);
    cell_rhs = 0.0;
    add_old_state_and_fluxes(kernel, cell, t_new, dt, old_state, cell_rhs);
    if (setup.gravity_loading)
      add_start_imbalance(kernel, cell, cell_rhs);
    const Tensor<1, 2> b = conditions.body_force(cell->material_id(), t_new);
    if (b.norm() > 0.0)
      kernel.add_body_force(b, cell_rhs);
    if (has_inhomogeneity(dofs)) {
      // Prescribed values enter the right-hand side through the cell matrix;
      // only cells that touch them need it.
      constraints.distribute_local_to_global(cell_rhs, dofs, rhs,
                                             cell_matrix_at(kernel, cell, dt));
    } else {
      constraints.distribute_local_to_global(cell_rhs, dofs, rhs);
    }
  }
  add_release_loads(t_new, rhs);
  add_spring_loads(rhs);
  rhs.compress(VectorOperation::add);
}

BiotProblem::BiotProblem(const Mesh& mesh, BiotSetup setup)
    : impl_(std::make_unique<Impl>(mesh, std::move(setup))) {}

BiotProblem::~BiotProblem() = default;

StepReport BiotProblem::advance_to(double t_new) {
  Impl& m = *impl_;
  if (!(t_new > m.time))
    throw InternalError(
        "time steps must move forward (from t = " + std::to_string(m.time) + " s to " +
        std::to_string(t_new) + " s)");
  if (!m.settled)
    throw InternalError("a gravity-loading start must be settled before the first step");
  // The same on every process.
  return m.setup.solved_by_newton() ? m.take_clay_step(t_new, 0) : m.take_step(t_new);
}

StepReport BiotProblem::Impl::take_step(double t_new) {
  Impl& m = *this;
  const double dt = t_new - m.time;
  StepReport report;
  report.time = t_new;
  report.dt = dt;
  report.last_dt = dt;
  report.drain_rounds = 0;
  bool new_geometry = m.excavate(m.time);
  new_geometry = m.fit_springs(m.time) || new_geometry;
  if (new_geometry) {
    m.find_exposed();
    m.fixed_dt = std::numeric_limits<double>::quiet_NaN(); // Newton's matrix is stale
  }
  m.gather_one_way(t_new);
  m.held_inflow_share = 0.0;
  // Cells taken out or props fitted change what the old states mean: start again
  // with implicit Euler.
  // Partly saturated soil: implicit Euler throughout (the mixed form's water
  // content is not a linear function of the old states).
  const bool euler = new_geometry || !m.setup.unsaturated.empty();
  const StepWeights weights =
      next_step_weights(dt, euler ? 0.0 : m.previous_dt, m.euler_steps_left);
  const double dt_eff = weights.effective_dt;
  m.form_old_state(weights.previous_weight);
  m.shift_history(dt);
  m.effective_dt = dt_eff;
  // Lines that take water only (the dug surface, wells, seepage faces) may need
  // several solves until the set of draining dofs settles; without one, the loop
  // runs once.
  constexpr unsigned int max_drain_rounds = 30;
  const bool newton = m.setup.solved_by_newton(); // the same on every process
  if (newton) {
    m.step_start = m.solution;
    if (new_geometry)
      m.newton_previous_dt = 0.0; // no trend to carry on
  }
  while (true) {
    if (newton)
      m.solve_newton_step(t_new, dt_eff, report);
    else
      m.solve_step(t_new, dt_eff, new_geometry, report);
    new_geometry = false;
    if (report.drain_rounds < max_drain_rounds) {
      if (!m.update_draining(t_new, dt_eff))
        break;
      continue;
    }
    // The last round allowed: keeps this solve, with the set it was solved with.
    const auto solved_draining = m.draining;
    const auto solved_stopped = m.pumped_stopped;
    if (m.update_draining(t_new, dt_eff)) {
      report.drains_settled = false;
      m.draining = solved_draining;
      m.pumped_stopped = solved_stopped;
    }
    break;
  }
  report.held_inflow_share = m.held_inflow_share;
  if (newton) {
    m.commit_clay_points();
    m.newton_previous = m.step_start;
    m.newton_previous_dt = dt;
  }
  m.time = t_new;
  m.update_reported();
  return report;
}

void BiotProblem::Impl::form_old_state(double previous_weight) {
  if (previous_weight == 0.0) {
    old_solution = solution;
    return;
  }
  // rhs is free until the step assembles it: (1 - c) x_n + c x_{n-1} formed there.
  rhs = owned_solution;
  rhs.sadd(1.0 - previous_weight, previous_weight, previous_solution);
  old_solution = rhs;
}

void BiotProblem::Impl::shift_history(double dt) {
  if (previous_dt > 0.0 && solver->takes_initial_guess()) {
    // x_n + r (x_n - x_{n-1}), r = dt / dt_n: the trend of the last step carried
    // on, formed in previous_solution; the swap leaves x_n there for the next step.
    const double r = dt / previous_dt;
    previous_solution.sadd(-r, 1.0 + r, owned_solution);
    previous_solution.swap(owned_solution);
  } else {
    if (previous_solution.size() != owned_solution.size())
      previous_solution.reinit(owned_solution); // same layout (allocated once)
    previous_solution = owned_solution;
  }
  previous_dt = dt;
}

void BiotProblem::Impl::solve_step(double t_new,
                                   double dt,
                                   bool new_geometry,
                                   StepReport& report) {
  Timer timer; // started: wall time of this process
  set_drain_values(t_new);
  make_constraints(constraint_inputs(), t_new, constraints);
  const std::vector<bool> pressures_now = active_pressures(conditions, t_new);
  const bool new_matrix = new_geometry || !(std::abs(dt - matrix_dt) <= 1e-12 * dt) ||
                          pressures_now != matrix_pressures ||
                          Utilities::MPI::logical_or(draining != matrix_draining, comm);
  if (new_matrix)
    assemble_matrix(dt);
  assemble_rhs(t_new, dt);
  report.assembly_seconds += timer.wall_time();
  if (new_matrix) {
    timer.restart();
    give_matrix_to_solver();
    matrix_dt = dt;
    matrix_pressures = pressures_now;
    matrix_draining = draining;
    report.new_matrix = true;
    report.factorisation_seconds += timer.wall_time();
  }
  timer.restart();
  // The system's constrained rows ask for zero (distribute() puts the values in
  // after the solve): a start that keeps them would begin with a large residual.
  if (solver->takes_initial_guess())
    constraints.set_zero(owned_solution);
  report.iterations += solve_system();
  constraints.distribute(owned_solution);
  solution = owned_solution;
  report.solve_seconds += timer.wall_time();
  ++report.drain_rounds;
}

double BiotProblem::time_matrix_vector_product(unsigned int repeats) const {
  const Impl& m = *impl_;
  LA::MPI::Vector x(m.owned_solution), y(m.owned_solution);
  x = 1.0;
  Timer timer(m.comm, /*sync_lap_times=*/true);
  for (unsigned int i = 0; i < repeats; ++i)
    m.matrix.vmult(y, x);
  timer.stop();
  return timer.last_wall_time() / repeats;
}

bool BiotProblem::is_removed(unsigned int active_cell_index) const {
  return !impl_->removed.empty() && impl_->removed[active_cell_index];
}

double BiotProblem::time() const {
  return impl_->time;
}
MPI_Comm BiotProblem::communicator() const {
  return impl_->comm;
}
const Mesh& BiotProblem::mesh() const {
  return impl_->mesh;
}
const BiotSetup& BiotProblem::setup() const {
  return impl_->setup;
}
const FieldLayout& BiotProblem::layout() const {
  return impl_->layout;
}
const Mapping<2>& BiotProblem::mapping() const {
  return impl_->mapping;
}
const DoFHandler<2>& BiotProblem::dof_handler() const {
  return impl_->dof_handler;
}
const LA::MPI::Vector& BiotProblem::solution() const {
  return impl_->solution;
}

} // namespace settlewell
