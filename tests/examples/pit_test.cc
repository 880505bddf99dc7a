// The basement-pit example (examples/basement-pit) at a coarse setting, and the
// things that must hold for it. These are consistency checks of the whole chain
// (scenario, mesh, stages, core, outputs), not comparisons with published values.
#include "example_support.h"

#include "settlewell/mesh/gmsh_mesh.h"
#include "settlewell/model/initial_state.h"
#include "settlewell/model/model_builder.h"
#include "settlewell/model/schedule.h"
#include "settlewell/output/probes.h"
#include "settlewell/physics/biot_problem.h"
#include "settlewell/scenario/parse.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>

using namespace example_support;

namespace {

constexpr double outer_face = 14.8; // half width 14 + wall 0.8, m

void coarse(toml::table& s) {
  coarsen_section(s, 1.0, 25.0, 1.4);
}

/// Shorter stages for the variants that only compare two runs, and monitoring
/// points moved off the cell edges (stresses jump across edges, and a point on an
/// edge is evaluated from one side, which mirroring swaps).
void short_stages(toml::table& s) {
  for (auto& p : *s["output"]["points"].as_array())
    p.as_table()->insert_or_assign("x", *p.as_table()->get("x")->value<double>() + 0.13);
  auto* stages = s["stages"].as_array();
  stages->get(0)->as_table()->insert_or_assign("duration", 20.0);
  stages->get(0)->as_table()->insert_or_assign("ramp", 20.0);
  stages->get(1)->as_table()->insert_or_assign("duration", 20.0);
  s["output"].as_table()->insert_or_assign("times", toml::array{10.0});
}

/// The sources of the water budget add up to the pumped volume (conservation:
/// within the run's water-balance tolerance times the water moved), and returns
/// the share of the named source (0 when it is not listed).
double budget_share(const std::filesystem::path& folder, const std::string& source) {
  const toml::table r = toml::parse_file((folder / "results.toml").string());
  const auto& budget = *r["water_budget"].as_table();
  const double pumped = budget["pumped_volume_m3"].value_or(0.0);
  double sum = 0.0, share = 0.0;
  for (const auto& node : *budget["sources"].as_array()) {
    const auto& src = *node.as_table();
    sum += src["volume_m3"].value_or(0.0);
    if (src["name"].value_or(std::string()) == source)
      share = src["share_of_pumped_volume"].value_or(0.0);
  }
  EXPECT_GT(pumped, 0.0);
  EXPECT_NEAR(sum, pumped, 1e-6 * pumped);
  return share;
}

} // namespace

// Settlement beside the pit is positive and, beyond its peak, falls with distance.
TEST(PitExample, SettlementOutsideTheWallIsPositiveAndDecays) {
  const auto run = run_example("basement-pit", "coarse", coarse);
  const Csv surface(run.folder / "profiles" / "ground_surface.csv");
  const auto rows = rows_at(surface, 365.0);
  ASSERT_FALSE(rows.empty());
  const auto& x = surface.column("x_m");
  const auto& s = surface.column("settlement_m");
  std::vector<std::pair<double, double>> outside;
  for (const auto r : rows)
    if (x[r] >= outer_face + 1.0)
      outside.emplace_back(x[r], s[r]);
  ASSERT_GT(outside.size(), 50u);
  const auto peak =
      std::max_element(outside.begin(), outside.end(),
                       [](auto& a, auto& b) { return a.second < b.second; });
  for (const auto& [xi, si] : outside)
    EXPECT_GT(si, 0.0) << "x = " << xi;
  for (auto it = peak; it + 1 != outside.end(); ++it)
    EXPECT_LE((it + 1)->second, it->second + 1e-9) << "x = " << (it + 1)->first;
  EXPECT_LT(outside.back().second, 0.25 * peak->second);
  ASSERT_TRUE(run.summary.settlement_outside.has_value());
  EXPECT_NEAR(*run.summary.settlement_outside, peak->second, 0.02 * peak->second);
  EXPECT_GT(run.summary.pumped_volume.at("W1"), 0.0);
  // A year on, the flow is close to steady: the far boundary, at a fixed head,
  // supplies nearly all of the water, and the run warns of it.
  EXPECT_GT(budget_share(run.folder, "far_boundary"), 0.9);
}

