#pragma once

#include "settlewell/core/state_archive.h"
#include "settlewell/scenario/scenario.h"

#include <mpi.h>

#include <cstdint>
#include <string>

namespace settlewell {

/// A run's checkpoint: the folder `checkpoint` in its run folder, holding
/// `state.bin` (this header, then the state of the problem, the monitors and
/// steps.csv) and the triangulation files of deal.II's distributed serialisation
/// (`mesh*`). A checkpoint is written into `checkpoint.partial` and renamed into
/// place once complete, so that a run killed at any moment leaves the last complete
/// one (as `checkpoint`, or `checkpoint.old` while they were being swapped).
struct CheckpointHeader {
  std::string scenario_path; ///< the scenario file the run was started from
  /// The command line's choices that change the model (they override the scenario).
  unsigned int refinements = 0;
  int solver = 0; ///< SolverChoice
  bool allow_large = false;
  std::string mesh_sha256; ///< of the user's mesh file; empty: generated
  std::uint64_t cells = 0; ///< active cells of the model
  std::uint64_t step = 0;  ///< steps done
  std::uint64_t steps_planned = 0;
  double time = 0.0;              ///< s, at the checkpoint
  std::string started;            ///< UTC, when the run was first started
  double wall_seconds_before = 0; ///< of the run up to the checkpoint
  std::uint32_t processes = 1;    ///< that wrote it (loading may use another count)
};

void visit(StateArchive& a, CheckpointHeader& h);

/// The checkpoint folder to resume `run_folder` from. Throws InputError (one line)
/// for a folder that is not a Settlewell run, a finished run, or one with no
/// complete checkpoint.
std::string checkpoint_to_resume(const std::string& run_folder);

/// The scenario a run was started with, as its run folder keeps it
/// (`scenario.toml`, paths in it taken from where the original was), with the
/// command line's choices of the header. Collective.
scenario::Scenario resumed_scenario(const std::string& run_folder,
                                    const CheckpointHeader& header);

/// Reads the header of a checkpoint (every rank reads the file). Collective.
CheckpointHeader read_checkpoint_header(const std::string& checkpoint, MPI_Comm comm);

} // namespace settlewell
