#pragma once

#include "settlewell/core/state_archive.h"
#include "settlewell/output/derived.h"
#include "settlewell/physics/biot_problem.h"

#include <optional>
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
  /// `initial` gives the state at t = 0 that absolute heads, pore pressures,
  /// stresses and fluxes are built on (by default: from the problem's setup).
  FieldWriter(std::string directory,
              std::string basename,
              MPI_Comm comm,
              std::optional<InitialFields> initial = std::nullopt);

  /// Writes the current state of `problem` and rewrites the PVD record.
  /// Returns the path of the file written for this time.
  std::string write(const BiotProblem& problem);

  std::string series_path() const;

private:
  friend void visit(StateArchive& a, FieldWriter& writer);
  std::string directory_;
  std::string basename_;
  MPI_Comm comm_;
  std::optional<InitialFields> initial_;
  std::vector<std::pair<double, std::string>> series_;
};

/// The times and files written so far (a resumed run numbers on from them).
void visit(StateArchive& a, FieldWriter& writer);

} // namespace settlewell
