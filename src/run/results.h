#pragma once

// Private to src/run: the run's own part of results.toml, and the summary read back
// from it.
#include "settlewell/mesh/mesh.h"
#include "settlewell/model/schedule.h"
#include "settlewell/run/simulation.h"

#include <mpi.h>
#include <toml++/toml.h>

namespace settlewell {

/// What the run itself puts into results.toml: program, input, start and end,
/// mesh and step counts, the inputs as the report shows them and the stages. The
/// monitors add the rest.
toml::table run_results(const scenario::Scenario& s,
                        const Mesh& mesh,
                        const model::Schedule& schedule,
                        const RunSummary& size,
                        const std::string& started,
                        MPI_Comm comm);

/// The headline numbers of a run from its results (the monitors' [summary],
/// [[discharge]] and [water_balance]).
void read_summary(const toml::table& results, RunSummary& summary);

/// manifest.json: program, input and its SHA-256, start and end, processes, cells,
/// unknowns, steps, the stages with their steps, and the wall time of each part of
/// the run. Rank 0 writes.
void write_manifest(const std::string& path,
                    const scenario::Scenario& s,
                    const model::Schedule& schedule,
                    const RunSummary& summary,
                    const std::string& started,
                    const std::map<std::string, double>& wall_time_by_part,
                    MPI_Comm comm);

} // namespace settlewell
