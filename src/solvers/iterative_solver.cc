#include "petsc_check.h"

#include "settlewell/solvers/linear_solver.h"

#include <petscksp.h>

#include <algorithm>
#include <vector>

namespace settlewell {

namespace {

/// An index set of PETSc's from one of deal.II's (this process's owned dofs).
IS petsc_index_set(const dealii::IndexSet& dofs, MPI_Comm comm, PetscInt block_size) {
  std::vector<PetscInt> indices;
  indices.reserve(dofs.n_elements());
  for (const auto d : dofs)
    indices.push_back(static_cast<PetscInt>(d));
  IS is;
  petsc_check(ISCreateGeneral(comm, PetscInt(indices.size()), indices.data(),
                              PETSC_COPY_VALUES, &is),
              "ISCreateGeneral");
  if (block_size > 1)
    petsc_check(ISSetBlockSize(is, block_size), "ISSetBlockSize");
  return is;
}

/// Defaults for the field splits; options already in PETSc's database (the
/// user's) win.
void set_default(const char* name, const char* value) {
  PetscBool present = PETSC_FALSE;
  petsc_check(PetscOptionsHasName(nullptr, nullptr, name, &present),
              "PetscOptionsHasName");
  if (!present)
    petsc_check(PetscOptionsSetValue(nullptr, name, value), "PetscOptionsSetValue");
}

class BlockSolver final : public LinearSolver {
public:
  BlockSolver(MPI_Comm comm,
              const dealii::IndexSet& u,
              const dealii::IndexSet& p,
              const std::vector<double>& coordinates,
              double tolerance)
      : comm_(comm) {
    // Each displacement node has its two components next to each other in the
    // dof numbering: block size 2, and rigid-body modes from the node coordinates
    // for the smoothed aggregation (the field split hands them to the block).
    is_u_ = petsc_index_set(u, comm, 2);
    is_p_ = petsc_index_set(p, comm, 1);
    attach_rigid_body_modes(coordinates);
    for (const auto& [name, value] : std::vector<std::pair<const char*, const char*>>{
             // The displacement block: a few CG iterations with BoomerAMG (one
             // V-cycle alone was too weak for Q2 elasticity on stretched cells;
             // PETSc's GAMG with rigid-body modes was weaker still here).
             {"-settlewell_iterative_fieldsplit_u_ksp_type", "cg"},
             {"-settlewell_iterative_fieldsplit_u_ksp_rtol", "0.1"},
             {"-settlewell_iterative_fieldsplit_u_pc_type", "hypre"},
             {"-settlewell_iterative_fieldsplit_u_pc_hypre_type", "boomeramg"},
             {"-settlewell_iterative_fieldsplit_u_pc_hypre_boomeramg_strong_threshold",
              "0.5"},
             {"-settlewell_iterative_fieldsplit_u_pc_hypre_boomeramg_coarsen_type",
              "HMIS"},
             {"-settlewell_iterative_fieldsplit_u_pc_hypre_boomeramg_interp_type",
              "ext+i"},
             {"-settlewell_iterative_fieldsplit_p_ksp_type", "preonly"},
             {"-settlewell_iterative_fieldsplit_p_pc_type", "hypre"},
             {"-settlewell_iterative_fieldsplit_p_pc_hypre_type", "boomeramg"}})
      set_default(name, value);
    petsc_check(KSPCreate(comm, &ksp_), "KSPCreate");
    // The prefix first: the field splits' solvers take theirs from it when made.
    petsc_check(KSPSetOptionsPrefix(ksp_, "settlewell_iterative_"),
                "KSPSetOptionsPrefix");
    petsc_check(KSPSetType(ksp_, KSPFGMRES), "KSPSetType");
    petsc_check(KSPGMRESSetRestart(ksp_, 200), "KSPGMRESSetRestart");
    petsc_check(KSPSetTolerances(ksp_, tolerance, 1e-300, PETSC_DEFAULT, 1000),
                "KSPSetTolerances");
    petsc_check(KSPSetNormType(ksp_, KSP_NORM_UNPRECONDITIONED), "KSPSetNormType");
    // Start from the solution vector's values. PETSc's test stays relative to
    // the right-hand side's norm, so a good start saves iterations and does not
    // loosen the stopping test.
    petsc_check(KSPSetInitialGuessNonzero(ksp_, PETSC_TRUE), "KSPSetInitialGuessNonzero");
    PC pc;
    petsc_check(KSPGetPC(ksp_, &pc), "KSPGetPC");
    petsc_check(PCSetType(pc, PCFIELDSPLIT), "PCSetType");
    petsc_check(PCFieldSplitSetIS(pc, "u", is_u_), "PCFieldSplitSetIS");
    petsc_check(PCFieldSplitSetIS(pc, "p", is_p_), "PCFieldSplitSetIS");
    petsc_check(PCFieldSplitSetType(pc, PC_COMPOSITE_SCHUR), "PCFieldSplitSetType");
    petsc_check(PCFieldSplitSetSchurFactType(pc, PC_FIELDSPLIT_SCHUR_FACT_UPPER),
                "PCFieldSplitSetSchurFactType");
    set_from_user_options(ksp_, comm);
  }
  void attach_rigid_body_modes(const std::vector<double>& coordinates) {
    Vec xy;
    petsc_check(VecCreateMPI(comm_, PetscInt(coordinates.size()), PETSC_DETERMINE, &xy),
                "VecCreateMPI");
    petsc_check(VecSetBlockSize(xy, 2), "VecSetBlockSize");
    PetscScalar* values;
    petsc_check(VecGetArray(xy, &values), "VecGetArray");
    std::copy(coordinates.begin(), coordinates.end(), values);
    petsc_check(VecRestoreArray(xy, &values), "VecRestoreArray");
    MatNullSpace modes;
    petsc_check(MatNullSpaceCreateRigidBody(xy, &modes), "MatNullSpaceCreateRigidBody");
    petsc_check(PetscObjectCompose(reinterpret_cast<PetscObject>(is_u_), "nearnullspace",
                                   reinterpret_cast<PetscObject>(modes)),
                "attaching the rigid-body modes");
    MatNullSpaceDestroy(&modes);
    VecDestroy(&xy);
  }

