#include "settlewell/verification/column_model.h"

#include "settlewell/mesh/axis_grading.h"
#include "settlewell/mesh/box_mesh.h"
#include "settlewell/output/probes.h"
#include "settlewell/verification/case_support.h"

#include <algorithm>

namespace settlewell::verification {

namespace {

std::vector<double> column_edges(const ColumnSpec& spec) {
  if (spec.drained_base)
    return symmetric_cell_edges(-spec.height, 0.0, spec.n_cells, spec.growth);
  // Finest at the drained top.
  return cell_edges({-spec.height, 0.0, spec.n_cells, 1.0 / spec.growth});
}

BiotSetup column_setup(const ColumnSpec& spec) {
  BiotSetup setup;
  setup.analysis = spec.analysis;
  PoroelasticMaterial clay;
  clay.poisson_ratio = spec.poisson_ratio;
  clay.youngs_modulus = PoroelasticMaterial::youngs_from_mv(spec.mv, spec.poisson_ratio);
  clay.conductivity_x = clay.conductivity_y = spec.conductivity;
  setup.materials["soil"] = clay;
  setup.initial_head = [](const dealii::Point<2>&) { return 0.0; };
  auto& bc = setup.conditions;
  bc.fix("left", true, false).fix("right", true, false).fix("bottom", true, true);
  bc.head("top", uniform(step_at_start(-spec.head_drop)));
  if (spec.drained_base)
    bc.head("bottom", uniform(step_at_start(-spec.head_drop)));
  if (spec.surface_load != 0.0)
    bc.normal_traction("top", uniform(step_at_start(-spec.surface_load)));
  return setup;
}

} // namespace

ColumnModel::ColumnModel(const ColumnSpec& spec, MPI_Comm comm)
    : spec_(spec) {
  BoxSpec box;
  const double x0 = spec.analysis == AnalysisType::axisymmetric ? spec.inner_radius : 0.0;
  box.x_edges = {x0, x0 + 1.0};
  box.y_edges = column_edges(spec);
  mesh_ = std::make_unique<Mesh>(make_box_mesh(box, comm));
  problem_ = std::make_unique<BiotProblem>(*mesh_, column_setup(spec));
}

double ColumnModel::cv() const {
  const auto& clay = problem_->setup().materials.at("soil");
  return clay.consolidation_coefficient(clay.conductivity_y, problem_->setup().gamma_w);
}

double ColumnModel::drainage_path() const {
  return spec_.drained_base ? spec_.height / 2.0 : spec_.height;
}

double ColumnModel::initial_excess() const {
  return problem_->setup().gamma_w * spec_.head_drop + spec_.surface_load;
}

double ColumnModel::ultimate_settlement() const {
  return spec_.mv * initial_excess() * spec_.height;
}

double ColumnModel::settlement() const {
  const double x_mid =
      (spec_.analysis == AnalysisType::axisymmetric ? spec_.inner_radius : 0.0) + 0.5;
  return -probe(*problem_, dealii::Point<2>(x_mid, 0.0)).uy;
}

double ColumnModel::excess_ratio(double Z) const {
  const double x_mid =
      (spec_.analysis == AnalysisType::axisymmetric ? spec_.inner_radius : 0.0) + 0.5;
  const double y = -std::min(Z * drainage_path(), spec_.height);
  const double final_excess = -problem_->setup().gamma_w * spec_.head_drop;
  const double p = probe(*problem_, dealii::Point<2>(x_mid, y)).excess_pressure;
  return (p - final_excess) / initial_excess();
}

} // namespace settlewell::verification
