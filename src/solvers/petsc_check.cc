#include "petsc_check.h"

#include <deal.II/base/mpi.h>

namespace settlewell {

namespace {

/// Keeps the first message PETSc raises, instead of printing a trace.
PetscErrorCode keep_first_message(MPI_Comm,
                                  int,
                                  const char*,
                                  const char*,
                                  PetscErrorCode code,
                                  PetscErrorType,
                                  const char* message,
                                  void* context) {
  auto& kept = *static_cast<std::string*>(context);
  if (kept.empty() && message != nullptr)
    kept = message;
  return code;
}

} // namespace

void set_from_user_options(KSP ksp, MPI_Comm comm) {
  std::string message;
  PetscPushErrorHandler(keep_first_message, &message);
  const PetscErrorCode code = KSPSetFromOptions(ksp);
  PetscPopErrorHandler();
  if (code != 0 && message.empty())
    message = "error code " + std::to_string(static_cast<int>(code));
  // The first failing process's message, on every process.
  const bool failed = code != 0;
  const int any = dealii::Utilities::MPI::max(int(failed), comm);
  if (any == 0)
    return;
  const unsigned int first =
      dealii::Utilities::MPI::min(failed ? dealii::Utilities::MPI::this_mpi_process(comm)
                                         : dealii::Utilities::MPI::n_mpi_processes(comm),
                                  comm);
  message = dealii::Utilities::MPI::broadcast(comm, message, first);
  throw InputError("the PETSc options (numerics.petsc_options or PETSC_OPTIONS) were "
                   "refused: " +
                   message);
}

} // namespace settlewell
