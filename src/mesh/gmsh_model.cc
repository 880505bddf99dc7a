// The current Gmsh model's mesh as plain data (GmshModelData): the one place where
// the mesh reader calls the Gmsh API for nodes, groups and elements.
#include "gmsh_checks.h"

#include <gmsh.h>

namespace settlewell {

namespace {

/// The elements of a physical group's entities, one block per entity and type.
std::vector<GmshElementBlock> read_group_blocks(int dim, int group) {
  std::vector<int> entities;
  gmsh::model::getEntitiesForPhysicalGroup(dim, group, entities);
  std::vector<GmshElementBlock> blocks;
  for (const int entity : entities) {
    std::vector<int> types;
    std::vector<std::vector<std::size_t>> element_tags, node_tags;
    gmsh::model::mesh::getElements(types, element_tags, node_tags, dim, entity);
    for (std::size_t t = 0; t < types.size(); ++t)
      blocks.push_back({types[t], std::move(element_tags[t]), std::move(node_tags[t])});
  }
  return blocks;
}

} // namespace

GmshModelData read_current_model() {
  GmshModelData model;
  std::vector<double> parametric;
  gmsh::model::mesh::getNodes(model.node_tags, model.node_coords, parametric);
  gmsh::vectorpair groups;
  gmsh::model::getPhysicalGroups(groups);
  for (const auto& [dim, tag] : groups) {
    GmshGroup group;
    group.dim = dim;
    group.tag = tag;
    gmsh::model::getPhysicalName(dim, tag, group.name);
    if (dim == 1 || dim == 2)
      group.blocks = read_group_blocks(dim, tag);
    model.groups.push_back(std::move(group));
  }
  return model;
}

} // namespace settlewell
