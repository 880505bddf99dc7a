#pragma once

// The only place that names the linear-algebra back end (PETSc through deal.II's
// wrappers). Other modules say LA::MPI::Vector and LA::MPI::SparseMatrix.
#include <deal.II/lac/generic_linear_algebra.h>

namespace settlewell {
namespace LA = dealii::LinearAlgebraPETSc;
inline constexpr int dim = 2;
} // namespace settlewell
