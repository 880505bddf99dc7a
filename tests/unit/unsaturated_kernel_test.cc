// The partly saturated cell terms (CellKernel::add_unsaturated_terms): their
// tangent against central differences of their residual, on one cell
// whose state straddles the water table, and their vanishing in saturated soil.
#include "settlewell/mesh/box_mesh.h"
#include "settlewell/physics/cell_kernel.h"

#include <deal.II/dofs/dof_handler.h>
#include <deal.II/fe/mapping_q1.h>
#include <deal.II/grid/grid_tools.h>

#include <gtest/gtest.h>

#include <cmath>

using namespace settlewell;

namespace {

Mesh one_cell_mesh() {
  BoxSpec box;
  box.x_edges = {0.0, 0.8};
  box.y_edges = {-0.5, 0.4};
  return make_box_mesh(box, MPI_COMM_WORLD);
}

struct OneCell {
  Mesh mesh;
  FieldLayout layout;
  dealii::DoFHandler<2> dofs;
  dealii::MappingQ1<2> mapping;
  OneCell()
      : mesh(one_cell_mesh()) {
    dofs.reinit(*mesh.triangulation);
    dofs.distribute_dofs(layout.fe);
  }
};

RetentionCurve curve(RetentionCurve::Model model, double n) {
  RetentionCurve c;
  c.model = model;
  c.saturated_content = 0.38;
  c.residual_content = 0.05;
  c.alpha = 2.5;
  c.n = n;
  return c;
}

CellCoefficients coefficients() {
  CellCoefficients c;
  c.alpha = 0.9;
  c.mobility[0][0] = 2e-5 / 9.81;
  c.mobility[1][1] = 1e-5 / 9.81;
  c.mobility[0][1] = c.mobility[1][0] = 3e-6 / 9.81;
  return c;
}

/// A state whose pressure changes and strains are all of some size.
dealii::Vector<double> state(const OneCell& cell, double scale, double shift) {
  dealii::Vector<double> v(cell.layout.fe.n_dofs_per_cell());
  for (unsigned int i = 0; i < v.size(); ++i) {
    const bool u =
        cell.layout.is_displacement(cell.layout.fe.system_to_component_index(i).first);
    v(i) = (u ? 1e-3 : scale) * std::sin(1.7 * i + shift);
  }
  return v;
}

} // namespace

TEST(UnsaturatedKernel, TangentMatchesCentralDifferences) {
  OneCell cell;
  const auto c = coefficients();
  for (const auto& rc : {curve(RetentionCurve::Model::van_genuchten, 1.6),
                         curve(RetentionCurve::Model::van_genuchten, 2.8),
                         curve(RetentionCurve::Model::gardner, 0.0)}) {
    UnsaturatedCoefficients u;
    u.curve = &rc;
    u.gamma_w = 9.81;
    // The water table 0.1 m above the cell's middle, on a slope.
    u.start_pressure = [](const dealii::Point<2>& x) {
      return 9.81 * (0.05 + 0.1 * x[0] - x[1]);
    };
    CellKernel kernel(cell.layout, AnalysisType::plane_strain, cell.mapping);
    kernel.reinit(cell.dofs.begin_active());
    const unsigned int n = kernel.dofs_per_cell();
    const auto local = state(cell, 4.0, 0.0), old = state(cell, 3.0, 0.4);
    const double dt = 3600.0;
    dealii::FullMatrix<double> tangent(n, n);
    dealii::Vector<double> residual(n), up(n), down(n);
    kernel.add_unsaturated_terms(c, u, local, old, dt, &tangent, residual);
    double largest = 0.0, worst = 0.0;
    for (unsigned int j = 0; j < n; ++j) {
      const bool is_u =
          cell.layout.is_displacement(cell.layout.fe.system_to_component_index(j).first);
      const double h = is_u ? 1e-7 : 1e-5;
      auto plus = local, minus = local;
      plus(j) += h;
      minus(j) -= h;
      up = 0.0;
      down = 0.0;
      kernel.add_unsaturated_terms(c, u, plus, old, dt, nullptr, up);
      kernel.add_unsaturated_terms(c, u, minus, old, dt, nullptr, down);
      for (unsigned int i = 0; i < n; ++i) {
        const double difference = (up(i) - down(i)) / (2.0 * h);
        largest = std::max(largest, std::abs(difference));
        worst = std::max(worst, std::abs(tangent(i, j) - difference));
      }
    }
    EXPECT_GT(largest, 0.0);
    // Central differences err by O(h^2) and round-off; 1e-6 of the largest entry.
    EXPECT_LT(worst, 1e-6 * largest) << RetentionCurve::name(rc.model) << " n " << rc.n;
  }
}

TEST(UnsaturatedKernel, NothingWhereTheSoilStaysSaturated) {
  OneCell cell;
  const auto rc = curve(RetentionCurve::Model::van_genuchten, 2.0);
  UnsaturatedCoefficients u;
  u.curve = &rc;
  u.gamma_w = 9.81;
  u.start_pressure = [](const dealii::Point<2>& x) { return 9.81 * (3.0 - x[1]); };
  CellKernel kernel(cell.layout, AnalysisType::plane_strain, cell.mapping);
  kernel.reinit(cell.dofs.begin_active());
  const unsigned int n = kernel.dofs_per_cell();
  dealii::FullMatrix<double> tangent(n, n);
  dealii::Vector<double> residual(n);
  kernel.add_unsaturated_terms(coefficients(), u, state(cell, 4.0, 0.0),
                               state(cell, 3.0, 0.4), 3600.0, &tangent, residual);
  EXPECT_EQ(residual.l2_norm(), 0.0);
  EXPECT_EQ(tangent.frobenius_norm(), 0.0);
}
