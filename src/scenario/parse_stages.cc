// Stages (what changes when) and outputs (what is written when and where).
#include "parse_parts.h"

#include "settlewell/core/units.h"
#include "settlewell/scenario/keys.h"

#include <algorithm>
#include <cmath>
#include <set>
#include <sstream>

namespace settlewell::scenario {

namespace {

double days(const TableReader& r, const std::string& key) {
  return units::days(r.number(key));
}

bool well_exists(const Scenario& s, const std::string& name) {
  if (!s.section)
    return s.mesh_file.has_value(); // a mesh file's lines are checked against the mesh
  for (const auto& w : s.section->wells)
    if (w.name == name)
      return true;
  return false;
}

Target
read_target(const TableReader& r, const std::string& what, bool may_enter = false) {
  if (r.has("head") == r.has("discharge"))
    r.fail_here("give either head or discharge for " + what);
  if (r.has("head"))
    return {Target::Kind::head, r.elevation("head")};
  const double q = r.number("discharge");
  if (q < 0.0 && !may_enter)
    r.fail("discharge", "must not be negative (it is the pumped rate)");
  return {Target::Kind::discharge, q / units::seconds_per_day};
}

TimeSteps read_time_steps(const TableReader& stage, double duration) {
  TimeSteps steps;
  const TableReader r = sub_table(stage, "time_steps", "stages[].time_steps");
  if (r.has("first")) {
    steps.first = units::days(r.positive("first"));
    if (steps.first > duration)
      r.fail("first", "is longer than the stage");
  }
  steps.growth = r.number("growth");
  if (!(steps.growth >= 1.0 && steps.growth <= 10.0))
    r.fail("growth", "must lie in [1, 10]");
  const long long per_rung = r.integer("per_rung");
  if (per_rung < 1 || per_rung > 1000)
    r.fail("per_rung", "must lie in [1, 1000]");
  steps.per_rung = static_cast<unsigned int>(per_rung);
  if (r.has("largest"))
    steps.largest = units::days(r.positive("largest"));
  if (steps.largest > 0.0 && steps.first > steps.largest)
    r.fail("largest", "is smaller than the first step");
  return steps;
}

/// A stage may dig in a section, or in a mesh file that names the regions a dig
/// takes out; otherwise `key` is refused, naming what is missing.
void require_pit(const TableReader& r, const Scenario& s, const std::string& key) {
  if (s.section || (s.mesh_file && !s.mesh_file->excavation_regions.empty()))
    return;
  r.fail(key, s.mesh_file ? "needs mesh_file.excavation_regions (the regions of the "
                            "mesh a dig takes out)"
                          : "needs a [section] geometry, or a [mesh_file] with "
                            "excavation_regions");
}

/// The dig level of a stage: below the earlier ones (and, in a section, below the
/// ground surface and not below the final excavation level). A mesh file's levels
/// are checked against its excavation regions when the mesh is read.
void read_dig_level(const TableReader& r, Scenario& s, Stage& stage) {
  require_pit(r, s, "dig_level");
  stage.dig_level = r.number("dig_level");
  std::optional<double> deepest;
  if (s.section)
    deepest = s.section->ground_surface;
  for (const auto& earlier : s.stages)
    if (earlier.dig_level)
      deepest = std::min(deepest.value_or(*earlier.dig_level), *earlier.dig_level);
  if (deepest && !(*stage.dig_level < *deepest))
    r.fail("dig_level", std::string("must lie below ") +
                            (s.section ? "the ground surface and below " : "") +
                            "the dig levels of the stages before (" +
                            format_number(*deepest) + " m)");
  if (s.section && *stage.dig_level < s.section->excavation_level() - 1e-9)
    r.fail("dig_level", "lies below the final excavation level (" +
                            format_number(s.section->excavation_level()) +
                            " m, section.excavation_depth)");
  s.locations["stages." + stage.name + ".dig_level"] = r.where("dig_level");
}

void read_stage_changes(const TableReader& r, Scenario& s, Stage& stage) {
  for_each_named(r, "wells", [&](const std::string& name, const TableReader& w) {
    if (!well_exists(s, name))
      throw InputError(w.where("head") + ": " + w.label() + ": no well named '" + name +
                       "'");
    stage.wells[name] = read_target(w, "well '" + name + "'");
  });
  for_each_named(r, "boundaries", [&](const std::string& name, const TableReader& b) {
    stage.boundary_targets[name] = read_target(b, "boundary '" + name + "'", true);
  });
  if (r.has("dig_level"))
    read_dig_level(r, s, stage);
  if (r.has("pit_water_level")) {
    require_pit(r, s, "pit_water_level");
    stage.pit_water_level = r.elevation("pit_water_level");
    if (s.section && *stage.pit_water_level > s.section->ground_surface)
      r.fail("pit_water_level", "lies above the ground surface");
    s.locations["stages." + stage.name + ".pit_water_level"] = r.where("pit_water_level");
  }
  if (r.has("excavation_level_head")) {
    if (!s.section)
      r.fail("excavation_level_head", "needs a [section] geometry");
    stage.excavation_level_head = r.elevation("excavation_level_head");
  }
  for_each_table(r, "loads", [&](const TableReader& l) {
    SurfaceLoad load;
    load.boundary = l.text("boundary");
    load.pressure = l.number("pressure");
    load.x_from = l.number("x_from");
    load.x_to = l.number("x_to");
    if (!(load.x_to > load.x_from))
      l.fail("x_to", "must be greater than x_from");
    stage.loads.push_back(load);
  });
}

} // namespace

void parse_stages(const TableReader& top, Scenario& s) {
  if (!top.has("stages"))
    top.fail_here("missing the required array [[stages]]");
  std::set<std::string> names;
  for_each_table(top, "stages", [&](const TableReader& r) {
    Stage stage;
    stage.name = r.text("name");
    if (!names.insert(stage.name).second)
      r.fail("name", "two stages are named '" + stage.name + "'");
    stage.duration = days(r, "duration");
    if (!(stage.duration > 0.0))
      r.fail("duration", "must be positive");
    stage.ramp = units::days(r.number("ramp"));
    if (stage.ramp < 0.0)
      r.fail("ramp", "must not be negative");
    if (stage.ramp > stage.duration * (1 + 1e-12))
      r.fail("ramp", "is longer than its stage (" +
                         format_number(units::to_days(stage.duration)) + " days)");
    read_stage_changes(r, s, stage);
    stage.steps = read_time_steps(r, stage.duration);
    s.locations["stages." + stage.name] = r.where("name");
    s.stages.push_back(stage);
  });
  if (s.stages.empty())
    top.fail("stages", "needs at least one stage");
  if (s.section)
    for (const auto& prop : s.section->props)
      if (!names.count(prop.stage))
        throw InputError(s.location_of("section.props." + prop.name) +
                         ": section.props: prop '" + prop.name +
                         "' is installed in stage '" + prop.stage +
                         "', which does not exist");
}

namespace {

void check_inside(
    const TableReader& r, const Scenario& s, double x, double y, const std::string& key) {
  double x0, x1, y0, y1;
  if (!model_extent(s, x0, x1, y0, y1))
    return; // a mesh file: checked when the mesh is loaded
  const double tol = 1e-9 * std::max(1.0, x1 - x0);
  if (x < x0 - tol || x > x1 + tol || y < y0 - tol || y > y1 + tol)
    r.fail(key, "the point (" + format_number(x) + ", " + format_number(y) +
                    ") lies outside the model (x " + format_number(x0) + " to " +
                    format_number(x1) + ", y " + format_number(y0) + " to " +
                    format_number(y1) + ")");
}

std::pair<double, double> read_xy(const TableReader& r, const toml::node& node) {
  const toml::array* a = node.as_array();
  if (a == nullptr || a->size() != 2 || !(*a)[0].is_number() || !(*a)[1].is_number())
    throw InputError(position(r.file(), node) + ": " + r.label() +
                     ".points: each point must be [x, y]");
  const double x = number_value((*a)[0]), y = number_value((*a)[1]);
  if (!std::isfinite(x) || !std::isfinite(y))
    throw InputError(position(r.file(), node) + ": " + r.label() +
                     ".points: each point must be [x, y] in finite numbers");
  return {x, y};
}

void read_output_sites(const TableReader& r, const Scenario& s, Output& out) {
  for_each_table(r, "points", [&](const TableReader& p) {
    MonitoringPoint point{p.text("name"), p.number("x"), p.number("y")};
    check_inside(p, s, point.x, point.y, "x");
    out.points.push_back(point);
  });
  for_each_table(r, "lines", [&](const TableReader& l) {
    SectionLine line;
    line.name = l.text("name");
    const toml::array* pts = l.array("points");
    if (pts == nullptr || pts->size() < 2)
      l.fail("points", "needs at least two points [x, y]");
    for (const auto& node : *pts) {
      line.points.push_back(read_xy(l, node));
      check_inside(l, s, line.points.back().first, line.points.back().second, "points");
    }
    const long long n = l.integer("samples");
    if (n < 2 || n > 100000)
      l.fail("samples", "must lie in 2..100000");
    line.samples = static_cast<unsigned int>(n);
    out.lines.push_back(line);
  });
  for_each_table(r, "columns", [&](const TableReader& c) {
    Column column{c.text("name"), c.number("x")};
    double x0, x1, y0, y1;
    if (model_extent(s, x0, x1, y0, y1))
      check_inside(c, s, column.x, y0, "x");
    out.columns.push_back(column);
  });
}

} // namespace

void parse_output(const TableReader& top, Scenario& s) {
  const TableReader r = sub_table(top, "output", "output");
  if (const toml::array* times = r.array("times")) {
    for (const auto& node : *times) {
      if (!node.is_number())
        throw InputError(position(r.file(), node) +
                         ": output.times: must be numbers (days)");
      const double t_s = units::days(number_value(node));
      if (!(t_s > 0.0) || t_s > s.end_time() * (1 + 1e-12))
        throw InputError(
            position(r.file(), node) +
            ": output.times: each time must lie after 0 and not after the last "
            "stage ends (" +
            format_number(units::to_days(s.end_time())) + " days)");
      s.output.times.push_back(t_s);
    }
  }
  const long long per_stage = r.integer("per_stage");
  if (per_stage < 0 || per_stage > 1000)
    r.fail("per_stage", "must lie in 0..1000");
  s.output.per_stage = static_cast<unsigned int>(per_stage);
  if (r.has("displacements_from")) {
    s.output.displacements_from = r.text("displacements_from");
    std::vector<std::string> names;
    for (const auto& stage : s.stages)
      names.push_back(stage.name);
    if (std::find(names.begin(), names.end(), s.output.displacements_from) ==
        names.end()) {
      const std::string suggestion = nearest(s.output.displacements_from, names);
      r.fail("displacements_from",
             "is not the name of a stage" +
                 (suggestion.empty() ? std::string()
                                     : "; did you mean '" + suggestion + "'?"));
    }
  }
  read_output_sites(r, s, s.output);
}

} // namespace settlewell::scenario

