#pragma once

#include "settlewell/boundary/conditions.h"
#include "settlewell/core/types.h"
#include "settlewell/core/units.h"
#include "settlewell/materials/poroelastic.h"

#include <deal.II/base/point.h>

#include <functional>
#include <map>
#include <string>

namespace settlewell {

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

  /// automatic: direct up to `direct_limit` unknowns, iterative above. MUMPS
  /// with a reused factorisation beat the iterative solver at every size
  /// measured (up to 1.4 M unknowns, about 4.7 KB per unknown), so the limit is
  /// where its memory, not its speed, becomes the concern.
  SolverChoice solver = SolverChoice::automatic;
  double solver_tolerance = 1e-10; ///< relative residual (iterative)
  std::size_t direct_limit = 1500000;
};

} // namespace settlewell
