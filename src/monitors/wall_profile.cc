#include "wall_profile.h"

#include "settlewell/checks/wall.h"
#include "settlewell/core/units.h"

#include <deal.II/base/mpi.h>
#include <deal.II/base/quadrature_lib.h>

#include <cmath>
#include <filesystem>

namespace settlewell::monitors {

using dealii::Point;
using units::to_days;

namespace {

/// Samples every 0.25 m or so from the ground surface to the toe, ends inset by
/// a millimetre so that each lies inside a wall cell.
std::vector<double> sample_levels(double top, double toe) {
  const unsigned int n = std::max(2u, unsigned(std::ceil((top - toe) / 0.25)) + 1);
  std::vector<double> y;
  for (unsigned int i = 0; i < n; ++i)
    y.push_back(top - 1e-3 - (top - toe - 2e-3) * i / (n - 1));
  return y;
}

toml::table extreme_table(double value, double y, double time) {
  return toml::table{{"value", value}, {"elevation_m", y}, {"at_days", to_days(time)}};
}

} // namespace

WallProfile::WallProfile(const RunContext& run)
    : scenario_(run.scenario) {
  const auto& sec = *scenario_.section;
  const auto& wall = *sec.wall;
  depths_ = sample_levels(sec.ground_surface, wall.toe);
  // Five Gauss-Legendre points integrate the stress across the thickness exactly
  // for the polynomial stress of the Q2 cells up to degree 9.
  const dealii::QGauss<1> gauss(5);
  for (unsigned int q = 0; q < gauss.size(); ++q) {
    gauss_x_.push_back(2 * gauss.point(q)[0] - 1);
    gauss_w_.push_back(2 * gauss.weight(q));
  }
  const double half = sec.excavation_width / 2;
  for (const double side : {1.0, -1.0}) {
    if (!(side > 0 ? wall.right : wall.left))
      continue;
    const double centre = side * (half + wall.thickness / 2);
    std::vector<Point<2>> points;
    for (const double y : depths_)
      for (const double g : gauss_x_)
        points.emplace_back(centre + g * wall.thickness / 2, y);
    sides_.push_back({side > 0 ? "right" : "left", -side, centre,
                      SamplePoints(run.problem, points, "wall samples")});
  }
  deflection_.resize(sides_.size());
  moment_.resize(sides_.size());
  stage_deflection_.assign(sides_.size(),
                           std::vector<std::optional<Extreme>>(scenario_.stages.size()));
  stage_moment_ = stage_deflection_;
}

WallProfile::Profile WallProfile::evaluate(const Side& side, const RunView& view) const {
  const auto values = side.across.evaluate(view.run.problem, view.run.derivation);
  const double half_thickness = scenario_.section->wall->thickness / 2;
  const std::size_t n = gauss_x_.size();
  std::vector<double> offsets, weights;
  for (std::size_t q = 0; q < n; ++q) {
    offsets.push_back(gauss_x_[q] * half_thickness);
    weights.push_back(gauss_w_[q] * half_thickness);
  }
  Profile p;
  std::vector<double> sigma_yy(n), ux(n);
  for (std::size_t i = 0; i < depths_.size(); ++i) {
    for (std::size_t q = 0; q < n; ++q) {
      const auto& v = values[i * n + q];
      // The total vertical stress, tension positive (alpha = 1 in the wall).
      sigma_yy[q] = -v.vertical_effective_stress - v.pore_pressure;
      ux[q] = v.ux;
    }
    const auto section = checks::wall_section(offsets, weights, sigma_yy, ux);
    p.deflection.push_back(side.inward * section.mean_displacement);
    // Tension on the pit side (smaller |x|) gives a positive moment.
    p.moment.push_back(side.inward * section.moment);
  }
  return p;
}

void WallProfile::start(const RunView& view) {
  const std::string folder = view.folder + "/checks";
  if (dealii::Utilities::MPI::this_mpi_process(view.comm()) == 0)
    std::filesystem::create_directories(folder);
  table_.emplace(folder + "/wall.csv",
                 std::vector<std::string>{"side", "time_days", "y_m",
                                          "deflection_towards_pit_mm",
                                          "bending_moment_kNm_per_m"},
                 view.comm());
}

void WallProfile::at_output_time(const RunView& view) {
  const std::size_t stage = view.stage();
  for (std::size_t s = 0; s < sides_.size(); ++s) {
    const Profile p = evaluate(sides_[s], view);
    for (std::size_t i = 0; i < depths_.size(); ++i) {
      table_->row({to_days(view.time()), depths_[i], 1000 * p.deflection[i], p.moment[i]},
                  {sides_[s].name});
      const Extreme d{p.deflection[i], depths_[i], view.time()};
      const Extreme m{p.moment[i], depths_[i], view.time()};
      auto more = [](const std::optional<Extreme>& e, const Extreme& x) {
        return !e || std::abs(x.value) > std::abs(e->value);
      };
      if (more(deflection_[s], d))
        deflection_[s] = d;
      if (more(moment_[s], m))
        moment_[s] = m;
      if (view.step_number > 0 && more(stage_deflection_[s][stage], d))
        stage_deflection_[s][stage] = d;
      if (view.step_number > 0 && more(stage_moment_[s][stage], m))
        stage_moment_[s][stage] = m;
    }
  }
}

void WallProfile::finish(const RunView&, toml::table& results) {
  toml::array sides;
  for (std::size_t s = 0; s < sides_.size(); ++s) {
    toml::array stages;
    for (std::size_t k = 0; k < scenario_.stages.size(); ++k) {
      toml::table t{{"stage", scenario_.stages[k].name}};
      if (stage_deflection_[s][k]) {
        const auto& d = *stage_deflection_[s][k];
        const auto& m = *stage_moment_[s][k];
        t.insert("largest_deflection_mm", extreme_table(1000 * d.value, d.y, d.time));
        t.insert("largest_moment_kNm_per_m", extreme_table(m.value, m.y, m.time));
      }
      stages.push_back(t);
    }
    const auto& d = *deflection_[s];
    const auto& m = *moment_[s];
    sides.push_back(
        toml::table{{"side", sides_[s].name},
                    {"largest_deflection_mm", extreme_table(1000 * d.value, d.y, d.time)},
                    {"largest_moment_kNm_per_m", extreme_table(m.value, m.y, m.time)},
                    {"stages", stages}});
  }
  results.insert("wall",
                 toml::table{{"sign_convention",
                              "deflection positive towards the pit; moment positive with "
                              "the pit-side face in tension"},
                             {"sides", sides}});
}

void WallProfile::visit_state(StateArchive& a) {
  a.mark("wall profile");
  a& deflection_& moment_& stage_deflection_& stage_moment_& table_;
}

} // namespace settlewell::monitors
