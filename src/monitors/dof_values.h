#pragma once

// Private to src/monitors: values of a distributed vector at many dofs with one
// read of its storage, not a PETSc call per entry (which cost the demo's monitors
// about a tenth of their time).
#include "settlewell/core/linear_algebra.h"

#include <deal.II/base/types.h>

#include <algorithm>
#include <vector>

namespace settlewell::monitors {

/// v[d] for each of `dofs` (entries this process holds, owned or ghost).
inline std::vector<double>
values_at(const LA::MPI::Vector& v,
          const std::vector<dealii::types::global_dof_index>& dofs) {
  std::vector<double> values(dofs.size());
  v.extract_subvector_to(dofs.begin(), dofs.end(), values.begin());
  return values;
}

/// The largest of factor * v[d] over `dofs`, and 0 if none is larger. This
/// process only.
inline double largest_scaled(const LA::MPI::Vector& v,
                             const std::vector<dealii::types::global_dof_index>& dofs,
                             double factor) {
  double largest = 0.0;
  for (const double x : values_at(v, dofs))
    largest = std::max(largest, factor * x);
  return largest;
}

} // namespace settlewell::monitors
