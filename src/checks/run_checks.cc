#include "settlewell/checks/run_checks.h"

#include "settlewell/checks/stability.h"
#include "settlewell/core/units.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <sstream>

namespace settlewell::checks {

using dealii::Point;

namespace {

constexpr unsigned int n_line_samples = 40;

/// Midpoints of n equal parts of [a, b] at elevation y.
std::vector<Point<2>>
along(double a, double b, double y, unsigned int n = n_line_samples) {
  std::vector<Point<2>> points;
  for (unsigned int i = 0; i < n; ++i)
    points.emplace_back(a + (b - a) * (i + 0.5) / n, y);
  return points;
}

/// The inside of the pit, [x0, x1].
std::pair<double, double> pit_span(const scenario::Section& s, AnalysisType analysis) {
  const double half = s.excavation_width / 2;
  if (analysis == AnalysisType::axisymmetric)
    return {s.wells.empty() ? 0.0 : s.wells.front().radius, half};
  return {s.half_model ? 0.0 : -half, half};
}

const scenario::Layer& layer_at(const std::vector<scenario::Layer>& layers, double y) {
  for (std::size_t k = 0; k + 1 < layers.size(); ++k)
    if (y > layers[k + 1].top)
      return layers[k];
  return layers.back();
}

/// The layers' bottoms (the next layer's top, or the model base).
double bottom_of(const std::vector<scenario::Layer>& layers, std::size_t k, double base) {
  return k + 1 < layers.size() ? layers[k + 1].top : base;
}

/// Thickness-weighted integral of a per-layer quantity between two elevations.
template <typename F>
double integrate_layers(const std::vector<scenario::Layer>& layers,
                        double base,
                        double from,
                        double to,
                        F per_layer) {
  double total = 0.0;
  for (std::size_t k = 0; k < layers.size(); ++k) {
    const double top = std::min(layers[k].top, to);
    const double bottom = std::max(bottom_of(layers, k, base), from);
    if (top > bottom)
      total += per_layer(layers[k]) * (top - bottom);
  }
  return total;
}

std::string percent(double ratio) {
  std::ostringstream os;
  os << std::lround(100.0 * ratio) << " %";
  return os.str();
}

std::string days_text(double seconds) {
  std::ostringstream os;
  os << std::lround(units::to_days(seconds)) << " days";
  return os.str();
}

} // namespace

RunChecks::RunChecks(const BiotProblem& problem,
                     const scenario::Scenario& s,
                     const std::function<double(const Point<2>&)>& initial_head)
    : scenario_(s) {
  if (s.section) {
    section_ = &*s.section;
    const auto& sec = *section_;
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
            sec.layers[k],
            SamplePoints(problem, along(x0, x1, underside), "uplift line"));
    }
  }
  for (const auto& n : s.neighbours) {
    std::vector<Point<2>> points;
    for (unsigned int i = 0; i < n.samples; ++i)
      points.emplace_back(n.x_from + (n.x_to - n.x_from) * i / (n.samples - 1),
                          n.foundation_level);
    foundations_.emplace_back(problem, points, "neighbour '" + n.name + "'");
  }
  const std::vector<scenario::Layer>* layers =
      s.section ? &s.section->layers : (s.box ? &s.box->layers : nullptr);
  if (layers == nullptr)
    return; // a user's mesh: no layer stack for a 1D estimate
  const double base = s.section ? s.section->bottom : s.box->bottom;
  for (const auto& c : s.output.columns) {
    ColumnComparison cc;
    cc.name = c.name;
    cc.x = c.x;
    columns_.push_back(cc);
    column_tops_.emplace_back(problem,
                              std::vector<Point<2>>{Point<2>(c.x, layers->front().top)},
                              "column '" + c.name + "'");
    std::vector<Point<2>> mids;
    for (std::size_t k = 0; k < layers->size(); ++k)
      mids.emplace_back(c.x, 0.5 * ((*layers)[k].top + bottom_of(*layers, k, base)));
    column_layers_mid_.emplace_back(problem, mids, "column '" + c.name + "'");
  }
  // The head falls the scenario itself sets in each layer: a well's final target
  // head against the initial head at its screen, or a box boundary's.
  design_fall_.assign(layers->size(), std::numeric_limits<double>::quiet_NaN());
  auto set_fall = [&](std::size_t k, double fall) {
    design_fall_[k] =
        std::isnan(design_fall_[k]) ? fall : std::max(design_fall_[k], fall);
  };
  for (const auto& stage : s.stages) {
    for (const auto& [name, target] : stage.wells) {
      if (!s.section || target.kind != scenario::Target::Kind::head)
        continue;
      for (const auto& w : s.section->wells)
        if (w.name == name) {
          const Point<2> mid(w.x, 0.5 * (w.screen_top + w.screen_bottom));
          for (std::size_t k = 0; k < layers->size(); ++k)
            if (&layer_at(*layers, mid[1]) == &(*layers)[k])
              set_fall(k, initial_head(mid) - target.value);
        }
    }
    if (s.box)
      for (const auto& [boundary, head] : stage.boundary_heads) {
        const std::size_t k = boundary == "bottom" ? layers->size() - 1 : 0;
        if (boundary == "bottom" || boundary == "top")
          set_fall(k, initial_head(Point<2>(0.0, (*layers)[k].top)) - head);
      }
  }
  // The hand method's ramp is that of the first stage that changes a head.
  const auto lowering =
      std::find_if(s.stages.begin(), s.stages.end(), [](const auto& st) {
        return !st.wells.empty() || !st.boundary_heads.empty();
      });
  for (auto& cc : columns_)
    cc.ramp = lowering != s.stages.end() ? lowering->ramp : 0.0;
}

