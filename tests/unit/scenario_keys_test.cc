// The key registry is the one place where scenario defaults are declared: every
// default that looks like a value is one of the key's type, and a scenario that
// leaves a key out gets exactly the registry's default.
#include "settlewell/core/errors.h"
#include "settlewell/scenario/keys.h"
#include "settlewell/scenario/parse.h"

#include <gtest/gtest.h>

#include <cstdlib>
#include <functional>
#include <set>
#include <sstream>
#include <string>

namespace sc = settlewell::scenario;

namespace {

bool looks_like_a_value(const std::string& d) {
  return !d.empty() && (std::isdigit(static_cast<unsigned char>(d[0])) || d[0] == '"' ||
                        d[0] == '-' || d == "true" || d == "false");
}

double default_number(const std::string& path) {
  return std::strtod(sc::key_spec(path).default_value.c_str(), nullptr);
}

/// A scenario with the required keys only (a box of one sand layer, one stage).
const char* minimal = R"(
[materials.sand]
unit_weight = 19.0
youngs_modulus = 30000
poisson_ratio = 0.3
conductivity = 1e-4
[box]
bottom = -4.0
layers = [ { top = 0.0, material = "sand" } ]
[groundwater]
water_table = 0.0
[[stages]]
name = "hold"
duration = 10.0
)";

} // namespace

TEST(KeyRegistry, EveryValueLikeDefaultIsALiteralOfItsType) {
  for (const auto& key : sc::all_keys()) {
    if (key.default_value == "-" || key.required())
      continue;
    EXPECT_EQ(looks_like_a_value(key.default_value), key.has_literal_default())
        << key.path << " (" << key.type << ") default " << key.default_value;
  }
}

// A sweep's chart labels its axis with the unit of the swept key, which names a
// user's material or an element of the stages.
TEST(KeyRegistry, UnitOfAConcretePathIsThatOfItsDeclaredKey) {
  EXPECT_EQ(settlewell::scenario::unit_of("section.wall.toe"), "m");
  EXPECT_EQ(settlewell::scenario::unit_of("materials.aquifer_sand.conductivity_x"),
            "m/s");
  EXPECT_EQ(settlewell::scenario::unit_of("stages[1].wells.W1.head"), "m");
  EXPECT_EQ(settlewell::scenario::unit_of("materials.aquifer_sand.poisson_ratio"), "");
  EXPECT_EQ(settlewell::scenario::unit_of("materials.aquifer_sand.no_such_key"), "");
  EXPECT_EQ(settlewell::scenario::unit_of("stages.wells.W1.head"), "");
}

TEST(KeyRegistry, AnUndeclaredPathIsAnInternalError) {
  EXPECT_THROW(sc::key_spec("materials.<name>.no_such_key"), settlewell::InternalError);
}

TEST(KeyRegistry, OmittedKeysTakeTheRegistryDefaults) {
  const sc::Scenario s = sc::parse_scenario(minimal, "minimal.toml");
  const std::vector<std::pair<std::string, double>> numbers{
      {"unit_weight_water", s.gamma_w},
      {"materials.<name>.biot_alpha", s.materials.at("sand").poroelastic.biot_alpha},
      {"materials.<name>.storage", s.materials.at("sand").poroelastic.storage},
      {"materials.<name>.earth_pressure_at_rest", s.materials.at("sand").k0},
      {"box.width", s.box->width},
      {"box.cells_x", double(s.box->cells_x)},
      {"box.cell_height", s.box->cell_height},
      {"stages[].ramp", s.stages[0].ramp},
      {"stages[].time_steps.growth", s.stages[0].steps.growth},
      {"output.per_stage", double(s.output.per_stage)},
      {"numerics.refinements", double(s.numerics.refinements)},
      {"numerics.tolerance", s.numerics.tolerance},
      {"checks.piping_factor", s.limits.piping_factor},
      {"checks.heave_factor", s.limits.heave_factor},
      {"checks.uplift_factor", s.limits.uplift_factor},
      {"checks.low_permeability", s.limits.low_permeability},
      {"checks.settlement_limit", s.limits.settlement},
      {"checks.angular_distortion_limit", s.limits.angular_distortion},
      {"checks.mass_balance_tolerance", s.limits.mass_balance}};
  for (const auto& [path, value] : numbers)
    EXPECT_DOUBLE_EQ(value, default_number(path)) << path;
  EXPECT_EQ(s.analysis, settlewell::AnalysisType::plane_strain);
  EXPECT_EQ(s.numerics.solver, settlewell::SolverChoice::automatic);
  EXPECT_EQ(s.title, "");
}

// The key reference names each table once, and no key name runs into its type.
TEST(KeyRegistry, ReferenceListsEachTableOnceWithColumnsApart) {
  std::ostringstream text;
  sc::print_key_reference(text);
  std::istringstream lines(text.str());
  std::set<std::string> headings;
  std::string line;
  int keys = 0;
  while (std::getline(lines, line)) {
    if (!line.empty() && (line.front() == '[' || line == "(top level)")) {
      EXPECT_TRUE(headings.insert(line).second) << line << " is listed twice";
    } else if (line.rfind("  ", 0) == 0) {
      ++keys;
      const auto name_end = line.find(' ', 2);
      ASSERT_NE(name_end, std::string::npos) << line;
      EXPECT_EQ(line.compare(name_end, 2, "  "), 0)
          << "name and type run together: " << line;
    }
  }
  EXPECT_EQ(keys, int(sc::all_keys().size()));
}

// A boundary part holds the faces whose midpoints lie on its side and in its
// window; an end not given is open.
TEST(BoundaryPart, ContainsMidpointsOnItsSideAndInItsWindow) {
  sc::BoundaryPart bank{"far_boundary", "left", std::nullopt, std::nullopt, -16.0, -3.0};
  EXPECT_TRUE(bank.contains(-68.4, -9.0));
  EXPECT_FALSE(bank.contains(68.4, -9.0));   // the right side
  EXPECT_FALSE(bank.contains(-68.4, -20.0)); // below the window
  EXPECT_TRUE(bank.contains(-68.4, -3.0));   // the window's ends belong to it
  sc::BoundaryPart channel{"ground_surface", std::nullopt, std::nullopt, -28.4,
                           std::nullopt,     std::nullopt};
  EXPECT_TRUE(channel.contains(-50.0, 4.0));
  EXPECT_FALSE(channel.contains(-20.0, 4.0));
}
