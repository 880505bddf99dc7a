#pragma once

// Private to src/solvers: PETSc error codes as exceptions.
#include "settlewell/core/errors.h"

#include <petscsys.h>

#include <string>

namespace settlewell {

inline void petsc_check(PetscErrorCode code, const char* what) {
  if (code != 0)
    throw SolverError(std::string("PETSc failed in ") + what + " (error code " +
                      std::to_string(static_cast<int>(code)) + ")");
}

} // namespace settlewell
