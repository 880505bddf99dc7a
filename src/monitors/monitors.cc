#include "base_stability.h"
#include "columns.h"
#include "extremes.h"
#include "field_series.h"
#include "layer_stack.h"
#include "neighbours.h"
#include "plausibility.h"
#include "prop_forces.h"
#include "sampled_tables.h"
#include "wall_profile.h"
#include "water_account.h"

namespace settlewell::monitors {

std::vector<std::unique_ptr<Monitor>> make_monitors(const RunContext& run) {
  std::vector<std::unique_ptr<Monitor>> list;
  list.push_back(std::make_unique<FieldSeries>(run));
  list.push_back(std::make_unique<PointHistory>(run));
  list.push_back(std::make_unique<LineProfiles>(run));
  list.push_back(std::make_unique<WaterAccount>(run));
  list.push_back(std::make_unique<Extremes>(run));
  list.push_back(std::make_unique<Plausibility>(run));
  if (run.scenario.section || !run.problem.setup().excavation.empty())
    list.push_back(std::make_unique<BaseStability>(run));
  if (!run.problem.setup().springs.empty())
    list.push_back(std::make_unique<PropForces>(run));
  if (run.scenario.section && run.scenario.section->wall)
    list.push_back(std::make_unique<WallProfile>(run));
  list.push_back(std::make_unique<Neighbours>(run));
  if (layers_of(run.scenario) != nullptr) // a user's mesh has no layer stack
    list.push_back(std::make_unique<Columns>(run));
  return list;
}

} // namespace settlewell::monitors
