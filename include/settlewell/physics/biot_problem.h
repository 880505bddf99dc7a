#pragma once

#include "settlewell/core/linear_algebra.h"
#include "settlewell/core/state_archive.h"
#include "settlewell/mesh/mesh.h"
#include "settlewell/physics/biot_setup.h"
#include "settlewell/physics/field_layout.h"

#include <deal.II/dofs/dof_handler.h>
#include <deal.II/fe/mapping.h>

#include <memory>
#include <optional>

namespace settlewell {

/// What one time step did.
struct StepReport {
  double time = 0.0;           ///< s, at the end of the step
  double dt = 0.0;             ///< s
  bool new_matrix = false;     ///< the matrix was assembled and factorised in this step
  unsigned int iterations = 0; ///< of the linear solver (summed over the rounds)
  unsigned int drain_rounds =
      1;                      ///< solves until the drained surface's active set settled
  bool drains_settled = true; ///< false: the round limit was reached
  /// The water entering the one-way points kept held to the step's end (points
  /// that left the draining set and would have come back) over the water leaving
  /// the draining points, at the step's last solve: what those points feed in.
  double held_inflow_share = 0.0;
  double assembly_seconds = 0.0;      ///< matrix (if new) and right-hand side
  double factorisation_seconds = 0.0; ///< solver set-up for a new matrix
  double solve_seconds = 0.0;
  /// With a clay (Newton's method): the solves of the step, the points that were
  /// yielding at its end, and the residual before each solve and at the end,
  /// relative to the largest a step started with.
  unsigned int newton_iterations = 0;
  unsigned int factorisations = 0;   ///< in this step (Newton's method)
  unsigned int line_search_cuts = 0; ///< corrections halved by the line search
  unsigned int yielding_points = 0;
  std::vector<double> newton_residuals;
  /// Steps the step was taken in: 1, or more after a failed Newton step was
  /// taken again in halves.
  unsigned int sub_steps = 1;
  /// s: the length of the step's last sub-step (dt when it was taken whole). The
  /// water balance and storage after a step are rates at its end; times dt they
  /// give the step's volumes.
  double last_dt = 0.0;
};

/// Quasi-static Biot consolidation on a mesh: Taylor-Hood Q2^2 x Q1, BDF2 in time
/// (implicit Euler where a step has no usable history; see step_weights). Unknowns
/// are the displacement and the excess pore pressure (change from the initial
/// state) at the current time. The matrix depends only on the effective step dt'
/// (2/3 of a step on a rung of equal steps); it is assembled and factorised once per
/// distinct dt' and reused.
class BiotProblem {
public:
  /// Checks the setup against the mesh (names, materials) and distributes dofs.
  /// The mesh must outlive the problem. Collective.
  BiotProblem(const Mesh& mesh, BiotSetup setup);
  ~BiotProblem();
  BiotProblem(const BiotProblem&) = delete;
  BiotProblem& operator=(const BiotProblem&) = delete;

  /// One step from time() to t_new (s): BDF2 after a step (step_weights), implicit
  /// Euler at the start and after cells are dug or props fitted. Collective.
  StepReport advance_to(double t_new);

  /// The gravity-loading start (setup().gravity_loading), before the first step: a
  /// drained solve at t = 0, the excess pore pressure held at zero, that puts the
  /// start state (unit weights, initial pore pressure, geostatic stress) in
  /// equilibrium. Its displacement is the reference the reported displacements are
  /// measured from. Collective.
  StepReport settle_under_gravity();
  /// From now on displacements are reported from the present ones (from the start
  /// of a stage the user names). Collective.
  void set_displacement_reference();
  /// solution() with the displacements measured from the reference: the start of
  /// the analysis (after gravity loading), or set_displacement_reference(). The
  /// same vector as solution() while there is no reference. With ghost values.
  const LA::MPI::Vector& reported_solution() const;

  /// Water leaving the soil through a boundary or internal line during the last
  /// step, m^3/s (per metre run in plane strain; for the full circle in
  /// axisymmetric). Where a head is prescribed this is the consistent flux (the
  /// residual of the storage equation at the prescribed dofs), not a derivative of
  /// heads. Collective.
  double outflow(const std::string& line) const;
  /// outflow() of each line, from one evaluation of the storage residual (the
  /// cost of one line for all of them). Collective.
  std::vector<double> outflows(const std::vector<std::string>& lines) const;

