#pragma once

// Private to src/physics: the state of a BiotProblem, shared by the files that
// implement it (biot_problem.cc: set-up, assembly and stepping; water_balance.cc:
// discharges and storage; excavation.cc: cells taken out and their forces).
#include "settlewell/physics/biot_problem.h"
#include "settlewell/physics/cell_kernel.h"
#include "settlewell/physics/constraints.h"
#include "settlewell/physics/internal_lines.h"
#include "settlewell/physics/resolved_conditions.h"
#include "settlewell/solvers/linear_solver.h"

#include <deal.II/base/table.h>
#include <deal.II/dofs/dof_tools.h>
#include <deal.II/fe/mapping_q1.h>
#include <deal.II/lac/affine_constraints.h>

#include <functional>
#include <limits>
#include <memory>
#include <optional>
#include <set>
#include <unordered_map>
#include <vector>

namespace settlewell {

using namespace dealii; // as in the two files that include this one

struct BiotProblem::Impl {
  Impl(const Mesh& mesh, BiotSetup setup);

  /// A pressure dof on a line that takes water only (one_way_flow.cc): where it
  /// is, and what limits its pressure (an index into conditions.pressures, or
  /// dug_surface).
  static constexpr std::size_t dug_surface = std::numeric_limits<std::size_t>::max();
  struct OneWayDof {
    Point<2> x;
    std::size_t condition = dug_surface;
  };

  ConstraintInputs constraint_inputs() const {
    return {dof_handler, layout,   conditions,         plate,   setup.rigid_skeleton,
            owned,       relevant, pressure_line_dofs, removed, drained_now};
  }
  /// Whether a cell is in the model (not excavated).
  bool in_model(const DoFHandler<2>::active_cell_iterator& cell) const {
    return removed.empty() || !removed[cell->active_cell_index()];
  }
  void setup_dofs();
  void choose_solver();
  /// (x, y) of each displacement node, in the order of the owned dofs `u`.
  std::vector<double> displacement_node_coordinates(const IndexSet& u) const;
  /// `target` sized to the owned dofs with the couplings `coupling` allows.
  void reinit_distributed(LA::MPI::SparseMatrix& target,
                          const Table<2, DoFTools::Coupling>& coupling) const;
  void find_internal_lines();
  void add_line_fluxes(CellKernel& kernel,
                       const DoFHandler<2>::active_cell_iterator& cell,
                       double t,
                       double dt,
                       Vector<double>& cell_rhs) const;
  /// (`old_state` is scratch space of the cell's size.)
  void add_old_state_and_fluxes(CellKernel& kernel,
                                const DoFHandler<2>::active_cell_iterator& cell,
                                double t,
                                double dt,
                                Vector<double>& old_state,
                                Vector<double>& cell_rhs) const;
  /// The unconstrained storage-equation residual (row times solution minus
  /// right-hand side) of a solve at (t, dt), at the pressure dofs in `wanted`:
  /// dt times the water leaving through each. Owned entries. Collective.
  void storage_residual(double t,
                        double dt,
                        const std::set<types::global_dof_index>& wanted,
                        LA::MPI::Vector& out) const;
  /// Water leaving through a set of prescribed-pressure dofs in the last step, m^3/s.
  double reaction_outflow(const std::set<types::global_dof_index>& dofs) const;
  double prescribed_outflow(const FluxBoundary& flux) const;
  /// Sets old_solution to the weighted old state of a step (step_weights): x_n, or
  /// (1 - c) x_n + c x_{n-1}. Before shift_history.
  void form_old_state(double previous_weight);
  /// Keeps x_n as the step's x_{n-1} in previous_solution, and for a solver that
  /// iterates from a start puts in owned_solution the last solution extrapolated
  /// linearly to a step of length dt from the one before.
  void shift_history(double dt);
  /// Sets row_signs if the solver wants the symmetric form of the system.
  void set_row_signs();
  /// Hands the assembled matrix (and Schur approximation) to the solver, its
  /// pressure rows negated first, in place, if the solver wants the symmetric
  /// form: call it once after each assemble_matrix.
  void give_matrix_to_solver();
  /// Solves for owned_solution with rhs (negated like the matrix). Returns the
  /// solver's iterations.
  unsigned int solve_system();
  /// One assembly and solve of the step to t_new (matrix rebuilt when needed).
  void solve_step(double t_new, double dt, bool new_geometry, StepReport& report);
  /// (Clay cells get no displacement block and no stress force here: a Newton step
  /// adds them in each iteration, add_clay_terms.)
  void assemble_matrix(double dt);
  void assemble_rhs(double t_new, double dt);
  void add_face_terms(CellKernel& kernel,
                      const DoFHandler<2>::active_cell_iterator& cell,
                      double t_new,
                      double dt,
                      Vector<double>& cell_rhs) const;
  bool has_inhomogeneity(const std::vector<types::global_dof_index>& dofs) const;

