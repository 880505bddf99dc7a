// GoogleTest main for Settlewell: MPI and PETSc must be running for the library.
#include "settlewell/core/threads.h"

#include <deal.II/base/mpi.h>
#include <gtest/gtest.h>

int main(int argc, char** argv) {
  ::testing::InitGoogleTest(&argc, argv);
  int petsc_argc = 1;
  dealii::Utilities::MPI::MPI_InitFinalize mpi(petsc_argc, argv, 1);
  settlewell::limit_blas_threads();
  return RUN_ALL_TESTS();
}
