#pragma once

#include "settlewell/scenario/sweep_file.h"

#include <mpi.h>

#include <iosfwd>
#include <string>

namespace settlewell {

struct SweepOptions {
  std::string folder;          ///< the sweep's folder (one run folder per variant)
  unsigned int group_size = 1; ///< processes per variant
  bool overwrite = false;
  bool allow_large = false; ///< lift the bounds on each variant's memory and steps
};

/// Runs every variant of a sweep, each in its own run folder
/// (<folder>/variant_NNN/run), spreading them over groups of `group_size`
/// processes of `world` (MPI sub-communicators; variant i goes to group
/// i mod groups). Then rank 0 writes <folder>/sweep_summary.csv (the parameter
/// values and the headline results of each variant) and, if the sweep names a
/// chart, <folder>/sweep_chart.png. Collective on `world`. Returns 0, or the
/// signal (SIGINT, SIGTERM) that stopped it: then the variants that ran are whole,
/// the sweep's manifest.json says "stopped" and there is no summary.
int run_sweep(const scenario::SweepSpec& sweep,
              const SweepOptions& options,
              MPI_Comm world,
              std::ostream& log);

} // namespace settlewell