  // The storage terms (storage_rows.cc).
  /// The pressure rows of each owned cell's matrix at dt = 0, (alpha B, S M), in
  /// the cell's dof order: a state's storage terms (alpha div u + S p against each
  /// pressure shape function) are their product with its local values.
  struct StorageRows {
    std::vector<unsigned int> rows;  ///< local indices of the pressure dofs
    std::vector<std::size_t> offset; ///< by active cell index, into values
    std::vector<double> values;
  } storage_rows;
  /// Integrates storage_rows (constructor, after setup_dofs).
  void build_storage_rows();
  /// An owned cell's matrix at time step dt, from its two parts (the matrix is
  /// A0 + dt A1) integrated at the first call and kept. For the cells that need a
  /// matrix every step (prescribed values, water-balance lines): a boundary's
  /// worth, so the memory stays small. `kernel` is already set to `cell`.
  const FullMatrix<double>&
  cell_matrix_at(CellKernel& kernel,
                 const DoFHandler<2>::active_cell_iterator& cell,
                 double dt) const;
  /// cell_matrix_at's parts by active cell index, and its result. Mutable: a
  /// cache behind const queries (water balance), filled on first use.
  mutable std::unordered_map<unsigned int,
                             std::pair<FullMatrix<double>, FullMatrix<double>>>
      cell_matrix_parts;
  mutable FullMatrix<double> cell_matrix_now;
  /// Adds the storage terms of a state (the cell's local values) to `out`.
  void add_storage_terms(const DoFHandler<2>::active_cell_iterator& cell,
                         const Vector<double>& local_state,
                         Vector<double>& out) const;

  // The start in equilibrium and the reported displacement (initial_equilibrium.cc).
  /// Adds a cell's out-of-balance force in the start state (the geostatic effective
  /// stress, the initial pore pressure and the unit weight) to `out`'s
  /// displacement rows.
  void add_start_imbalance(CellKernel& kernel,
                           const DoFHandler<2>::active_cell_iterator& cell,
                           Vector<double>& out) const;
  /// Recomputes `reported` from the solution and the reference (if any).
  void update_reported();
  bool settled = false;       ///< the gravity-loading solve is done (or not needed)
  bool has_reference = false; ///< displacements are reported from `reference`
  LA::MPI::Vector reference;  ///< owned; displacement dofs only
  LA::MPI::Vector reported;   ///< solution - reference, with ghosts

  // Excavation (excavation.cc).
  /// Unit weights by region id from the geostatic state (constructor).
  void map_unit_weights();
  /// Removal flags and event flags (constructor).
  void prepare_excavation();
  /// Takes out the cells of every event that has started by time t and not been
  /// applied yet, keeping the forces they carried. Returns whether any was applied.
  bool excavate(double t);
  /// Minus the forces the removed cells carried, released by the fraction due at t.
  void add_release_loads(double t, LA::MPI::Vector& target) const;
  /// The owned dofs where cells that different events remove meet, or dug cells meet
  /// cells that stay: the future dug boundaries. Collective.
  IndexSet dug_boundary_dofs() const;
  /// Sets `removed` from the events applied (`excavated`): a cell is out if one of
  /// them removes it. For a checkpoint's state (checkpoint.cc).
  void mark_removed_cells();
  /// Gives the deactivated dofs (those of removed cells only) a unit-scaled diagonal.
  void set_deactivated_diagonals(LA::MPI::SparseMatrix& target) const;

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
  LA::MPI::SparseMatrix schur; ///< pressure-block preconditioner (iterative solver only)
  LA::MPI::Vector rhs, owned_solution, solution, old_solution;
  /// Owned: +1 in displacement rows, -1 in pressure rows; empty unless the solver
  /// wants the symmetric form. Matrix and rhs are scaled by it before a solve.
  LA::MPI::Vector row_signs;
  std::unique_ptr<LinearSolver> solver;
  /// Per conditions.pressures: for internal lines and one-way boundaries.
  std::vector<LineDofs> pressure_line_dofs;
  std::vector<double> unit_weights; ///< by region id, kN/m^3 (with excavation only)
  std::vector<bool> removed;        ///< by active cell index: taken out by excavation
  std::vector<bool> excavated;      ///< per setup.excavation: applied
  /// A locally owned removed cell: its dofs, and in its displacement rows the
  /// geostatic out-of-balance force and the force of its stress change at removal.
  struct ReleasedCell {
    std::size_t event;
    unsigned int cell; ///< active cell index
    std::vector<types::global_dof_index> dofs;
    Vector<double> geostatic, carried;
  };
  std::vector<ReleasedCell> released;

