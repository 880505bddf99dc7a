// libFuzzer target on the mesh reader as a user meets it: any bytes given as a .msh
// file are opened by Gmsh and, if Gmsh reads them, go through the reader's checks
// and its distributed triangulation (mesh_fuzz_support.h). Gmsh refusing the file
// is an answer (the reader's "Gmsh cannot read it"); so are a checked mesh and a
// one-line InputError; a crash, inside Gmsh or not, is a finding. Gmsh is not built
// with coverage, so the fuzzer is guided only by our code: this target mutates the
// bad-input and example .msh files more than it explores, and mesh_fuzz.cc does
// the exploring on plain data.
#include "gmsh_grid.h"
#include "mesh_fuzz_support.h"

#include <gmsh.h>

#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <string>
#include <unistd.h>

namespace {

/// A file of this process's own, as Gmsh reads files by name (and its format by
/// the name's ending).
std::string input_path;

} // namespace

extern "C" int LLVMFuzzerInitialize(int*, char***) {
  mesh_fuzz::start_mpi();
  input_path = "mesh_file_fuzz-" + std::to_string(getpid()) + ".msh";
  std::atexit([] { std::remove(input_path.c_str()); });
  return 0;
}

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  std::FILE* file = std::fopen(input_path.c_str(), "wb");
  if (!file || std::fwrite(data, 1, size, file) != size || std::fclose(file) != 0)
    mesh_fuzz::fail("cannot write " + input_path);
  // A session of its own, as the reader has: after a file it could not read, Gmsh
  // 4.8 reads nothing from the next file in the same session (no nodes, no error).
  settlewell::GmshSession session;
  try {
    gmsh::open(input_path);
  } catch (...) { // the reader's "Gmsh cannot read it" (Gmsh 4.8 throws strings)
    return 0;
  }
  mesh_fuzz::check_and_triangulate(settlewell::read_current_model(), input_path);
  return 0;
}
