#pragma once

#include "settlewell/mesh/mesh.h"

#include <deal.II/dofs/dof_handler.h>

#include <utility>
#include <vector>

namespace settlewell {

/// The pressure degrees of freedom on an internal line (locally relevant ones,
/// with their positions), so that heads can be prescribed inside the mesh.
std::vector<std::pair<dealii::types::global_dof_index, dealii::Point<2>>>
pressure_dofs_on_line(const dealii::DoFHandler<2>& dof_handler,
                      const std::vector<Segment>& line);

/// The pressure degrees of freedom on a boundary (locally relevant ones, with
/// their positions).
std::vector<std::pair<dealii::types::global_dof_index, dealii::Point<2>>>
pressure_dofs_on_boundary(const dealii::DoFHandler<2>& dof_handler,
                          dealii::types::boundary_id id);

/// A cell face lying on an internal line.
struct LineFace {
  dealii::DoFHandler<2>::active_cell_iterator cell;
  unsigned int face = 0;
};

/// The faces of locally owned cells that lie on a boundary.
std::vector<LineFace> faces_on_boundary(const dealii::DoFHandler<2>& dof_handler,
                                        dealii::types::boundary_id id);

/// The faces on an internal line that this process integrates over: each face is
/// taken once, from the locally owned cell of the two with the smaller id.
std::vector<LineFace> faces_on_line(const dealii::DoFHandler<2>& dof_handler,
                                    const std::vector<Segment>& line);

} // namespace settlewell
