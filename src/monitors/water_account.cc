#include "water_account.h"

#include "settlewell/core/units.h"

#include <deal.II/base/conditional_ostream.h>
#include <deal.II/base/mpi.h>

#include <cmath>
#include <iostream>

namespace settlewell::monitors {

WaterAccount::WaterAccount(const RunContext& run)
    : pumped_(run.model.pumped)
    , tolerance_(run.scenario.limits.mass_balance) {
  for (const auto& p : pumped_) {
    volume_[p.label] = 0.0;
    stage_volume_[p.label].assign(run.schedule.stages().size(), 0.0);
  }
}

std::vector<std::string> WaterAccount::step_columns() const {
  std::vector<std::string> columns;
  for (const auto& p : pumped_)
    columns.push_back("discharge_" + p.label + "_m3_per_day");
  columns.insert(columns.end(), {"net_outflow_m3_per_day", "storage_gain_m3",
                                 "water_balance_error_relative"});
  return columns;
}

std::vector<double> WaterAccount::after_step(const RunView& view) {
  const BiotProblem& problem = view.run.problem;
  const double dt = view.step.dt;
  std::vector<double> values;
  for (const auto& p : pumped_) {
    const double q =
        p.drained_surface ? problem.drained_surface_outflow() : problem.outflow(p.line);
    volume_[p.label] += q * dt;
    stage_volume_[p.label][view.stage()] += q * dt;
    final_discharge_[p.label] = q;
    values.push_back(q * units::seconds_per_day);
  }
  // Water balance of the step: what left plus what was stored must vanish, relative
  // to the water that moved: in plus out through the boundaries, and the storage
  // change of every cell whatever its sign, in this step or in the run's largest
  // step so far. With net values as the scale, a steady through-flow would turn
  // round-off into a large relative error; with this step's alone, so would the
  // round-off of a model that has come to rest.
  const auto exchange = problem.water_exchange();
  const double net_outflow = exchange.net_outflow;
  const double out = net_outflow * dt;
  const auto storage = problem.storage_change();
  const double stored = storage.net;
  largest_moved_ = std::max({largest_moved_, exchange.gross * dt, storage.gross});
  const double scale = std::max(largest_moved_, 1e-30);
  const double error = std::abs(out + stored) / scale;
  worst_balance_ = std::max(worst_balance_, error);
  if (error > tolerance_ && steps_off_++ == 0)
    dealii::ConditionalOStream(std::cerr,
                               dealii::Utilities::MPI::this_mpi_process(view.comm()) == 0)
        << "settlewell: warning: the water balance of step at day "
        << units::to_days(view.time()) << " is off by " << error
        << " (relative); see steps.csv (the run's last lines count such steps)\n";
  values.insert(values.end(), {net_outflow * units::seconds_per_day, stored, error});
  return values;
}

void WaterAccount::finish(const RunView& view, toml::table& results) {
  toml::array discharge;
  for (const auto& p : pumped_) {
    toml::array per_stage;
    for (const double v : stage_volume_.at(p.label))
      per_stage.push_back(v);
    const auto q = final_discharge_.find(p.label);
    discharge.push_back(toml::table{
        {"line", p.label},
        {"final_m3_per_day",
         q != final_discharge_.end() ? q->second * units::seconds_per_day : 0.0},
        {"volume_m3", volume_.at(p.label)},
        {"stage_volumes_m3", per_stage}});
  }
  results.insert("discharge", discharge);
  results.insert("discharge_unit",
                 view.run.scenario.analysis == AnalysisType::axisymmetric
                     ? "per well"
                     : "per metre run");
  // A half model (symmetry line at x = 0) pumps half of what the whole pit pumps:
  // the report and the summary give both.
  const auto& sc = view.run.scenario;
  results.insert("modelled_half", sc.analysis == AnalysisType::plane_strain &&
                                      sc.section && sc.section->half_model);
  results.insert("water_balance",
                 toml::table{{"largest_relative_error", worst_balance_},
                             {"tolerance", tolerance_},
                             {"steps_over_tolerance", int64_t(steps_off_)},
                             {"closes", worst_balance_ <= tolerance_}});
}

void WaterAccount::visit_state(StateArchive& a) {
  a.mark("water account");
  a& volume_& final_discharge_& stage_volume_& worst_balance_& largest_moved_& steps_off_;
}

} // namespace settlewell::monitors
