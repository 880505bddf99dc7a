#include "settlewell/run/stop_request.h"

#include <deal.II/base/mpi.h>

#include <csignal>

namespace settlewell {

namespace {

volatile std::sig_atomic_t requested = 0;

extern "C" void ask_to_stop(int signal) {
  requested = signal;
}

} // namespace

void catch_stop_signals() {
  std::signal(SIGINT, ask_to_stop);
  std::signal(SIGTERM, ask_to_stop);
}

int stop_signal(MPI_Comm comm) {
  return dealii::Utilities::MPI::max(static_cast<int>(requested), comm);
}

std::string signal_name(int signal) {
  if (signal == SIGINT)
    return "SIGINT";
  if (signal == SIGTERM)
    return "SIGTERM";
  return "signal " + std::to_string(signal);
}

} // namespace settlewell
