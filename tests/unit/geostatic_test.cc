// The geostatic state of level, layered ground is in equilibrium: the cells'
// out-of-balance forces (weight minus the internal force of the absolute total
// stress, the integral excavation releases) sum to zero at every node inside the
// mesh. A wrong sign, weight or stress component leaves forces of the order of a
// cell's weight.
#include "settlewell/mesh/axis_grading.h"
#include "settlewell/mesh/box_mesh.h"
#include "settlewell/physics/cell_kernel.h"
#include "settlewell/physics/field_layout.h"

#include <deal.II/dofs/dof_handler.h>
#include <deal.II/dofs/dof_tools.h>
#include <deal.II/fe/mapping_q1.h>

#include <gtest/gtest.h>

#include <map>

using namespace settlewell;
using namespace dealii;

namespace {

/// Two invented layers: 3 m of sand (20 kN/m^3, K0 0.45) over 5 m of clay
/// (17 kN/m^3, K0 0.65), the water table 1 m below the top, alpha = 1.
struct Geostatic {
  double gamma_w = 9.81;
  double weight(double y) const { return y > -3.0 ? 20.0 : 17.0; }
  double k0(double y) const { return y > -3.0 ? 0.45 : 0.65; }
  double overburden(double y) const {
    return 20.0 * std::min(-y, 3.0) + 17.0 * std::max(-3.0 - y, 0.0);
  }
  double pore_pressure(double y) const { return gamma_w * (-1.0 - y); }
  SymmetricTensor<2, 3> effective_stress(double y) const {
    const double vertical = overburden(y) - pore_pressure(y);
    SymmetricTensor<2, 3> s;
    s[1][1] = -vertical;
    s[0][0] = s[2][2] = -k0(y) * vertical;
    return s;
  }
};

/// The largest summed out-of-balance force at a node off the boundary, and the
/// weight of the smallest cell (the scale of a wrong force).
std::pair<double, double> largest_interior_imbalance(AnalysisType analysis) {
  BoxSpec box;
  box.x_edges = cell_edges({1.0, 5.0, 4, 1.0});
  box.y_edges = cell_edges({-8.0, 0.0, 16, 1.0});
  box.bands = {{"clay", -8.0, -3.0}, {"sand", -3.0, 0.0}};
  const Mesh mesh = make_box_mesh(box, MPI_COMM_SELF);
  const FieldLayout layout;
  DoFHandler<2> dofs(*mesh.triangulation);
  dofs.distribute_dofs(layout.fe);
  const MappingQ1<2> mapping;
  CellKernel kernel(layout, analysis, mapping);
  const Geostatic state;
  CellCoefficients c;
  c.alpha = 1.0;
  std::map<types::global_dof_index, double> force;
  Vector<double> local(kernel.dofs_per_cell());
  std::vector<types::global_dof_index> indices(kernel.dofs_per_cell());
  for (const auto& cell : dofs.active_cell_iterators()) {
    kernel.reinit(cell);
    local = 0.0;
    kernel.add_geostatic_imbalance(
        c, state.weight(cell->center()[1]),
        [&](const Point<2>& x) { return state.effective_stress(x[1]); },
        [&](const Point<2>& x) { return state.pore_pressure(x[1]); }, local);
    cell->get_dof_indices(indices);
    for (unsigned int i = 0; i < indices.size(); ++i)
      force[indices[i]] += local(i);
  }
  const IndexSet boundary = DoFTools::extract_boundary_dofs(dofs);
  double largest = 0.0;
  for (const auto& [dof, f] : force)
    if (!boundary.is_element(dof))
      largest = std::max(largest, std::abs(f));
  return {largest, 17.0 * 1.0 * 0.5};
}

} // namespace

TEST(Geostatic, LevelLayeredGroundIsInEquilibriumInPlaneStrain) {
  const auto [largest, cell_weight] =
      largest_interior_imbalance(AnalysisType::plane_strain);
  EXPECT_LT(largest, 1e-10 * cell_weight);
}

// Axisymmetric: the hoop stress equals the radial one (K0 both ways), so the ring
// of soil is in radial equilibrium too; forces carry 2 pi r.
TEST(Geostatic, LevelLayeredGroundIsInEquilibriumAxisymmetric) {
  const auto [largest, cell_weight] =
      largest_interior_imbalance(AnalysisType::axisymmetric);
  EXPECT_LT(largest, 1e-10 * 2 * 3.14159 * 5.0 * cell_weight);
}
