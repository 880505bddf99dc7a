#pragma once

#include "settlewell/physics/biot_problem.h"

#include <string>
#include <utility>
#include <vector>

namespace settlewell {

/// Writes the fields of a problem at chosen times: one VTU per time (a PVTU with
/// one piece per process when run in parallel) and one PVD series whose times are
/// in days, so that ParaView or any VTK reader opens the whole series.
class FieldWriter {
public:
  /// Creates `directory` if needed. Files are named `<basename>_NNNN.vtu`.
  FieldWriter(std::string directory, std::string basename, MPI_Comm comm);

  /// Writes the current state of `problem` and rewrites the PVD record.
  /// Returns the path of the file written for this time.
  std::string write(const BiotProblem& problem);

  std::string series_path() const;

private:
  std::string directory_;
  std::string basename_;
  MPI_Comm comm_;
  std::vector<std::pair<double, std::string>> series_;
};

} // namespace settlewell
