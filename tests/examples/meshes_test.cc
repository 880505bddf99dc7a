// The meshes kept in meshes/ are those the examples generate: same cells, same
// region, boundary and internal-line names. If an example changes, regenerate
// with `settlewell mesh examples/<name>/scenario.toml -o DIR` and copy DIR/mesh.msh.
#include "settlewell/mesh/gmsh_mesh.h"
#include "settlewell/scenario/parse.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <filesystem>

class ExampleMesh : public ::testing::TestWithParam<std::string> {};

TEST_P(ExampleMesh, KeptMeshMatchesTheGeneratedOne) {
  const std::string root = SETTLEWELL_SOURCE_DIR;
  const auto scenario = settlewell::scenario::read_scenario(
      root + "/examples/" + GetParam() + "/scenario.toml");
  const auto generated = settlewell::make_scenario_mesh(scenario, MPI_COMM_WORLD);
  // The kept file holds the generator's groups; the scenario's parts of boundaries
  // are made from them as they would be for a [mesh_file] scenario.
  auto kept =
      settlewell::read_gmsh_file(root + "/meshes/" + GetParam() + ".msh", MPI_COMM_WORLD);
  settlewell::apply_boundary_parts(scenario, kept);
  EXPECT_EQ(kept.triangulation->n_global_active_cells(),
            generated.triangulation->n_global_active_cells());
  EXPECT_EQ(kept.names.region_names(), generated.names.region_names());
  EXPECT_EQ(kept.names.boundary_names(), generated.names.boundary_names());
  ASSERT_EQ(kept.internal_lines.size(), generated.internal_lines.size());
  for (const auto& [name, segments] : generated.internal_lines)
    EXPECT_EQ(kept.internal_lines.at(name).size(), segments.size()) << name;
}

/// Every example (a folder of examples/ with a scenario.toml), so that a new one
/// cannot be left without its kept mesh.
std::vector<std::string> examples() {
  std::vector<std::string> names;
  for (const auto& entry : std::filesystem::directory_iterator(
           std::string(SETTLEWELL_SOURCE_DIR) + "/examples"))
    if (std::filesystem::exists(entry.path() / "scenario.toml"))
      names.push_back(entry.path().filename().string());
  std::sort(names.begin(), names.end());
  return names;
}

INSTANTIATE_TEST_SUITE_P(Examples,
                         ExampleMesh,
                         ::testing::ValuesIn(examples()),
                         [](const auto& info) {
                           std::string n = info.param;
                           for (auto& c : n)
                             c = c == '-' ? '_' : c;
                           return n;
                         });
