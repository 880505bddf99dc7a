#pragma once

#include "settlewell/core/linear_algebra.h"

#include <deal.II/base/index_set.h>

#include <memory>
#include <string>
#include <vector>

namespace settlewell {

/// Solves A x = b for the Biot system. `set_matrix` is called once per assembled
/// matrix (once per distinct time step); `solve` may then be called many times
/// and reuses the factorisation or preconditioner.
class LinearSolver {
public:
  virtual ~LinearSolver() = default;
  /// `schur` is the pressure-block approximation of the Schur complement, given
  /// only to solvers that ask for it (needs_schur_approximation()).
  virtual void set_matrix(const LA::MPI::SparseMatrix& matrix,
                          const LA::MPI::SparseMatrix* schur) = 0;
  /// Returns the number of iterations (1 for a direct solve). A solver that
  /// takes_initial_guess() starts from `solution`'s values; the others ignore them.
  virtual unsigned int solve(const LA::MPI::Vector& rhs, LA::MPI::Vector& solution) = 0;
  /// Solves `current` x = rhs by a Krylov method (GMRES) preconditioned with the
  /// factorisation of the matrix last given to set_matrix, which may since have
  /// changed its values (`current` may be that matrix, assembled again), from x = 0
  /// to `relative_tolerance` of the right-hand side. Returns the Krylov iterations,
  /// or 0 when it did not converge in `max_iterations` (give the matrix again to
  /// refactorise) or the solver keeps no factorisation.
  virtual unsigned int solve_with_kept_factor(const LA::MPI::SparseMatrix& current,
                                              const LA::MPI::Vector& rhs,
                                              LA::MPI::Vector& solution,
                                              double relative_tolerance,
                                              unsigned int max_iterations) {
    (void)current, (void)rhs, (void)solution, (void)relative_tolerance,
        (void)max_iterations;
    return 0;
  }
  virtual bool needs_schur_approximation() const { return false; }
  virtual bool takes_initial_guess() const { return false; }
  /// Whether the solver is given the system with its pressure rows (matrix and
  /// right-hand side) negated: the Biot system is then symmetric (indefinite),
  /// which a symmetric factorisation needs.
  virtual bool wants_symmetric_form() const { return false; }
};

/// Sparse direct factorisation by MUMPS through PETSc, in serial and in parallel:
/// symmetric-indefinite (LDL^T) of the symmetric form of the system, or LU when
/// the system is not symmetric (a clay's tangent). Extra PETSc options may be
/// given with the prefix `settlewell_direct_`.
std::unique_ptr<LinearSolver> make_direct_solver(MPI_Comm comm, bool symmetric = true);

/// FGMRES with a block upper-triangular (Schur) preconditioner, PETSc's field
/// split: CG preconditioned by hypre BoomerAMG to a loose tolerance (0.1) on the
/// displacement block (block size 2; the rigid-body modes are attached for AMGs
/// that use them) and one BoomerAMG cycle on a fixed-stress approximation of the
/// Schur complement, (S + alpha^2/K) M_p + dt H. `displacement` and `pressure` are this
/// process's owned dofs of each field; `coordinates` holds (x, y) for each owned
/// displacement node, in dof order (each node's ux and uy are next to each other).
/// Options with the prefix `settlewell_iterative_` (and the field splits'
/// `settlewell_iterative_fieldsplit_u_`, `..._p_`) tune it.
std::unique_ptr<LinearSolver>
make_iterative_solver(MPI_Comm comm,
                      const dealii::IndexSet& displacement,
                      const dealii::IndexSet& pressure,
                      const std::vector<double>& coordinates,
                      double relative_tolerance);

/// Multiplies each row i of `matrix` by factors(i) (PETSc's MatDiagonalScale):
/// with +1 and -1 it gives a solver the symmetric form of the system.
void scale_rows(LA::MPI::SparseMatrix& matrix, const LA::MPI::Vector& factors);

/// Passes a string of PETSc options (for experts) to PETSc's options database.
void add_petsc_options(const std::string& options);

} // namespace settlewell
