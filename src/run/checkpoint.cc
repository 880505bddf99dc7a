#include "settlewell/run/checkpoint.h"

#include "settlewell/core/errors.h"
#include "settlewell/scenario/parse.h"

#include <filesystem>
#include <fstream>
#include <iterator>
#include <regex>
#include <sstream>

namespace settlewell {

namespace fs = std::filesystem;

void visit(StateArchive& a, CheckpointHeader& h) {
  a.mark("settlewell checkpoint 1");
  a& h.scenario_path& h.refinements& h.solver& h.allow_large& h.mesh_sha256& h.cells& h
      .step& h.steps_planned& h.time& h.started& h.wall_seconds_before& h.processes;
}

namespace {

std::string text_of(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  return std::string((std::istreambuf_iterator<char>(in)),
                     std::istreambuf_iterator<char>());
}

} // namespace

std::string checkpoint_to_resume(const std::string& run_folder) {
  const std::string manifest = text_of(run_folder + "/manifest.json");
  if (!std::regex_search(manifest, std::regex(R"("program"\s*:\s*"settlewell")")) ||
      !std::regex_search(manifest, std::regex(R"("kind"\s*:\s*"run")")))
    throw InputError(run_folder + ": is not a Settlewell run folder (no manifest.json "
                                  "of a run); --resume needs the folder of a run");
  if (std::regex_search(manifest, std::regex(R"("state"\s*:\s*"finished")")))
    throw InputError(run_folder + ": the run has finished; there is nothing to resume");
  // checkpoint.old is the last complete one only while a new one is swapped in.
  for (const char* name : {"/checkpoint", "/checkpoint.old"})
    if (fs::exists(run_folder + name + "/state.bin"))
      return run_folder + name;
  throw InputError(run_folder + ": has no checkpoint (the run stopped before its first "
                                "output time); start it again");
}

CheckpointHeader read_checkpoint_header(const std::string& checkpoint, MPI_Comm comm) {
  const std::string source = checkpoint + "/state.bin";
  std::istringstream in(text_of(source));
  StateArchive a(in, source, "", comm);
  CheckpointHeader header;
  a& header;
  return header;
}

scenario::Scenario resumed_scenario(const std::string& run_folder,
                                    const CheckpointHeader& header) {
  // Parsed under the original's name, so that a mesh file named relative to the
  // scenario is found where the run found it.
  auto s = scenario::parse_scenario(text_of(run_folder + "/scenario.toml"),
                                    header.scenario_path);
  s.numerics.refinements = header.refinements;
  s.numerics.solver = static_cast<SolverChoice>(header.solver);
  s.numerics.allow_large = header.allow_large;
  return s;
}

} // namespace settlewell
