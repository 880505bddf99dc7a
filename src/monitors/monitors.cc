#include "base_stability.h"
#include "clay_yield.h"
#include "columns.h"
#include "extremes.h"
#include "field_series.h"
#include "head_rise.h"
#include "neighbours.h"
#include "plausibility.h"
#include "prop_forces.h"
#include "sampled_tables.h"
#include "wall_profile.h"
#include "water_account.h"
#include "well_levels.h"

namespace settlewell::monitors {

namespace {

/// Says in the results why the base checks are not made in a user's mesh that
/// names no pit (the report prints it where the checks would be).
class BaseChecksSkipped : public Monitor {
public:
  void finish(const RunView&, toml::table& results) override {
    results.insert(
        "base_stability",
        toml::table{{"skipped", "the mesh (mesh_file) names no "
                                "excavation_regions, so there is no pit floor: "
                                "piping, heave and uplift are not checked"}});
  }
};

} // namespace

std::vector<std::unique_ptr<Monitor>> make_monitors(const RunContext& run) {
  std::vector<std::unique_ptr<Monitor>> list;
  list.push_back(std::make_unique<FieldSeries>(run));
  list.push_back(std::make_unique<PointHistory>(run));
  list.push_back(std::make_unique<LineProfiles>(run));
  list.push_back(std::make_unique<WaterAccount>(run));
  if (WellLevels::wanted(run.scenario))
    list.push_back(std::make_unique<WellLevels>(run));
  list.push_back(std::make_unique<Extremes>(run));
  list.push_back(std::make_unique<HeadRise>(run));
  if (run.problem.has_clays())
    list.push_back(std::make_unique<ClayYield>());
  list.push_back(std::make_unique<Plausibility>(run));
  if (run.scenario.section || !run.problem.setup().excavation.empty())
    list.push_back(std::make_unique<BaseStability>(run));
  else
    list.push_back(std::make_unique<BaseChecksSkipped>());
  if (!run.problem.setup().springs.empty())
    list.push_back(std::make_unique<PropForces>(run));
  if (run.scenario.section && run.scenario.section->wall)
    list.push_back(std::make_unique<WallProfile>(run));
  list.push_back(std::make_unique<Neighbours>(run));
  if (!run.scenario.output.columns.empty())
    list.push_back(std::make_unique<Columns>(run));
  return list;
}

} // namespace settlewell::monitors
