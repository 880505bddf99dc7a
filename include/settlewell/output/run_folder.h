#pragma once

#include <mpi.h>

#include <string>
#include <vector>

namespace settlewell {

/// What a results folder holds: one run (with its report), or a sweep of runs.
enum class FolderKind { run, sweep };

/// Prepares an empty results folder on rank 0 and marks it as Settlewell's
/// (manifest.json, state "running"). Collective. Throws InputError, touching
/// nothing, for: a path that is not a folder; the current folder or one that holds
/// it; a folder that holds one of `inputs` (the files the run reads); a folder that
/// already holds files, unless `overwrite`. With `overwrite`, the folder must be
/// one Settlewell wrote for the same kind (its manifest.json says so) and hold only
/// what such a folder holds (folder_entries); exactly those entries are removed.
void prepare_run_folder(const std::string& path,
                        bool overwrite,
                        FolderKind kind,
                        const std::vector<std::string>& inputs,
                        MPI_Comm comm);

/// Whether `name` is a top-level entry (file or folder) that a run (with its
/// report) or a sweep writes into its folder.
bool is_folder_entry(FolderKind kind, const std::string& name);

/// Writes `folder`/manifest.json's short form on rank 0: the program, the kind of
/// folder, its state ("running" before anything else is written, "failed" when a
/// run stops on an error) and a detail (the error), if any.
void write_folder_state(const std::string& folder,
                        FolderKind kind,
                        const std::string& state,
                        const std::string& detail,
                        MPI_Comm comm);

/// "run" or "sweep", as manifests write it.
const char* kind_name(FolderKind kind);

/// Lower-case hex SHA-256 of a file's bytes.
std::string sha256_of_file(const std::string& path);

/// The time now as ISO 8601 in UTC ("2026-12-01T23:38:04Z").
std::string utc_now();

} // namespace settlewell
