#include "settlewell/scenario/keys.h"

#include "settlewell/core/errors.h"
#include "settlewell/core/units.h"

#include <algorithm>
#include <cstdlib>
#include <iomanip>
#include <ostream>
#include <set>
#include <sstream>

namespace settlewell::scenario {

namespace {

std::string number_text(double v) {
  std::ostringstream os;
  os << v;
  return os.str();
}

} // namespace

// clang-format off
const std::vector<KeySpec>& all_keys() {
  static const std::vector<KeySpec> keys{
    {"title", "string", "", "\"\"", "A title for the run folder and reports"},
    {"coupling", "string", "", "\"biot\"", "biot (flow and deformation) or flow_only (the skeleton held rigid: transient seepage with the storage S alone; no movement is computed)"},
    {"analysis", "string", "", "\"plane_strain\"", "plane_strain (a section, per metre run) or axisymmetric (a shaft or single well about x = 0)"},
    {"unit_weight_water", "number", "kN/m3", number_text(units::default_gamma_w), "Unit weight of water"},

    {"materials.<name>.unit_weight", "number", "kN/m3", "required", "Saturated unit weight, 1 to 100"},
    {"materials.<name>.youngs_modulus", "number", "kPa", "-", "Drained Young's modulus E' (give this, constrained_modulus or mv), 10 to 1e9"},
    {"materials.<name>.constrained_modulus", "number", "kPa", "-", "Drained oedometer modulus 1/mv, 10 to 1e9"},
    {"materials.<name>.mv", "number", "1/kPa", "-", "Coefficient of volume compressibility, 1e-9 to 0.1"},
    {"materials.<name>.poisson_ratio", "number", "", "required", "Drained Poisson's ratio, in (-1, 0.5)"},
    {"materials.<name>.conductivity", "number", "m/s", "-", "Hydraulic conductivity, isotropic (or give conductivity_x and conductivity_y), 1e-14 to 10"},
    {"materials.<name>.conductivity_x", "number", "m/s", "-", "Horizontal (radial) hydraulic conductivity, 1e-14 to 10"},
    {"materials.<name>.conductivity_y", "number", "m/s", "-", "Vertical hydraulic conductivity, 1e-14 to 10"},
    {"materials.<name>.biot_alpha", "number", "", "1", "Biot coefficient, in (0, 1]"},
    {"materials.<name>.storage", "number", "1/kPa", "0", "Storage coefficient S = 1/M (or give porosity and the bulk moduli)"},
    {"materials.<name>.porosity", "number", "", "-", "Porosity n, to compute S = (alpha - n)/Ks + n/Kw"},
    {"materials.<name>.water_bulk_modulus", "number", "kPa", "2.2e6", "Kw, used with porosity"},
    {"materials.<name>.grain_bulk_modulus", "number", "kPa", "infinite", "Ks, used with porosity"},
    {"materials.<name>.earth_pressure_at_rest", "number", "", "0.5", "K0 for the initial horizontal effective stress"},
    {"materials.<name>.air_entry_suction", "number", "kPa", "checks.suction_limit", "Suction the soil holds before air enters its pores; beyond it the saturated model is flagged (clays hold tens to hundreds of kPa; common practice)"},
    {"materials.<name>.retention", "string", "", "\"none\"", "How the soil holds water above the water table: none (saturated at any suction, flagged beyond air_entry_suction), van_genuchten (van Genuchten 1980 with Mualem's conductivity) or gardner (Gardner 1958, exponential); with a curve the soil drains, its conductivity falls, it carries Bishop's effective stress with chi = S_r and weighs its moist weight; solved by Newton's method with implicit Euler"},
    {"materials.<name>.retention_alpha", "number", "1/m", "-", "van_genuchten or gardner: a, of the suction head, 0.01 to 100 (sands about 2 to 15, silts 0.5 to 2, clays below 0.5; common practice)"},
    {"materials.<name>.retention_n", "number", "", "-", "van_genuchten: n, 1.05 to 10 (sands 2 to 4, silts 1.4 to 2, clays 1.05 to 1.3; common practice)"},
    {"materials.<name>.saturated_water_content", "number", "", "porosity", "With a retention curve: theta_s, the water content when saturated, in (0, 1)"},
    {"materials.<name>.residual_water_content", "number", "", "0", "With a retention curve: theta_r, the water the soil keeps however dry, in [0, theta_s)"},
    {"materials.<name>.model", "string", "", "\"linear_elastic\"", "The skeleton: linear_elastic (E' and nu') or cam_clay (Modified Cam Clay, Roscoe & Burland 1968: stiffness and yielding from Cc, Cr, e0, phi'cs and the preconsolidation; solved by Newton's method)"},
    {"materials.<name>.compression_index", "number", "", "-", "cam_clay: Cc, slope of e against log10 sigma' on virgin loading, 0.01 to 10"},
    {"materials.<name>.recompression_index", "number", "", "-", "cam_clay: Cr (or Cs), slope of e against log10 sigma' on unloading and reloading, below Cc"},
    {"materials.<name>.void_ratio", "number", "", "-", "cam_clay: e0, the void ratio at the start, 0.1 to 15"},
    {"materials.<name>.friction_angle_cs", "number", "degrees", "-", "cam_clay: critical-state friction angle phi'cs, 5 to 50; M = 6 sin phi'/(3 - sin phi'); K0 = 1 - sin phi' (Jaky 1944) on the past one-dimensional loading"},
    {"materials.<name>.preconsolidation_pressure", "number|profile", "kPa", "-", "cam_clay: vertical preconsolidation pressure sigma'p (give this, ocr or pop); each of the three may be a profile [[elevation (m), value], ...], linear between its points and constant beyond"},
    {"materials.<name>.ocr", "number|profile", "", "-", "cam_clay: overconsolidation ratio sigma'p/sigma'v0, 1 to 100"},
    {"materials.<name>.pop", "number|profile", "kPa", "-", "cam_clay: pre-overburden pressure sigma'p - sigma'v0, 0 to 1e4"},
    {"materials.<name>.permeability_change_index", "number", "", "none", "cam_clay: Ck, the loss of void ratio that makes the conductivity ten times smaller, k = k0 10^((e - e0)/Ck) (Taylor 1948), 0.01 to 10; often near 0.5 e0; not given: k stays k0"},

    {"section.ground_surface", "number", "m", "required", "Elevation of the ground surface"},
    {"section.bottom", "number", "m", "required", "Elevation of the model base"},
    {"section.half_model", "boolean", "", "true", "Model only x >= 0, with a symmetry line at x = 0 (plane strain)"},
    {"section.excavation_width", "number", "m", "required", "Width between the inner wall faces (axisymmetric: shaft diameter)"},
    {"section.excavation_depth", "number", "m", "required", "Final excavation level below the ground surface"},
    {"section.far_distance", "number", "m", "required", "Distance from the outer wall face to the far boundary"},
    {"section.layers[].top", "number", "m", "required", "Elevation of the layer's top (the first is the ground surface)"},
    {"section.layers[].material", "string", "", "required", "Material of the layer"},
    {"section.layers[].name", "string", "", "the material", "Region name of the layer"},
    {"section.wall.thickness", "number", "m", "required", "Cutoff wall thickness"},
    {"section.wall.toe", "number", "m", "required", "Elevation of the wall toe"},
    {"section.wall.material", "string", "", "required", "Material of the wall"},
    {"section.wall.interface_thickness", "number", "m", "-", "Thickness of an interface zone of soil along both wall faces, ground to toe (thin-layer elements after Desai et al. 1984; about 0.01 to 0.1 of the wall's height of cells beside it); none if not given"},
    {"section.wall.interface_material", "string", "", "-", "Material of the interface zone: its shear stiffness (from E' and nu') sets how the soil slides along the wall"},
    {"section.wall.sides", "string", "", "both (right in a half model or a shaft)", "left, right or both"},
    {"section.wells[].name", "string", "", "required", "Well name, used by stages and outputs"},
    {"section.wells[].x", "number", "m", "required", "Position (plane strain: a row of wells seen in section, inside the pit unless a recharge well; axisymmetric: 0 = the axis)"},
    {"section.wells[].radius", "number", "m", "0.15", "Well radius (axisymmetric: the model starts there; plane strain with spacing: for the water level in a well)"},
    {"section.wells[].spacing", "number", "m", "-", "Plane strain: distance between the wells of the row; gives the water level in a well from the row's average head (Muskat 1937)"},
    {"section.wells[].screen_top", "number", "m", "required", "Elevation of the screen top"},
    {"section.wells[].screen_bottom", "number", "m", "required", "Elevation of the screen bottom"},
    {"section.wells[].recharge", "boolean", "", "false", "A recharge well: a head held in it may put water into the ground, and it may stand outside the wall; any other well takes water only (where holding its head would put water in, its pump stands)"},
    {"section.props[].name", "string", "", "required", "Prop (strut) level name"},
    {"section.props[].level", "number", "m", "required", "Elevation of the prop on the wall's inner face"},
    {"section.props[].stiffness", "number", "kN/m per m", "required", "Plane strain: prop force per metre run for a metre of wall movement (EA / (L s) of the struts, L their free length to the pit's centre line, s their spacing); axisymmetric: the ring's axial stiffness EA in kN"},
    {"section.props[].preload", "number", "kN/m", "0", "Preload per metre run of wall (per metre of circumference in a shaft)"},
    {"section.props[].stage", "string", "", "required", "Stage at whose start the prop is installed"},
    {"section.mesh.size_near_wall", "number", "m", "0.5", "Cell size at the wall faces and the pit edge"},
    {"section.mesh.size_near_well", "number", "m", "0.5", "Cell size at well screens"},
    {"section.mesh.size_far", "number", "m", "10", "Largest cell size"},
    {"section.mesh.growth", "number", "", "1.25", "Ratio of neighbouring cell sizes away from a wall or well"},

    {"box.width", "number", "m", "1", "Width of the box"},
    {"box.x_origin", "number", "m", "0", "x of the box's left side (axisymmetric: its inner radius, > 0 for an annulus)"},
    {"box.bottom", "number", "m", "required", "Elevation of the box base"},
    {"box.layers[].top", "number", "m", "required", "Elevation of the layer's top (the first is the box's top)"},
    {"box.layers[].material", "string", "", "required", "Material of the layer"},
    {"box.layers[].name", "string", "", "the material", "Region name of the layer"},
    {"box.cells_x", "integer", "", "1", "Cells across the width"},
    {"box.cell_height", "number", "m", "0.5", "Cell height"},

    {"mesh_file.path", "string", "", "required", "A Gmsh .msh file (relative to the scenario) with named physical groups"},
    {"mesh_file.excavation_regions", "array of strings", "", "[]", "Regions (physical surfaces) a stage's dig_level may take out: their cells whose centre lies above it; their highest point is the ground before any dig"},
    {"mesh_file.regions.<name>", "string", "", "the region's name", "Material of a region (physical surface) of the mesh"},

    {"groundwater.water_table", "number", "m", "required", "Initial water-table elevation (hydrostatic below, saturated above)"},
    {"groundwater.layer_heads.<name>", "number", "m", "-", "Initial piezometric head in a layer (artesian aquifers); layers between given ones take a linear head"},
    {"initial_state.method", "string", "", "\"k0\"", "k0: the geostatic state with each material's earth_pressure_at_rest is the equilibrium of the start; gravity: a drained gravity-loading solve at t = 0 finds the start's stresses from the unit weights (K0 = nu/(1 - nu) in level ground), balanced also beside walls and under sloping layers; its movement is not reported"},

    {"boundaries.<name>.hydraulic", "string", "", "depends on the boundary", "no_flow, fixed_head or seepage_face (water leaves at atmospheric pressure where the soil's would be higher; none enters)"},
    {"boundaries.<name>.head", "number", "m", "the initial head", "Head held on a fixed_head boundary"},
    {"boundaries.<name>.mechanical", "string", "", "depends on the boundary", "free, fixed (both directions), roller (normal direction fixed) or rigid_plate (a rigid frictionless plate: one normal movement for the whole straight boundary)"},
    {"boundaries.<name>.plate_pressure", "number", "kPa", "0", "With rigid_plate: mean pressure on the plate (compression positive), applied at the start and held"},
    {"boundaries.<name>.part_of", "string", "", "-", "Makes <name> a part of this boundary (its faces on the side and in the window); what the part does not set it takes from that boundary"},
    {"boundaries.<name>.side", "string", "", "-", "With part_of: left (x < 0) or right (x > 0) side of a full section's boundary"},
    {"boundaries.<name>.x_from", "number", "m", "-", "With part_of: the part's faces have their midpoints at x >= x_from"},
    {"boundaries.<name>.x_to", "number", "m", "-", "With part_of: ... at x <= x_to"},
    {"boundaries.<name>.y_from", "number", "m", "-", "With part_of: ... at elevations >= y_from"},
    {"boundaries.<name>.y_to", "number", "m", "-", "With part_of: ... at elevations <= y_to"},

    {"stages[].name", "string", "", "required", "Stage name"},
    {"stages[].duration", "number", "days", "required", "Stage duration (stages follow each other)"},
    {"stages[].ramp", "number", "days", "0", "Changes of this stage ramp linearly over this time from the stage start"},
    {"stages[].wells.<name>.head", "number", "m", "-", "Target head in the well (give head or discharge); the well takes water only (unless a recharge well) and the part of its screen above this head drains at atmospheric pressure"},
    {"stages[].wells.<name>.discharge", "number", "m3/day", "-", "Target pumped discharge (per metre run in plane strain, per well in axisymmetric); 0 stops the well"},
    {"stages[].boundaries.<name>.head", "number", "m", "-", "Target head on a boundary or internal line (give head or discharge); water may enter and leave (on a seepage_face boundary: leave only)"},
    {"stages[].boundaries.<name>.discharge", "number", "m3/day", "-", "Total water leaving through a boundary or internal line, spread evenly over it (per metre run in plane strain, in all in axisymmetric); negative: water entering"},
    {"stages[].excavation_level_head", "number", "m", "-", "Target head held along the final excavation level inside the pit; water leaves there, none enters"},
    {"stages[].pit_water_level", "number", "m", "the dig level", "Elevation of the water in the pit during the stage (a sump); the dug surface drains to it: water leaves where its pressure would be higher, none enters where it is lower"},
    {"stages[].dig_level", "number", "m", "-", "Elevation the pit is dug to in this stage: the soil inside the walls (a user's mesh: of mesh_file.excavation_regions) above it is taken out at the stage's start and the forces it carried are released over the ramp"},
    {"stages[].loads[].boundary", "string", "", "\"ground_surface\"", "Boundary that carries the load"},
    {"stages[].loads[].pressure", "number", "kPa", "required", "Vertical surcharge (compressive positive)"},
    {"stages[].loads[].x_from", "number", "m", "required", "Start of the loaded strip"},
    {"stages[].loads[].x_to", "number", "m", "required", "End of the loaded strip"},
    {"stages[].time_steps.first", "number", "days", "duration/1000", "First step of the stage (the undrained response)"},
    {"stages[].time_steps.growth", "number", "", "2", "Ratio of one rung of the step ladder to the one before"},
    {"stages[].time_steps.per_rung", "integer", "", "8", "Steps taken at each rung (one factorisation serves them)"},
    {"stages[].time_steps.largest", "number", "days", "duration/40, ramp/100", "Largest step (the default is the smaller of a fortieth of the stage and a hundredth of its ramp)"},

    {"output.times", "array of numbers", "days", "[]", "Extra output times"},
    {"output.per_stage", "integer", "", "4", "Output times inside each stage, log-spaced (stage ends are always written)"},
    {"output.displacements_from", "string", "", "the start", "Name of the stage from whose start displacements, settlements and strains are reported (before it, from the start of the analysis); e.g. to zero the movement of a wall's installation"},
    {"output.points[].name", "string", "", "required", "Monitoring point name"},
    {"output.points[].x", "number", "m", "required", "x of the point"},
    {"output.points[].y", "number", "m", "required", "Elevation of the point"},
    {"output.lines[].name", "string", "", "required", "Section line name"},
    {"output.lines[].points", "array of [x, y]", "m", "required", "Polyline vertices"},
    {"output.lines[].samples", "integer", "", "101", "Sample points along the line"},
    {"output.columns[].name", "string", "", "required", "Column name"},
    {"output.columns[].x", "number", "m", "required", "x of a vertical column for the 1D comparison"},

    {"neighbours[].name", "string", "", "required", "Neighbouring building"},
    {"neighbours[].x_from", "number", "m", "required", "Start of its foundation"},
    {"neighbours[].x_to", "number", "m", "required", "End of its foundation"},
    {"neighbours[].foundation_level", "number", "m", "required", "Elevation of its foundation"},
    {"neighbours[].height", "number", "m", "-", "Building height, for the deep-beam strains (Burland 1995)"},
    {"neighbours[].samples", "integer", "", "21", "Points along the foundation"},

    {"numerics.refinements", "integer", "", "0", "Global refinements of the mesh (each multiplies the cells by 4)"},
    {"numerics.solver", "string", "", "\"auto\"", "direct (MUMPS), iterative (FGMRES with a block preconditioner), or auto (by size)"},
    {"numerics.tolerance", "number", "", "1e-10", "Relative residual at which the iterative solver stops"},
    {"numerics.petsc_options", "string", "", "\"\"", "Extra PETSc options (for experts), e.g. \"-settlewell_direct_mat_mumps_icntl_14 60\""},

    {"checks.piping_factor", "number", "", "1.5", "Least factor against piping at the excavation base before it is flagged"},
    {"checks.heave_factor", "number", "", "1.5", "Least factor on Terzaghi's heave prism beside the wall toe"},
    {"checks.uplift_factor", "number", "", "1.1", "Least factor against uplift of a low-permeability layer below the base"},
    {"checks.low_permeability", "number", "m/s", "1e-7", "Layers with vertical conductivity at or below this confine (uplift) and consolidate (1D estimate)"},
    {"checks.settlement_limit", "number", "m", "0.025", "Settlement of a neighbour above which it is flagged"},
    {"checks.angular_distortion_limit", "number", "", "0.002", "Angular distortion of a neighbour above which it is flagged (1/500)"},
    {"checks.mass_balance_tolerance", "number", "", "1e-6", "Relative water-balance error of a step above which a warning is given"},
    {"checks.suction_limit", "number", "kPa", "10", "Suction (negative pore pressure) in soil still in the model above which a warning is given, for materials without air_entry_suction: the model keeps soil saturated at any suction, where real soil drains beyond its air-entry value (a few kPa in sands; common practice)"},
    {"checks.head_rise_limit", "number", "m", "0.1", "Rise of the head since its stage began, in soil more permeable than checks.low_permeability, in a stage that only lowers heads (it lowers a held head or pumps more, and raises none, digs nothing and changes no load), above which a warning is given: water comes from where the stage does not mean it to (common practice, no single source)"},
  };
  return keys;
}
// clang-format on

bool KeySpec::has_literal_default() const {
  const std::string t = type;
  const std::string& d = default_value;
  if (d.empty() || d == "required" || d == "-")
    return false;
  if (t == "string")
    return d.size() >= 2 && d.front() == '"' && d.back() == '"';
  if (t == "boolean")
    return d == "true" || d == "false";
  if (t == "number" || t == "integer") {
    char* end = nullptr;
    std::strtod(d.c_str(), &end);
    return *end == '\0' &&
           (t == "number" || d.find_first_not_of("0123456789") == std::string::npos);
  }
  return false;
}

const KeySpec& key_spec(const std::string& path) {
  for (const auto& key : all_keys())
    if (path == key.path)
      return key;
  throw InternalError("the scenario key '" + path + "' is not declared in keys.cc");
}

namespace {

std::vector<std::string> segments_of(const std::string& path) {
  std::vector<std::string> out;
  std::stringstream parts(path);
  for (std::string part; std::getline(parts, part, '.');)
    out.push_back(part);
  return out;
}

/// Whether a declared segment ("<name>", "stages[]", "head") matches a concrete one.
bool segment_matches(const std::string& declared, const std::string& concrete) {
  if (declared == "<name>")
    return !concrete.empty();
  if (declared.size() > 2 && declared.compare(declared.size() - 2, 2, "[]") == 0) {
    const std::string name = declared.substr(0, declared.size() - 2);
    return concrete.size() > name.size() + 2 &&
           concrete.compare(0, name.size(), name) == 0 && concrete[name.size()] == '[' &&
           concrete.back() == ']';
  }
  return declared == concrete;
}

} // namespace

std::string unit_of(const std::string& concrete_path) {
  const auto concrete = segments_of(concrete_path);
  for (const auto& key : all_keys()) {
    const auto declared = segments_of(key.path);
    if (declared.size() == concrete.size() &&
        std::equal(declared.begin(), declared.end(), concrete.begin(), segment_matches))
      return key.unit;
  }
  return "";
}

namespace {

bool starts_with(const std::string& s, const std::string& prefix) {
  return s.size() > prefix.size() && s.compare(0, prefix.size(), prefix) == 0 &&
         s[prefix.size()] == '.';
}

std::string next_segment(const std::string& path, const std::string& table) {
  const std::string rest = table.empty() ? path : path.substr(table.size() + 1);
  return rest.substr(0, rest.find('.'));
}

} // namespace

std::vector<std::string> children_of(const std::string& table_path) {
  std::set<std::string> children;
  for (const auto& key : all_keys()) {
    const std::string path = key.path;
    if (table_path.empty() || starts_with(path, table_path))
      children.insert(next_segment(path, table_path));
  }
  return {children.begin(), children.end()};
}

bool holds_named_entries(const std::string& table_path) {
  const auto children = children_of(table_path);
  return children.size() == 1 && children.front() == "<name>";
}

std::string nearest(const std::string& key, const std::vector<std::string>& candidates) {
  auto distance = [](const std::string& a, const std::string& b) {
    std::vector<std::size_t> row(b.size() + 1);
    for (std::size_t j = 0; j <= b.size(); ++j)
      row[j] = j;
    for (std::size_t i = 1; i <= a.size(); ++i) {
      std::size_t diagonal = row[0];
      row[0] = i;
      for (std::size_t j = 1; j <= b.size(); ++j) {
        const std::size_t up = row[j];
        row[j] =
            std::min({row[j] + 1, row[j - 1] + 1, diagonal + (a[i - 1] != b[j - 1])});
        diagonal = up;
      }
    }
    return row[b.size()];
  };
  std::string best;
  std::size_t best_distance = std::max<std::size_t>(3, key.size() / 2) + 1;
  for (const auto& c : candidates) {
    if (c == "<name>")
      continue;
    const std::size_t d = distance(key, c);
    if (d < best_distance)
      best = c, best_distance = d;
  }
  return best;
}

void print_key_reference(std::ostream& out) {
  out << "Scenario keys (TOML). Times in days, lengths and elevations in m, stresses in\n"
         "kPa, conductivities in m/s. <name> is a name you choose; [] an array "
         "element.\n";
  // Each table once, in the order of its first key, with all its keys under it.
  const auto table_of = [](const std::string& path) {
    const auto dot = path.rfind('.');
    return dot == std::string::npos ? std::string() : path.substr(0, dot);
  };
  std::vector<std::string> tables;
  std::size_t name_width = 22;
  for (const auto& key : all_keys()) {
    const std::string path = key.path, table = table_of(path);
    if (std::find(tables.begin(), tables.end(), table) == tables.end())
      tables.push_back(table);
    name_width =
        std::max(name_width, path.size() - (table.empty() ? 0 : table.size() + 1));
  }
  for (const auto& table : tables) {
    out << '\n' << (table.empty() ? "(top level)" : "[" + table + "]") << '\n';
    for (const auto& key : all_keys()) {
      const std::string path = key.path;
      if (table_of(path) != table)
        continue;
      out << "  " << std::left << std::setw(int(name_width + 2))
          << path.substr(table.empty() ? 0 : table.size() + 1) << std::setw(18)
          << key.type << std::setw(8) << key.unit << key.doc;
      const std::string fallback = key.default_value;
      if (fallback == "required")
        out << " (required)\n";
      else if (fallback == "-")
        out << '\n';
      else
        out << " (default: " << fallback << ")\n";
    }
  }
}

} // namespace settlewell::scenario
