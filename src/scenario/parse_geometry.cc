// Geometry of a scenario: a parametric section, a layered box, or a Gmsh file.
#include "parse_parts.h"
#include "settlewell/core/files.h"
#include "settlewell/core/units.h"

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <set>

namespace settlewell::scenario {

namespace {

std::vector<Layer>
read_layers(const TableReader& r, const Scenario& s, double top, double bottom) {
  std::vector<Layer> layers;
  std::set<std::string> names;
  for_each_table(r, "layers", [&](const TableReader& l) {
    Layer layer;
    layer.top = l.number("top");
    layer.material = l.text("material");
    layer.name = l.optional_text("name").value_or(layer.material);
    if (!s.materials.count(layer.material))
      l.fail("material", "no material named '" + layer.material + "'");
    if (layers.empty() && std::abs(layer.top - top) > 1e-9)
      l.fail("top", "the first layer must start at the top of the model (" +
                        format_number(top) + " m)");
    if (!layers.empty() && !(layer.top < layers.back().top))
      l.fail("top", "layer tops must decrease downward");
    if (!(layer.top > bottom))
      l.fail("top", "lies at or below the model base (" + format_number(bottom) + " m)");
    if (!names.insert(layer.name).second)
      l.fail("name", "two layers are named '" + layer.name + "'; give them names");
    layers.push_back(layer);
  });
  if (layers.empty())
    r.fail_here("needs at least one entry in layers");
  return layers;
}

Wall read_wall(const TableReader& w, const Scenario& s, const Section& section) {
  Wall wall;
  wall.thickness = w.positive("thickness");
  wall.toe = w.number("toe");
  wall.material = w.text("material");
  if (!s.materials.count(wall.material))
    w.fail("material", "no material named '" + wall.material + "'");
  if (!(wall.toe < section.ground_surface))
    w.fail("toe", "must lie below the ground surface");
  if (!(wall.toe > section.bottom))
    w.fail("toe", "lies at or below the model base (" + format_number(section.bottom) +
                      " m); deepen the model");
  if (w.has("interface_thickness") != w.has("interface_material"))
    w.fail_here("give interface_thickness and interface_material together");
  if (w.has("interface_thickness")) {
    wall.interface_thickness = w.positive("interface_thickness");
    wall.interface_material = w.text("interface_material");
    if (!s.materials.count(wall.interface_material))
      w.fail("interface_material", "no material named '" + wall.interface_material + "'");
    if (!(wall.interface_thickness < 0.5 * section.excavation_width / 2))
      w.fail("interface_thickness", "must be less than a quarter of the pit's width");
  }
  const std::string sides =
      w.optional_text("sides").value_or(section.half_model ? "right" : "both");
  if (sides != "left" && sides != "right" && sides != "both")
    w.fail("sides", "must be left, right or both");
  wall.left = sides != "right";
  wall.right = sides != "left";
  if ((section.half_model || s.analysis == AnalysisType::axisymmetric) &&
      sides != "right")
    w.fail("sides",
           "a half model or an axisymmetric shaft has its wall on the right only");
  return wall;
}

/// A well outside the pit must be a recharge well, outside the wall and inside
/// the far boundary.
void check_recharge_well_outside(const TableReader& r,
                                 const Well& well,
                                 const Section& section) {
  const double half_width = section.excavation_width / 2;
  const double outer = half_width + (section.wall ? section.wall->thickness : 0.0);
  const double x = std::abs(well.x);
  if (!well.recharge)
    r.fail("x", "the well lies outside the pit (|x| < " + format_number(half_width) +
                    " m); only a recharge well (recharge = true) may stand outside it");
  if (!(x > outer))
    r.fail("x", "the recharge well lies in the wall (" + format_number(half_width) +
                    " to " + format_number(outer) + " m from the centre line)");
  if (!(x < outer + section.far_distance))
    r.fail("x", "the recharge well lies beyond the far boundary (" +
                    format_number(outer + section.far_distance) +
                    " m from the centre line)");
}

void check_well(const TableReader& r,
                const Well& well,
                const Scenario& s,
                const Section& section) {
  const double half_width = section.excavation_width / 2;
  if (s.analysis == AnalysisType::axisymmetric) {
    if (std::abs(well.x) > 1e-9)
      r.fail("x", "an axisymmetric model takes one well, on the axis (x = 0)");
    if (!(well.radius > 0.0 && well.radius < half_width))
      r.fail("radius", "must be positive and inside the shaft");
  } else if (section.half_model && !(well.x > 0.0)) {
    r.fail("x", "a half model's wells lie at x > 0");
  } else if (!(std::abs(well.x) < half_width)) {
    check_recharge_well_outside(r, well, section);
  }
  if (well.spacing > 0.0 && s.analysis == AnalysisType::axisymmetric)
    r.fail("spacing",
           "applies to a plane-strain row of wells, not to an axisymmetric well");
  if (well.spacing > 0.0 && !(well.spacing > 2.0 * units::pi * well.radius))
    r.fail("spacing", "must exceed 2 pi times the radius (" +
                          format_number(2.0 * units::pi * well.radius) +
                          " m): closer wells act as a slot");
  if (!(well.screen_top > well.screen_bottom))
    r.fail("screen_top", "must lie above screen_bottom");
  if (!(well.screen_top <= section.ground_surface))
    r.fail("screen_top", "lies above the ground surface");
  if (!(well.screen_bottom >= section.bottom))
    r.fail("screen_bottom", "lies below the model base");
}

std::vector<Well>
read_wells(const TableReader& r, const Scenario& s, const Section& section) {
  std::vector<Well> wells;
  std::set<std::string> names;
  for_each_table(r, "wells", [&](const TableReader& w) {
    Well well;
    well.name = w.text("name");
    well.x = w.number("x");
    well.radius = w.positive("radius");
    if (w.has("spacing"))
      well.spacing = w.positive("spacing");
    well.screen_top = w.number("screen_top");
    well.screen_bottom = w.number("screen_bottom");
    if (w.has("recharge"))
      well.recharge = w.boolean("recharge");
    check_well(w, well, s, section);
    if (!names.insert(well.name).second)
      w.fail("name", "two wells are named '" + well.name + "'");
    wells.push_back(well);
  });
  if (s.analysis == AnalysisType::axisymmetric && wells.size() > 1)
    r.fail("wells", "an axisymmetric model takes at most one well");
  return wells;
}

std::vector<Prop> read_props(const TableReader& r, const Section& section) {
  std::vector<Prop> props;
  std::set<std::string> names;
  for_each_table(r, "props", [&](const TableReader& p) {
    Prop prop{p.text("name"), p.number("level"), p.positive("stiffness"),
              p.number("preload"), p.text("stage")};
    if (!section.wall)
      p.fail_here("a prop needs a [section.wall]");
    if (!(prop.level < section.ground_surface && prop.level > section.wall->toe))
      p.fail("level", "must lie on the wall, between its toe (" +
                          format_number(section.wall->toe) +
                          " m) and the ground surface");
    if (prop.preload < 0.0)
      p.fail("preload", "must not be negative");
    if (!names.insert(prop.name).second)
      p.fail("name", "two props are named '" + prop.name + "'");
    props.push_back(prop);
  });
  return props;
}

MeshSizes read_mesh_sizes(const TableReader& section) {
  MeshSizes m;
  const TableReader r = sub_table(section, "mesh", "section.mesh");
  m.near_wall = r.positive("size_near_wall");
  m.near_well = r.positive("size_near_well");
  m.far = r.positive("size_far");
  m.growth = r.number("growth");
  if (!(m.growth >= 1.0 && m.growth <= 2.0))
    r.fail("growth", "must lie in [1, 2]");
  if (m.far < std::max(m.near_wall, m.near_well))
    r.fail("size_far", "must not be smaller than the sizes near walls and wells");
  return m;
}

Section read_section(const TableReader& r, const Scenario& s) {
  Section section;
  section.ground_surface = r.number("ground_surface");
  section.bottom = r.number("bottom");
  if (!(section.bottom < section.ground_surface))
    r.fail("bottom", "must lie below the ground surface");
  section.half_model = r.boolean("half_model");
  if (s.analysis == AnalysisType::axisymmetric) {
    if (r.has("half_model"))
      r.fail("half_model", "does not apply to an axisymmetric model");
    section.half_model = true; // the model is r >= 0
  }
  section.excavation_width = r.positive("excavation_width");
  section.excavation_depth = r.positive("excavation_depth");
  if (!(section.excavation_level() > section.bottom))
    r.fail("excavation_depth", "reaches the model base");
  section.far_distance = r.positive("far_distance");
  section.layers = read_layers(r, s, section.ground_surface, section.bottom);
  if (const toml::table* wall = r.table("wall"))
    section.wall = read_wall(TableReader(*wall, "section.wall", "section.wall", r.file()),
                             s, section);
  if (section.wall && !(section.wall->toe < section.excavation_level()))
    r.fail("wall", "the wall toe must lie below the excavation level");
  section.wells = read_wells(r, s, section);
  section.props = read_props(r, section);
  section.mesh = read_mesh_sizes(r);
  return section;
}

Box read_box(const TableReader& r, const Scenario& s) {
  Box box;
  box.width = r.positive("width");
  box.x_origin = r.number("x_origin");
  if (s.analysis == AnalysisType::axisymmetric && box.x_origin < 0.0)
    r.fail("x_origin", "is a radius in an axisymmetric model: it must not be negative");
  box.bottom = r.number("bottom");
  const toml::array* layers = r.array("layers");
  if (layers == nullptr || layers->empty() || !(*layers)[0].is_table())
    r.fail_here("needs at least one entry in layers");
  const double top =
      TableReader(*(*layers)[0].as_table(), "box.layers[]", "box.layers[0]", r.file())
          .number("top");
  if (!(box.bottom < top))
    r.fail("bottom", "must lie below the top of the first layer");
  box.layers = read_layers(r, s, top, box.bottom);
  const long long cells = r.integer("cells_x");
  if (cells < 1 || cells > 10000)
    r.fail("cells_x", "must lie in 1..10000");
  box.cells_x = static_cast<unsigned int>(cells);
  box.cell_height = r.positive("cell_height");
  return box;
}

/// mesh_file.excavation_regions: distinct, non-empty names, each one's position kept
/// for the check against the mesh (model_builder.cc).
std::vector<std::string> read_excavation_regions(const TableReader& r, Scenario& s) {
  std::vector<std::string> names;
  const toml::array* array = r.array("excavation_regions");
  if (array == nullptr)
    return names;
  for (const auto& node : *array) {
    const std::string where = position(r.file(), node);
    auto fail = [&](const std::string& message) {
      throw InputError(where + ": mesh_file.excavation_regions: " + message);
    };
    if (!node.is_string())
      fail("each entry must be a region name (a string)");
    const std::string name = node.as_string()->get();
    if (name.empty())
      fail("a region name is empty");
    if (std::find(names.begin(), names.end(), name) != names.end())
      fail("the region '" + name + "' is named twice");
    names.push_back(name);
    s.locations["mesh_file.excavation_regions." + name] = where;
  }
  return names;
}

MeshFile read_mesh_file(const TableReader& r, Scenario& s) {
  MeshFile m;
  m.path = r.text("path");
  const std::filesystem::path relative(m.path);
  if (relative.is_relative())
    m.path = (std::filesystem::path(s.source_path).parent_path() / relative).string();
  if (const auto problem = input_file_problem(m.path, largest_mesh_file_bytes);
      !problem.empty())
    r.fail("path", "cannot read '" + m.path + "': " + problem);
  if (const toml::table* regions = r.table("regions")) {
    const TableReader rr(*regions, "mesh_file.regions", "mesh_file.regions", r.file());
    for (const auto& [key, node] : *regions) {
      const std::string region(key.str());
      const std::string material = rr.text(region);
      if (!s.materials.count(material))
        rr.fail(region, "no material named '" + material + "'");
      m.region_materials[region] = material;
    }
  }
  m.excavation_regions = read_excavation_regions(r, s);
  return m;
}

} // namespace

void parse_geometry(const TableReader& top, Scenario& s) {
  const int n = top.has("section") + top.has("box") + top.has("mesh_file");
  if (n != 1)
    top.fail_here("give exactly one geometry: [section], [box] or [mesh_file]");
  if (const toml::table* t = top.table("section")) {
    s.section = read_section(TableReader(*t, "section", "section", top.file()), s);
    s.locations["section"] = position(top.file(), *t);
    if (const toml::array* props = (*t)["props"].as_array())
      for (std::size_t i = 0; i < s.section->props.size(); ++i)
        s.locations["section.props." + s.section->props[i].name] =
            position(top.file(), *(*props)[i].as_table()->get("stage"));
  } else if (const toml::table* b = top.table("box")) {
    s.box = read_box(TableReader(*b, "box", "box", top.file()), s);
    s.locations["box"] = position(top.file(), *b);
  } else {
    const toml::table* m = top.table("mesh_file");
    s.mesh_file =
        read_mesh_file(TableReader(*m, "mesh_file", "mesh_file", top.file()), s);
    s.locations["mesh_file"] = position(top.file(), *m);
  }
}

std::vector<std::string> region_names(const Scenario& s) {
  std::vector<std::string> names;
  const std::vector<Layer>* layers =
      s.section ? &s.section->layers : (s.box ? &s.box->layers : nullptr);
  if (layers != nullptr)
    for (const auto& l : *layers)
      names.push_back(l.name);
  if (s.mesh_file)
    for (const auto& [region, material] : s.mesh_file->region_materials)
      names.push_back(region);
  return names;
}

bool model_extent(
    const Scenario& s, double& x_min, double& x_max, double& y_min, double& y_max) {
  if (s.section) {
    const Section& sec = *s.section;
    const double outer = sec.excavation_width / 2 +
                         (sec.wall ? sec.wall->thickness : 0.0) + sec.far_distance;
    const bool starts_at_axis =
        sec.half_model || s.analysis == AnalysisType::axisymmetric;
    x_min = starts_at_axis ? 0.0 : -outer;
    if (s.analysis == AnalysisType::axisymmetric && !sec.wells.empty())
      x_min = sec.wells.front().radius; // the model starts at the well's radius
    x_max = outer;
    y_min = sec.bottom;
    y_max = sec.ground_surface;
    return true;
  }
  if (s.box) {
    x_min = s.box->x_origin;
    x_max = s.box->x_origin + s.box->width;
    y_min = s.box->bottom;
    y_max = s.box->layers.front().top;
    return true;
  }
  return false;
}

} // namespace settlewell::scenario