namespace settlewell::scenario {

namespace {

std::string metres(double v) {
  std::ostringstream out;
  out << v;
  return out.str();
}

/// A neighbour stands on one side of the cutoff wall: the settlement under a
/// footprint across it would mix the pit's side with the retained ground.
void refuse_footprint_across_wall(const Scenario& s,
                                  const Neighbour& n,
                                  const TableReader& r) {
  if (!s.section || !s.section->wall)
    return;
  const double inner = s.section->excavation_width / 2;
  const double outer = inner + s.section->wall->thickness;
  std::vector<std::pair<double, double>> faces{{inner, outer}};
  if (!s.section->half_model && s.analysis == AnalysisType::plane_strain)
    faces.emplace_back(-outer, -inner);
  for (const auto& [low, high] : faces)
    if (n.x_from < high && n.x_to > low)
      r.fail("x_from", "the foundation (x " + metres(n.x_from) + " to " + metres(n.x_to) +
                           " m) crosses the cutoff wall (x " + metres(low) + " to " +
                           metres(high) + " m); a neighbour stands on one side of it");
}

} // namespace

void parse_checks(const TableReader& top, Scenario& s) {
  for_each_table(top, "neighbours", [&](const TableReader& r) {
    Neighbour n;
    n.name = r.text("name");
    n.x_from = r.number("x_from");
    n.x_to = r.number("x_to");
    n.foundation_level = r.number("foundation_level");
    if (!(n.x_to > n.x_from))
      r.fail("x_to", "must be greater than x_from");
    if (r.has("height"))
      n.height = r.positive("height");
    const long long samples = r.integer("samples");
    if (samples < 3 || samples > 10000)
      r.fail("samples", "must lie in 3..10000");
    n.samples = static_cast<unsigned int>(samples);
    double x0, x1, y0, y1;
    if (model_extent(s, x0, x1, y0, y1)) {
      if (n.x_from < x0 - 1e-9 || n.x_to > x1 + 1e-9)
        r.fail("x_from", "the foundation lies outside the model");
      if (n.foundation_level < y0 || n.foundation_level > y1)
        r.fail("foundation_level", "lies outside the model");
    }
    refuse_footprint_across_wall(s, n, r);
    s.neighbours.push_back(n);
  });
  {
    const TableReader r = sub_table(top, "numerics", "numerics");
    const long long refinements = r.integer("refinements");
    if (refinements < 0 || refinements > 8)
      r.fail("refinements", "must lie in 0..8");
    s.numerics.refinements = static_cast<unsigned int>(refinements);
    const std::string solver = r.text("solver");
    if (solver == "direct")
      s.numerics.solver = SolverChoice::direct;
    else if (solver == "iterative")
      s.numerics.solver = SolverChoice::iterative;
    else if (solver != "auto")
      r.fail("solver", "must be auto, direct or iterative (got '" + solver + "')");
    s.numerics.tolerance = r.positive("tolerance");
    if (s.numerics.tolerance >= 1.0)
      r.fail("tolerance", "must be below 1");
    s.numerics.petsc_options = r.text("petsc_options");
  }
  const TableReader r = sub_table(top, "checks", "checks");
  CheckLimits& l = s.limits;
  l.piping_factor = r.positive("piping_factor");
  l.heave_factor = r.positive("heave_factor");
  l.uplift_factor = r.positive("uplift_factor");
  l.low_permeability = r.positive("low_permeability");
  l.settlement = r.positive("settlement_limit");
  l.angular_distortion = r.positive("angular_distortion_limit");
  l.mass_balance = r.positive("mass_balance_tolerance");
  l.suction = r.positive("suction_limit");
  l.head_rise = r.positive("head_rise_limit");
}

} // namespace settlewell::scenario
