#pragma once

#include "settlewell/physics/biot_problem.h"

#include <deal.II/base/symmetric_tensor.h>
#include <deal.II/lac/vector.h>

#include <functional>
#include <limits>
#include <vector>

namespace settlewell {

/// What the output needs of the state at t = 0.
struct InitialFields {
  std::function<double(const dealii::Point<2>&)> head;
  std::function<dealii::Tensor<1, 2>(const dealii::Point<2>&)> head_gradient;
  /// Geostatic effective stress, tension positive, (xx, yy, zz = out of plane).
  std::function<dealii::SymmetricTensor<2, 3>(const dealii::Point<2>&,
                                              dealii::types::material_id)>
      effective_stress;

  /// From the core's setup alone: its initial head (gradient by central
  /// differences) and no initial stress, so stresses are changes only.
  static InitialFields from_setup(const BiotSetup& setup);
};

/// Everything reported at a point, in output units and signs.
struct DerivedState {
  double settlement = 0.0;                        ///< m, positive down
  double head = 0.0;                              ///< m
  double drawdown = 0.0;                          ///< m, positive when heads fall
  double pore_pressure = 0.0;                     ///< kPa, absolute, compression positive
  dealii::SymmetricTensor<2, 3> effective_stress; ///< kPa, absolute, tension positive
  double mean_effective_stress = 0.0;     ///< p' = -tr/3, kPa, compression positive
  double deviator_stress = 0.0;           ///< q = sqrt(3/2 s:s), kPa
  double vertical_effective_stress = 0.0; ///< -sigma'_yy, kPa, compression positive
  double volumetric_strain = 0.0;         ///< tension positive
  dealii::Tensor<1, 2> darcy_flux;        ///< m/s
  dealii::Tensor<1, 2> head_gradient;     ///< grad h, m/m
  /// In a Cam Clay cell (the cell's mean, see BiotProblem::clay_cell_state): the
  /// yield size p'c, kPa, and the yield ratio (1: yielding). NaN elsewhere.
  double yield_size = std::numeric_limits<double>::quiet_NaN();
  double yield_ratio = std::numeric_limits<double>::quiet_NaN();
  /// S_r from the soil's retention curve (1 in soil without one), and the suction
  /// max(0, -p), kPa.
  double saturation = 1.0;
  double suction = 0.0;
};

/// Turns the primary unknowns at a point into the reported quantities.
class Derivation {
public:
  Derivation(const BiotProblem& problem, InitialFields initial);

  /// `values` and `gradients` hold the three components (ux, uy, excess pressure).
  /// In a Cam Clay cell the stresses are the clay's, from its history: give the
  /// cell (locally owned) so that they can be found.
  DerivedState at(const dealii::Point<2>& x,
                  dealii::types::material_id region,
                  const dealii::Vector<double>& values,
                  const std::vector<dealii::Tensor<1, 2>>& gradients) const;
  DerivedState at(const dealii::Point<2>& x,
                  const dealii::DoFHandler<2>::active_cell_iterator& cell,
                  const dealii::Vector<double>& values,
                  const std::vector<dealii::Tensor<1, 2>>& gradients) const;

  const InitialFields& initial() const { return initial_; }

private:
  const BiotProblem& problem_;
  InitialFields initial_;
  double gamma_w_;
  bool axisymmetric_;
  std::vector<PoroelasticMaterial> materials_;   ///< by material id
  std::vector<const RetentionCurve*> retention_; ///< by material id; null: none
};

} // namespace settlewell
