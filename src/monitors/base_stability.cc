#include "base_stability.h"

#include "layer_stack.h"

#include "settlewell/checks/stability.h"
#include "settlewell/core/units.h"

#include <deal.II/base/mpi.h>

#include <cmath>
#include <filesystem>
#include <limits>

namespace settlewell::monitors {

using dealii::Point;
using units::to_days;

namespace {

constexpr unsigned int n_line_samples = 40;

/// Midpoints of n equal parts of [a, b] at elevation y.
std::vector<Point<2>> along(double a, double b, double y) {
  std::vector<Point<2>> points;
  for (unsigned int i = 0; i < n_line_samples; ++i)
    points.emplace_back(a + (b - a) * (i + 0.5) / n_line_samples, y);
  return points;
}

/// The inside of the pit, [x0, x1].
std::pair<double, double> pit_span(const scenario::Section& s, AnalysisType analysis) {
  const double half = s.excavation_width / 2;
  if (analysis == AnalysisType::axisymmetric)
    return {s.wells.empty() ? 0.0 : s.wells.front().radius, half};
  return {s.half_model ? 0.0 : -half, half};
}

double mean_head(const SamplePoints& p, const RunView& view) {
  double h = 0.0;
  for (const auto& v : p.evaluate(view.run.problem, view.run.derivation))
    h += v.head / p.points().size();
  return h;
}

std::vector<std::string> csv_header(const BaseState& b) {
  std::vector<std::string> h{"time_days", "exit_gradient", "exit_x_m",
                             "critical_gradient", "piping_factor"};
  for (const auto& heave : b.heave) {
    h.push_back("heave_excess_head_" + heave.side + "_m");
    h.push_back("heave_factor_" + heave.side);
  }
  for (const auto& u : b.uplift) {
    h.push_back("uplift_pore_pressure_" + u.layer + "_kPa");
    h.push_back("uplift_factor_" + u.layer);
  }
  return h;
}

std::vector<double> csv_row(const BaseState& b) {
  std::vector<double> row{to_days(b.time), b.exit_gradient, b.exit_x, b.critical_gradient,
                          b.piping_factor};
  for (const auto& heave : b.heave)
    row.insert(row.end(), {heave.mean_excess_head, heave.factor});
  for (const auto& u : b.uplift)
    row.insert(row.end(), {u.pore_pressure, u.factor});
  return row;
}

/// TOML has no infinity that every reader takes; a factor with nothing driving
/// the failure is written as -1 and read as "not applicable".
double factor_value(double f) {
  return std::isfinite(f) ? f : -1.0;
}

/// A factor of safety over the output times: its least value, its value at the
/// end, and the first time after which it stays at or above its limit (the time
/// from which the base could be dug to the final level as far as this check goes).
toml::table factor_history(const std::vector<double>& times,
                           const std::vector<double>& factors,
                           double limit) {
  std::size_t worst = 0;
  for (std::size_t i = 1; i < factors.size(); ++i)
    if (factors[i] < factors[worst])
      worst = i;
  double holds_from = -1.0;
  for (std::size_t i = factors.size(); i-- > 0;) {
    if (factors[i] < limit)
      break;
    holds_from = to_days(times[i]);
  }
  return toml::table{{"least", factor_value(factors[worst])},
                     {"least_at_days", to_days(times[worst])},
                     {"at_end", factor_value(factors.back())},
                     {"limit", limit},
                     {"holds_from_days", holds_from}};
}

} // namespace

BaseStability::BaseStability(const RunContext& run)
    : scenario_(run.scenario)
    , section_(*run.scenario.section) {
  const auto& s = scenario_;
  const auto& sec = section_;
  const BiotProblem& problem = run.problem;
  const auto [x0, x1] = pit_span(sec, s.analysis);
  const double y_exc = sec.excavation_level();
  const double delta = 1e-6 * (sec.ground_surface - sec.bottom);
  exit_points_.emplace(problem, along(x0, x1, y_exc - delta), "exit-gradient samples");
  if (sec.wall) {
    const double d = y_exc - sec.wall->toe;
    const double half = sec.excavation_width / 2;
    for (const double side : {1.0, -1.0}) {
      if (!(side > 0 ? sec.wall->right : sec.wall->left))
        continue;
      const double a = side > 0 ? std::max(x0, half - d / 2) : -half;
      const double b = side > 0 ? half : std::min(x1, -half + d / 2);
      prisms_.emplace_back(
          side > 0 ? "right" : "left",
          std::make_pair(
              SamplePoints(problem, along(a, b, sec.wall->toe), "heave prism base"),
              SamplePoints(problem, along(a, b, y_exc), "heave prism top")));
    }
  }
  for (std::size_t k = 0; k + 1 < sec.layers.size(); ++k) {
    const double underside = sec.layers[k + 1].top;
    const auto& m = s.materials.at(sec.layers[k].material).poroelastic;
    const auto& below = s.materials.at(sec.layers[k + 1].material).poroelastic;
    if (underside < y_exc && m.conductivity_y <= s.limits.low_permeability &&
        below.conductivity_y > s.limits.low_permeability)
      uplift_lines_.emplace_back(
          sec.layers[k], SamplePoints(problem, along(x0, x1, underside), "uplift line"));
  }
}

BaseState BaseStability::evaluate(const RunView& view) const {
  const auto& sec = section_;
  const double gw = scenario_.gamma_w;
  const double y_exc = sec.excavation_level();
  BaseState b;
  b.time = view.time();
  const auto exits = exit_points_->evaluate(view.run.problem, view.run.derivation);
  b.exit_gradient = -std::numeric_limits<double>::infinity();
  for (std::size_t i = 0; i < exits.size(); ++i)
    if (-exits[i].gradient_y > b.exit_gradient) {
      b.exit_gradient = -exits[i].gradient_y; // upward flow: head falls upward
      b.exit_x = exit_points_->points()[i][0];
    }
  const auto& base_layer = layer_at(sec.layers, y_exc - 1e-6);
  b.critical_gradient = checks::critical_gradient(
      scenario_.materials.at(base_layer.material).unit_weight, gw);
  b.piping_factor = checks::piping_factor(b.critical_gradient, b.exit_gradient);
  auto saturated = [&](const scenario::Layer& l) {
    return scenario_.materials.at(l.material).unit_weight;
  };
  auto submerged = [&](const scenario::Layer& l) { return saturated(l) - gw; };
  for (const auto& [side, samples] : prisms_) {
    BaseState::Heave h;
    h.side = side;
    h.depth = y_exc - sec.wall->toe;
    h.mean_excess_head = mean_head(samples.first, view) - mean_head(samples.second, view);
    const double gamma_sub =
        integrate_layers(sec.layers, sec.bottom, sec.wall->toe, y_exc, submerged) /
        h.depth;
    h.factor = checks::heave_factor(gamma_sub, h.depth, h.mean_excess_head, gw);
    b.heave.push_back(h);
  }
  for (const auto& [layer, samples] : uplift_lines_) {
    BaseState::Uplift u;
    u.layer = layer.name;
    u.underside = samples.points().front()[1];
    u.overburden =
        integrate_layers(sec.layers, sec.bottom, u.underside, y_exc, saturated);
    u.pore_pressure = -std::numeric_limits<double>::infinity();
    for (const auto& v : samples.evaluate(view.run.problem, view.run.derivation))
      u.pore_pressure = std::max(u.pore_pressure, v.pore_pressure);
    u.factor = checks::uplift_factor(u.overburden, u.pore_pressure);
    b.uplift.push_back(u);
  }
  return b;
}

void BaseStability::start(const RunView& view) {
  folder_ = view.folder + "/checks";
  if (dealii::Utilities::MPI::this_mpi_process(view.comm()) == 0)
    std::filesystem::create_directories(folder_);
}

void BaseStability::at_output_time(const RunView& view) {
  history_.push_back(evaluate(view));
  if (!table_)
    table_.emplace(folder_ + "/base_stability.csv", csv_header(history_.back()),
                   view.comm());
  table_->row(csv_row(history_.back()));
}

void BaseStability::finish(const RunView&, toml::table& results) {
  if (history_.empty())
    return;
  const auto& limits = scenario_.limits;
  std::vector<double> times, piping;
  for (const auto& b : history_)
    times.push_back(b.time), piping.push_back(b.piping_factor);
  const auto& last = history_.back();
  toml::table t{{"piping", factor_history(times, piping, limits.piping_factor)},
                {"exit_gradient_at_end", last.exit_gradient},
                {"exit_x_at_end_m", last.exit_x},
                {"critical_gradient", last.critical_gradient}};
  // The history of the i-th entry of a per-time list (heave sides, uplift layers).
  auto history_of = [&](auto member, std::size_t i, double limit) {
    std::vector<double> f;
    for (const auto& b : history_)
      f.push_back(((b.*member)[i]).factor);
    return factor_history(times, f, limit);
  };
  toml::array heave, uplift;
  for (std::size_t i = 0; i < last.heave.size(); ++i) {
    toml::table h = history_of(&BaseState::heave, i, limits.heave_factor);
    h.insert("side", last.heave[i].side);
    h.insert("depth_m", last.heave[i].depth);
    h.insert("mean_excess_head_at_end_m", last.heave[i].mean_excess_head);
    heave.push_back(h);
  }
  for (std::size_t i = 0; i < last.uplift.size(); ++i) {
    toml::table u = history_of(&BaseState::uplift, i, limits.uplift_factor);
    u.insert("layer", last.uplift[i].layer);
    u.insert("underside_m", last.uplift[i].underside);
    u.insert("overburden_kPa", last.uplift[i].overburden);
    u.insert("pore_pressure_at_end_kPa", last.uplift[i].pore_pressure);
    uplift.push_back(u);
  }
  t.insert("heave", heave);
  t.insert("uplift", uplift);
  results.insert("base_stability", t);
}

} // namespace settlewell::monitors
