#include "well_levels.h"

#include "column_stack.h"

#include "settlewell/analytical/wells.h"
#include "settlewell/core/number_text.h"
#include "settlewell/core/units.h"
#include "settlewell/mesh/gmsh_mesh.h"

#include <deal.II/base/conditional_ostream.h>
#include <deal.II/base/mpi.h>

#include <iostream>
#include <limits>

namespace settlewell::monitors {

using dealii::Point;

namespace {

constexpr unsigned int n_screen_samples = 20;

/// Midpoints of equal parts of the screen.
std::vector<Point<2>> along_screen(const scenario::Well& w) {
  std::vector<Point<2>> points;
  const double length = w.screen_top - w.screen_bottom;
  for (unsigned int i = 0; i < n_screen_samples; ++i)
    points.emplace_back(w.x, w.screen_top - length * (i + 0.5) / n_screen_samples);
  return points;
}

/// The integral of the horizontal conductivity along the screen, m^2/s.
double screen_transmissivity(const BiotProblem& problem, const scenario::Well& w) {
  const double part = (w.screen_top - w.screen_bottom) / n_screen_samples;
  double T = 0.0;
  for (const auto& p : along_screen(w))
    T += problem.setup().materials.at(region_at(problem, p)).conductivity_x * part;
  return T;
}

} // namespace

bool WellLevels::wanted(const scenario::Scenario& s) {
  if (!s.section || s.analysis != AnalysisType::plane_strain)
    return false;
  for (const auto& w : s.section->wells)
    if (w.spacing > 0.0)
      return true;
  return false;
}

WellLevels::WellLevels(const RunContext& run) {
  for (const auto& w : run.scenario.section->wells) {
    if (!(w.spacing > 0.0))
      continue;
    for (const auto& p : run.model.pumped)
      if (p.label == w.name)
        rows_.push_back(Row{w, p.line,
                            SamplePoints(run.problem, along_screen(w), "well " + w.name),
                            screen_transmissivity(run.problem, w)});
  }
}

std::vector<std::string> WellLevels::step_columns() const {
  std::vector<std::string> columns;
  for (const auto& r : rows_)
    columns.push_back("well_level_" + r.well.name + "_m");
  return columns;
}

std::vector<double> WellLevels::after_step(const RunView& view) {
  std::vector<double> values;
  for (auto& r : rows_) {
    double sum = 0.0;
    for (const auto& v : r.screen.evaluate(view.run.problem, view.run.derivation))
      sum += v.head;
    r.row_head = sum / n_screen_samples;
    // The discharge per metre run of the row times the spacing is each well's.
    const double per_well = view.run.problem.outflow(r.line) * r.well.spacing;
    r.loss = analytical::well_row_convergence_loss(per_well, r.transmissivity,
                                                   r.well.spacing, r.well.radius);
    r.level = r.row_head - r.loss;
    if (per_well > 0.0 && (!r.pumped || r.level < r.lowest)) {
      r.lowest = r.level;
      r.lowest_at = view.time();
      r.pumped = true;
    }
    values.push_back(r.level);
  }
  return values;
}

void WellLevels::finish(const RunView& view, toml::table& results) {
  toml::array rows;
  for (const auto& r : rows_) {
    const bool dry = r.pumped && r.lowest < r.well.screen_bottom;
    toml::table t{
        {"well", r.well.name},
        {"spacing_m", r.well.spacing},
        {"radius_m", r.well.radius},
        {"screen_top_m", r.well.screen_top},
        {"screen_bottom_m", r.well.screen_bottom},
        {"transmissivity_m2_per_day", r.transmissivity * units::seconds_per_day},
        {"row_head_at_end_m", r.row_head},
        {"convergence_loss_at_end_m", r.loss},
        {"level_at_end_m", r.level},
        {"below_screen_bottom", dry}};
    if (r.pumped) {
      t.insert("lowest_level_m", r.lowest);
      t.insert("lowest_level_day", units::to_days(r.lowest_at));
    }
    if (dry) {
      const std::string warning =
          "well " + r.well.name +
          ": to hold the row's average head, the water in each well "
          "must fall to " +
          significant(r.lowest) + " m, below the screen's bottom (" +
          significant(r.well.screen_bottom) +
          " m): the wells cannot do it; closer wells or "
          "longer screens";
      t.insert("warning", warning);
      dealii::ConditionalOStream(
          std::cerr, dealii::Utilities::MPI::this_mpi_process(view.comm()) == 0)
          << "settlewell: warning: " << warning << "\n";
    }
    rows.push_back(t);
  }
  results.insert("well_levels", rows);
}

void WellLevels::visit_state(StateArchive& a) {
  a.mark("well levels");
  for (auto& r : rows_)
    a& r.row_head& r.loss& r.level& r.lowest& r.lowest_at& r.pumped;
}

} // namespace settlewell::monitors
