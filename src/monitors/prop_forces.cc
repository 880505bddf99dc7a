#include "prop_forces.h"

#include "settlewell/core/units.h"

#include <deal.II/base/mpi.h>

#include <filesystem>

namespace settlewell::monitors {

using units::to_days;

PropForces::PropForces(const RunContext& run)
    : scenario_(run.scenario) {}

double PropForces::reported(double spring_force) const {
  // A ring's radial force for the full circle is 2 pi R q; its hoop force R q.
  return scenario_.analysis == AnalysisType::axisymmetric ? spring_force / (2 * units::pi)
                                                          : spring_force;
}

void PropForces::start(const RunView& view) {
  const std::string folder = view.folder + "/checks";
  if (dealii::Utilities::MPI::this_mpi_process(view.comm()) == 0)
    std::filesystem::create_directories(folder);
  const std::string unit = scenario_.analysis == AnalysisType::axisymmetric
                               ? "ring_hoop_force_kN"
                               : "force_kN_per_m";
  table_.emplace(folder + "/props.csv",
                 std::vector<std::string>{"prop", "time_days", "fitted", unit},
                 view.comm());
}

void PropForces::at_output_time(const RunView& view) {
  const auto& springs = view.run.problem.setup().springs;
  times_.push_back(view.time());
  forces_.emplace_back();
  for (std::size_t k = 0; k < springs.size(); ++k) {
    const bool fitted = view.run.problem.spring_fitted(k);
    const double force = reported(view.run.problem.spring_force(k));
    forces_.back().push_back(fitted ? std::optional<double>(force) : std::nullopt);
    table_->row_with_gaps({to_days(view.time()), fitted ? 1.0 : 0.0,
                           fitted ? std::optional<double>(force) : std::nullopt},
                          {springs[k].name});
  }
}

void PropForces::finish(const RunView& view, toml::table& results) {
  const auto& springs = view.run.problem.setup().springs;
  const auto& stages = view.run.schedule.stages();
  toml::array props;
  for (std::size_t k = 0; k < springs.size(); ++k) {
    std::optional<std::size_t> largest;
    toml::array per_stage;
    for (const auto& stage : stages) {
      std::optional<double> most;
      for (std::size_t i = 0; i < times_.size(); ++i) {
        const auto& f = forces_[i][k];
        if (f && times_[i] > stage.start && times_[i] <= stage.end * (1 + 1e-12))
          most = most ? std::max(*most, *f) : *f;
      }
      toml::table t{{"stage", stage.name}};
      if (most)
        t.insert("largest_force", *most);
      else
        t.insert("largest_force", "not fitted");
      per_stage.push_back(t);
    }
    for (std::size_t i = 0; i < times_.size(); ++i)
      if (forces_[i][k] && (!largest || *forces_[i][k] > *forces_[*largest][k]))
        largest = i;
    toml::table t{{"name", springs[k].name},
                  {"level_m", springs[k].at[1]},
                  {"unit", scenario_.analysis == AnalysisType::axisymmetric
                               ? "ring hoop force, kN"
                               : "kN per metre run"},
                  {"stages", per_stage}};
    if (largest) {
      t.insert("largest_force", *forces_[*largest][k]);
      t.insert("largest_at_days", to_days(times_[*largest]));
    } else {
      t.insert("largest_force", "not fitted");
    }
    props.push_back(t);
  }
  results.insert("props", props);
}

void PropForces::visit_state(StateArchive& a) {
  a.mark("prop forces");
  a& times_& forces_& table_;
}

} // namespace settlewell::monitors
