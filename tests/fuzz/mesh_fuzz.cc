// libFuzzer target on the mesh reader's checks (gmsh_checks.h): any mesh the Gmsh
// API could hand the reader, and many it could not (NaN, infinite or huge
// coordinates, repeated or missing node tags, wrong element types, elements in two
// groups), must end in a checked mesh or an InputError of one line, never a crash,
// an undefined behaviour or another exception. A mesh the checks pass goes on to the
// reader's distributed triangulation (mesh_fuzz_support.h), built against deal.II's
// debug library so that its internal assertions are on: a deal.II exception or
// assertion there is a mesh our checks should have refused. Built with clang's
// -fsanitize=fuzzer,address,undefined by tests/fuzz/fuzz.sh, outside the main (GCC)
// build.
//
// The bytes are read as a program, not as a file: first a structured grid of up to
// 5 x 5 counter-clockwise cells with a region group and four boundary groups (the
// usual valid mesh, so that most inputs reach deal.II), then up to 64 edits, each
// a hostile change of a node, an element, a group or an added element. On plain
// data the checks see values Gmsh's parser would refuse or repair (and Gmsh, not
// built with coverage, would give the fuzzer no guidance); mesh_file_fuzz.cc sends
// .msh text through Gmsh as well.
#include "mesh_fuzz_support.h"

#include <fuzzer/FuzzedDataProvider.h>

#include <algorithm>
#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <limits>
#include <string>
#include <utility>