  /// The water that crossed the model's boundaries and lines in the last step,
  /// m^3/s: the net outflow (out minus in) and the gross exchange (out plus in, each
  /// prescribed dof and flux line counted once), the scale of the water balance.
  struct WaterExchange {
    double net_outflow = 0.0;
    double gross = 0.0;
  };
  /// Collective.
  WaterExchange water_exchange() const;
  /// Water leaving through the drained surface that excavation exposed, during the
  /// last step (consistent flux), m^3/s. Collective.
  double drained_surface_outflow() const;
  /// How a line with a one-way condition (water leaves, none enters) stood in the
  /// last step.
  struct OneWayState {
    bool one_way = false; ///< a one-way condition applies on the line now
    /// A pumped line whose pump stopped: held, its net flow would have entered
    /// the ground, so it is sealed all along.
    bool stopped = false;
    /// The line's held pressure is zero all along: what it holds lies below it (a
    /// well whose target head is below its screen has run dry).
    bool dry = false;
  };
  /// Collective.
  OneWayState one_way_state(const std::string& line) const;
  /// Water taken into storage during the last step, the integral of
  /// S dp + alpha d(eps_v), m^3 (per metre run, or for the full circle): the net
  /// change, which with water_exchange().net_outflow * dt closes the water balance,
  /// and the gross (the sum of every cell's change, whatever its sign), its scale.
  struct StorageChange {
    double net = 0.0;
    double gross = 0.0;
  };
  /// Collective.
  StorageChange storage_change() const;

  /// The water the soils with a retention curve have given up by draining since
  /// the start, the integral of theta(P0) - theta(P) over them (negative where
  /// they took water in), m^3 (per metre run, or for the full circle): the volume
  /// drained from the pores above the phreatic line. 0 without such soils.
  /// Collective.
  double water_drained_from_pores() const;

  /// Seconds for one product of the system matrix with a vector, averaged over
  /// `repeats` products (for benchmarks; the matrix must be assembled). Collective.
  double time_matrix_vector_product(unsigned int repeats) const;

  /// The force in spring k of setup().springs (compression positive; its preload
  /// before it is fitted), kN per metre run or for the full circle. Collective.
  double spring_force(std::size_t k) const;
  /// Whether spring k is fitted at time().
  bool spring_fitted(std::size_t k) const;

  /// How far the start state (setup().geostatic, with the displacement now, which
  /// after gravity loading holds its equilibrium) is from equilibrium where
  /// digging will release it, over the free displacement dofs on a future dug
  /// boundary (where a lift meets what stays or another lift): the largest
  /// out-of-balance force at one, their sum, and the sum of the forces the dug
  /// cells carry there, kN per metre run (for the full circle in axisymmetric). Digging
  /// releases only the forces of the dug cells, so an imbalance there moves the ground as
  /// if it were load. Level, horizontally layered ground gives round-off; a wall with its
  /// own K0 does not. Collective.
  struct OutOfBalance {
    double largest = 0.0, summed = 0.0, released = 0.0;
  };
  OutOfBalance geostatic_out_of_balance() const;

  /// Checkpoints (checkpoint.cc). Saves the time, the digging and props done so far
  /// into `a`, and with deal.II's distributed serialisation, into the files named
  /// from `mesh_file`: the triangulation, the solution, the drained surface's
  /// active set and the forces the dug cells released. Collective.
  void save_checkpoint(StateArchive& a, const std::string& mesh_file) const;
  /// Restores the state save_checkpoint saved, on any number of processes. The
  /// triangulation must have been loaded from the same `mesh_file` (load_mesh) before
  /// this problem was built. Collective.
  void load_checkpoint(StateArchive& a);

  /// A locally owned cell of a Cam Clay region, as committed at time(): the mean
  /// over its quadrature points of the absolute effective stress (xx, yy, zz, xy,
  /// kPa, tension positive), of the yield size p'c (kPa) and of the yield ratio
  /// p'c / (p' + q^2/(M^2 p')), 1 where the clay is yielding and above 1 inside
  /// the yield surface. Empty for any other cell.
  struct ClayCellState {
    PlaneTensor stress{};
    double yield_size = 0.0;
    double yield_ratio = 0.0;
  };
  std::optional<ClayCellState> clay_cell_state(unsigned int active_cell_index) const;
  /// Whether some region has a Cam Clay skeleton.
  bool has_clays() const;
  /// c of a region's conductivity k = k0 exp(c tr eps) (a clay with a
  /// permeability change index), 0 where the conductivity stays.
  double conductivity_rate(dealii::types::material_id region) const;
  /// Where a Cam Clay region has yielded so far: its quadrature points whose yield
  /// size p'c differs from the start's (they went past the yield surface at some
  /// time), the box that holds them, and the largest change of p'c. Collective.
  struct ClayYield {
    std::string region;
    unsigned int points = 0, yielded = 0;
    double x_from = 0.0, x_to = 0.0, y_from = 0.0, y_to = 0.0; ///< m, of the yielded
    double largest_change = 0.0; ///< of p'c, kPa (positive: it grew)
  };
  std::vector<ClayYield> clay_yield() const;

  /// Whether the cell of this active index has been taken out by excavation.
  bool is_removed(unsigned int active_cell_index) const;

  double time() const;
  MPI_Comm communicator() const;
  const Mesh& mesh() const;
  const BiotSetup& setup() const;
  const FieldLayout& layout() const;
  const dealii::Mapping<2>& mapping() const;
  const dealii::DoFHandler<2>& dof_handler() const;
  /// Displacement (m) and excess pore pressure (kPa) at time(), with ghost values.
  const LA::MPI::Vector& solution() const;

private:
  struct Impl;
  std::unique_ptr<Impl> impl_;
};

} // namespace settlewell