// A full model with a mirrored row of wells is the half model twice: same heads and
// settlements at mirrored points (to solver round-off: the meshes are mirror
// images), and twice the discharge.
TEST(PitExample, HalfModelEqualsFullModel) {
  const auto half = run_example("basement-pit", "half", [](toml::table& s) {
    coarse(s);
    short_stages(s);
  });
  const auto full = run_example("basement-pit", "full", [](toml::table& s) {
    coarse(s);
    short_stages(s);
    s["section"].as_table()->insert_or_assign("half_model", false);
    auto* wells = s["section"]["wells"].as_array();
    toml::table mirror = *wells->get(0)->as_table();
    mirror.insert_or_assign("name", "W1m");
    mirror.insert_or_assign("x", -7.0);
    wells->push_back(mirror);
    auto* stage_wells = s["stages"][0]["wells"].as_table();
    stage_wells->insert("W1m", toml::table{{"head", -5.0}});
    auto* points = s["output"]["points"].as_array();
    const std::size_t n = points->size();
    for (std::size_t i = 0; i < n; ++i) {
      toml::table p = *points->get(i)->as_table();
      p.insert_or_assign("name",
                         std::string(*p["name"].value<std::string>()) + "_mirror");
      p.insert_or_assign("x", -*p["x"].value<double>());
      points->push_back(p);
    }
  });
  const Csv a(half.folder / "points.csv"), b(full.folder / "points.csv");
  const auto rows_a = rows_at(a, 40.0), rows_b = rows_at(b, 40.0);
  ASSERT_EQ(rows_b.size(), 2 * rows_a.size());
  for (std::size_t i = 0; i < rows_a.size(); ++i)
    for (const char* field :
         {"head_m", "settlement_m", "vertical_effective_stress_kPa"}) {
      const double va = a.column(field)[rows_a[i]];
      const double scale = 1e-6 * std::max(1.0, std::abs(va));
      EXPECT_NEAR(b.column(field)[rows_b[i]], va, scale)
          << a.text("point")[rows_a[i]] << " " << field;
      EXPECT_NEAR(b.column(field)[rows_b[i + rows_a.size()]], va, scale)
          << a.text("point")[rows_a[i]] << " mirrored " << field;
    }
  const double volume_half = half.summary.pumped_volume.at("W1");
  const double volume_full =
      full.summary.pumped_volume.at("W1") + full.summary.pumped_volume.at("W1m");
  EXPECT_NEAR(volume_full, 2.0 * volume_half, 1e-6 * volume_half);
}

// With a no-flow far boundary 3 km away and two days of pumping, the drawdown
// cone has not reached the boundary: the drawdown there is a small fraction of
// the drawdown just outside the wall.
TEST(PitExample, FarFieldDrawdownVanishesWithANoFlowBoundary) {
  const auto run = run_example("basement-pit", "no-flow-far", [](toml::table& s) {
    coarsen_section(s, 1.0, 100.0, 1.4);
    s["section"].as_table()->insert_or_assign("far_distance", 3000.0);
    s.insert_or_assign(
        "boundaries",
        toml::table{
            {"far_boundary", toml::table{{"hydraulic", "no_flow"}}},
            {"ground_surface", toml::table{{"hydraulic", "fixed_head"}, {"head", 5.0}}}});
    auto* stages = s["stages"].as_array();
    stages->get(0)->as_table()->insert_or_assign("duration", 2.0);
    stages->get(0)->as_table()->insert_or_assign("ramp", 1.0);
    stages->erase(stages->begin() + 1);
    s["output"].as_table()->insert_or_assign("times", toml::array{});
    auto* lines = s["output"]["lines"].as_array();
    lines->get(1)->as_table()->insert_or_assign(
        "points", toml::array{toml::array{0.0, -14.5}, toml::array{3014.8, -14.5}});
    lines->get(0)->as_table()->insert_or_assign(
        "points", toml::array{toml::array{0.0, 6.0}, toml::array{3014.8, 6.0}});
  });
  const Csv aquifer(run.folder / "profiles" / "aquifer_mid.csv");
  const auto rows = rows_at(aquifer, 2.0);
  const auto& x = aquifer.column("x_m");
  const auto& s = aquifer.column("drawdown_m");
  double near_wall = 0.0, at_far = 0.0;
  for (const auto r : rows) {
    if (x[r] > outer_face && x[r] < outer_face + 20.0)
      near_wall = std::max(near_wall, s[r]);
    if (x[r] > 3000.0)
      at_far = std::max(at_far, std::abs(s[r]));
  }
  EXPECT_GT(near_wall, 1.0);
  EXPECT_LT(at_far, 0.01 * near_wall);
  // A no-flow far boundary supplies nothing: the water comes from storage and the
  // ground surface.
  EXPECT_EQ(budget_share(run.folder, "far_boundary"), 0.0);
  EXPECT_GT(budget_share(run.folder, "storage"), 0.5);
}

