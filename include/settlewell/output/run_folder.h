#pragma once

#include <mpi.h>

#include <string>

namespace settlewell {

/// Prepares an empty run folder on rank 0. A folder that already holds files is an
/// InputError unless `overwrite`, in which case its contents are removed. Collective.
void prepare_run_folder(const std::string& path, bool overwrite, MPI_Comm comm);

/// Lower-case hex SHA-256 of a file's bytes.
std::string sha256_of_file(const std::string& path);

/// The time now as ISO 8601 in UTC ("2026-12-01T23:38:04Z").
std::string utc_now();

} // namespace settlewell
