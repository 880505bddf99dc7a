#include "petsc_check.h"

#include "settlewell/solvers/linear_solver.h"

#include <petscksp.h>

#include <algorithm>

namespace settlewell {

namespace {

class MumpsSolver final : public LinearSolver {
public:
  MumpsSolver(MPI_Comm comm, bool symmetric)
      : symmetric_(symmetric) {
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
  ~MumpsSolver() override {
    KSPDestroy(&krylov_);
    KSPDestroy(&ksp_);
  }
  MumpsSolver(const MumpsSolver&) = delete;
  MumpsSolver& operator=(const MumpsSolver&) = delete;

  void set_matrix(const LA::MPI::SparseMatrix& matrix,
                  const LA::MPI::SparseMatrix*) override {
    const Mat mat = matrix;
    petsc_check(KSPSetReusePreconditioner(ksp_, PETSC_FALSE),
                "KSPSetReusePreconditioner");
    petsc_check(KSPSetOperators(ksp_, mat, mat), "KSPSetOperators");
    // Factorise now, so that the cost is booked to the matrix and not to a solve.
    petsc_check(KSPSetUp(ksp_),
                "the MUMPS factorisation (is the system singular? check "
                "that displacements are restrained and a pressure is fixed "
                "or storage is positive)");
  }

  bool wants_symmetric_form() const override { return symmetric_; }

  unsigned int solve_with_kept_factor(const LA::MPI::SparseMatrix& current,
                                      const LA::MPI::Vector& rhs,
                                      LA::MPI::Vector& solution,
                                      double relative_tolerance,
                                      unsigned int max_iterations) override {
    // The factor stays as it is although the matrix it came from has changed.
    petsc_check(KSPSetReusePreconditioner(ksp_, PETSC_TRUE), "KSPSetReusePreconditioner");
    if (krylov_ == nullptr)
      make_krylov();
    const Mat mat = current;
    petsc_check(KSPSetOperators(krylov_, mat, mat), "KSPSetOperators");
    petsc_check(KSPSetTolerances(krylov_, relative_tolerance, 1e-300, PETSC_DEFAULT,
                                 PetscInt(max_iterations)),
                "KSPSetTolerances");
    solution = 0.0;
    petsc_check(KSPSolve(krylov_, rhs, solution),
                "the Krylov solve with the kept factor");
    KSPConvergedReason reason;
    petsc_check(KSPGetConvergedReason(krylov_, &reason), "KSPGetConvergedReason");
    PetscInt iterations = 0;
    petsc_check(KSPGetIterationNumber(krylov_, &iterations), "KSPGetIterationNumber");
    return reason > 0 ? static_cast<unsigned int>(std::max<PetscInt>(iterations, 1)) : 0;
  }

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
  /// GMRES, right-preconditioned (its residual is the true one) by the factor.
  void make_krylov() {
    MPI_Comm comm;
    petsc_check(PetscObjectGetComm(reinterpret_cast<PetscObject>(ksp_), &comm),
                "PetscObjectGetComm");
    petsc_check(KSPCreate(comm, &krylov_), "KSPCreate");
    petsc_check(KSPSetType(krylov_, KSPGMRES), "KSPSetType");
    petsc_check(KSPSetPCSide(krylov_, PC_RIGHT), "KSPSetPCSide");
    petsc_check(KSPSetNormType(krylov_, KSP_NORM_UNPRECONDITIONED), "KSPSetNormType");
    PC pc;
    petsc_check(KSPGetPC(krylov_, &pc), "KSPGetPC");
    petsc_check(PCSetType(pc, PCSHELL), "PCSetType");
    petsc_check(PCShellSetContext(pc, this), "PCShellSetContext");
    petsc_check(PCShellSetApply(pc, apply_factor), "PCShellSetApply");
  }
  static PetscErrorCode apply_factor(PC pc, Vec x, Vec y) {
    void* self = nullptr;
    PetscCall(PCShellGetContext(pc, &self));
    PetscCall(KSPSolve(static_cast<MumpsSolver*>(self)->ksp_, x, y));
    return 0;
  }

  bool symmetric_;
  KSP ksp_ = nullptr;
  KSP krylov_ = nullptr; ///< for solve_with_kept_factor, made at its first use
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
