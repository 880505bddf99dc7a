#include "settlewell/core/errors.h"
#include "settlewell/solvers/linear_solver.h"

#include <petscksp.h>

namespace settlewell {

namespace {

void check(PetscErrorCode code, const char* what) {
  if (code != 0)
    throw SolverError(std::string("PETSc failed in ") + what + " (error code " +
                      std::to_string(static_cast<int>(code)) + ")");
}

class MumpsSolver final : public LinearSolver {
public:
  explicit MumpsSolver(MPI_Comm comm) {
    check(KSPCreate(comm, &ksp_), "KSPCreate");
    check(KSPSetType(ksp_, KSPPREONLY), "KSPSetType");
    PC pc;
    check(KSPGetPC(ksp_, &pc), "KSPGetPC");
    check(PCSetType(pc, PCLU), "PCSetType");
    check(PCFactorSetMatSolverType(pc, MATSOLVERMUMPS), "PCFactorSetMatSolverType");
    check(KSPSetOptionsPrefix(ksp_, "settlewell_direct_"), "KSPSetOptionsPrefix");
    check(KSPSetFromOptions(ksp_), "KSPSetFromOptions");
  }
  ~MumpsSolver() override { KSPDestroy(&ksp_); }
  MumpsSolver(const MumpsSolver&) = delete;
  MumpsSolver& operator=(const MumpsSolver&) = delete;

  void set_matrix(const LA::MPI::SparseMatrix& matrix) override {
    const Mat mat = matrix;
    check(KSPSetOperators(ksp_, mat, mat), "KSPSetOperators");
    // Factorise now, so that the cost is booked to the matrix and not to a solve.
    check(KSPSetUp(ksp_), "the MUMPS factorisation (is the system singular? check "
                          "that displacements are restrained and a pressure is fixed "
                          "or storage is positive)");
  }

  unsigned int solve(const LA::MPI::Vector& rhs, LA::MPI::Vector& solution) override {
    check(KSPSolve(ksp_, rhs, solution), "the MUMPS solve");
    KSPConvergedReason reason;
    check(KSPGetConvergedReason(ksp_, &reason), "KSPGetConvergedReason");
    if (reason < 0)
      throw SolverError("the direct solve failed (PETSc reason " +
                        std::to_string(static_cast<int>(reason)) + ")");
    return 1;
  }

  std::string name() const override { return "direct (MUMPS LU)"; }

private:
  KSP ksp_ = nullptr;
};

} // namespace

std::unique_ptr<LinearSolver> make_direct_solver(MPI_Comm comm) {
  return std::make_unique<MumpsSolver>(comm);
}

} // namespace settlewell
