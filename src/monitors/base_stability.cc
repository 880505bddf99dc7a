#include "base_stability.h"

#include "column_stack.h"
#include "layer_stack.h"

#include "settlewell/checks/stability.h"
#include "settlewell/core/units.h"

#include <deal.II/base/mpi.h>

#include <cmath>
#include <filesystem>
#include <limits>
#include <set>
#include <tuple>

namespace settlewell::monitors {

using dealii::Point;
using units::to_days;

namespace {

constexpr unsigned int n_line_samples = 40;
const char* const not_dug = "the pit is not dug yet (no stage has reached a dig_level)";
const char* const no_wall =
    "the mesh (mesh_file) has no region named \"wall\", so the wall's toe is not known";

/// Midpoints of n equal parts of [a, b] at elevation y.
std::vector<Point<2>> along(double a, double b, double y) {
  std::vector<Point<2>> points;
  for (unsigned int i = 0; i < n_line_samples; ++i)
    points.emplace_back(a + (b - a) * (i + 0.5) / n_line_samples, y);
  return points;
}

/// As along(), with both ends (moved in by `inset`) as well: the exit gradient is
/// largest at the wall face, half a sample spacing from the nearest midpoint.
std::vector<Point<2>> along_with_ends(double a, double b, double y, double inset) {
  std::vector<Point<2>> points = along(a, b, y);
  points.emplace_back(a + inset, y);
  points.emplace_back(b - inset, y);
  return points;
}

/// The inside of the pit, [x0, x1].
std::pair<double, double> pit_span(const scenario::Section& s, AnalysisType analysis) {
  const double half = s.excavation_width / 2;
  if (analysis == AnalysisType::axisymmetric)
    return {s.wells.empty() ? 0.0 : s.wells.front().radius, half};
  return {s.half_model ? 0.0 : -half, half};
}

/// The mean head of a line of samples, by area in axisymmetric (weights r).
double mean_head(const SamplePoints& p, const RunView& view, bool axisymmetric) {
  double sum = 0.0, weights = 0.0;
  const auto values = p.evaluate(view.run.problem, view.run.derivation);
  for (std::size_t i = 0; i < values.size(); ++i) {
    const double w = axisymmetric ? p.points()[i][0] : 1.0;
    sum += w * values[i].head, weights += w;
  }
  return sum / weights;
}

/// The least of some factors (none evaluated: empty).
Factor least_of(const std::vector<Factor>& factors) {
  Factor least;
  for (const auto& f : factors)
    if (f && (!least || *f < *least))
      least = f;
  return least;
}

void insert_factor(toml::table& t, const std::string& key, const Factor& f) {
  if (f)
    t.insert(key, *f);
  else
    t.insert(key, "not evaluated");
}

/// A factor over the output times at which it was evaluated: its least value and
/// when, its value at the last output time, and the first time after which it
/// stays at or above its limit (the time from which the base holds as far as this
/// check goes). +inf stands for a factor with nothing driving the failure.
toml::table factor_history(const std::vector<BaseState>& history,
                           const std::function<Factor(const BaseState&)>& factor,
                           double limit,
                           const std::string& reason) {
  toml::table t{{"limit", limit}};
  std::optional<std::size_t> worst;
  std::optional<double> holds_from;
  bool holds = true;
  for (std::size_t i = history.size(); i-- > 0;) {
    const Factor f = factor(history[i]);
    if (!f)
      continue;
    if (!worst || *f < *factor(history[*worst]))
      worst = i;
    holds = holds && *f >= limit;
    if (holds)
      holds_from = to_days(history[i].time);
  }
  if (!worst) {
    t.insert("evaluated", false);
    t.insert("reason", reason);
    return t;
  }
  t.insert("evaluated", true);
  t.insert("least", *factor(history[*worst]));
  t.insert("least_at_days", to_days(history[*worst].time));
  const Factor last = factor(history.back());
  if (last)
    t.insert("at_end", *last);
  else
    t.insert("at_end", "not evaluated");
  if (holds_from)
    t.insert("holds_from_days", *holds_from);
  else
    t.insert("holds_from_days", "never");
  return t;
}

} // namespace

toml::array BaseStability::stage_table(const RunView& view) const {
  toml::array stages;
  const auto& schedule = view.run.schedule.stages();
  for (const auto& stage : schedule) {
    std::vector<Factor> piping, heave, uplift;
    for (const auto& b : history_) {
      if (!(b.time > stage.start && b.time <= stage.end * (1 + 1e-12)))
        continue;
      piping.push_back(b.piping);
      for (const auto& h : b.heave)
        heave.push_back(h.factor);
      for (const auto& u : b.uplift)
        uplift.push_back(u.factor);
    }
    toml::table t{{"name", stage.name}};
    const auto level = dig_level_at(stage.end);
    if (level)
      t.insert("dig_level_m", *level);
    else
      t.insert("dig_level_m", "not dug");
    insert_factor(t, "least_piping_factor", least_of(piping));
    insert_factor(t, "least_heave_factor", least_of(heave));
    insert_factor(t, "least_uplift_factor", least_of(uplift));
    stages.push_back(t);
  }
  return stages;
}

BaseStability::Pit BaseStability::section_pit(const scenario::Scenario& s) {
  const auto& sec = *s.section;
  Pit pit;
  std::tie(pit.x0, pit.x1) = pit_span(sec, s.analysis);
  pit.ground = sec.ground_surface;
  pit.bottom = sec.bottom;
  if (sec.wall)
    pit.toe = sec.wall->toe;
  pit.layers = sec.layers;
  return pit;
}

BaseStability::Pit BaseStability::mesh_pit(const RunContext& run,
                                           std::vector<std::string>& sides) {
  // The extent of the excavation regions' cells and of the wall's, from every
  // process.
  const auto& names = run.problem.mesh().names;
  std::set<unsigned int> dug;
  for (const auto& region : run.scenario.mesh_file->excavation_regions)
    dug.insert(names.region_id(region));
  const bool has_wall = names.has_region("wall");
  const unsigned int wall = has_wall ? names.region_id("wall") : 0;
  constexpr double inf = std::numeric_limits<double>::infinity();
  double x_min = inf, x_max = -inf, top = -inf, toe = inf, wall_x = 0.0, wall_cells = 0.0;
  for (const auto& cell : run.problem.dof_handler().active_cell_iterators()) {
    if (!cell->is_locally_owned())
      continue;
    for (const unsigned int v : cell->vertex_indices()) {
      const Point<2>& p = cell->vertex(v);
      if (dug.count(cell->material_id()))
        x_min = std::min(x_min, p[0]), x_max = std::max(x_max, p[0]),
        top = std::max(top, p[1]);
      if (has_wall && cell->material_id() == wall)
        toe = std::min(toe, p[1]);
    }
    if (has_wall && cell->material_id() == wall)
      wall_x += cell->center()[0], wall_cells += 1.0;
  }
  const MPI_Comm comm = run.problem.communicator();
  Pit pit;
  pit.x0 = dealii::Utilities::MPI::min(x_min, comm);
  pit.x1 = dealii::Utilities::MPI::max(x_max, comm);
  pit.ground = dealii::Utilities::MPI::max(top, comm);
  const ColumnStack stack = column_stack(run.problem, 0.5 * (pit.x0 + pit.x1));
  for (const auto& l : stack.layers)
    pit.layers.push_back({l.region,
                          run.scenario.mesh_file->region_materials.count(l.region)
                              ? run.scenario.mesh_file->region_materials.at(l.region)
                              : l.region,
                          l.top});
  pit.bottom = stack.layers.empty() ? pit.ground : stack.layers.back().bottom;
  wall_cells = dealii::Utilities::MPI::sum(wall_cells, comm);
  if (wall_cells > 0.0) {
    pit.toe = dealii::Utilities::MPI::min(toe, comm);
    const double centre = dealii::Utilities::MPI::sum(wall_x, comm) / wall_cells;
    sides.push_back(centre > 0.5 * (pit.x0 + pit.x1) ? "right" : "left");
  }
  return pit;
}

BaseStability::BaseStability(const RunContext& run)
    : scenario_(run.scenario) {
  if (scenario_.section) {
    pit_ = section_pit(scenario_);
    if (scenario_.section->wall) {
      if (scenario_.section->wall->right)
        sides_.push_back("right");
      if (scenario_.section->wall->left)
        sides_.push_back("left");
    }
  } else {
    pit_ = mesh_pit(run, sides_);
  }
  const auto& layers = pit_.layers;
  const double low_k = scenario_.limits.low_permeability;
  for (std::size_t k = 0; k + 1 < layers.size(); ++k) {
    const auto& m = scenario_.materials.at(layers[k].material).poroelastic;
    const auto& below = scenario_.materials.at(layers[k + 1].material).poroelastic;
    if (m.conductivity_y <= low_k && below.conductivity_y > low_k)
      uplift_layers_.push_back(k);
  }
  for (std::size_t k = 0; k < scenario_.stages.size(); ++k) {
    stage_start_.push_back(run.schedule.stages()[k].start);
    if (scenario_.stages[k].dig_level)
      digs_.emplace_back(run.schedule.stages()[k].start, *scenario_.stages[k].dig_level);
  }
}

double BaseStability::pit_water_level_at(double t) const {
  // As the model sets it: the stage's pit_water_level, else the dig level so far.
  double dug_to = pit_.ground, level = dug_to;
  for (std::size_t k = 0; k < stage_start_.size() && stage_start_[k] < t * (1 - 1e-12);
       ++k) {
    dug_to = scenario_.stages[k].dig_level.value_or(dug_to);
    level = scenario_.stages[k].pit_water_level.value_or(dug_to);
  }
  return level;
}

std::optional<double> BaseStability::dig_level_at(double t) const {
  // Cells leave the model in the first step after their stage starts.
  std::optional<double> level;
  for (const auto& [start, dig] : digs_)
    if (start < t * (1 - 1e-12))
      level = dig;
  return level;
}

const BaseStability::Samples& BaseStability::samples_at(double dig,
                                                        const BiotProblem& problem) {
  const auto found = samples_.find(dig);
  if (found != samples_.end())
    return found->second;
  Samples& s = samples_[dig];
  const double x0 = pit_.x0, x1 = pit_.x1;
  const double delta = 1e-6 * (pit_.ground - pit_.bottom);
  s.exit.emplace(problem, along_with_ends(x0, x1, dig - delta, delta),
                 "exit-gradient samples");
  for (const auto& side : sides_) {
    // Terzaghi's prism: d/2 wide beside the toe, or as wide as the pit (a shaft's
    // whole floor) when that is narrower.
    const double d = std::max(dig - *pit_.toe, 0.0);
    const double a = side == "right" ? std::max(x0, x1 - d / 2) : x0;
    const double b = side == "right" ? x1 : std::min(x1, x0 + d / 2);
    s.prism_widths.push_back(b - a);
    s.prisms.emplace_back(
        SamplePoints(problem, along(a, b, *pit_.toe), "heave prism base"),
        // Just below the floor: on it, a sample may fall in a dug cell above.
        SamplePoints(problem, along(a, b, dig - delta), "heave prism top"));
  }
  for (const std::size_t k : uplift_layers_) {
    const double underside = pit_.layers[k + 1].top;
    if (underside < dig)
      s.uplift_lines.emplace_back(std::in_place, problem, along(x0, x1, underside),
                                  "uplift line");
    else
      s.uplift_lines.emplace_back(std::nullopt);
  }
  return s;
}

BaseState BaseStability::evaluate(const RunView& view) {
  BaseState b;
  b.time = view.time();
  b.dig_level = dig_level_at(b.time);
  for (const auto& side : sides_)
    b.heave.push_back({side, 0.0, 0.0, 0.0, std::nullopt});
  for (const std::size_t k : uplift_layers_)
    b.uplift.push_back(
        {pit_.layers[k].name, pit_.layers[k + 1].top, 0.0, 0.0, std::nullopt});
  if (!b.dig_level)
    return b;
  const double dig = *b.dig_level;
  const Samples& s = samples_at(dig, view.run.problem);
  const double gw = scenario_.gamma_w;
  const bool axisymmetric = scenario_.analysis == AnalysisType::axisymmetric;
  // Water exits the floor where it drains: where the pore pressure just below it
  // has reached the pit water's (the floor is sealed elsewhere). Piping needs that
  // exit; without it nothing drives it (the gradient is then -infinity).
  const auto exits = s.exit->evaluate(view.run.problem, view.run.derivation);
  const double pit_pressure = gw * std::max(0.0, pit_water_level_at(b.time) - dig);
  b.exit_gradient = -std::numeric_limits<double>::infinity();
  for (std::size_t i = 0; i < exits.size(); ++i)
    if (exits[i].pore_pressure >= pit_pressure - 1e-3 &&
        -exits[i].gradient_y > b.exit_gradient) {
      b.exit_gradient = -exits[i].gradient_y; // upward flow: head falls upward
      b.exit_x = s.exit->points()[i][0];
    }
  const auto& floor_layer = layer_at(pit_.layers, dig - 1e-6);
  b.critical_gradient = checks::critical_gradient(
      scenario_.materials.at(floor_layer.material).unit_weight, gw);
  // Piping is a failure of permeable soil under exiting seepage; a floor of a
  // low-permeability layer drains by consolidating, and heave and uplift cover it
  // (the gradient at its drained surface is a boundary layer, not a seepage exit).
  if (scenario_.materials.at(floor_layer.material).poroelastic.conductivity_y >
      scenario_.limits.low_permeability)
    b.piping = checks::piping_factor(b.critical_gradient, b.exit_gradient);
  else
    b.piping_reason = "the floor is in " + floor_layer.name +
                      ", a low-permeability layer (checks.low_permeability): heave "
                      "and uplift cover it";
  auto saturated = [&](const scenario::Layer& l) {
    return scenario_.materials.at(l.material).unit_weight;
  };
  auto submerged = [&](const scenario::Layer& l) { return saturated(l) - gw; };
  for (std::size_t i = 0; i < b.heave.size(); ++i) {
    auto& h = b.heave[i];
    h.depth = dig - *pit_.toe;
    h.width = s.prism_widths[i];
    if (!(h.depth > 0.0))
      continue; // the toe is at or above the floor: no prism
    h.mean_excess_head = mean_head(s.prisms[i].first, view, axisymmetric) -
                         mean_head(s.prisms[i].second, view, axisymmetric);
    const double gamma_sub =
        integrate_layers(pit_.layers, pit_.bottom, *pit_.toe, dig, submerged) / h.depth;
    h.factor = checks::heave_factor(gamma_sub, h.depth, h.mean_excess_head, gw);
  }
  for (std::size_t i = 0; i < b.uplift.size(); ++i) {
    if (!s.uplift_lines[i])
      continue; // the layer's underside is at or above the floor
    auto& u = b.uplift[i];
    u.overburden =
        integrate_layers(pit_.layers, pit_.bottom, u.underside, dig, saturated);
    u.pore_pressure = -std::numeric_limits<double>::infinity();
    for (const auto& v :
         s.uplift_lines[i]->evaluate(view.run.problem, view.run.derivation))
      u.pore_pressure = std::max(u.pore_pressure, v.pore_pressure);
    u.factor = checks::uplift_factor(u.overburden, u.pore_pressure);
  }
  return b;
}

void BaseStability::start(const RunView& view) {
  std::vector<std::string> header{"time_days", "dig_level_m",       "exit_gradient",
                                  "exit_x_m",  "critical_gradient", "piping_factor"};
  for (const auto& side : sides_)
    header.insert(header.end(),
                  {"heave_excess_head_" + side + "_m", "heave_factor_" + side});
  for (const std::size_t k : uplift_layers_) {
    const auto& name = pit_.layers[k].name;
    header.insert(header.end(),
                  {"uplift_pore_pressure_" + name + "_kPa", "uplift_factor_" + name});
  }
  const std::string folder = view.folder + "/checks";
  if (dealii::Utilities::MPI::this_mpi_process(view.comm()) == 0)
    std::filesystem::create_directories(folder);
  table_.emplace(folder + "/base_stability.csv", header, view.comm());
}

void BaseStability::at_output_time(const RunView& view) {
  const BaseState b = evaluate(view);
  history_.push_back(b);
  // Cells of checks that are not evaluated at this time stay empty.
  std::vector<std::optional<double>> row{to_days(b.time), b.dig_level};
  if (b.dig_level)
    row.insert(row.end(), {b.exit_gradient, b.exit_x, b.critical_gradient});
  else
    row.insert(row.end(), 3, std::nullopt);
  row.push_back(b.piping);
  for (const auto& h : b.heave) {
    row.push_back(h.factor ? std::optional<double>(h.mean_excess_head) : std::nullopt);
    row.push_back(h.factor);
  }
  for (const auto& u : b.uplift) {
    row.push_back(u.factor ? std::optional<double>(u.pore_pressure) : std::nullopt);
    row.push_back(u.factor);
  }
  table_->row_with_gaps(row);
}

void BaseStability::finish(const RunView& view, toml::table& results) {
  if (history_.empty())
    return;
  const auto& limits = scenario_.limits;
  const BaseState& last = history_.back();
  std::string piping_reason = not_dug;
  for (const auto& b : history_)
    if (!b.piping_reason.empty())
      piping_reason = b.piping_reason;
  toml::table t{{"piping", factor_history(
                               history_, [](const BaseState& b) { return b.piping; },
                               limits.piping_factor, piping_reason)}};
  if (last.dig_level) {
    t.insert("dig_level_at_end_m", *last.dig_level);
    t.insert("exit_gradient_at_end", last.exit_gradient);
    t.insert("exit_x_at_end_m", last.exit_x);
    t.insert("critical_gradient", last.critical_gradient);
  } else {
    t.insert("dig_level_at_end_m", "not dug");
  }
  toml::array heave, uplift;
  for (std::size_t i = 0; i < last.heave.size(); ++i) {
    toml::table h = factor_history(
        history_, [i](const BaseState& b) { return b.heave[i].factor; },
        limits.heave_factor,
        last.dig_level ? "the wall toe is not below the dig level" : not_dug);
    h.insert("side", last.heave[i].side);
    h.insert("depth_at_end_m", last.heave[i].depth);
    h.insert("width_at_end_m", last.heave[i].width);
    h.insert("mean_excess_head_at_end_m", last.heave[i].mean_excess_head);
    heave.push_back(h);
  }
  for (std::size_t i = 0; i < last.uplift.size(); ++i) {
    toml::table u = factor_history(
        history_, [i](const BaseState& b) { return b.uplift[i].factor; },
        limits.uplift_factor,
        last.dig_level ? "the layer's underside is not below the dig level" : not_dug);
    u.insert("layer", last.uplift[i].layer);
    u.insert("underside_m", last.uplift[i].underside);
    u.insert("overburden_at_end_kPa", last.uplift[i].overburden);
    u.insert("pore_pressure_at_end_kPa", last.uplift[i].pore_pressure);
    uplift.push_back(u);
  }
  t.insert("heave", heave);
  if (sides_.empty() && !scenario_.section)
    t.insert("heave_not_checked", no_wall);
  t.insert("uplift", uplift);
  t.insert("stages", stage_table(view));
  results.insert("base_stability", t);
}

static void visit(StateArchive& a, BaseState::Heave& h) {
  a& h.side& h.depth& h.width& h.mean_excess_head& h.factor;
}

static void visit(StateArchive& a, BaseState::Uplift& u) {
  a& u.layer& u.underside& u.overburden& u.pore_pressure& u.factor;
}

static void visit(StateArchive& a, BaseState& b) {
  a& b.time& b.dig_level& b.exit_gradient& b.exit_x& b.critical_gradient& b.piping& b
      .piping_reason& b.heave& b.uplift;
}

void BaseStability::visit_state(StateArchive& a) {
  a.mark("base stability");
  a& history_& table_;
}

} // namespace settlewell::monitors
