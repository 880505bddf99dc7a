#pragma once

// What the two mesh fuzz targets share (mesh_fuzz.cc: plain data; mesh_file_fuzz.cc:
// .msh text through Gmsh): MPI and p4est started as the program starts them, and the
// reader's path from a model to a distributed triangulation, whose every answer but
// a checked mesh or a one-line InputError is a finding.
#include "gmsh_checks.h"

#include "settlewell/core/errors.h"

#include <deal.II/distributed/tria.h>

#include <mpi.h>
#include <p4est_base.h>
#include <sanitizer/lsan_interface.h>

#include <cstdio>
#include <cstdlib>
#include <string>

namespace mesh_fuzz {

/// A finding that is not a crash by itself: reported, then the process aborts so
/// that libFuzzer keeps the input.
[[noreturn]] inline void fail(const std::string& what) {
  std::fprintf(stderr, "mesh fuzz: %s\n", what.c_str());
  std::abort();
}

/// MPI and p4est as deal.II's MPI_InitFinalize starts them (p4est silent), but
/// without Open MPI's handlers of SIGABRT and SIGSEGV, which would end the process
/// before libFuzzer saves the input. What Open MPI allocates for the process and
/// never frees is not counted as leaked.
inline void start_mpi() {
  setenv("OMPI_MCA_opal_signal", "", 1);
  __lsan_disable();
  MPI_Init(nullptr, nullptr);
  __lsan_enable();
  sc_init(MPI_COMM_WORLD, 0, 0, nullptr, SC_LP_SILENT);
  p4est_init(nullptr, SC_LP_SILENT);
}

/// Checks a model as the reader does and, if it passes, makes the reader's
/// distributed triangulation of it (on one process p4est still builds its forest,
/// which refuses meshes a serial triangulation takes, such as a side of three
/// cells). Any exception but InputError escapes; so does a message of more than one
/// line or one that does not start with `source`.
inline void check_and_triangulate(const settlewell::GmshModelData& model,
                                  const std::string& source) {
  settlewell::CheckedMesh mesh;
  try {
    mesh = settlewell::check_gmsh_model(model, source);
  } catch (const settlewell::InputError& e) {
    const std::string message = e.what();
    if (message.find('\n') != std::string::npos || message.rfind(source, 0) != 0)
      fail("not a one-line message naming the file: " + message);
    return;
  }
  const std::size_t cells = mesh.cells.size();
  dealii::parallel::distributed::Triangulation<2> triangulation(MPI_COMM_SELF);
  settlewell::create_checked_triangulation(mesh, triangulation);
  if (triangulation.n_global_active_cells() != cells)
    fail("deal.II made " + std::to_string(triangulation.n_global_active_cells()) +
         " cells of " + std::to_string(cells));
}

} // namespace mesh_fuzz
