#pragma once

#include "settlewell/boundary/conditions.h"
#include "settlewell/core/types.h"
#include "settlewell/core/units.h"
#include "settlewell/materials/cam_clay.h"
#include "settlewell/materials/poroelastic.h"
#include "settlewell/materials/retention.h"

#include <deal.II/base/point.h>
#include <deal.II/base/symmetric_tensor.h>
#include <deal.II/base/types.h>

#include <cmath>
#include <functional>
#include <map>
#include <string>
#include <vector>

namespace settlewell {

/// Soil taken out of the model: at `start` (s) every cell for which `removes` is
/// true (given its centre and region id) leaves the model, and the forces it
/// carried on the cells that stay (its weight and its absolute stress, the
/// geostatic state included) are released linearly until `release_end`.
struct ExcavationEvent {
  double start = 0.0;
  double release_end = 0.0; ///< s; equal to `start`: released at once
  std::function<bool(const dealii::Point<2>& centre, dealii::types::material_id region)>
      removes;
};

/// A spring that holds one displacement component of the node at `at` from time
/// `from` (s) on: a prop. The force it puts on the soil or wall, along the unit
/// direction `direction` (0 = x, 1 = y) with sign `sense`, is
///   N = preload - stiffness * (u - u_from) . sense e_direction,
/// u_from the node's displacement when the spring is fitted (kN per metre run in
/// plane strain, for the full circle in axisymmetric; compression positive).
struct PointSpring {
  std::string name;
  dealii::Point<2> at;
  unsigned int direction = 0;
  double sense = 1.0;
  double stiffness = 0.0; ///< kN/m (per metre run, or for the full circle)
  double preload = 0.0;   ///< kN (per metre run, or for the full circle)
  double from = 0.0;      ///< s
};

/// The geostatic state that excavation releases, kPa and kN/m^3.
struct GeostaticState {
  /// Effective stress (xx, yy, zz = out of plane or hoop), tension positive.
  std::function<dealii::SymmetricTensor<2, 3>(const dealii::Point<2>&,
                                              dealii::types::material_id)>
      effective_stress;
  /// Unit weight by region name (the body force is this, downward).
  std::map<std::string, double> unit_weights;
};

/// A region whose skeleton follows Modified Cam Clay instead of linear elasticity.
/// Its PoroelasticMaterial still gives the conductivity, storage and Biot
/// coefficient; its E and nu' serve only as the stiffness the iterative solver's
/// preconditioner assumes.
struct ClaySkeleton {
  CamClayParameters parameters;
  /// The vertical preconsolidation pressure sigma'p at an elevation (m) where the
  /// start's vertical effective stress is sigma'v0, kPa.
  std::function<double(double vertical_start, double elevation)> preconsolidation;
  /// K0 of the past one-dimensional loading to sigma'p (the yield ellipse passes
  /// through the stress it reached).
  double k0_past = 0.5;
  /// Ck, the change of void ratio for a tenfold change of conductivity: the
  /// conductivity follows k = k0 10^((e - e0)/Ck) (Taylor 1948), with e - e0 =
  /// v0 tr(eps) in small strain. 0: the conductivity stays that of the material.
  double permeability_change_index = 0.0;

  /// c of k = k0 exp(c tr eps) (tr eps tension positive, from the start), 1/-; 0
  /// when the conductivity stays.
  double conductivity_rate() const {
    return permeability_change_index > 0.0
               ? std::log(10.0) * parameters.specific_volume / permeability_change_index
               : 0.0;
  }

