#pragma once

#include "settlewell/materials/retention.h"
#include "settlewell/mesh/mesh.h"
#include "settlewell/output/derived.h"
#include "settlewell/scenario/scenario.h"

#include <deal.II/base/symmetric_tensor.h>

#include <optional>
#include <vector>

namespace settlewell::model {

/// The state at t = 0: initial heads (hydrostatic below a water table, or given
/// piezometric heads per layer with linear leakage heads between them) and the
/// geostatic effective stress with K0 (or, with a gravity-loading start, none: the
/// solver's first solve builds it). Displacements are zero at t = 0.
class InitialState {
public:
  InitialState(const scenario::Scenario& s, const Mesh& mesh);

  double head(const dealii::Point<2>& x) const; ///< m
  dealii::Tensor<1, 2> head_gradient(const dealii::Point<2>& x) const;
  double pore_pressure(const dealii::Point<2>& x) const; ///< kPa, gamma_w (h0 - y)
  /// kPa, compression +: the saturated unit weights, less the water a soil with a
  /// retention curve does not hold above its water table (its moist weight).
  double vertical_total_stress(const dealii::Point<2>& x,
                               dealii::types::material_id region) const;
  /// Geostatic effective stress, tension positive (Bishop's, with chi = S_r, in a
  /// soil with a retention curve), components (xx, yy, zz) with zz
  /// out of plane (hoop in axisymmetric) and no shear, kPa.
  dealii::SymmetricTensor<2, 3> effective_stress(const dealii::Point<2>& x,
                                                 dealii::types::material_id region) const;
  /// The effective stress the solver starts from: the geostatic one, or none with
  /// a gravity-loading start (whose solve then builds it), kPa.
  dealii::SymmetricTensor<2, 3>
  start_effective_stress(const dealii::Point<2>& x,
                         dealii::types::material_id region) const;
  /// This state in the form the output module takes (it refers to this object).
  InitialFields fields() const;

private:
  double gamma_w_;
  bool gravity_loading_;
  std::vector<std::pair<double, double>> head_knots_;   ///< (y, h), y decreasing
  std::vector<std::pair<double, double>> weight_knots_; ///< (layer top, unit weight)
  double top_ = 0.0;
  std::vector<double> region_unit_weight_, region_k0_; ///< by material id
  /// The retention curve of each layer (weight_knots_'s order) and region, if any.
  std::vector<std::optional<RetentionCurve>> layer_retention_, region_retention_;
  /// The weight a soil with a retention curve lacks for the water it does not
  /// hold at the start, the integral of gamma_w (theta_s - theta(p0)) dy of a curve
  /// from y_low to y_high (m) at x's abscissa, kPa.
  double deficit_between(const RetentionCurve& curve,
                         const dealii::Point<2>& x,
                         double y_low,
                         double y_high) const;
};

} // namespace settlewell::model