BaseStability RunChecks::evaluate_base(const BiotProblem& problem,
                                       const Derivation& derivation) const {
  const auto& sec = *section_;
  const double gw = scenario_.gamma_w;
  const double y_exc = sec.excavation_level();
  BaseStability b;
  b.time = problem.time();
  const auto exits = exit_points_->evaluate(problem, derivation);
  b.exit_gradient = -std::numeric_limits<double>::infinity();
  for (std::size_t i = 0; i < exits.size(); ++i)
    if (-exits[i].gradient_y > b.exit_gradient) {
      b.exit_gradient = -exits[i].gradient_y; // upward flow: head falls upward
      b.exit_x = exit_points_->points()[i][0];
    }
  const auto& base_layer = layer_at(sec.layers, y_exc - 1e-6);
  b.critical_gradient =
      critical_gradient(scenario_.materials.at(base_layer.material).unit_weight, gw);
  b.piping_factor = piping_factor(b.critical_gradient, b.exit_gradient);

  auto submerged = [&](const scenario::Layer& l) {
    return scenario_.materials.at(l.material).unit_weight - gw;
  };
  auto saturated = [&](const scenario::Layer& l) {
    return scenario_.materials.at(l.material).unit_weight;
  };
  for (const auto& [side, samples] : prisms_) {
    auto mean_head = [&](const SamplePoints& p) {
      double h = 0.0;
      for (const auto& v : p.evaluate(problem, derivation))
        h += v.head / p.points().size();
      return h;
    };
    BaseStability::Heave h;
    h.side = side;
    h.depth = y_exc - sec.wall->toe;
    h.mean_excess_head = mean_head(samples.first) - mean_head(samples.second);
    const double gamma_sub =
        integrate_layers(sec.layers, sec.bottom, sec.wall->toe, y_exc, submerged) /
        h.depth;
    h.factor = heave_factor(gamma_sub, h.depth, h.mean_excess_head, gw);
    b.heave.push_back(h);
  }
  for (const auto& [layer, samples] : uplift_lines_) {
    BaseStability::Uplift u;
    u.layer = layer.name;
    u.underside = samples.points().front()[1];
    u.overburden =
        integrate_layers(sec.layers, sec.bottom, u.underside, y_exc, saturated);
    u.pore_pressure = -std::numeric_limits<double>::infinity();
    for (const auto& v : samples.evaluate(problem, derivation))
      u.pore_pressure = std::max(u.pore_pressure, v.pore_pressure);
    u.factor = uplift_factor(u.overburden, u.pore_pressure);
    b.uplift.push_back(u);
  }
  return b;
}

void RunChecks::evaluate(const BiotProblem& problem, const Derivation& derivation) {
  if (section_ != nullptr)
    base_.push_back(evaluate_base(problem, derivation));
  for (std::size_t n = 0; n < foundations_.size(); ++n) {
    const auto& spec = scenario_.neighbours[n];
    const auto values = foundations_[n].evaluate(problem, derivation);
    FoundationMovement m;
    for (std::size_t i = 0; i < values.size(); ++i) {
      m.x.push_back(foundations_[n].points()[i][0]);
      m.settlement.push_back(values[i].settlement);
      m.ux.push_back(values[i].ux);
    }
    NeighbourState st;
    st.name = spec.name;
    st.time = problem.time();
    st.distortion = distortion(m);
    st.principal_strain = principal_tensile_strain(st.distortion.horizontal_strain,
                                                   st.distortion.angular_distortion);
    double strain = st.principal_strain;
    if (spec.height) {
      st.beam = deep_beam_strains(st.distortion.deflection_ratio, st.distortion.hogging,
                                  st.distortion.length, *spec.height,
                                  st.distortion.horizontal_strain);
      strain = std::max({strain, st.beam->bending, st.beam->diagonal});
    }
    st.category = category_from_strain(strain);
    neighbours_.push_back(st);
  }
}

