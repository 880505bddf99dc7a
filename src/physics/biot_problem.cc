#include "settlewell/physics/biot_problem.h"

#include "settlewell/core/errors.h"
#include "settlewell/physics/cell_kernel.h"
#include "settlewell/physics/constraints.h"
#include "settlewell/physics/resolved_conditions.h"
#include "settlewell/solvers/linear_solver.h"

#include <deal.II/base/mpi.h>
#include <deal.II/dofs/dof_tools.h>
#include <deal.II/fe/mapping_q1.h>
#include <deal.II/lac/affine_constraints.h>
#include <deal.II/lac/dynamic_sparsity_pattern.h>
#include <deal.II/lac/sparsity_tools.h>

#include <chrono>
#include <cmath>
#include <limits>

namespace settlewell {

using namespace dealii;

namespace {

double seconds_since(std::chrono::steady_clock::time_point start) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
}

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

struct BiotProblem::Impl {
  Impl(const Mesh& mesh, BiotSetup setup);

  ConstraintInputs constraint_inputs() const {
    return {dof_handler,          layout, conditions, plate,
            setup.rigid_skeleton, owned,  relevant};
  }
  void setup_dofs();
  void assemble_matrix(double dt);
  void assemble_rhs(double t_new, double dt);
  void add_face_terms(CellKernel& kernel,
                      const DoFHandler<2>::active_cell_iterator& cell,
                      double t_new,
                      double dt,
                      Vector<double>& cell_rhs) const;
  bool has_inhomogeneity(const std::vector<types::global_dof_index>& dofs) const;

  const Mesh& mesh;
  BiotSetup setup;
  MPI_Comm comm;
  FieldLayout layout;
  MappingQ1<2> mapping;
  DoFHandler<2> dof_handler;
  ResolvedConditions conditions;
  std::vector<CellCoefficients> coefficients;
  std::optional<PlateLink> plate;
  IndexSet owned, relevant;
  AffineConstraints<double> constraints;
  LA::MPI::SparseMatrix matrix;
  LA::MPI::Vector rhs, owned_solution, solution, old_solution;
  std::unique_ptr<LinearSolver> solver;
  double time = 0.0;
  double matrix_dt = std::numeric_limits<double>::quiet_NaN();
};

BiotProblem::Impl::Impl(const Mesh& mesh_, BiotSetup setup_)
    : mesh(mesh_)
    , setup(std::move(setup_))
    , comm(mesh_.triangulation->get_communicator())
    , dof_handler(*mesh_.triangulation)
    , conditions(resolve_conditions(setup, mesh_.names))
    , coefficients(coefficients_by_region(setup, mesh_.names))
    , solver(make_direct_solver(comm)) {
  if (!(setup.gamma_w > 0.0))
    throw InputError("the unit weight of water must be positive, kN/m^3");
  if (setup.analysis == AnalysisType::axisymmetric)
    check_axisymmetric_domain(mesh);
  if (setup.rigid_skeleton && conditions.plate)
    throw InputError("a rigid plate cannot load a rigid skeleton");
  setup_dofs();
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
  make_constraints(constraint_inputs(), 0.0, constraints);

  DynamicSparsityPattern dsp(relevant);
  DoFTools::make_sparsity_pattern(dof_handler, dsp, constraints, false);
  SparsityTools::distribute_sparsity_pattern(dsp, owned, comm, relevant);
  matrix.reinit(owned, owned, dsp, comm);
  rhs.reinit(owned, comm);
  owned_solution.reinit(owned, comm);
  solution.reinit(owned, relevant, comm);
  old_solution.reinit(owned, relevant, comm);
}

void BiotProblem::Impl::assemble_matrix(double dt) {
  matrix = 0.0;
  CellKernel kernel(layout, setup.analysis, mapping);
  FullMatrix<double> cell_matrix(kernel.dofs_per_cell(), kernel.dofs_per_cell());
  std::vector<types::global_dof_index> dofs(kernel.dofs_per_cell());
  for (const auto& cell : dof_handler.active_cell_iterators()) {
    if (!cell->is_locally_owned())
      continue;
    kernel.reinit(cell);
    cell_matrix = 0.0;
    kernel.add_matrix(coefficients[cell->material_id()], dt, cell_matrix);
    cell->get_dof_indices(dofs);
    constraints.distribute_local_to_global(cell_matrix, dofs, matrix);
  }
  matrix.compress(VectorOperation::add);
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
      if (fb.id == id)
        kernel.add_face_outflow(f, dt, fb.outflow, t_new, cell_rhs);
  }
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
  Vector<double> cell_rhs(n);
  FullMatrix<double> cell_matrix(n, n);
  std::vector<types::global_dof_index> dofs(n);
  for (const auto& cell : dof_handler.active_cell_iterators()) {
    if (!cell->is_locally_owned())
      continue;
    kernel.reinit(cell);
    cell->get_dof_indices(dofs);
    const CellCoefficients& c = coefficients[cell->material_id()];
    cell_rhs = 0.0;
    kernel.add_old_state(c, old_solution, cell_rhs);
    const Tensor<1, 2> b = conditions.body_force(cell->material_id(), t_new);
    if (b.norm() > 0.0)
      kernel.add_body_force(b, cell_rhs);
    if (cell->at_boundary())
      add_face_terms(kernel, cell, t_new, dt, cell_rhs);
    if (has_inhomogeneity(dofs)) {
      // Prescribed values enter the right-hand side through the cell matrix;
      // only cells that touch them need it.
      cell_matrix = 0.0;
      kernel.add_matrix(c, dt, cell_matrix);
      constraints.distribute_local_to_global(cell_rhs, dofs, rhs, cell_matrix);
    } else {
      constraints.distribute_local_to_global(cell_rhs, dofs, rhs);
    }
  }
  rhs.compress(VectorOperation::add);
}

BiotProblem::BiotProblem(const Mesh& mesh, BiotSetup setup)
    : impl_(std::make_unique<Impl>(mesh, std::move(setup))) {}

BiotProblem::~BiotProblem() = default;

StepReport BiotProblem::advance_to(double t_new) {
  Impl& m = *impl_;
  const double dt = t_new - m.time;
  if (!(dt > 0.0))
    throw InputError("time steps must move forward (from t = " + std::to_string(m.time) +
                     " s to " + std::to_string(t_new) + " s)");
  StepReport report;
  report.time = t_new;
  report.dt = dt;
  const auto start = std::chrono::steady_clock::now();
  m.old_solution = m.solution;
  make_constraints(m.constraint_inputs(), t_new, m.constraints);
  report.new_matrix = !(std::abs(dt - m.matrix_dt) <= 1e-12 * dt);
  if (report.new_matrix)
    m.assemble_matrix(dt);
  m.assemble_rhs(t_new, dt);
  report.assembly_seconds = seconds_since(start);
  if (report.new_matrix) {
    const auto factor_start = std::chrono::steady_clock::now();
    m.solver->set_matrix(m.matrix);
    m.matrix_dt = dt;
    report.factorisation_seconds = seconds_since(factor_start);
  }

  const auto solve_start = std::chrono::steady_clock::now();
  report.iterations = m.solver->solve(m.rhs, m.owned_solution);
  m.constraints.distribute(m.owned_solution);
  m.solution = m.owned_solution;
  report.solve_seconds = seconds_since(solve_start);
  m.time = t_new;
  return report;
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
std::string BiotProblem::solver_name() const {
  return impl_->solver->name();
}

} // namespace settlewell