  ~BlockSolver() override {
    KSPDestroy(&ksp_);
    MatDestroy(&schur_);
    ISDestroy(&is_u_);
    ISDestroy(&is_p_);
  }
  BlockSolver(const BlockSolver&) = delete;
  BlockSolver& operator=(const BlockSolver&) = delete;

  void set_matrix(const LA::MPI::SparseMatrix& matrix,
                  const LA::MPI::SparseMatrix* schur) override {
    if (schur == nullptr)
      throw SolverError(
          "the block preconditioner needs a Schur-complement approximation");
    const Mat system = matrix;
    MatDestroy(&schur_);
    petsc_check(MatCreateSubMatrix(static_cast<Mat>(*schur), is_p_, is_p_,
                                   MAT_INITIAL_MATRIX, &schur_),
                "extracting the pressure block of the Schur approximation");
    PC pc;
    petsc_check(KSPGetPC(ksp_, &pc), "KSPGetPC");
    petsc_check(PCFieldSplitSetSchurPre(pc, PC_FIELDSPLIT_SCHUR_PRE_USER, schur_),
                "PCFieldSplitSetSchurPre");
    petsc_check(KSPSetOperators(ksp_, system, system), "KSPSetOperators");
    petsc_check(KSPSetUp(ksp_), "setting up the block preconditioner");
  }

  unsigned int solve(const LA::MPI::Vector& rhs, LA::MPI::Vector& solution) override {
    petsc_check(KSPSolve(ksp_, rhs, solution), "the iterative solve");
    KSPConvergedReason reason;
    petsc_check(KSPGetConvergedReason(ksp_, &reason), "KSPGetConvergedReason");
    PetscInt iterations = 0;
    petsc_check(KSPGetIterationNumber(ksp_, &iterations), "KSPGetIterationNumber");
    if (reason < 0)
      throw SolverError("the iterative solver did not converge (PETSc reason " +
                        std::to_string(static_cast<int>(reason)) + " after " +
                        std::to_string(iterations) +
                        " iterations); try numerics.solver = \"direct\"");
    return static_cast<unsigned int>(iterations);
  }

  bool needs_schur_approximation() const override { return true; }
  bool takes_initial_guess() const override { return true; }

private:
  MPI_Comm comm_;
  KSP ksp_ = nullptr;
  IS is_u_ = nullptr, is_p_ = nullptr;
  Mat schur_ = nullptr;
};

} // namespace

std::unique_ptr<LinearSolver>
make_iterative_solver(MPI_Comm comm,
                      const dealii::IndexSet& displacement,
                      const dealii::IndexSet& pressure,
                      const std::vector<double>& coordinates,
                      double relative_tolerance) {
  return std::make_unique<BlockSolver>(comm, displacement, pressure, coordinates,
                                       relative_tolerance);
}

} // namespace settlewell