void RunChecks::record_columns(const BiotProblem& problem, const Derivation& derivation) {
  for (std::size_t c = 0; c < columns_.size(); ++c) {
    columns_[c].times.push_back(problem.time());
    columns_[c].settlement_2d.push_back(
        column_tops_[c].evaluate(problem, derivation)[0].settlement);
  }
}

std::vector<ColumnLayer> RunChecks::column_layers() const {
  const auto& layers =
      scenario_.section ? scenario_.section->layers : scenario_.box->layers;
  const double base =
      scenario_.section ? scenario_.section->bottom : scenario_.box->bottom;
  std::vector<ColumnLayer> out;
  for (std::size_t k = 0; k < layers.size(); ++k) {
    const auto& m = scenario_.materials.at(layers[k].material).poroelastic;
    out.push_back({layers[k].name, layers[k].top, bottom_of(layers, k, base),
                   1.0 / m.constrained_modulus(),
                   m.consolidation_coefficient(m.conductivity_y, scenario_.gamma_w),
                   m.conductivity_y <= scenario_.limits.low_permeability, 0.0});
  }
  return out;
}

namespace {

bool surface_drained(const scenario::Scenario& s, double x) {
  const bool inside = s.section && std::abs(x) < s.section->excavation_width / 2;
  const std::string top = s.section ? (inside ? "pit_surface" : "ground_surface") : "top";
  const auto found = s.boundaries.find(top);
  return found != s.boundaries.end() &&
         found->second.hydraulic == scenario::BoundarySpec::Hydraulic::fixed_head;
}

std::vector<std::string> comparison_notes(const ColumnComparison& c,
                                          const std::vector<ColumnLayer>& layers,
                                          const std::vector<double>& design_fall,
                                          const std::vector<double>& computed_fall) {
  std::vector<std::string> notes;
  for (std::size_t k = 0; k < layers.size(); ++k)
    if (!std::isnan(design_fall[k]) && design_fall[k] > 0.0 &&
        computed_fall[k] < 0.8 * design_fall[k])
      notes.push_back(
          "Partial drawdown: in " + layers[k].name + " the 2D head falls by " +
          percent(computed_fall[k] / design_fall[k]) +
          " of the design drawdown here (distance from the wells, flow round the "
          "wall toe, recharge), so the 1D estimate from the design drawdown is "
          "too large.");
  // The layer that gives most of the settlement sets the pace.
  const LayerEstimate* main = nullptr;
  for (const auto& e : c.computed.layers)
    if (e.consolidating && (main == nullptr || e.settlement > main->settlement))
      main = &e;
  if (c.ramp > 0.0 && main != nullptr && main->t50 > 0.0 && c.ramp >= 0.3 * main->t50)
    notes.push_back("Ramping: the heads fall over " + days_text(c.ramp) +
                    ", comparable with " + main->name + "'s t50 of " +
                    days_text(main->t50) +
                    " for an instantaneous drop, so consolidation lags the instantaneous "
                    "estimate (the ramped estimate allows for it).");
  if (!c.settlement_2d.empty() && c.computed.ultimate > 0.0) {
    const double at_end = c.computed.settlement_at(c.times.back(), c.ramp);
    const double ratio = c.settlement_2d.back() / at_end;
    if (std::abs(ratio - 1.0) > 0.15)
      notes.push_back("With the computed heads the 1D estimate still differs by " +
                      percent(ratio - 1.0) +
                      " at the end: the ground is not in 1D strain here (the wall's "
                      "stiffness and the 2D shape of the drawdown change the stresses).");
    else
      notes.push_back(
          "With the heads the 2D model computes, the 1D estimate matches the 2D "
          "settlement within " +
          percent(std::abs(ratio - 1.0)) + " at the end of the run.");
  }
  return notes;
}

} // namespace

void RunChecks::finish_columns(const BiotProblem& problem, const Derivation& derivation) {
  for (std::size_t c = 0; c < columns_.size(); ++c) {
    ColumnComparison& cc = columns_[c];
    std::vector<ColumnLayer> design = column_layers(), computed = design;
    const auto mids = column_layers_mid_[c].evaluate(problem, derivation);
    std::vector<double> computed_fall(design.size());
    cc.design_known = false;
    for (std::size_t k = 0; k < design.size(); ++k) {
      computed_fall[k] = mids[k].drawdown;
      computed[k].head_fall = computed_fall[k];
      if (!std::isnan(design_fall_[k])) {
        design[k].head_fall = design_fall_[k];
        cc.design_known = true;
      }
    }
    const bool drained = surface_drained(scenario_, cc.x);
    cc.design = estimate_one_d(design, scenario_.gamma_w, drained);
    cc.computed = estimate_one_d(computed, scenario_.gamma_w, drained);
    cc.notes = comparison_notes(cc, design, design_fall_, computed_fall);
  }
}

} // namespace settlewell::checks
