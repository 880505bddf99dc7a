#pragma once

#include "settlewell/core/state_archive.h"

#include <mpi.h>

#include <fstream>
#include <memory>
#include <optional>
#include <string>
#include <vector>

namespace settlewell {

/// A CSV file (RFC 4180) written by rank 0, one row at a time and flushed, so that
/// a long run can be watched and an interrupted one keeps what was done. Text
/// fields are quoted when they hold a comma, a quote or a line break. A row that
/// cannot be written (a full disk) throws SystemError.
class CsvFile {
public:
  /// A file not opened: writes nothing (until a checkpoint's state reopens it).
  CsvFile() = default;
  CsvFile(const std::string& path, const std::vector<std::string>& header, MPI_Comm comm);
  /// The `labels` (text) first, then the numbers (9 significant digits).
  void row(const std::vector<double>& values,
           const std::vector<std::string>& labels = {});
  /// The same with cells left empty where a value is missing (not evaluated).
  void row_with_gaps(const std::vector<std::optional<double>>& values,
                     const std::vector<std::string>& labels = {});

private:
  friend void visit(StateArchive& a, CsvFile& file);
  std::unique_ptr<std::ofstream> out_;
  std::string path_;
};

/// Saves the file's path (within the run folder) and length; loading cuts the file
/// back to that length (rows written after the checkpoint go) and reopens it to
/// append. Throws InputError if the file is missing or shorter.
void visit(StateArchive& a, CsvFile& file);

} // namespace settlewell
