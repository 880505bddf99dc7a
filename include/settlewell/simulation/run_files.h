#pragma once

#include <mpi.h>

#include <fstream>
#include <memory>
#include <string>
#include <vector>

namespace settlewell {

/// A CSV file written by rank 0, one row at a time (flushed, so that a long run
/// can be watched and an interrupted one keeps what was done).
class CsvFile {
public:
  CsvFile(const std::string& path, const std::vector<std::string>& header, MPI_Comm comm);
  void row(const std::vector<double>& values,
           const std::vector<std::string>& labels = {});

private:
  std::unique_ptr<std::ofstream> out_;
};

/// Lower-case hex SHA-256 of a file's bytes.
std::string sha256_of_file(const std::string& path);

/// The time now as ISO 8601 in UTC ("2026-12-01T23:38:04Z").
std::string utc_now();

/// Prepares an empty run folder on rank 0. A folder that already holds files is an
/// InputError unless `overwrite`, in which case its contents are removed. Collective.
void prepare_run_folder(const std::string& path, bool overwrite, MPI_Comm comm);

/// Escapes a string for a JSON document.
std::string json_string(const std::string& s);

} // namespace settlewell
