#include "extremes.h"

#include "dof_values.h"

#include "settlewell/mesh/gmsh_mesh.h"
#include "settlewell/physics/field_layout.h"

#include <deal.II/base/mpi.h>
#include <deal.II/dofs/dof_tools.h>

#include <cmath>
#include <map>

namespace settlewell::monitors {

using namespace dealii;

namespace {

std::vector<types::global_dof_index> owned_boundary_dofs(const BiotProblem& problem,
                                                         const std::string& boundary,
                                                         unsigned int component) {
  std::vector<types::global_dof_index> dofs;
  if (!problem.mesh().names.has_boundary(boundary))
    return dofs;
  const IndexSet on = DoFTools::extract_boundary_dofs(
      problem.dof_handler(), problem.layout().mask_of(component),
      {problem.mesh().names.boundary_id(boundary)});
  for (const auto d : on)
    if (problem.dof_handler().locally_owned_dofs().is_element(d))
      dofs.push_back(d);
  return dofs;
}

} // namespace

Extremes::Extremes(const RunContext& run) {
  const BiotProblem& problem = run.problem;
  const scenario::Scenario& s = run.scenario;
  const auto& dh = problem.dof_handler();
  std::map<types::global_dof_index, Point<2>> support;
  DoFTools::map_dofs_to_support_points(problem.mapping(), dh, support);
  double outer = 0.0;
  if (s.section) {
    has_wall_zone_ = true;
    inner_ = s.section->excavation_width / 2;
    outer = inner_ + (s.section->wall ? s.section->wall->thickness : 0);
  }
  for (const auto& e : problem.setup().excavation)
    first_dig_ = first_dig_ < 0.0 ? e.start : std::min(first_dig_, e.start);
  const auto& fe = dh.get_fe();
  std::vector<types::global_dof_index> cell_dofs(fe.n_dofs_per_cell());
  std::map<types::global_dof_index, unsigned int> component;
  for (const auto& cell : dh.active_cell_iterators())
    if (cell->is_locally_owned()) {
      cell->get_dof_indices(cell_dofs);
      for (unsigned int i = 0; i < cell_dofs.size(); ++i)
        component[cell_dofs[i]] = fe.system_to_component_index(i).first;
    }
  const double tol = 1e-9 * (1.0 + outer);
  for (const auto& [dof, c] : component) {
    if (!dh.locally_owned_dofs().is_element(dof))
      continue;
    const bool outside = has_wall_zone_ && std::abs(support.at(dof)[0]) >= outer - tol;
    if (c == FieldLayout::uy)
      all_uy_.push_back(dof);
    if (c == FieldLayout::pressure) {
      all_p_.push_back(dof);
      if (outside)
        outside_p_.push_back(dof);
    }
  }
  pit_surface_uy_ =
      owned_boundary_dofs(problem, section_names::pit_surface, FieldLayout::uy);
  for (const auto d :
       owned_boundary_dofs(problem, section_names::ground_surface, FieldLayout::uy))
    if (std::abs(support.at(d)[0]) >= outer - tol)
      outside_surface_uy_.push_back(d);
}

double Extremes::largest(const BiotProblem& problem, const Dofs& dofs, double factor) {
  return Utilities::MPI::max(largest_scaled(problem.reported_solution(), dofs, factor),
                             problem.communicator());
}

double Extremes::floor_heave_now(const BiotProblem& problem) const {
  const auto& fe = problem.dof_handler().get_fe();
  std::vector<types::global_dof_index> dofs(fe.n_dofs_per_cell());
  double heave = 0.0;
  for (const auto& cell : problem.dof_handler().active_cell_iterators()) {
    if (!cell->is_locally_owned() || problem.is_removed(cell->active_cell_index()) ||
        std::abs(cell->center()[0]) > inner_)
      continue;
    cell->get_dof_indices(dofs);
    for (unsigned int i = 0; i < dofs.size(); ++i)
      if (fe.system_to_component_index(i).first == FieldLayout::uy)
        heave = std::max(heave, double(problem.reported_solution()[dofs[i]]));
  }
  return Utilities::MPI::max(heave, problem.communicator());
}

std::vector<double> Extremes::after_step(const RunView& view) {
  const BiotProblem& problem = view.run.problem;
  const double to_drawdown = -1.0 / problem.setup().gamma_w;
  const bool dug = first_dig_ >= 0.0 && view.step.time > first_dig_;
  if (!dug)
    pit_ = std::max(pit_, largest(problem, pit_surface_uy_, -1.0));
  else if (has_wall_zone_)
    floor_heave_ = std::max(floor_heave_, floor_heave_now(problem));
  const double outside_now = largest(problem, outside_surface_uy_, -1.0);
  outside_ = std::max(outside_, outside_now);
  stage_outside_.resize(view.run.schedule.stages().size(), 0.0);
  stage_outside_[view.stage()] = std::max(stage_outside_[view.stage()], outside_now);
  anywhere_ = std::max(anywhere_, largest(problem, all_uy_, -1.0));
  drawdown_outside_ =
      std::max(drawdown_outside_, largest(problem, outside_p_, to_drawdown));
  drawdown_ = std::max(drawdown_, largest(problem, all_p_, to_drawdown));
  return {};
}

void Extremes::finish(const RunView& view, toml::table& results) {
  toml::table summary{{"settlement_anywhere_m", anywhere_},
                      {"drawdown_anywhere_m", drawdown_}};
  if (has_wall_zone_) {
    summary.insert("settlement_inside_m", pit_);
    if (first_dig_ >= 0.0) // the pit surface only until it is dug
      summary.insert("floor_heave_m", floor_heave_);
    summary.insert("settlement_outside_m", outside_);
    summary.insert("drawdown_outside_m", drawdown_outside_);
    toml::array stages;
    for (std::size_t k = 0; k < stage_outside_.size(); ++k)
      stages.push_back(toml::table{{"stage", view.run.schedule.stages()[k].name},
                                   {"settlement_outside_m", stage_outside_[k]}});
    summary.insert("stages", stages);
  }
  results.insert("summary", summary);
}

void Extremes::visit_state(StateArchive& a) {
  a.mark("extremes");
  a& floor_heave_& pit_& outside_& anywhere_& drawdown_outside_& drawdown_&
      stage_outside_;
}

} // namespace settlewell::monitors