// Long after pumping reaches its final head, the transient heads equal those of a
// separate steady seepage solve (the core with a rigid skeleton and no storage,
// one step: div(k grad h) = 0 with the same boundary heads).
TEST(PitExample, LateTimeHeadsMatchASteadySeepageSolve) {
  auto long_hold = [](toml::table& s) {
    coarse(s);
    s["stages"][1].as_table()->insert_or_assign("duration", 6000.0);
    s["output"].as_table()->insert_or_assign("times", toml::array{});
  };
  const auto run = run_example("basement-pit", "long-hold", long_hold);

  using namespace settlewell;
  const auto scenario = scenario::read_scenario(
      write_variant("basement-pit", "long-hold", long_hold).string());
  const Mesh mesh = make_scenario_mesh(scenario, MPI_COMM_WORLD);
  const model::InitialState initial(scenario, mesh);
  const model::Schedule schedule(scenario);
  auto model = model::build_model(scenario, mesh, initial, schedule);
  model.setup.rigid_skeleton = true;
  for (auto& [region, m] : model.setup.materials)
    m.storage = 0.0;
  BiotProblem steady(mesh, model.setup);
  steady.advance_to(scenario.end_time());

  const Csv points(run.folder / "points.csv");
  const auto rows = rows_at(points, units::to_days(scenario.end_time()));
  ASSERT_EQ(rows.size(), scenario.output.points.size());
  for (std::size_t i = 0; i < rows.size(); ++i) {
    const auto& p = scenario.output.points[i];
    const dealii::Point<2> x(p.x, p.y);
    const double steady_head =
        initial.head(x) + probe(steady, x).excess_pressure / scenario.gamma_w;
    // 1 mm on drawdowns of up to 10 m: the consolidation left after 6000 days
    // (Tv about 8 for the clay) and the last steps' lag are far smaller.
    EXPECT_NEAR(points.column("head_m")[rows[i]], steady_head, 1e-3) << p.name;
  }
}

// A well screen may reach the model base: the section is meshed with the screen
// line ending on the base, and the longer screen at the same head pumps more
// (it reaches deeper into the aquifer).
TEST(PitExample, AScreenMayReachTheModelBase) {
  auto variant = [](double screen_bottom) {
    return [screen_bottom](toml::table& s) {
      coarse(s);
      short_stages(s);
      s["section"]["wells"][0].as_table()->insert_or_assign("screen_bottom",
                                                            screen_bottom);
    };
  };
  const auto shipped = run_example("basement-pit", "screen-shipped", variant(-15.0));
  const auto to_base = run_example("basement-pit", "screen-to-base", variant(-30.0));
  EXPECT_GT(shipped.summary.pumped_volume.at("W1"), 0.0);
  EXPECT_GT(to_base.summary.pumped_volume.at("W1"),
            shipped.summary.pumped_volume.at("W1"));
}
