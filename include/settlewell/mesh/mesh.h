#pragma once

#include "settlewell/mesh/name_table.h"

#include <deal.II/distributed/tria.h>

#include <memory>

namespace settlewell {

/// A distributed triangulation together with the names of its regions
/// (material ids) and boundaries (boundary ids).
struct Mesh {
  explicit Mesh(MPI_Comm comm);

  std::unique_ptr<dealii::parallel::distributed::Triangulation<2>> triangulation;
  NameTable names;
};

} // namespace settlewell
