#include "extremes.h"

#include "dof_values.h"

#include "settlewell/core/number_text.h"
#include "settlewell/core/units.h"
#include "settlewell/mesh/gmsh_mesh.h"
#include "settlewell/model/model_builder.h"
#include "settlewell/physics/field_layout.h"

#include <deal.II/base/mpi.h>
#include <deal.II/dofs/dof_tools.h>

#include <cmath>
#include <iostream>
#include <limits>
#include <optional>
#include <set>

namespace settlewell::monitors {

using namespace dealii;

namespace {

/// Values closer than this (relative) are the same maximum: the run's round-off,
/// which differs between process counts and a resumed run, then does not move the
/// place or the time of a maximum (a well's head held for months is reached at the
/// end of its ramp, not at whichever later step rounds up).
constexpr double same_value = 1e-9;

bool clearly_larger(double a, double b) {
  return a > b + same_value * std::abs(b);
}

} // namespace

void Located::keep_larger(const Located& now, double at) {
  if (!clearly_larger(now.value, value))
    return;
  *this = now;
  time = at;
}

void visit(StateArchive& a, Located& l) {
  a& l.value& l.x& l.y& l.time& l.region;
}

void Extremes::Sites::add(types::global_dof_index dof,
                          const Point<2>& at,
                          const std::string& region) {
  dofs.push_back(dof);
  points.push_back(at);
  regions.push_back(region);
}

Located
share_largest(const std::vector<Located>& candidates, MPI_Comm comm, double kept) {
  double local = 0.0;
  for (const auto& c : candidates)
    local = std::max(local, c.value);
  const double largest = Utilities::MPI::max(local, comm);
  if (!clearly_larger(largest, kept))
    return Located{largest, 0.0, 0.0, 0.0, ""}; // not a new maximum: no place needed
  const auto first = [](const Located& a, const Located& b) {
    return a.x < b.x || (a.x == b.x && a.y < b.y);
  };
  std::optional<Located> mine;
  for (const auto& c : candidates)
    if (!clearly_larger(largest, c.value) && (!mine || first(c, *mine)))
      mine = c;
  // Each process's choice as plain numbers and its region's name.
  const std::vector<double> numbers =
      mine ? std::vector<double>{mine->value, mine->x, mine->y} : std::vector<double>{};
  const auto all_numbers = Utilities::MPI::all_gather(comm, numbers);
  const auto all_regions = Utilities::MPI::all_gather(comm, mine ? mine->region : "");
  std::optional<Located> best;
  for (std::size_t rank = 0; rank < all_numbers.size(); ++rank) {
    const auto& n = all_numbers[rank];
    if (n.empty())
      continue;
    const Located theirs{n[0], n[1], n[2], 0.0, all_regions[rank]};
    if (!best || first(theirs, *best))
      best = theirs;
  }
  Located out = best.value_or(Located{});
  out.value = largest;
  return out;
}

namespace {

/// Where each dof of this process's cells lies, and the regions of the cells that
/// hold it (two or more on a boundary between regions). The ghost cells count too:
/// every cell beside an owned dof is owned or a ghost, so a dof on a partition's
/// edge has the same regions on any number of processes.
struct DofPlaces {
  std::map<types::global_dof_index, unsigned int> component;
  std::map<types::global_dof_index, std::set<std::string>> regions;
  std::map<types::global_dof_index, Point<2>> support;
};

/// "soft_clay" inside a region; "aquifer_sand / soft_clay" on their boundary.
std::string joined(const std::set<std::string>& names) {
  std::string out;
  for (const auto& n : names)
    out += (out.empty() ? "" : " / ") + n;
  return out;
}

DofPlaces dof_places(const BiotProblem& problem) {
  DofPlaces places;
  const auto& dh = problem.dof_handler();
  DoFTools::map_dofs_to_support_points(problem.mapping(), dh, places.support);
  const auto& fe = dh.get_fe();
  std::vector<types::global_dof_index> cell_dofs(fe.n_dofs_per_cell());
  for (const auto& cell : dh.active_cell_iterators())
    if (!cell->is_artificial()) {
      cell->get_dof_indices(cell_dofs);
      const std::string& region = problem.mesh().names.region_name(cell->material_id());
      for (unsigned int i = 0; i < cell_dofs.size(); ++i) {
        places.component[cell_dofs[i]] = fe.system_to_component_index(i).first;
        places.regions[cell_dofs[i]].insert(region);
      }
    }
  return places;
}

std::set<types::global_dof_index> owned_boundary_dofs(const BiotProblem& problem,
                                                      const std::string& boundary,
                                                      unsigned int component) {
  std::set<types::global_dof_index> dofs;
  if (!problem.mesh().names.has_boundary(boundary))
    return dofs;
  const IndexSet on = DoFTools::extract_boundary_dofs(
      problem.dof_handler(), problem.layout().mask_of(component),
      {problem.mesh().names.boundary_id(boundary)});
  for (const auto d : on)
    if (problem.dof_handler().locally_owned_dofs().is_element(d))
      dofs.insert(d);
  return dofs;
}

} // namespace

Extremes::Extremes(const RunContext& run)
    : suction_limit_(run.scenario.limits.suction) {
  const BiotProblem& problem = run.problem;
  const scenario::Scenario& s = run.scenario;
  double outer = 0.0;
  if (s.section) {
    has_wall_zone_ = true;
    inner_ = s.section->excavation_width / 2;
    outer = inner_ + (s.section->wall ? s.section->wall->thickness : 0);
  }
  for (const auto& e : problem.setup().excavation)
    first_dig_ = first_dig_ < 0.0 ? e.start : std::min(first_dig_, e.start);
  const DofPlaces places = dof_places(problem);
  const auto pit_surface =
      owned_boundary_dofs(problem, section_names::pit_surface, FieldLayout::uy);
  const auto ground_surface =
      owned_boundary_dofs(problem, section_names::ground_surface, FieldLayout::uy);
  const double tol = 1e-9 * (1.0 + outer);
  const auto& owned = problem.dof_handler().locally_owned_dofs();
  const double gw = problem.setup().gamma_w;
  const auto materials = model::region_materials(s, problem.mesh());
  for (const auto& [region, material] : materials) {
    const auto id = problem.mesh().names.region_id(region);
    suction_limits_.resize(std::max<std::size_t>(suction_limits_.size(), id + 1),
                           suction_limit_);
    suction_limits_[id] =
        s.materials.at(material).air_entry_suction.value_or(suction_limit_);
    // A section's wall is not soil; a soil with a retention curve drains.
    if (region == section_names::wall_region || s.materials.at(material).retention)
      suction_limits_[id] = std::numeric_limits<double>::infinity();
  }
  for (const auto& [dof, c] : places.component)
    if (c == FieldLayout::pressure) {
      const Point<2>& at = places.support.at(dof);
      start_pressure_[dof] = gw * (problem.setup().initial_head(at) - at[1]);
    }
  for (const auto& [dof, c] : places.component) {
    if (!owned.is_element(dof))
      continue;
    const Point<2>& at = places.support.at(dof);
    const auto& regions = places.regions.at(dof);
    const std::string region = joined(regions);
    const bool outside = has_wall_zone_ && std::abs(at[0]) >= outer - tol;
    if (c == FieldLayout::uy) {
      all_uy_.add(dof, at, region);
      if (pit_surface.count(dof))
        pit_surface_uy_.add(dof, at, region);
      if (ground_surface.count(dof) && outside)
        outside_surface_uy_.add(dof, at, region);
    }
    if (c == FieldLayout::pressure) {
      all_p_.add(dof, at, region);
      if (outside) {
        outside_p_.add(dof, at, region);
        for (const auto& r : regions)
          if (r != section_names::wall_region)
            outside_p_by_region_[r].add(dof, at, r);
      }
    }
  }
  // Every process lists every region outside the wall, so that each takes part in
  // the same collective calls.
  const auto local_names = [&] {
    std::vector<std::string> names;
    for (const auto& [name, sites] : outside_p_by_region_)
      names.push_back(name);
    return names;
  }();
  for (const auto& list : Utilities::MPI::all_gather(problem.communicator(), local_names))
    for (const auto& name : list)
      outside_p_by_region_[name];
}

Located Extremes::largest(const BiotProblem& problem,
                          const Sites& sites,
                          double factor,
                          double kept) {
  // The candidates: this process's values above zero (a maximum of 0 has no place).
  std::vector<Located> candidates;
  const auto values = values_at(problem.reported_solution(), sites.dofs);
  double local = 0.0;
  for (const double v : values)
    local = std::max(local, factor * v);
  for (std::size_t i = 0; i < values.size(); ++i)
    if (factor * values[i] > 0.0 && !clearly_larger(local, factor * values[i]))
      candidates.push_back({factor * values[i], sites.points[i][0], sites.points[i][1],
                            0.0, sites.regions[i]});
  return share_largest(candidates, problem.communicator(), kept);
}

Located Extremes::floor_heave_now(const BiotProblem& problem) const {
  const auto& fe = problem.dof_handler().get_fe();
  const auto& unit_points = fe.get_unit_support_points();
  std::vector<types::global_dof_index> dofs(fe.n_dofs_per_cell());
  std::vector<Located> candidates;
  double local = 0.0;
  for (const auto& cell : problem.dof_handler().active_cell_iterators()) {
    if (!cell->is_locally_owned() || problem.is_removed(cell->active_cell_index()) ||
        std::abs(cell->center()[0]) > inner_)
      continue;
    cell->get_dof_indices(dofs);
    for (unsigned int i = 0; i < dofs.size(); ++i) {
      const double up = problem.reported_solution()[dofs[i]];
      if (fe.system_to_component_index(i).first != FieldLayout::uy || up <= 0.0 ||
          clearly_larger(local, up))
        continue;
      local = std::max(local, up);
      const Point<2> at =
          problem.mapping().transform_unit_to_real_cell(cell, unit_points[i]);
      candidates.push_back(
          {up, at[0], at[1], 0.0, problem.mesh().names.region_name(cell->material_id())});
    }
  }
  return share_largest(candidates, problem.communicator(), floor_heave_.value);
}

Located Extremes::suction_now(const BiotProblem& problem, bool& over) const {
  const auto& fe = problem.dof_handler().get_fe();
  const auto& unit_points = fe.get_unit_support_points();
  const auto& solution = problem.solution();
  std::vector<types::global_dof_index> dofs(fe.n_dofs_per_cell());
  std::vector<Located> candidates;
  double local = 0.0;
  bool local_over = false;
  for (const auto& cell : problem.dof_handler().active_cell_iterators()) {
    if (!cell->is_locally_owned() || problem.is_removed(cell->active_cell_index()))
      continue;
    cell->get_dof_indices(dofs);
    for (unsigned int i = 0; i < dofs.size(); ++i) {
      if (fe.system_to_component_index(i).first != FieldLayout::pressure)
        continue;
      const double limit = suction_limits_.at(cell->material_id());
      const double suction = -(start_pressure_.at(dofs[i]) + solution[dofs[i]]);
      // Beyond the limit where the analysis added to it (the start's suction
      // moves nothing); a wall is no soil.
      local_over = local_over || (suction > limit && solution[dofs[i]] < -0.01 * limit);
      if (std::isinf(limit) || suction <= 0.0 || clearly_larger(local, suction))
        continue;
      local = std::max(local, suction);
      const Point<2> at =
          problem.mapping().transform_unit_to_real_cell(cell, unit_points[i]);
      candidates.push_back({suction, at[0], at[1], 0.0,
                            problem.mesh().names.region_name(cell->material_id())});
    }
  }
  over = Utilities::MPI::logical_or(local_over, problem.communicator());
  return share_largest(candidates, problem.communicator(), suction_.value);
}

std::vector<double> Extremes::after_step(const RunView& view) {
  const BiotProblem& problem = view.run.problem;
  const double to_drawdown = -1.0 / problem.setup().gamma_w;
  const double t = view.step.time;
  const bool dug = first_dig_ >= 0.0 && t > first_dig_;
  if (!dug)
    pit_.keep_larger(largest(problem, pit_surface_uy_, -1.0, pit_.value), t);
  else if (has_wall_zone_)
    floor_heave_.keep_larger(floor_heave_now(problem), t);
  const Located outside_now = largest(problem, outside_surface_uy_, -1.0, outside_.value);
  outside_.keep_larger(outside_now, t);
  stage_outside_.resize(view.run.schedule.stages().size(), 0.0);
  stage_outside_[view.stage()] =
      std::max(stage_outside_[view.stage()], outside_now.value);
  anywhere_.keep_larger(largest(problem, all_uy_, -1.0, anywhere_.value), t);
  drawdown_.keep_larger(largest(problem, all_p_, to_drawdown, drawdown_.value), t);
  bool over = false;
  const Located suction = suction_now(problem, over);
  suction_.keep_larger(suction, t);
  if (over && suction_steps_++ == 0 && Utilities::MPI::this_mpi_process(view.comm()) == 0)
    std::cerr << "settlewell: warning: at day " << units::to_days(t)
              << " the analysis has raised the suction in soil beyond its air-entry "
                 "limit (materials.<name>.air_entry_suction, else checks.suction_limit, "
              << significant(suction_limit_)
              << " kPa): the model keeps it saturated and counts the suction in its "
                 "effective stress, where real soil would drain (unsaturated flow is "
                 "not modelled; the run's last lines count such steps)\n";
  if (has_wall_zone_) {
    drawdown_outside_.keep_larger(
        largest(problem, outside_p_, to_drawdown, drawdown_outside_.value), t);
    for (const auto& [region, sites] : outside_p_by_region_) {
      Located& kept = drawdown_outside_by_region_[region];
      kept.keep_larger(largest(problem, sites, to_drawdown, kept.value), t);
    }
  }
  return {};
}

namespace {

/// Where and when a largest value was reached: {x_m, y_m, region, time_days}; the
/// value itself stays in its own key, which readers of earlier runs know.
toml::table place_of(const Located& l) {
  return toml::table{{"x_m", l.x},
                     {"y_m", l.y},
                     {"region", l.region},
                     {"time_days", units::to_days(l.time)}};
}

/// The value as `key`_m and, when it is not zero (a zero is reached everywhere at
/// the start), its place as `key`_at.
void insert_located(toml::table& summary, const std::string& key, const Located& l) {
  summary.insert(key + "_m", l.value);
  if (l.value > 0.0)
    summary.insert(key + "_at", place_of(l));
}

} // namespace

void Extremes::finish(const RunView& view, toml::table& results) {
  toml::table summary;
  insert_located(summary, "settlement_anywhere", anywhere_);
  insert_located(summary, "drawdown_anywhere", drawdown_);
  summary.insert("suction_largest_kPa", suction_.value);
  if (suction_.value > 0.0)
    summary.insert("suction_largest_at", place_of(suction_));
  summary.insert("suction_limit_kPa", suction_limit_);
  summary.insert("steps_over_suction_limit", int64_t(suction_steps_));
  if (has_wall_zone_) {
    insert_located(summary, "settlement_inside", pit_);
    if (first_dig_ >= 0.0) // the pit surface only until it is dug
      insert_located(summary, "floor_heave", floor_heave_);
    insert_located(summary, "settlement_outside", outside_);
    insert_located(summary, "drawdown_outside", drawdown_outside_);
    toml::array by_region;
    for (const auto& [region, l] : drawdown_outside_by_region_) {
      toml::table entry = l.value > 0.0 ? place_of(l) : toml::table{};
      entry.insert_or_assign("region", region);
      entry.insert("drawdown_m", l.value);
      by_region.push_back(entry);
    }
    summary.insert("drawdown_outside_by_region", by_region);
    toml::array stages;
    for (std::size_t k = 0; k < stage_outside_.size(); ++k)
      stages.push_back(toml::table{{"stage", view.run.schedule.stages()[k].name},
                                   {"settlement_outside_m", stage_outside_[k]}});
    summary.insert("stages", stages);
  }
  results.insert("summary", summary);
}

void Extremes::visit_state(StateArchive& a) {
  a.mark("extremes 2");
  a& floor_heave_& pit_& outside_& anywhere_& drawdown_outside_& drawdown_&
      drawdown_outside_by_region_& stage_outside_& suction_& suction_steps_;
}

} // namespace settlewell::monitors
