#include "head_rise.h"

#include "dof_values.h"

#include "settlewell/core/number_text.h"
#include "settlewell/core/units.h"
#include "settlewell/mesh/gmsh_mesh.h"
#include "settlewell/model/model_builder.h"
#include "settlewell/physics/field_layout.h"

#include <deal.II/base/mpi.h>

#include <iostream>
#include <map>
#include <numeric>
#include <optional>
#include <set>

namespace settlewell::monitors {

using namespace dealii;

namespace {

/// How a stage moves the things it controls, against what held before it.
struct StageMoves {
  double start_head = 0.0; ///< m: what a head first held is compared with
  bool lowers = false, raises = false;
  /// A held head (or level) that goes from `before` (none: the start's) to `now`.
  void head(std::optional<double> before, double now) {
    const double was = before.value_or(start_head);
    lowers = lowers || now < was;
    raises = raises || now > was;
  }
  /// A target that moves from `before` (none: not controlled) to `now`.
  void target(const std::optional<scenario::Target>& before,
              const scenario::Target& now) {
    using Kind = scenario::Target::Kind;
    if (now.kind == Kind::head) {
      head(before && before->kind == Kind::head ? std::optional(before->value)
                                                : std::nullopt,
           now.value);
      return;
    }
    // A discharge out of the ground (negative: a recharge).
    const double pumped_before =
        before && before->kind == Kind::discharge ? before->value : 0.0;
    lowers = lowers || now.value > pumped_before;
    raises = raises || now.value < pumped_before || now.value < 0.0;
  }
};

bool same_loads(const std::vector<scenario::SurfaceLoad>& a,
                const std::vector<scenario::SurfaceLoad>& b) {
  return std::equal(a.begin(), a.end(), b.begin(), b.end(),
                    [](const auto& x, const auto& y) {
                      return x.boundary == y.boundary && x.pressure == y.pressure &&
                             x.x_from == y.x_from && x.x_to == y.x_to;
                    });
}

} // namespace

std::vector<bool> stages_that_lower(const scenario::Scenario& s) {
  std::map<std::string, scenario::Target> wells, lines; // the last target of each
  std::optional<double> level_head, dig, pit_water;
  const std::vector<scenario::SurfaceLoad> none;
  const std::vector<scenario::SurfaceLoad>* loads = &none;
  std::set<std::string> recharge;
  if (s.section)
    for (const auto& w : s.section->wells)
      if (w.recharge)
        recharge.insert(w.name);
  // The start's highest head: a first held head below it lowers, above it raises.
  double start_head = s.groundwater.water_table;
  for (const auto& [layer, head] : s.groundwater.layer_heads)
    start_head = std::max(start_head, head);
  std::vector<bool> out;
  for (const auto& stage : s.stages) {
    StageMoves m{start_head};
    const auto follow = [&m](std::map<std::string, scenario::Target>& last,
                             const std::map<std::string, scenario::Target>& now) {
      for (const auto& [name, target] : now) {
        const auto it = last.find(name);
        m.target(it == last.end() ? std::nullopt : std::optional(it->second), target);
        last[name] = target;
      }
    };
    follow(wells, stage.wells);
    for (const auto& [name, target] : stage.wells)
      m.raises = m.raises || recharge.count(name) != 0;
    follow(lines, stage.boundary_targets);
    if (stage.excavation_level_head) {
      m.head(level_head, *stage.excavation_level_head);
      level_head = stage.excavation_level_head;
    }
    if (stage.pit_water_level) {
      m.head(pit_water, *stage.pit_water_level);
      pit_water = stage.pit_water_level;
    }
    // Digging and loads change the total stress, which moves heads both ways (the
    // ground the wall pushes into is squeezed): such a stage is not watched.
    const bool digs = stage.dig_level && (!dig || *stage.dig_level < *dig);
    if (stage.dig_level)
      dig = stage.dig_level;
    m.raises = m.raises || digs || !same_loads(stage.loads, *loads);
    loads = &stage.loads;
    out.push_back(m.lowers && !m.raises);
  }
  return out;
}

HeadRise::HeadRise(const RunContext& run)
    : lowers_(stages_that_lower(run.scenario))
    , limit_(run.scenario.limits.head_rise)
    , gamma_w_(run.problem.setup().gamma_w)
    , largest_(lowers_.size())
    , steps_over_(lowers_.size(), 0) {
  for (const auto& stage : run.schedule.stages())
    names_.push_back(stage.name);
  const BiotProblem& problem = run.problem;
  const auto& fe = problem.dof_handler().get_fe();
  const auto& unit_points = fe.get_unit_support_points();
  const auto& owned = problem.dof_handler().locally_owned_dofs();
  std::vector<types::global_dof_index> cell_dofs(fe.n_dofs_per_cell());
  // The permeable soil: a wall is none, and a low-permeability layer answers
  // changes of stress undrained, its head rising where the ground beside it
  // compresses (Mandel 1953; Verruijt 1969), which no source of water explains.
  std::set<std::string> permeable;
  for (const auto& [region, material] :
       model::region_materials(run.scenario, problem.mesh()))
    if (region != section_names::wall_region &&
        run.scenario.materials.at(material).poroelastic.conductivity_y >
            run.scenario.limits.low_permeability)
      permeable.insert(region);
  std::map<types::global_dof_index, std::pair<Point<2>, std::string>> soil;
  for (const auto& cell : problem.dof_handler().active_cell_iterators()) {
    if (cell->is_artificial())
      continue;
    const std::string& region = problem.mesh().names.region_name(cell->material_id());
    if (!permeable.count(region))
      continue;
    cell->get_dof_indices(cell_dofs);
    for (unsigned int i = 0; i < cell_dofs.size(); ++i)
      if (fe.system_to_component_index(i).first == FieldLayout::pressure &&
          owned.is_element(cell_dofs[i]) && !soil.count(cell_dofs[i]))
        soil.emplace(
            cell_dofs[i],
            std::pair(problem.mapping().transform_unit_to_real_cell(cell, unit_points[i]),
                      region));
  }
  for (const auto& [dof, place] : soil) {
    dofs_.push_back(dof);
    points_.push_back(place.first);
    regions_.push_back(place.second);
  }
}

void HeadRise::start(const RunView& view) {
  last_ = values_at(view.run.problem.reported_solution(), dofs_);
  stage_start_ = last_;
  stage_ = 0;
}

std::vector<double> HeadRise::after_step(const RunView& view) {
  const std::size_t stage = view.stage();
  std::vector<double> now = values_at(view.run.problem.reported_solution(), dofs_);
  if (stage_start_.empty()) // resumed
    stage_start_ = now;
  else if (stage != stage_)
    stage_start_ = last_; // the last step ended at the stage's start
  stage_ = stage;
  last_ = std::move(now);
  if (!lowers_.at(stage))
    return {};
  std::vector<double> rise(dofs_.size());
  double local = 0.0;
  for (std::size_t i = 0; i < dofs_.size(); ++i) {
    rise[i] = (last_[i] - stage_start_[i]) / gamma_w_;
    local = std::max(local, rise[i]);
  }
  // The places of this process's largest (within round-off: share_largest picks
  // the same one for any partition).
  std::vector<Located> candidates;
  for (std::size_t i = 0; i < dofs_.size(); ++i)
    if (rise[i] > 0.0 && rise[i] >= local * (1.0 - 1e-9))
      candidates.push_back({rise[i], points_[i][0], points_[i][1], 0.0, regions_[i]});
  Located& kept = largest_[stage];
  const Located found = share_largest(candidates, view.comm(), kept.value);
  kept.keep_larger(found, view.time());
  if (!(found.value > limit_))
    return {};
  const bool first =
      std::accumulate(steps_over_.begin(), steps_over_.end(), std::uint64_t(0)) == 0;
  ++steps_over_[stage];
  if (first && Utilities::MPI::this_mpi_process(view.comm()) == 0)
    std::cerr << "settlewell: warning: at day " << units::to_days(view.time())
              << " in stage '" << names_[stage]
              << "', which only lowers heads, the head has risen "
              << significant(found.value) << " m since the stage began, more than "
              << "checks.head_rise_limit (" << significant(limit_)
              << " m) at x = " << significant(found.x)
              << " m, y = " << significant(found.y) << " m in " << found.region
              << ": water comes from where the stage does not mean it to (a boundary "
                 "that feeds the soil, a recharge, a load); the run's last lines count "
                 "such steps\n";
  return {};
}

void HeadRise::finish(const RunView&, toml::table& results) {
  toml::array stages;
  for (std::size_t k = 0; k < lowers_.size(); ++k) {
    toml::table entry{{"stage", names_[k]},
                      {"lowers_heads", bool(lowers_[k])},
                      {"largest_rise_m", largest_[k].value},
                      {"steps_over_limit", int64_t(steps_over_[k])}};
    if (largest_[k].value > 0.0)
      entry.insert("largest_rise_at",
                   toml::table{{"x_m", largest_[k].x},
                               {"y_m", largest_[k].y},
                               {"region", largest_[k].region},
                               {"time_days", units::to_days(largest_[k].time)}});
    stages.push_back(std::move(entry));
  }
  results.insert_or_assign(
      "head_rise", toml::table{{"limit_m", limit_}, {"stages", std::move(stages)}});
}

void HeadRise::visit_state(StateArchive& a) {
  a.mark("head rise");
  a& largest_& steps_over_;
  if (a.loading()) {
    last_.clear();
    stage_start_.clear();
  }
}

} // namespace settlewell::monitors
