#pragma once

// Private to src/solvers: PETSc error codes as exceptions.
#include "settlewell/core/errors.h"

#include <petscksp.h>
#include <petscsys.h>

#include <mpi.h>

#include <string>

namespace settlewell {

inline void petsc_check(PetscErrorCode code, const char* what) {
  if (code != 0)
    throw SolverError(std::string("PETSc failed in ") + what + " (error code " +
                      std::to_string(static_cast<int>(code)) + ")");
}

/// KSPSetFromOptions, where the user's PETSc options (numerics.petsc_options or
/// PETSC_OPTIONS) take effect: PETSc's own page of error lines is kept back, its
/// first message becomes one InputError line, and every process throws it if any
/// process failed (PETSc may fail on some only), so that all leave the same way.
void set_from_user_options(KSP ksp, MPI_Comm comm);

} // namespace settlewell