  // Clays with a stress history (clay_history.cc) and their Newton steps
  // (newton_step.cc).
  struct ClayPoint {
    const CamClayParameters* parameters = nullptr; ///< in setup.clays
    PlaneTensor start_stress{};                    ///< the start state's effective stress
    double start_yield_size = 0.0;                 ///< p'c at the start, kPa
    Point<2> x;                                    ///< where it is, m
    types::material_id region = 0;
    CamClayState committed, trial;
    PlaneTangent tangent{};
    PlaneTensor start_strain{}; ///< at the step's start (since t = 0)
    PlaneTensor strain{};       ///< of the current iterate
  };
  /// Throws `Error` with the lowest rank's `problem` on every process if any
  /// process has one (empty: none). Collective.
  template <typename Error>
  void throw_first_problem(const std::string& problem) const;
  /// The points of every owned clay cell and their start states (constructor).
  void prepare_clays();
  /// Calls `visit` with every owned clay point and its strain in `state`.
  void for_each_clay_cell_strain(
      const LA::MPI::Vector& state,
      const std::function<void(ClayPoint&, const PlaneTensor&)>& visit);
  /// Each clay point's strain at step_start (its start_strain and strain).
  void record_step_start_strains();
  /// Trial states and tangents of every clay point for the strain from step_start
  /// to solution. Returns how many yield, over all processes. Collective.
  unsigned int update_clay_points();
  /// The trial states become the committed ones (a step accepted).
  void commit_clay_points();
  bool has_clay_points(const DoFHandler<2>::active_cell_iterator& cell) const;
  /// The clay cell's tangent block, added to its cell matrix, and its stress less
  /// its tangent's share, to its right-hand side (from the points' current state).
  void add_clay_terms(CellKernel& kernel,
                      const DoFHandler<2>::active_cell_iterator& cell,
                      FullMatrix<double>& cell_matrix,
                      Vector<double>& cell_rhs) const;
  /// A clay cell's flow terms when its conductivity follows its strain (Ck given:
  /// conductivity_rate of its region not 0), about the state `local`
  /// (CellKernel::add_strain_dependent_flow).
  void add_clay_flow(CellKernel& kernel,
                     const DoFHandler<2>::active_cell_iterator& cell,
                     const Vector<double>& local,
                     double dt,
                     FullMatrix<double>& cell_matrix,
                     Vector<double>& cell_rhs) const;
  struct FieldNorms {
    double u = 0.0, p = 0.0;
  };
  /// The norms of b - K x in the displacement and the storage rows (after
  /// assembly, before the solver's row signs). Collective.
  FieldNorms newton_residual();
  /// Adds the solution of K delta = newton_r to the iterate (a kept factor as
  /// GMRES's preconditioner, or a new factorisation).
  void add_newton_correction(StepReport& report);
  LA::MPI::Vector newton_r;     ///< the residual of the iterate (newton_residual)
  LA::MPI::Vector newton_delta; ///< the last correction (add_newton_correction)
  /// The iterate's residual relative to largest_drive (which a step's first
  /// iterate may raise): the clay points updated if asked, the system assembled.
  double newton_iterate_residual(double t_new,
                                 double dt,
                                 bool first_iteration,
                                 bool update_points,
                                 StepReport& report);
  /// The residual after the last correction, that correction halved while the
  /// residual does not fall below `previous` (a backtracking line search).
  double searched_residual(double t_new, double dt, double previous, StepReport& report);
  /// A Newton step's system: the parts no clay changes (`fixed_matrix` per dt',
  /// set of held pressures, set of draining dofs and geometry; `fixed_rhs` per
  /// solve), to which each iteration adds the clays' terms.
  void assemble_newton_system(double t_new, double dt, bool first_iteration);
  void add_clay_terms(double dt);
  LA::MPI::SparseMatrix fixed_matrix;
  LA::MPI::Vector fixed_rhs;
  double fixed_dt = std::numeric_limits<double>::quiet_NaN();
  std::vector<bool> fixed_pressures;
  /// The draining dofs `fixed_matrix` was condensed with: a dof that joins or
  /// leaves the set changes its row.
  std::set<types::global_dof_index> fixed_draining;
  bool newton_factor_ready = false; ///< the solver holds a factor of some tangent
  /// Whether the last correction left the residual `relative` at round-off.
  bool at_round_off(double relative) const;
  /// One step by Newton's method (replaces solve_step when there are clays).
  void solve_newton_step(double t_new, double dt, StepReport& report);
  /// One step from `time` to t_new (advance_to after its checks).
  StepReport take_step(double t_new);
  /// take_step for a run with clays: a step whose Newton iteration or material
  /// update fails is taken again as two halves, down to setup.newton.max_halvings
  /// halvings; past that the state stays at the last good one and the error is
  /// raised. Collective.
  StepReport take_clay_step(double t_new, unsigned int halvings);
  /// What a step changes before it is accepted (the state and its history).
  struct StepHistory {
    LA::MPI::Vector solution, previous_solution;
    double previous_dt = 0.0;
    unsigned int euler_steps_left = 0;
    std::set<types::global_dof_index> draining;
    std::vector<bool> one_way_open, pumped_stopped;
  };
  StepHistory kept_history() const;
  void restore(const StepHistory& kept);
  /// Every clay point's trial state back to its committed one, with the elastic
  /// tangent there.
  void reset_clay_trials();
  /// Per active cell, for a checkpoint: the committed stress (4) and yield size of
  /// each point of an owned clay cell, empty for any other cell.
  std::vector<std::vector<double>> clay_cell_values() const;
  /// Sets the committed states from clay_cell_values (resume). Collective.
  void load_clay_cell_values(const std::vector<std::vector<double>>& values);
  /// The last accepted step's start and length (0: none to carry on): the first
  /// iterate of a Newton step carries the last step's trend on.
  LA::MPI::Vector newton_previous;
  double newton_previous_dt = 0.0;
  std::vector<std::size_t> clay_offset; ///< by active cell index, into clay_points
  std::vector<ClayPoint> clay_points;
  unsigned int clay_points_per_cell = 0;
  std::vector<const ClaySkeleton*> clay_by_region; ///< by region id; null: elastic
  /// ClaySkeleton::conductivity_rate of a region, 0 if it is not a clay.
  double conductivity_rate(types::material_id region) const;
  LA::MPI::Vector step_start; ///< the solution at the step's start, with ghosts
  LA::MPI::Vector displacement_mask, pressure_mask; ///< 1 on the field's owned dofs
  FieldNorms largest_drive; ///< the largest residual at a step's start so far

