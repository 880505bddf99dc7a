#pragma once

#include <mpi.h>

#include <string>

namespace settlewell {

/// From now on SIGINT (Ctrl-C) and SIGTERM do not kill the process: they ask the
/// run to stop after the step it is computing, so that its folder stays whole.
void catch_stop_signals();

/// The signal that asked to stop on any process of `comm`, 0 if none. Collective.
int stop_signal(MPI_Comm comm);

/// "SIGINT", "SIGTERM" or "signal N".
std::string signal_name(int signal);

} // namespace settlewell
