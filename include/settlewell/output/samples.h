#pragma once

#include "settlewell/output/derived.h"
#include "settlewell/physics/biot_problem.h"

#include <deal.II/base/point.h>

#include <memory>
#include <string>
#include <vector>

namespace settlewell {

/// The quantities sampled at a point (units and signs as in DerivedState).
struct SampleValues {
  double ux = 0.0;                           ///< m
  double settlement = 0.0;                   ///< m, positive down
  double head = 0.0;                         ///< m
  double drawdown = 0.0;                     ///< m
  double pore_pressure = 0.0;                ///< kPa
  double excess_pore_pressure = 0.0;         ///< kPa
  double vertical_effective_stress = 0.0;    ///< kPa, compression positive
  double mean_effective_stress = 0.0;        ///< kPa, compression positive
  double deviator_stress = 0.0;              ///< kPa
  double horizontal_effective_stress = 0.0;  ///< in-plane, kPa, compression positive
  double shear_effective_stress = 0.0;       ///< sigma'_xy (y up, tension positive), kPa
  double flux_x = 0.0, flux_y = 0.0;         ///< Darcy flux, m/s
  double gradient_x = 0.0, gradient_y = 0.0; ///< hydraulic gradient grad h
};

/// A fixed set of points (monitoring points, samples along a section line) located
/// once in the mesh and evaluated whenever asked, by deal.II's remote point
/// evaluation: each point is evaluated on the process that owns the cell holding it
/// (one cell per point, also on a cell edge) and every process gets every value.
/// A point in a cell that excavation removed gets NaN values.
class SamplePoints {
public:
  /// Collective. Throws InputError naming `what` and the first point outside the mesh.
  SamplePoints(const BiotProblem& problem,
               std::vector<dealii::Point<2>> points,
               const std::string& what);
  ~SamplePoints();
  SamplePoints(SamplePoints&&) noexcept;

  /// Collective.
  std::vector<SampleValues> evaluate(const BiotProblem& problem,
                                     const Derivation& derivation) const;
  const std::vector<dealii::Point<2>>& points() const { return points_; }

private:
  struct Evaluator; ///< deal.II's RemotePointEvaluation, set up once
  std::vector<dealii::Point<2>> points_;
  std::unique_ptr<Evaluator> evaluator_;
};

} // namespace settlewell