  /// p'c of the yield ellipse at an elevation (m) where the start's effective
  /// stress (tension positive) is `start`, kPa.
  double yield_size(const dealii::SymmetricTensor<2, 3>& start, double elevation) const {
    return yield_size_from_vertical_preconsolidation(
        preconsolidation(-start[1][1], elevation), k0_past,
        parameters.critical_state_slope);
  }
};

/// Newton's method for a step when some skeleton is nonlinear.
struct NewtonSettings {
  unsigned int max_iterations = 25;
  /// Converged when each field's residual (the displacement rows and the storage
  /// rows) has fallen below this fraction of the largest that a step's start
  /// presented so far in the run.
  double tolerance = 1e-8;
  /// Each correction's linear solve stops at this fraction of the residual when
  /// it runs GMRES with a kept factor (an inexact Newton step; a new factor
  /// solves exactly).
  double linear_tolerance = 1e-4;
  /// A step that fails is taken again as two halves, at most this many times
  /// over (down to 1/2^max_halvings of the step).
  unsigned int max_halvings = 5;
  /// A correction after which the residual does not fall (or a point's return
  /// fails) is halved, at most this many times (a line search; 0: none).
  unsigned int line_search_cuts = 4;
  /// Each step's first iterate carries the last step's trend on (else it starts
  /// from the last step's state).
  bool carry_trend = true;
};

/// Everything the Biot core needs besides the mesh. Plain data, no parsing.
struct BiotSetup {
  AnalysisType analysis = AnalysisType::plane_strain;
  double gamma_w = units::default_gamma_w; ///< kN/m^3
  /// Material of every region of the mesh, by region name.
  std::map<std::string, PoroelasticMaterial> materials;
  BoundaryConditions conditions;
  /// Initial hydraulic head h0(x), m; the initial pore pressure is gamma_w (h0 - y).
  /// Prescribed heads and pore pressures are turned into changes from this state.
  std::function<double(const dealii::Point<2>&)> initial_head =
      [](const dealii::Point<2>&) { return 0.0; };
  /// Hold every displacement at zero: transient seepage with storage S alone
  /// (the uncoupled diffusion that Theis's solution assumes).
  bool rigid_skeleton = false;
  /// Excavation in time order; needs `geostatic` (the state it releases).
  std::vector<ExcavationEvent> excavation;
  GeostaticState geostatic;
  /// Start from a drained gravity-loading solve (BiotProblem::settle_under_gravity)
  /// instead of taking `geostatic` as in equilibrium. Its out-of-balance force, with
  /// the unit weights and the initial pore pressure, then stays in every step's
  /// right-hand side, and the displacement unknowns are measured from that state.
  bool gravity_loading = false;
  /// The water level in the pit (head, m) at time t. When set, the surface that
  /// excavation exposes drains: the pore pressure there stays at or below the
  /// pit's, gamma_w max(0, h_pit - y), water leaving where it would be higher and
  /// none entering where it is lower (decided by an active set each step).
  TimeFunction pit_water_head;
  /// Regions (by name) with a Cam Clay skeleton; they need `geostatic` (the start
  /// stress). Their steps are solved by Newton's method.
  std::map<std::string, ClaySkeleton> clays;
  /// Regions (by name) whose soil drains above the water table along a retention
  /// curve (unsaturated flow with Bishop's effective stress, CellKernel::
  /// add_unsaturated_terms). Their steps are solved by Newton's method with
  /// implicit Euler: the mixed form keeps mass only with a one-step scheme.
  std::map<std::string, RetentionCurve> unsaturated;
  /// Whether steps are solved by Newton's method: with a clay with a stress
  /// history or a soil with a retention curve.
  bool solved_by_newton() const { return !clays.empty() || !unsaturated.empty(); }
  NewtonSettings newton;
  /// Props and other point supports, fitted at their `from` times.
  std::vector<PointSpring> springs;

  /// automatic: direct up to `direct_limit` unknowns, iterative above. MUMPS
  /// with a reused factorisation beat the iterative solver at every size
  /// measured (up to 1.4 M unknowns, about 4.7 KB per unknown), so the limit is
  /// where its memory, not its speed, becomes the concern.
  SolverChoice solver = SolverChoice::automatic;
  double solver_tolerance = 1e-10; ///< relative residual (iterative)
  std::size_t direct_limit = 1500000;
};

} // namespace settlewell
