#include "sampled_tables.h"

#include "settlewell/core/units.h"

#include <deal.II/base/mpi.h>

#include <algorithm>
#include <filesystem>

namespace settlewell::monitors {

using dealii::Point;

namespace {

const std::vector<std::string> sample_columns{"head_m",
                                              "drawdown_m",
                                              "settlement_m",
                                              "ux_m",
                                              "excess_pore_pressure_kPa",
                                              "pore_pressure_kPa",
                                              "vertical_effective_stress_kPa"};

std::vector<double> sample_row(const SampleValues& v) {
  return {v.head,
          v.drawdown,
          v.settlement,
          v.ux,
          v.excess_pore_pressure,
          v.pore_pressure,
          v.vertical_effective_stress};
}

std::vector<std::string> with(std::vector<std::string> head,
                              const std::vector<std::string>& tail) {
  head.insert(head.end(), tail.begin(), tail.end());
  return head;
}

std::vector<Point<2>> monitoring_points(const scenario::Scenario& s) {
  std::vector<Point<2>> points;
  for (const auto& p : s.output.points)
    points.emplace_back(p.x, p.y);
  return points;
}

/// The scenario's section lines, and for a section a ground-surface profile (the
/// settlement trough) when the scenario does not name one.
std::vector<scenario::SectionLine> profile_lines(const scenario::Scenario& s) {
  std::vector<scenario::SectionLine> lines = s.output.lines;
  const bool named = std::any_of(lines.begin(), lines.end(), [](const auto& line) {
    return line.name == "ground_surface";
  });
  if (!s.section || named)
    return lines;
  const auto& sec = *s.section;
  const double outer = sec.excavation_width / 2 + (sec.wall ? sec.wall->thickness : 0.0) +
                       sec.far_distance;
  double x0 = (sec.half_model || s.analysis == AnalysisType::axisymmetric) ? 0.0 : -outer;
  if (s.analysis == AnalysisType::axisymmetric && !sec.wells.empty())
    x0 = sec.wells.front().radius;
  const double y = sec.ground_surface;
  lines.push_back({"ground_surface", {{x0, y}, {outer, y}}, 201});
  return lines;
}

/// Evenly spaced points along a polyline, ends included.
std::vector<Point<2>> line_samples(const scenario::SectionLine& line) {
  std::vector<double> cumulative{0.0};
  for (std::size_t i = 1; i < line.points.size(); ++i) {
    const Point<2> a(line.points[i - 1].first, line.points[i - 1].second);
    const Point<2> b(line.points[i].first, line.points[i].second);
    cumulative.push_back(cumulative.back() + a.distance(b));
  }
  std::vector<Point<2>> samples;
  for (unsigned int k = 0; k < line.samples; ++k) {
    const double s = cumulative.back() * k / (line.samples - 1);
    std::size_t i = 1;
    while (i + 1 < cumulative.size() && cumulative[i] < s)
      ++i;
    const double w = cumulative[i] > cumulative[i - 1]
                         ? (s - cumulative[i - 1]) / (cumulative[i] - cumulative[i - 1])
                         : 0.0;
    samples.emplace_back((1 - w) * line.points[i - 1].first + w * line.points[i].first,
                         (1 - w) * line.points[i - 1].second + w * line.points[i].second);
  }
  return samples;
}

} // namespace

PointHistory::PointHistory(const RunContext& run)
    : points_(run.problem,
              monitoring_points(run.scenario),
              run.scenario.location_of("output") + ": output.points") {}

void PointHistory::write(const RunView& view) {
  const auto& run = view.run;
  const std::string t_days = std::to_string(units::to_days(view.time()));
  const std::string& stage = run.schedule.stages()[view.stage()].name;
  const auto values = points_.evaluate(run.problem, run.derivation);
  for (std::size_t i = 0; i < values.size(); ++i) {
    const auto& p = run.scenario.output.points[i];
    auto row = sample_row(values[i]);
    row.insert(row.begin(), {p.x, p.y});
    table_->row(row, {t_days, stage, p.name});
  }
}

void PointHistory::start(const RunView& view) {
  table_.emplace(view.folder + "/points.csv",
                 with({"time_days", "stage", "point", "x_m", "y_m"}, sample_columns),
                 view.comm());
  write(view);
}

std::vector<double> PointHistory::after_step(const RunView& view) {
  write(view);
  return {};
}

LineProfiles::LineProfiles(const RunContext& run) {
  for (const auto& line : profile_lines(run.scenario)) {
    names_.push_back(line.name);
    lines_.emplace_back(run.problem, line_samples(line),
                        run.scenario.location_of("output") + ": output.lines '" +
                            line.name + "'");
  }
}

void LineProfiles::start(const RunView& view) {
  if (dealii::Utilities::MPI::this_mpi_process(view.comm()) == 0)
    std::filesystem::create_directories(view.folder + "/profiles");
  for (const auto& name : names_)
    tables_.emplace_back(view.folder + "/profiles/" + name + ".csv",
                         with({"time_days", "distance_m", "x_m", "y_m"}, sample_columns),
                         view.comm());
}

void LineProfiles::at_output_time(const RunView& view) {
  for (std::size_t l = 0; l < lines_.size(); ++l) {
    const auto values = lines_[l].evaluate(view.run.problem, view.run.derivation);
    const auto& points = lines_[l].points();
    double distance = 0.0;
    for (std::size_t i = 0; i < values.size(); ++i) {
      if (i > 0)
        distance += points[i].distance(points[i - 1]);
      auto row = sample_row(values[i]);
      row.insert(row.begin(),
                 {units::to_days(view.time()), distance, points[i][0], points[i][1]});
      tables_[l].row(row);
    }
  }
}

void PointHistory::visit_state(StateArchive& a) {
  a.mark("point history");
  a& table_;
}

void LineProfiles::visit_state(StateArchive& a) {
  a.mark("line profiles");
  a& tables_;
}

} // namespace settlewell::monitors
