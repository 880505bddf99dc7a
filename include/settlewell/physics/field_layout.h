#pragma once

#include <deal.II/fe/component_mask.h>
#include <deal.II/fe/fe_system.h>
#include <deal.II/fe/fe_values_extractors.h>

namespace settlewell {

/// The one place that knows how the unknowns are laid out: Taylor-Hood Q2^2 x Q1,
/// components (ux, uy, excess pore pressure). No magic component numbers elsewhere.
struct FieldLayout {
  static constexpr unsigned int displacement_degree = 2;
  static constexpr unsigned int pressure_degree = 1;
  static constexpr unsigned int ux = 0;
  static constexpr unsigned int uy = 1;
  static constexpr unsigned int pressure = 2;
  static constexpr unsigned int n_components = 3;

  FieldLayout();

  dealii::FESystem<2> fe;
  dealii::FEValuesExtractors::Vector displacement{ux};
  dealii::FEValuesExtractors::Scalar excess_pressure{pressure};

  dealii::ComponentMask mask_of(unsigned int component) const;
  dealii::ComponentMask displacement_mask() const;
  bool is_displacement(unsigned int component) const { return component < pressure; }
};

} // namespace settlewell