  // Soil that drains above the water table (unsaturated_flow.cc).
  /// retention_by_region from setup.unsaturated (constructor).
  void prepare_unsaturated();
  std::vector<const RetentionCurve*>
      retention_by_region; ///< by region id; null: saturated
  bool is_unsaturated(const DoFHandler<2>::active_cell_iterator& cell) const {
    return cell->material_id() < retention_by_region.size() &&
           retention_by_region[cell->material_id()] != nullptr;
  }
  /// A partly saturated cell's terms (CellKernel::add_unsaturated_terms) at
  /// `solution` with the old state old_solution.
  void add_unsaturated_terms(CellKernel& kernel,
                             const DoFHandler<2>::active_cell_iterator& cell,
                             double dt,
                             FullMatrix<double>* tangent,
                             Vector<double>& residual) const;

  // Point springs, props (springs.cc).
  /// Finds the dof of every spring (collective; throws if its node is missing).
  void locate_springs();
  /// Fits the springs whose time has come, at the displacement now. Returns whether
  /// any was fitted.
  bool fit_springs(double t);
  void add_spring_stiffness(LA::MPI::SparseMatrix& target) const;
  void add_spring_loads(LA::MPI::Vector& target) const;
  /// A dof's value in the current solution, on every process. Collective.
  double value_of(types::global_dof_index dof) const;
  std::vector<types::global_dof_index> spring_dofs;
  std::vector<double> spring_fitted_at; ///< displacement at fitting; NaN: not fitted

