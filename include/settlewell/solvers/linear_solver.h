#pragma once

#include "settlewell/core/linear_algebra.h"

#include <memory>
#include <string>

namespace settlewell {

/// Solves A x = b for the Biot system. `set_matrix` is called once per assembled
/// matrix (once per distinct time step); `solve` may then be called many times
/// and reuses the factorisation or preconditioner.
class LinearSolver {
public:
  virtual ~LinearSolver() = default;
  virtual void set_matrix(const LA::MPI::SparseMatrix& matrix) = 0;
  /// Returns the number of iterations (1 for a direct solve).
  virtual unsigned int solve(const LA::MPI::Vector& rhs, LA::MPI::Vector& solution) = 0;
  virtual std::string name() const = 0;
};

/// Sparse direct LU factorisation by MUMPS through PETSc, in serial and in parallel.
/// Extra PETSc options may be given with the prefix `settlewell_direct_`.
std::unique_ptr<LinearSolver> make_direct_solver(MPI_Comm comm);

} // namespace settlewell
