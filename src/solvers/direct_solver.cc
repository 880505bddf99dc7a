#include "petsc_check.h"

#include "settlewell/solvers/linear_solver.h"

#include <petscksp.h>

namespace settlewell {

namespace {

class MumpsSolver final : public LinearSolver {
public:
  MumpsSolver(MPI_Comm comm, bool symmetric) : symmetric_(symmetric) {
    petsc_check(KSPCreate(comm, &ksp_), "KSPCreate");
    petsc_check(KSPSetType(ksp_, KSPPREONLY), "KSPSetType");
    PC pc;
    petsc_check(KSPGetPC(ksp_, &pc), "KSPGetPC");
    // With its pressure rows negated the Biot system is symmetric: PETSc's
    // Cholesky with MUMPS is MUMPS's LDL^T with pivoting for indefinite
    // matrices, with about half the factor entries and work of an LU. A clay's
    // tangent is not symmetric: LU then.
    petsc_check(PCSetType(pc, symmetric ? PCCHOLESKY : PCLU), "PCSetType");
    petsc_check(PCFactorSetMatSolverType(pc, MATSOLVERMUMPS), "PCFactorSetMatSolverType");
    petsc_check(KSPSetOptionsPrefix(ksp_, "settlewell_direct_"), "KSPSetOptionsPrefix");
    set_from_user_options(ksp_, comm);
  }
  ~MumpsSolver() override { KSPDestroy(&ksp_); }
  MumpsSolver(const MumpsSolver&) = delete;
  MumpsSolver& operator=(const MumpsSolver&) = delete;

  void set_matrix(const LA::MPI::SparseMatrix& matrix,
                  const LA::MPI::SparseMatrix*) override {
    const Mat mat = matrix;
    petsc_check(KSPSetOperators(ksp_, mat, mat), "KSPSetOperators");
    // Factorise now, so that the cost is booked to the matrix and not to a solve.
    petsc_check(KSPSetUp(ksp_),
                "the MUMPS factorisation (is the system singular? check "
                "that displacements are restrained and a pressure is fixed "
                "or storage is positive)");
  }

  bool wants_symmetric_form() const override { return symmetric_; }

  unsigned int solve(const LA::MPI::Vector& rhs, LA::MPI::Vector& solution) override {
    petsc_check(KSPSolve(ksp_, rhs, solution), "the MUMPS solve");
    KSPConvergedReason reason;
    petsc_check(KSPGetConvergedReason(ksp_, &reason), "KSPGetConvergedReason");
    if (reason < 0)
      throw SolverError("the direct solve failed (PETSc reason " +
                        std::to_string(static_cast<int>(reason)) + ")");
    return 1;
  }

private:
  bool symmetric_;
  KSP ksp_ = nullptr;
};

} // namespace

std::unique_ptr<LinearSolver> make_direct_solver(MPI_Comm comm, bool symmetric) {
  return std::make_unique<MumpsSolver>(comm, symmetric);
}

void scale_rows(LA::MPI::SparseMatrix& matrix, const LA::MPI::Vector& factors) {
  petsc_check(MatDiagonalScale(matrix.petsc_matrix(), factors, nullptr),
              "scaling the rows of the system matrix");
}

void add_petsc_options(const std::string& options) {
  if (!options.empty())
    petsc_check(PetscOptionsInsertString(nullptr, options.c_str()),
                "reading the PETSc options");
}

} // namespace settlewell