  // Lines where water leaves but does not enter (one_way_flow.cc): the surface
  // excavation exposes, draining to the pit, and the one-way conditions.
  /// Sets `exposed`: the pressure dofs on faces between cells in the model and
  /// removed cells (the dug surface).
  void find_exposed();
  /// Sets one_way at the start of a step to t: the dofs of the one-way conditions
  /// that apply at t (the first in their order takes a shared dof), then the dug
  /// surface's. A dof that a line takes anew is held at first, one the dug surface
  /// takes anew sealed. A line that opens starts with its pump running.
  void gather_one_way(double t);
  /// Whether a one-way dof lies below the water of a pumped line at t.
  bool below_pumped_water(const OneWayDof& d, double t) const;
  /// Starts or stops the pumped lines from the solve at t whose storage residual
  /// at the draining dofs is `residual`: a running line whose net flow would enter
  /// the ground stops (and stays stopped for the step); a stopped one starts where
  /// the soil's pressure exceeds its limit anywhere along it. Collective.
  void switch_pumped_lines(double t, const LA::MPI::Vector& residual, double tolerance);
  /// The excess pressure at which a one-way dof drains at time t, kPa.
  double drain_limit(const OneWayDof& d, double t) const;
  /// The draining dofs that one source (a condition, or dug_surface) limits.
  std::set<types::global_dof_index> draining_of(std::size_t condition) const;
  /// Sets drained_now to the draining dofs and their limits at time t.
  void set_drain_values(double t);
  /// Re-decides which one-way dofs drain from the solve at (t, dt): a draining dof
  /// whose water would enter stops draining; a sealed one above its limit drains.
  /// Returns whether the set changed anywhere. Collective.
  bool update_draining(double t, double dt);
  std::map<types::global_dof_index, Point<2>> exposed;  ///< locally relevant
  std::map<types::global_dof_index, OneWayDof> one_way; ///< locally relevant
  std::vector<bool> one_way_open; ///< per conditions.pressures: it applied last step
  /// Per conditions.pressures: a pumped line whose pump stopped, and one that
  /// stopped in the current step (it does not start again within the step).
  std::vector<bool> pumped_stopped, stopped_in_step;
  /// One-way points that left the draining set in this step, and those that came
  /// back after leaving and stay held to the step's end (point_drains).
  std::set<types::global_dof_index> left_in_step, held_in_step;
  /// StepReport::held_inflow_share of the last solve (measure_held_inflow).
  double held_inflow_share = 0.0;
  /// Sets held_inflow_share from the storage residual of a solve. Collective.
  void measure_held_inflow(const LA::MPI::Vector& residual);
  /// Whether an owned one-way point that no pump rule decides drains after the
  /// last solve: a held point while water leaves it, a sealed one where the soil's
  /// pressure exceeds its limit; one that left and would come back stays held.
  bool point_drains(types::global_dof_index d,
                    const OneWayDof& at,
                    double t,
                    const LA::MPI::Vector& residual,
                    double inflow_tolerance);
  std::set<types::global_dof_index> draining, matrix_draining;
  std::map<types::global_dof_index, double> drained_now;
  /// Internal-line flux faces of each owned cell: (face, index into conditions.fluxes).
  std::unordered_map<unsigned int, std::vector<std::pair<unsigned int, std::size_t>>>
      line_flux_faces;
  double time = 0.0;
  double matrix_dt = std::numeric_limits<double>::quiet_NaN();
  /// The solution one step before the last (owned), and the last step's length (0:
  /// no usable history: the start, or new geometry). For the two-step scheme
  /// (step_weights) and the iterative solver's start.
  LA::MPI::Vector previous_solution;
  double previous_dt = 0.0;
  unsigned int euler_steps_left = 0; ///< for next_step_weights
  /// The last step's effective length dt' (step_weights), s: its storage equation
  /// reads s(solution) - s(old_solution) + dt' (H p - q) = 0.
  double effective_dt = std::numeric_limits<double>::quiet_NaN();
  std::vector<bool> matrix_pressures; ///< active prescribed pressures of the matrix
};

} // namespace settlewell
