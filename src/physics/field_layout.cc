#include "settlewell/physics/field_layout.h"

#include <deal.II/fe/fe_q.h>

namespace settlewell {

FieldLayout::FieldLayout()
    : fe(dealii::FE_Q<2>(displacement_degree), 2, dealii::FE_Q<2>(pressure_degree), 1) {
  // Internal lines find pressure dofs as vertex dof number `pressure` (see
  // physics/internal_lines.cc); this holds for the base-element order above.
  for (unsigned int c = 0; c < n_components; ++c)
    AssertThrow(fe.system_to_component_index(c).first == c,
                dealii::ExcMessage("unexpected vertex dof order in the FE system"));
}

dealii::ComponentMask FieldLayout::mask_of(unsigned int component) const {
  std::vector<bool> mask(n_components, false);
  mask[component] = true;
  return dealii::ComponentMask(mask);
}

dealii::ComponentMask FieldLayout::displacement_mask() const {
  return dealii::ComponentMask(std::vector<bool>{true, true, false});
}

} // namespace settlewell