namespace {

using settlewell::GmshElementBlock;
using settlewell::GmshGroup;
using settlewell::GmshModelData;

constexpr double inf = std::numeric_limits<double>::infinity();
constexpr std::size_t no_size = std::numeric_limits<std::size_t>::max();

/// Element types a 1D or 2D entity (or a point) can hold, with the number of nodes
/// Gmsh gives for each: the API's node lists always fit their type.
constexpr std::pair<int, std::size_t> gmsh_types[] = {
    {1, 2}, {3, 4}, {2, 3}, {8, 3}, {9, 6}, {10, 9}, {15, 1}, {16, 8}, {26, 4}, {21, 10}};

std::size_t nodes_of_type(int type) {
  for (const auto& [t, n] : gmsh_types)
    if (t == type)
      return n;
  std::abort(); // the decoder gives no other type
}

/// A coordinate: mostly a small whole number (a valid cell is likely), else a value
/// at or past the checks' limits, or any double.
double coordinate(FuzzedDataProvider& in) {
  switch (in.ConsumeIntegralInRange(0, 3)) {
  case 0:
    return in.ConsumeIntegralInRange(-4, 12);
  case 1:
    return in.PickValueInArray({std::numeric_limits<double>::quiet_NaN(), inf, -inf, 1e7,
                                1.0000000000000002e7, -1e7, 1e300, -0.0, 1e-300, 5e-324,
                                1e-160, 0.5, 1e-9, 1e-13});
  case 2:
    return in.ConsumeFloatingPoint<double>();
  default:
    return in.ConsumeIntegralInRange(-4, 12) *
           in.PickValueInArray({1e-150, 1e-8, 1e-3, 1e3, 1e6, 2.5e6});
  }
}

/// A node tag: one the model defines (most often), a small or a huge one.
std::size_t node_tag(FuzzedDataProvider& in, const GmshModelData& model) {
  if (!model.node_tags.empty() && in.ConsumeBool())
    return model
        .node_tags[in.ConsumeIntegralInRange<std::size_t>(0, model.node_tags.size() - 1)];
  return in.ConsumeBool()
             ? in.ConsumeIntegralInRange<std::size_t>(0, 80)
             : in.PickValueInArray({no_size, no_size - 1, std::size_t(1) << 32});
}

/// Group names from a short list: shared names and the empty name are the cases.
std::string group_name(FuzzedDataProvider& in) {
  return in.PickValueInArray<std::string>(
      {"soil", "clay", "base", "top", "left", "right", "well_a", ""});
}

GmshGroup& add_group(GmshModelData& model, int dim, const std::string& name) {
  model.groups.push_back({dim, int(model.groups.size()) + 1, name, {}});
  return model.groups.back();
}

void add_line(GmshGroup& group, std::size_t tag, std::size_t a, std::size_t b) {
  if (group.blocks.empty())
    group.blocks.push_back({1, {}, {}});
  group.blocks.back().tags.push_back(tag);
  group.blocks.back().nodes.insert(group.blocks.back().nodes.end(), {a, b});
}

/// nx x ny cells of dx x dy from the origin, counter-clockwise, in one region, with
/// groups on the four sides.
GmshModelData make_grid(FuzzedDataProvider& in) {
  GmshModelData model;
  const int nx = in.ConsumeIntegralInRange(0, 5), ny = in.ConsumeIntegralInRange(0, 5);
  const double dx = in.PickValueInArray({1.0, 0.5, 1e-3, 60.0, 2e6, 1e-80});
  const double dy = in.PickValueInArray({1.0, 2.0, 1e-3, 1e-6, 3e6, 1e-80});
  const auto node = [nx](int i, int j) { return std::size_t(j * (nx + 1) + i + 1); };
  for (int j = 0; j <= ny; ++j)
    for (int i = 0; i <= nx; ++i) {
      model.node_tags.push_back(node(i, j));
      model.node_coords.insert(model.node_coords.end(), {i * dx, j * dy, 0.0});
    }
  GmshElementBlock quads{3, {}, {}};
  for (int j = 0; j < ny; ++j)
    for (int i = 0; i < nx; ++i) {
      quads.tags.push_back(quads.tags.size() + 1);
      quads.nodes.insert(quads.nodes.end(), {node(i, j), node(i + 1, j),
                                             node(i + 1, j + 1), node(i, j + 1)});
    }
  add_group(model, 2, "soil").blocks.push_back(quads);
  for (const char* side : {"base", "top", "left", "right"})
    add_group(model, 1, side);
  std::size_t tag = 1000;
  for (int i = 0; i < nx; ++i) {
    add_line(model.groups[1], ++tag, node(i, 0), node(i + 1, 0));
    add_line(model.groups[2], ++tag, node(i + 1, ny), node(i, ny));
  }
  for (int j = 0; j < ny; ++j) {
    add_line(model.groups[3], ++tag, node(0, j + 1), node(0, j));
    add_line(model.groups[4], ++tag, node(nx, j), node(nx, j + 1));
  }
  return model;
}

/// Changes a node's coordinate, tag, or adds or removes a node.
void edit_node(FuzzedDataProvider& in, GmshModelData& model) {
  const std::size_t count = model.node_tags.size();
  const std::size_t n = count ? in.ConsumeIntegralInRange<std::size_t>(0, count - 1) : 0;
  switch (count ? in.ConsumeIntegralInRange(0, 3) : 2) {
  case 0: {
    const int axis = in.ConsumeIntegralInRange(0, 2);
    model.node_coords[3 * n + axis] = coordinate(in);
    break;
  }
  case 1:
    model.node_tags[n] = node_tag(in, model);
    break;
  case 2:
    model.node_tags.push_back(node_tag(in, model));
    model.node_coords.insert(model.node_coords.end(),
                             {coordinate(in), coordinate(in), 0.0});
    break;
  default:
    model.node_tags.erase(model.node_tags.begin() + n);
    model.node_coords.erase(model.node_coords.begin() + 3 * n,
                            model.node_coords.begin() + 3 * n + 3);
  }
}

/// A block of some group, or none if there is none.
GmshElementBlock* pick_block(FuzzedDataProvider& in, GmshModelData& model) {
  if (model.groups.empty())
    return nullptr;
  auto& group =
      model.groups[in.ConsumeIntegralInRange<std::size_t>(0, model.groups.size() - 1)];
  if (group.blocks.empty())
    return nullptr;
  return &group
              .blocks[in.ConsumeIntegralInRange<std::size_t>(0, group.blocks.size() - 1)];
}

/// Gives a block another element type, resizing its node list as Gmsh would.
void retype(GmshElementBlock& block, int type) {
  block.type = type;
  block.nodes.resize(nodes_of_type(type) * block.tags.size(), 1);
}

/// Changes one element of a block: a node, its order, its tag, or removes it; or
/// changes the type of the whole block.
void edit_element(FuzzedDataProvider& in, GmshModelData& model) {
  GmshElementBlock* block = pick_block(in, model);
  if (!block || block->tags.empty())
    return;
  const std::size_t per = nodes_of_type(block->type);
  const std::size_t e = in.ConsumeIntegralInRange<std::size_t>(0, block->tags.size() - 1);
  const auto first = block->nodes.begin() + e * per;
  switch (in.ConsumeIntegralInRange(0, 4)) {
  case 0: {
    const std::size_t k = in.ConsumeIntegralInRange<std::size_t>(0, per - 1);
    first[k] = node_tag(in, model);
    break;
  }
  case 1: // reversed: inverted; two nodes swapped: twisted
    if (in.ConsumeBool())
      std::reverse(first, first + per);
    else
      std::swap(first[0], first[in.ConsumeIntegralInRange<std::size_t>(0, per - 1)]);
    break;
  case 2:
    block->tags[e] = in.ConsumeIntegralInRange<std::size_t>(0, 2000);
    break;
  case 3:
    block->tags.erase(block->tags.begin() + e);
    block->nodes.erase(first, first + per);
    break;
  default:
    retype(*block, in.PickValueInArray(gmsh_types).first);
  }
}

/// Copies an element of one block into a group (new or existing, of either
/// dimension), as when one entity is in two physical groups.
void copy_element(FuzzedDataProvider& in, GmshModelData& model) {
  const GmshElementBlock* from = pick_block(in, model);
  if (!from || from->tags.empty())
    return;
  const GmshElementBlock source = *from; // add_group may move the blocks
  const std::size_t per = nodes_of_type(source.type);
  const std::size_t e = in.ConsumeIntegralInRange<std::size_t>(0, source.tags.size() - 1);
  GmshGroup* to = nullptr;
  if (in.ConsumeBool()) {
    const int dim = in.ConsumeIntegralInRange(0, 3);
    to = &add_group(model, dim, group_name(in));
  } else
    to =
        &model.groups[in.ConsumeIntegralInRange<std::size_t>(0, model.groups.size() - 1)];
  to->blocks.push_back({source.type, {source.tags[e]}, {}});
  to->blocks.back().nodes.assign(source.nodes.begin() + e * per,
                                 source.nodes.begin() + (e + 1) * per);
}

/// A new element of any type on any node tags, in a new group.
void add_element(FuzzedDataProvider& in, GmshModelData& model) {
  const int type = in.PickValueInArray(gmsh_types).first;
  GmshElementBlock block{type, {in.ConsumeIntegralInRange<std::size_t>(0, 2000)}, {}};
  for (std::size_t k = 0; k < nodes_of_type(type); ++k)
    block.nodes.push_back(node_tag(in, model));
  const int dim = in.ConsumeIntegralInRange(0, 3);
  add_group(model, dim, group_name(in)).blocks.push_back(std::move(block));
}

/// Renames a group, changes its dimension or removes it.
void edit_group(FuzzedDataProvider& in, GmshModelData& model) {
  if (model.groups.empty())
    return;
  const std::size_t g =
      in.ConsumeIntegralInRange<std::size_t>(0, model.groups.size() - 1);
  switch (in.ConsumeIntegralInRange(0, 2)) {
  case 0:
    model.groups[g].name = group_name(in);
    break;
  case 1:
    model.groups[g].dim = in.ConsumeIntegralInRange(0, 3);
    break;
  default:
    model.groups.erase(model.groups.begin() + g);
  }
}

void edit(FuzzedDataProvider& in, GmshModelData& model) {
  switch (in.ConsumeIntegralInRange(0, 4)) {
  case 0:
    return edit_node(in, model);
  case 1:
    return edit_element(in, model);
  case 2:
    return copy_element(in, model);
  case 3:
    return add_element(in, model);
  default:
    return edit_group(in, model);
  }
}

/// The decoded model and the checks' answer on stderr, when MESH_FUZZ_PRINT is set:
/// to read an input (mesh_fuzz crash-...) as a mesh, and to write it as a .msh case.
void print_model(const GmshModelData& model) {
  for (std::size_t n = 0; n < model.node_tags.size(); ++n)
    std::fprintf(stderr, "node %zu: %.17g %.17g %.17g\n", model.node_tags[n],
                 model.node_coords[3 * n], model.node_coords[3 * n + 1],
                 model.node_coords[3 * n + 2]);
  for (const auto& group : model.groups)
    for (const auto& block : group.blocks)
      for (std::size_t e = 0; e < block.tags.size(); ++e) {
        std::fprintf(stderr, "group %d '%s' (dim %d) type %d element %zu:", group.tag,
                     group.name.c_str(), group.dim, block.type, block.tags[e]);
        const std::size_t per = nodes_of_type(block.type);
        for (std::size_t k = 0; k < per; ++k)
          std::fprintf(stderr, " %zu", block.nodes[e * per + k]);
        std::fprintf(stderr, "\n");
      }
  try {
    settlewell::check_gmsh_model(model, "fuzz.msh");
    std::fprintf(stderr, "the checks pass\n");
  } catch (const settlewell::InputError& e) {
    std::fprintf(stderr, "%s\n", e.what());
  }
}

} // namespace

extern "C" int LLVMFuzzerInitialize(int*, char***) {
  mesh_fuzz::start_mpi();
  return 0;
}

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  FuzzedDataProvider in(data, size);
  GmshModelData model = make_grid(in);
  for (int n = 0; n < 64 && in.remaining_bytes() > 0; ++n)
    edit(in, model);
  if (std::getenv("MESH_FUZZ_PRINT"))
    print_model(model);
  mesh_fuzz::check_and_triangulate(model, "fuzz.msh");
  return 0;
}
