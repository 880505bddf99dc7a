#include "settlewell/output/derived.h"

#include "settlewell/physics/field_layout.h"

#include <cmath>

namespace settlewell {

using namespace dealii;

InitialFields InitialFields::from_setup(const BiotSetup& setup) {
  InitialFields f;
  f.head = setup.initial_head;
  f.head_gradient = [h = setup.initial_head](const Point<2>& x) {
    const double d = 1e-4;
    Tensor<1, 2> g;
    for (unsigned int c = 0; c < 2; ++c) {
      Point<2> a = x, b = x;
      a[c] -= d;
      b[c] += d;
      g[c] = (h(b) - h(a)) / (2 * d);
    }
    return g;
  };
  f.effective_stress = [](const Point<2>&, types::material_id) {
    return SymmetricTensor<2, 3>();
  };
  return f;
}

Derivation::Derivation(const BiotProblem& problem, InitialFields initial)
    : problem_(problem)
    , initial_(std::move(initial))
    , gamma_w_(problem.setup().gamma_w)
    , axisymmetric_(problem.setup().analysis == AnalysisType::axisymmetric) {
  const auto& names = problem.mesh().names;
  for (const auto& region : names.region_names()) {
    const auto id = names.region_id(region);
    if (materials_.size() <= id)
      materials_.resize(id + 1);
    materials_[id] = problem.setup().materials.at(region);
    retention_.resize(materials_.size(), nullptr);
    const auto curve = problem.setup().unsaturated.find(region);
    if (curve != problem.setup().unsaturated.end())
      retention_[id] = &curve->second;
  }
}

namespace {
void set_stress(DerivedState& d, const SymmetricTensor<2, 3>& stress) {
  d.effective_stress = stress;
  d.mean_effective_stress = -trace(stress) / 3.0;
  const SymmetricTensor<2, 3> s = deviator(stress);
  d.deviator_stress = std::sqrt(1.5 * (s * s));
  d.vertical_effective_stress = -stress[1][1];
}
} // namespace

DerivedState Derivation::at(const Point<2>& x,
                            const DoFHandler<2>::active_cell_iterator& cell,
                            const Vector<double>& v,
                            const std::vector<Tensor<1, 2>>& grad) const {
  DerivedState d = at(x, cell->material_id(), v, grad);
  if (!problem_.has_clays() || !cell->is_locally_owned())
    return d;
  // A clay whose conductivity follows its strain (a permeability change index).
  if (const double rate = problem_.conductivity_rate(cell->material_id()); rate != 0.0)
    d.darcy_flux *= std::exp(rate * d.volumetric_strain);
  if (const auto clay = problem_.clay_cell_state(cell->active_cell_index())) {
    SymmetricTensor<2, 3> stress;
    stress[0][0] = clay->stress[0];
    stress[1][1] = clay->stress[1];
    stress[2][2] = clay->stress[2];
    stress[0][1] = clay->stress[3];
    set_stress(d, stress);
    d.yield_size = clay->yield_size;
    d.yield_ratio = clay->yield_ratio;
  }
  return d;
}

DerivedState Derivation::at(const Point<2>& x,
                            types::material_id region,
                            const Vector<double>& v,
                            const std::vector<Tensor<1, 2>>& grad) const {
  DerivedState d;
  const PoroelasticMaterial& m = materials_.at(region);
  const double dp = v[FieldLayout::pressure];
  d.settlement = -v[FieldLayout::uy];
  const double h0 = initial_.head(x);
  d.head = h0 + dp / gamma_w_;
  d.drawdown = -dp / gamma_w_;
  d.pore_pressure = gamma_w_ * (h0 - x[1]) + dp;

  SymmetricTensor<2, 3> strain;
  strain[0][0] = grad[FieldLayout::ux][0];
  strain[1][1] = grad[FieldLayout::uy][1];
  strain[0][1] = 0.5 * (grad[FieldLayout::ux][1] + grad[FieldLayout::uy][0]);
  if (axisymmetric_) // hoop strain u_r / r, which tends to du_r/dr on the axis
    strain[2][2] = x[0] > 1e-12 ? v[FieldLayout::ux] / x[0] : grad[FieldLayout::ux][0];
  d.volumetric_strain = trace(strain);
  const SymmetricTensor<2, 3> change =
      m.lame_lambda() * d.volumetric_strain * unit_symmetric_tensor<3>() +
      2.0 * m.shear_modulus() * strain;
  set_stress(d, initial_.effective_stress(x, region) + change);

  const Tensor<1, 2> head_gradient =
      initial_.head_gradient(x) + grad[FieldLayout::pressure] / gamma_w_;
  d.head_gradient = head_gradient;
  d.darcy_flux[0] = -m.conductivity_x * head_gradient[0];
  d.darcy_flux[1] = -m.conductivity_y * head_gradient[1];
  d.suction = std::max(0.0, -d.pore_pressure);
  if (const RetentionCurve* curve = retention_.at(region)) {
    const auto at = curve->at(d.pore_pressure / gamma_w_);
    d.saturation = at.saturation;
    d.darcy_flux *= at.conductivity;
  }
  return d;
}

} // namespace settlewell
