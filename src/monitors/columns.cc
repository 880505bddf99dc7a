#include "columns.h"

#include "column_stack.h"

#include "settlewell/core/errors.h"
#include "settlewell/core/number_text.h"
#include "settlewell/core/units.h"
#include "settlewell/model/model_builder.h"
#include "settlewell/output/csv_file.h"

#include <deal.II/base/mpi.h>

#include <cmath>
#include <filesystem>
#include <limits>
#include <sstream>

namespace settlewell::monitors {

using dealii::Point;
using units::to_days;

namespace {

std::string percent(double ratio) {
  std::ostringstream os;
  os << std::lround(100.0 * ratio) << " %";
  return os.str();
}

std::string days_text(double seconds) {
  std::ostringstream os;
  os << std::lround(to_days(seconds)) << " days";
  return os.str();
}

std::vector<std::string> comparison_notes(const ColumnComparison& c,
                                          const std::vector<checks::ColumnLayer>& layers,
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
  const checks::LayerEstimate* main = nullptr;
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

toml::table estimate_table(const checks::OneDEstimate& e, double ramp) {
  toml::array layers;
  for (const auto& l : e.layers) {
    toml::table t{{"name", l.name},
                  {"consolidating", l.consolidating},
                  {"settlement_m", l.settlement}};
    if (l.consolidating)
      t.insert_or_assign("drainage_path_m", l.drainage_path),
          t.insert_or_assign("drained_faces", l.drained_faces),
          t.insert_or_assign("cv_m2_per_year", l.cv * units::seconds_per_year),
          t.insert_or_assign("t50_days", to_days(l.t50)),
          t.insert_or_assign("t90_days", to_days(l.t90));
    layers.push_back(t);
  }
  return toml::table{{"ultimate_m", e.ultimate},
                     {"t50_days_instant", to_days(e.t50(0.0))},
                     {"t50_days_ramped", to_days(e.t50(ramp))},
                     {"layers", layers}};
}

/// The time the 2D curve first reaches half of its final value.
double half_time(const ColumnComparison& c) {
  const double half = 0.5 * c.settlement_2d.back();
  for (std::size_t i = 1; i < c.times.size(); ++i)
    if (c.settlement_2d[i] >= half && c.settlement_2d[i - 1] < half) {
      const double w =
          (half - c.settlement_2d[i - 1]) / (c.settlement_2d[i] - c.settlement_2d[i - 1]);
      return c.times[i - 1] + w * (c.times[i] - c.times[i - 1]);
    }
  return 0.0;
}

toml::table comparison_table(const ColumnComparison& c) {
  const double end = c.times.back();
  const double s1d_end = c.computed.settlement_at(end, c.ramp);
  toml::array notes;
  for (const auto& n : c.notes)
    notes.push_back(n);
  toml::table t{{"name", c.name},
                {"x_m", c.x},
                {"ramp_days", to_days(c.ramp)},
                {"end_days", to_days(end)},
                {"settlement_2d_end_m", c.settlement_2d.back()},
                {"settlement_1d_computed_end_m", s1d_end},
                {"ratio_2d_to_1d_computed_end",
                 s1d_end > 0 ? c.settlement_2d.back() / s1d_end : 0.0},
                {"t50_2d_days", to_days(half_time(c))},
                {"t50_1d_days", to_days(c.computed.t50(c.ramp, s1d_end))},
                {"computed", estimate_table(c.computed, c.ramp)},
                {"notes", notes}};
  if (c.design_known) {
    const double design_end = c.design.settlement_at(end, c.ramp);
    t.insert("design", estimate_table(c.design, c.ramp));
    t.insert("settlement_1d_design_end_m", design_end);
    t.insert("ratio_2d_to_1d_design_end",
             design_end > 0 ? c.settlement_2d.back() / design_end : 0.0);
  }
  return t;
}

/// one_d/<column>.csv: the 2D settlement and the 1D estimates over time.
void write_history(const std::string& folder, const ColumnComparison& c, MPI_Comm comm) {
  std::vector<std::string> header{"time_days", "settlement_2d_m",
                                  "settlement_1d_computed_instant_m",
                                  "settlement_1d_computed_ramped_m"};
  if (c.design_known)
    header.insert(header.end(),
                  {"settlement_1d_design_instant_m", "settlement_1d_design_ramped_m"});
  CsvFile table(folder + "/" + c.name + ".csv", header, comm);
  for (std::size_t i = 0; i < c.times.size(); ++i) {
    const double t = c.times[i];
    std::vector<double> row{to_days(t), c.settlement_2d[i],
                            c.computed.settlement_at(t, 0.0),
                            c.computed.settlement_at(t, c.ramp)};
    if (c.design_known)
      row.insert(row.end(),
                 {c.design.settlement_at(t, 0.0), c.design.settlement_at(t, c.ramp)});
    table.row(row);
  }
}

} // namespace

namespace {
/// The e-log description of a Cam Clay layer at the column: its indices, and the
/// start's vertical effective stress and the preconsolidation at its faces.
std::optional<checks::ColumnLayer::Oedometer>
oedometer(const RunContext& run, double x, const StackLayer& layer) {
  const auto found = run.problem.setup().clays.find(layer.region);
  if (found == run.problem.setup().clays.end())
    return std::nullopt;
  const auto& clay = found->second;
  const double ln10 = std::log(10.0);
  checks::ColumnLayer::Oedometer o;
  o.compression_index = clay.parameters.lambda * ln10;
  o.recompression_index = clay.parameters.kappa * ln10;
  o.void_ratio = clay.parameters.specific_volume - 1.0;
  const auto id = run.problem.mesh().names.region_id(layer.region);
  const auto& start = run.derivation.initial().effective_stress;
  o.start_top = -start(Point<2>(x, layer.top), id)[1][1];
  o.start_bottom = -start(Point<2>(x, layer.bottom), id)[1][1];
  o.past_top = clay.preconsolidation(o.start_top, layer.top);
  o.past_bottom = clay.preconsolidation(o.start_bottom, layer.bottom);
  return o;
}
} // namespace

Columns::Columns(const RunContext& run)
    : scenario_(run.scenario)
    , materials_(run.problem.setup().materials) {
  const auto roles = model::boundary_roles(scenario_, run.problem.mesh());
  for (const auto& c : scenario_.output.columns) {
    ColumnComparison cc;
    cc.name = c.name;
    cc.x = c.x;
    const ColumnStack stack = column_stack(run.problem, c.x);
    if (stack.layers.empty())
      throw InputError(scenario_.location_of("output.columns." + c.name) + ": column '" +
                       c.name + "': the line x = " + significant(c.x, 4) +
                       " m misses the mesh");
    const auto role = roles.find(stack.top_boundary);
    cc.surface_drained =
        role != roles.end() &&
        role->second.hydraulic == scenario::BoundarySpec::Hydraulic::fixed_head;
    cc.layers = stack.layers;
    for (const auto& l : stack.layers)
      cc.oedometers.push_back(oedometer(run, c.x, l));
    columns_.push_back(cc);
    tops_.emplace_back(run.problem,
                       std::vector<Point<2>>{Point<2>(c.x, stack.layers.front().top)},
                       "column '" + c.name + "'");
    // Each layer's top, middle and bottom: the heads at its faces and through it.
    std::vector<Point<2>> levels;
    for (const auto& l : stack.layers)
      for (const double y : {l.top, 0.5 * (l.top + l.bottom), l.bottom})
        levels.emplace_back(c.x, y);
    layer_levels_.emplace_back(run.problem, levels, "column '" + c.name + "'");
  }
  design_falls(run);
  // The hand method's ramp is that of the first stage that changes a head.
  const auto& stages = scenario_.stages;
  const auto lowering = std::find_if(stages.begin(), stages.end(), [](const auto& st) {
    return !st.wells.empty() || !st.boundary_targets.empty();
  });
  for (auto& cc : columns_)
    cc.ramp = lowering != stages.end() ? lowering->ramp : 0.0;
}

void Columns::design_falls(const RunContext& run) {
  // The head falls the scenario itself sets, by region: a well's final target head
  // against the initial head at the middle of its screen, in the region there; a
  // box's top or bottom boundary head in the region it bounds.
  const auto& s = scenario_;
  auto set_fall = [&](const std::string& region, double fall) {
    const auto found = design_fall_.find(region);
    design_fall_[region] =
        found == design_fall_.end() ? fall : std::max(found->second, fall);
  };
  for (const auto& stage : s.stages) {
    for (const auto& [name, target] : stage.wells) {
      if (target.kind != scenario::Target::Kind::head)
        continue;
      for (const auto& p : run.model.pumped)
        if (p.label == name && !p.line.empty()) {
          const Point<2> mid = line_middle(run.problem, p.line);
          set_fall(region_at(run.problem, mid), run.initial.head(mid) - target.value);
        }
    }
    if (s.box && !columns_.empty())
      for (const auto& [boundary, target] : stage.boundary_targets) {
        if (target.kind != scenario::Target::Kind::head)
          continue;
        const double head = target.value;
        const auto& layers = columns_.front().layers;
        if (boundary == "bottom" || boundary == "top") {
          const StackLayer& l = boundary == "bottom" ? layers.back() : layers.front();
          set_fall(l.region, run.initial.head(Point<2>(0.0, l.top)) - head);
        }
      }
  }
}

void Columns::record(const RunView& view) {
  for (std::size_t c = 0; c < columns_.size(); ++c) {
    columns_[c].times.push_back(view.time());
    columns_[c].settlement_2d.push_back(
        tops_[c].evaluate(view.run.problem, view.run.derivation)[0].settlement);
  }
}

void Columns::start(const RunView& view) {
  if (!columns_.empty() && dealii::Utilities::MPI::this_mpi_process(view.comm()) == 0)
    std::filesystem::create_directories(view.folder + "/one_d");
  record(view);
}

std::vector<double> Columns::after_step(const RunView& view) {
  record(view);
  return {};
}

std::vector<checks::ColumnLayer> Columns::column_layers(const ColumnComparison& c) const {
  std::vector<checks::ColumnLayer> out;
  for (const auto& l : c.layers) {
    const auto& m = materials_.at(l.region);
    checks::ColumnLayer layer;
    layer.name = l.region;
    layer.top = l.top;
    layer.bottom = l.bottom;
    layer.mv = 1.0 / m.constrained_modulus();
    layer.cv = m.consolidation_coefficient(m.conductivity_y, scenario_.gamma_w);
    layer.consolidating = m.conductivity_y <= scenario_.limits.low_permeability;
    layer.conductivity = m.conductivity_y;
    layer.oedometer = c.oedometers[out.size()];
    out.push_back(layer);
  }
  return out;
}

void Columns::compare(std::size_t c, const RunView& view) {
  ColumnComparison& cc = columns_[c];
  std::vector<checks::ColumnLayer> design = column_layers(cc), computed = design;
  const auto levels = layer_levels_[c].evaluate(view.run.problem, view.run.derivation);
  std::vector<double> design_fall(design.size(),
                                  std::numeric_limits<double>::quiet_NaN()),
      computed_fall(design.size());
  cc.design_known = false;
  for (std::size_t k = 0; k < design.size(); ++k) {
    // The 2D heads: at the layer's faces, and through it by Simpson's rule.
    const double top = levels[3 * k].drawdown, mid = levels[3 * k + 1].drawdown,
                 bottom = levels[3 * k + 2].drawdown;
    computed_fall[k] = (top + 4.0 * mid + bottom) / 6.0;
    computed[k].head_fall = computed_fall[k];
    computed[k].fall_top = top;
    computed[k].fall_bottom = bottom;
    const auto found = design_fall_.find(cc.layers[k].region);
    if (found != design_fall_.end()) {
      design_fall[k] = design[k].head_fall = found->second;
      cc.design_known = true;
    }
  }
  cc.design = checks::estimate_one_d(design, scenario_.gamma_w, cc.surface_drained);
  cc.computed = checks::estimate_one_d(computed, scenario_.gamma_w, cc.surface_drained);
  cc.notes = comparison_notes(cc, design, design_fall, computed_fall);
}

void Columns::finish(const RunView& view, toml::table& results) {
  if (columns_.empty())
    return;
  toml::array tables;
  for (std::size_t c = 0; c < columns_.size(); ++c) {
    compare(c, view);
    write_history(view.folder + "/one_d", columns_[c], view.comm());
    tables.push_back(comparison_table(columns_[c]));
  }
  results.insert("columns", tables);
}

void Columns::visit_state(StateArchive& a) {
  a.mark("columns");
  for (auto& c : columns_)
    a& c.times& c.settlement_2d;
}

} // namespace settlewell::monitors
