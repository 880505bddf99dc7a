#pragma once

#include "settlewell/scenario/scenario.h"

#include <mpi.h>

#include <iosfwd>

namespace settlewell {

/// `settlewell check`: builds the scenario's mesh and model without the Biot
/// problem, checks every name, condition, material and output point against them,
/// and prints what the scenario describes (regions, boundaries, stages, mesh size,
/// steps). Throws InputError at the first problem. Collective.
void check_scenario(const scenario::Scenario& scenario, MPI_Comm comm, std::ostream& out);

} // namespace settlewell
