#include "settlewell/scenario/parse.h"

#include "parse_parts.h"
#include "settlewell/core/errors.h"
#include "settlewell/core/files.h"
#include "settlewell/core/number_text.h"
#include "settlewell/scenario/keys.h"

#include <algorithm>
#include <fstream>
#include <functional>
#include <sstream>

namespace settlewell::scenario {

double Scenario::end_time() const {
  double t = 0.0;
  for (const auto& stage : stages)
    t += stage.duration;
  return t;
}

bool BoundaryPart::contains(double x, double y) const {
  if (side && (*side == "left" ? x >= 0.0 : x <= 0.0))
    return false;
  return (!x_from || x >= *x_from) && (!x_to || x <= *x_to) &&
         (!y_from || y >= *y_from) && (!y_to || y <= *y_to);
}

std::vector<std::string> Scenario::boundary_parts_parents_first() const {
  std::vector<std::string> pending, ordered;
  for (const auto& [name, spec] : boundaries)
    if (spec.part)
      pending.push_back(name);
  const auto placed = [&](const std::string& parent) {
    const auto found = boundaries.find(parent);
    return found == boundaries.end() || !found->second.part ||
           std::find(ordered.begin(), ordered.end(), parent) != ordered.end();
  };
  while (!pending.empty()) {
    const auto next = std::find_if(pending.begin(), pending.end(), [&](const auto& n) {
      return placed(boundaries.at(n).part->of);
    });
    if (next == pending.end())
      throw InputError(location_of("boundaries." + pending.front()) + ": boundaries." +
                       pending.front() + ".part_of: the parts form a loop");
    ordered.push_back(*next);
    pending.erase(next);
  }
  return ordered;
}

double Material::CamClay::past_at(double elevation) const {
  if (past_profile.empty())
    return past_value;
  if (elevation <= past_profile.front().first)
    return past_profile.front().second;
  for (std::size_t i = 1; i < past_profile.size(); ++i) {
    const auto& [y1, v1] = past_profile[i];
    if (elevation <= y1) {
      const auto& [y0, v0] = past_profile[i - 1];
      return v0 + (v1 - v0) * (elevation - y0) / (y1 - y0);
    }
  }
  return past_profile.back().second;
}

std::string Material::CamClay::past_text() const {
  std::ostringstream os;
  const char* const names[] = {"sigma'p", "OCR", "POP"};
  os << names[static_cast<int>(past)];
  const std::string unit = past == Past::ocr ? "" : " kPa";
  if (past_profile.empty())
    os << " " << past_value << unit;
  for (std::size_t i = 0; i < past_profile.size(); ++i)
    os << (i == 0 ? " " : ", ") << past_profile[i].second << unit << " at "
       << past_profile[i].first << " m";
  if (!past_profile.empty())
    os << " (linear between, constant beyond)";
  return os.str();
}

std::string Material::CamClay::summary() const {
  std::ostringstream os;
  os << "Cc " << compression_index << ", Cr " << recompression_index << ", e0 "
     << void_ratio << ", phi'cs " << friction_angle << " degrees, " << past_text();
  if (permeability_change_index > 0.0)
    os << ", Ck " << permeability_change_index << " (kx, ky at the start)";
  return os.str();
}

double Material::CamClay::preconsolidation(double vertical_start,
                                           double elevation) const {
  const double value = past_at(elevation);
  switch (past) {
  case Past::pressure:
    return value;
  case Past::ocr:
    return value * vertical_start;
  case Past::pop:
    break;
  }
  return vertical_start + value;
}

std::string Scenario::location_of(const std::string& key_path) const {
  const auto found = locations.find(key_path);
  return found != locations.end() ? found->second : source_path;
}

namespace {

// The ranges that values of a material must lie in: wide enough for any soil, rock
// or wall (steel: 78.5 kN/m3, E 2.1e8 kPa; clean gravel about 1 m/s, intact clay
// 1e-13 m/s), narrow enough to catch a slip of units or exponent. Common practice,
// no single source.
const char* const material_bounds = "the range of soils, rock and walls";
constexpr double lightest = 1.0, heaviest = 100.0;        // kN/m3
constexpr double softest = 10.0, stiffest = 1e9;          // kPa
constexpr double tightest = 1e-14, most_permeable = 10.0; // m/s

double conductivity(const TableReader& r, const std::string& key) {
  return r.within(key, tightest, most_permeable, "m/s", material_bounds);
}

const char* const clay_keys[] = {"compression_index",
                                 "recompression_index",
                                 "void_ratio",
                                 "friction_angle_cs",
                                 "preconsolidation_pressure",
                                 "ocr",
                                 "pop",
                                 "permeability_change_index"};

/// A preconsolidation key: a number, or a profile [[elevation, value], ...] with
/// distinct elevations, each value in [low, high].
void read_past(const TableReader& r,
               const std::string& key,
               double low,
               double high,
               const std::string& unit,
               const std::string& bounds,
               Material::CamClay& c) {
  if (!r.has_array(key)) {
    c.past_value = r.within(key, low, high, unit, bounds);
    return;
  }
  const std::string form = "must be a number or a profile [[elevation (m), value], ...]";
  for (const auto& item : *r.array(key)) {
    const auto* pair = item.as_array();
    if (pair == nullptr || pair->size() != 2 || !(*pair)[0].is_number() ||
        !(*pair)[1].is_number())
      r.fail(key, form);
    const double y = number_value((*pair)[0]), v = number_value((*pair)[1]);
    if (!(std::abs(y) <= 1e4))
      r.fail(key, "elevation " + significant(y) + " m is beyond 10 km of the datum");
    if (!(v >= low && v <= high))
      r.fail(key, "value " + significant(v) + " is outside " + significant(low) + " to " +
                      significant(high) + (unit.empty() ? "" : " " + unit) + " (" +
                      bounds + ")");
    c.past_profile.emplace_back(y, v);
  }
  if (c.past_profile.size() < 2)
    r.fail(key, "a profile needs at least two points; give a number for a constant");
  std::sort(c.past_profile.begin(), c.past_profile.end());
  for (std::size_t i = 1; i < c.past_profile.size(); ++i)
    if (c.past_profile[i].first == c.past_profile[i - 1].first)
      r.fail(key, "the profile gives elevation " + significant(c.past_profile[i].first) +
                      " m twice");
}

Material::CamClay read_cam_clay(const TableReader& r, double poisson_ratio) {
  // Bounds: any natural clay or silt (Cc up to about 10 in peat-like organic
  // clays, e0 up to about 15); common practice, no single source.
  const char* const clay_bounds = "the range of natural clays and silts";
  Material::CamClay c;
  c.compression_index = r.within("compression_index", 0.01, 10.0, "", clay_bounds);
  c.recompression_index = r.within("recompression_index", 1e-3, 5.0, "", clay_bounds);
  if (!(c.recompression_index < c.compression_index))
    r.fail("recompression_index", "must be smaller than compression_index");
  c.void_ratio = r.within("void_ratio", 0.1, 15.0, "", clay_bounds);
  c.friction_angle = r.within("friction_angle_cs", 5.0, 50.0, "degrees", clay_bounds);
  // Ck of natural clays lies near 0.5 e0 (Tavenas et al. 1983, from memory).
  if (r.has("permeability_change_index"))
    c.permeability_change_index =
        r.within("permeability_change_index", 0.01, 10.0, "", clay_bounds);
  const int n_past = r.has("preconsolidation_pressure") + r.has("ocr") + r.has("pop");
  if (n_past != 1)
    r.fail_here("a cam_clay material needs exactly one of preconsolidation_pressure, "
                "ocr and pop");
  if (r.has("preconsolidation_pressure")) {
    c.past = Material::CamClay::Past::pressure;
    read_past(r, "preconsolidation_pressure", 0.1, 1e5, "kPa", material_bounds, c);
  } else if (r.has("ocr")) {
    c.past = Material::CamClay::Past::ocr;
    read_past(r, "ocr", 1.0, 100.0, "", clay_bounds, c);
  } else {
    c.past = Material::CamClay::Past::pop;
    read_past(r, "pop", 0.0, 1e4, "kPa", clay_bounds, c);
  }
  c.parameters =
      CamClayParameters::from_indices(c.compression_index, c.recompression_index,
                                      c.void_ratio, c.friction_angle, poisson_ratio);
  return c;
}

/// The stiffness a cam_clay material gives the iterative solver's preconditioner:
/// its unloading bulk modulus v0 p'/kappa at p' = 100 kPa (a representative
/// stress; the analysis itself uses the clay's stress at every point).
double reference_youngs_modulus(const CamClayParameters& m) {
  const double bulk = m.specific_volume * 100.0 / m.kappa;
  return 3.0 * bulk * (1.0 - 2.0 * m.poisson_ratio);
}

/// E' from whichever of youngs_modulus, constrained_modulus and mv was given.
double elastic_youngs_modulus(const TableReader& r, double poisson_ratio) {
  if (r.has("youngs_modulus"))
    return r.within("youngs_modulus", softest, stiffest, "kPa", material_bounds);
  if (r.has("constrained_modulus"))
    return PoroelasticMaterial::youngs_from_mv(
        1.0 / r.within("constrained_modulus", softest, stiffest, "kPa", material_bounds),
        poisson_ratio);
  return PoroelasticMaterial::youngs_from_mv(
      r.within("mv", 1.0 / stiffest, 1.0 / softest, "1/kPa", material_bounds),
      poisson_ratio);
}

const char* const retention_keys[] = {"retention_alpha", "retention_n",
                                      "saturated_water_content",
                                      "residual_water_content"};

/// The retention curve of materials.<name>.retention, or none. `porosity`: the
/// material's (0: not given), theta_s's default.
std::optional<RetentionCurve> read_retention(const TableReader& r, double porosity) {
  const std::string model = r.text("retention");
  if (model == "none") {
    for (const char* key : retention_keys)
      if (r.has(key))
        r.fail(key, "belongs to a retention curve; add retention = \"van_genuchten\" "
                    "or \"gardner\"");
    return std::nullopt;
  }
  RetentionCurve c;
  if (model == "van_genuchten")
    c.model = RetentionCurve::Model::van_genuchten;
  else if (model == "gardner")
    c.model = RetentionCurve::Model::gardner;
  else
    r.fail("retention", "must be none, van_genuchten or gardner (got '" + model + "')");
  c.alpha = r.within("retention_alpha", 0.01, 100.0, "1/m", "a soil's range");
  if (c.model == RetentionCurve::Model::van_genuchten)
    c.n = r.within("retention_n", 1.05, 10.0, "", "a soil's range");
  else if (r.has("retention_n"))
    r.fail("retention_n", "belongs to a van_genuchten curve");
  if (r.has("saturated_water_content"))
    c.saturated_content = r.number("saturated_water_content");
  else if (porosity > 0.0)
    c.saturated_content = porosity;
  else
    r.fail_here("a retention curve needs saturated_water_content (or porosity)");
  if (!(c.saturated_content > 0.0 && c.saturated_content < 1.0))
    r.fail("saturated_water_content", "must lie in (0, 1)");
  c.residual_content = r.number("residual_water_content");
  if (!(c.residual_content >= 0.0 && c.residual_content < c.saturated_content))
    r.fail("residual_water_content", "must lie in [0, saturated_water_content)");
  return c;
}

Material read_material(const std::string& name, const TableReader& r) {
  Material m;
  m.name = name;
  m.unit_weight = r.within("unit_weight", lightest, heaviest, "kN/m3", material_bounds);
  auto& p = m.poroelastic;
  p.poisson_ratio = r.number("poisson_ratio");
  if (!(p.poisson_ratio > -1.0 && p.poisson_ratio < 0.5))
    r.fail("poisson_ratio", "must lie in (-1, 0.5)");
  const std::string model = r.text("model");
  if (model != "linear_elastic" && model != "cam_clay")
    r.fail("model", "must be linear_elastic or cam_clay (got '" + model + "')");
  const int n_stiffness =
      r.has("youngs_modulus") + r.has("constrained_modulus") + r.has("mv");
  if (model == "cam_clay") {
    if (n_stiffness != 0)
      r.fail_here("a cam_clay material takes its stiffness from recompression_index "
                  "and its stress: remove youngs_modulus, constrained_modulus or mv");
    m.cam_clay = read_cam_clay(r, p.poisson_ratio);
    p.youngs_modulus = reference_youngs_modulus(m.cam_clay->parameters);
  } else {
    for (const char* key : clay_keys)
      if (r.has(key))
        r.fail(key, "belongs to a cam_clay material; add model = \"cam_clay\"");
    if (n_stiffness != 1)
      r.fail_here("give exactly one of youngs_modulus, constrained_modulus and mv");
    p.youngs_modulus = elastic_youngs_modulus(r, p.poisson_ratio);
  }

  if (r.has("conductivity") == (r.has("conductivity_x") || r.has("conductivity_y")))
    r.fail_here("give conductivity, or both conductivity_x and conductivity_y");
  if (r.has("conductivity")) {
    p.conductivity_x = p.conductivity_y = conductivity(r, "conductivity");
  } else {
    p.conductivity_x = conductivity(r, "conductivity_x");
    p.conductivity_y = conductivity(r, "conductivity_y");
  }
  p.biot_alpha = r.number("biot_alpha");
  if (!(p.biot_alpha > 0.0 && p.biot_alpha <= 1.0))
    r.fail("biot_alpha", "must lie in (0, 1]");
  if (r.has("storage") && r.has("porosity"))
    r.fail_here("give storage or porosity (with the bulk moduli), not both");
  if (r.has("porosity")) {
    const double n = r.number("porosity");
    if (!(n > 0.0 && n < 1.0))
      r.fail("porosity", "must lie in (0, 1)");
    const double Kw = r.number("water_bulk_modulus");
    if (!(Kw > 0.0))
      r.fail("water_bulk_modulus", "must be positive");
    const double inverse_Ks =
        r.has("grain_bulk_modulus") ? 1.0 / r.positive("grain_bulk_modulus") : 0.0;
    p.storage = (p.biot_alpha - n) * inverse_Ks + n / Kw; // (alpha - n)/Ks + n/Kw
    m.storage_from = {n, Kw, inverse_Ks > 0.0 ? 1.0 / inverse_Ks : 0.0};
    if (p.storage < 0.0)
      r.fail("porosity", "gives a negative storage (alpha < n with finite Ks)");
  } else {
    p.storage = r.number("storage");
    if (p.storage < 0.0)
      r.fail("storage", "must not be negative");
  }
  m.k0 = r.number("earth_pressure_at_rest");
  if (!(m.k0 > 0.0))
    r.fail("earth_pressure_at_rest", "must be positive");
  if (r.has("air_entry_suction"))
    m.air_entry_suction = r.positive("air_entry_suction");
  m.retention = read_retention(r, m.storage_from ? m.storage_from->porosity : 0.0);
  if (m.retention && m.air_entry_suction)
    r.fail("air_entry_suction", "flags the saturated model only; a material with a "
                                "retention curve drains by it (remove one)");
  return m;
}

} // namespace

void parse_materials(const TableReader& top, Scenario& s) {
  if (!top.has("materials"))
    top.fail_here("missing the required table [materials]");
  for_each_named(top, "materials", [&](const std::string& name, const TableReader& r) {
    s.materials[name] = read_material(name, r);
    s.locations["materials." + name] = r.where("unit_weight");
  });
  if (s.materials.empty())
    top.fail("materials", "needs at least one material");
}

void parse_groundwater(const TableReader& top, Scenario& s) {
  const toml::table* t = top.table("groundwater");
  if (t == nullptr)
    top.fail_here("missing the required table [groundwater]");
  const TableReader r(*t, "groundwater", "groundwater", top.file());
  s.groundwater.water_table = r.elevation("water_table");
  double x0, x1, y0, y1;
  if (model_extent(s, x0, x1, y0, y1) && s.groundwater.water_table > y1 + 1e-9) {
    std::ostringstream top_text;
    top_text << y1;
    r.fail("water_table", "lies above the top of the model (" + top_text.str() +
                              " m): water standing on the ground is not modelled; put "
                              "the water table at or below the ground and hold a head on "
                              "the ground surface boundary for standing water");
  }
  const toml::table* heads = r.table("layer_heads");
  if (heads == nullptr)
    return;
  const auto regions = region_names(s);
  const TableReader h(*heads, "groundwater.layer_heads", "groundwater.layer_heads",
                      top.file());
  for (const auto& [key, node] : *heads) {
    const std::string name(key.str());
    if (std::find(regions.begin(), regions.end(), name) == regions.end()) {
      const std::string suggestion = nearest(name, regions);
      h.fail(name, "is not a layer" + (suggestion.empty()
                                           ? std::string()
                                           : "; did you mean '" + suggestion + "'?"));
    }
    s.groundwater.layer_heads[name] = h.elevation(name);
  }
}

void parse_initial_state(const TableReader& top, Scenario& s) {
  const TableReader r = sub_table(top, "initial_state", "initial_state");
  const std::string method = r.text("method");
  if (method != "k0" && method != "gravity")
    r.fail("method", "must be k0 or gravity (got '" + method + "')");
  s.gravity_loading = method == "gravity";
}

namespace {

/// A window's two ends: both optional, the second above the first.
void read_window(const TableReader& r,
                 const std::string& from,
                 const std::string& to,
                 std::optional<double>& low,
                 std::optional<double>& high) {
  if (r.has(from))
    low = r.elevation(from);
  if (r.has(to))
    high = r.elevation(to);
  if (low && high && !(*high > *low))
    r.fail(to, "must be greater than " + from);
}

/// boundaries.<name>.part_of and its side and window, if given.
std::optional<BoundaryPart>
read_boundary_part(const TableReader& r, const Scenario& s, const std::string& name) {
  if (!r.has("part_of")) {
    for (const char* key : {"side", "x_from", "x_to", "y_from", "y_to"})
      if (r.has(key))
        r.fail(key, "needs part_of, the boundary this is a part of");
    return std::nullopt;
  }
  BoundaryPart part;
  part.of = r.text("part_of");
  if (part.of == name)
    r.fail("part_of", "names the boundary itself");
  if (r.has("side")) {
    part.side = r.text("side");
    if (part.side != "left" && part.side != "right")
      r.fail("side", "must be left (x < 0) or right (x > 0) (got '" + *part.side + "')");
    if (s.section && (s.section->half_model || s.analysis == AnalysisType::axisymmetric))
      r.fail("side", "a half model or an axisymmetric section has its far boundary on "
                     "the right only; give x_from/x_to or y_from/y_to instead");
  }
  read_window(r, "x_from", "x_to", part.x_from, part.x_to);
  read_window(r, "y_from", "y_to", part.y_from, part.y_to);
  return part;
}

} // namespace

void parse_boundaries(const TableReader& top, Scenario& s) {
  for_each_named(top, "boundaries", [&](const std::string& name, const TableReader& r) {
    BoundarySpec b;
    const std::string hydraulic = r.optional_text("hydraulic").value_or("");
    if (hydraulic == "no_flow")
      b.hydraulic = BoundarySpec::Hydraulic::no_flow;
    else if (hydraulic == "fixed_head")
      b.hydraulic = BoundarySpec::Hydraulic::fixed_head;
    else if (hydraulic == "seepage_face")
      b.hydraulic = BoundarySpec::Hydraulic::seepage_face;
    else if (!hydraulic.empty())
      r.fail("hydraulic",
             "must be no_flow, fixed_head or seepage_face (got '" + hydraulic + "')");
    if (r.has("head")) {
      if (b.hydraulic == BoundarySpec::Hydraulic::no_flow ||
          b.hydraulic == BoundarySpec::Hydraulic::seepage_face)
        r.fail("head", "a " + hydraulic + " boundary takes no head");
      b.hydraulic = BoundarySpec::Hydraulic::fixed_head;
      b.head = r.elevation("head");
    }
    const std::string mechanical = r.optional_text("mechanical").value_or("");
    if (mechanical == "free")
      b.mechanical = BoundarySpec::Mechanical::free;
    else if (mechanical == "fixed")
      b.mechanical = BoundarySpec::Mechanical::fixed;
    else if (mechanical == "roller")
      b.mechanical = BoundarySpec::Mechanical::roller;
    else if (mechanical == "rigid_plate")
      b.mechanical = BoundarySpec::Mechanical::rigid_plate;
    else if (!mechanical.empty())
      r.fail("mechanical",
             "must be free, fixed, roller or rigid_plate (got '" + mechanical + "')");
    if (r.has("plate_pressure")) {
      if (b.mechanical != BoundarySpec::Mechanical::rigid_plate)
        r.fail("plate_pressure", "needs mechanical = \"rigid_plate\"");
      b.plate_pressure = r.number("plate_pressure");
    }
    b.part = read_boundary_part(r, s, name);
    s.boundaries[name] = b;
    s.locations["boundaries." + name] = r.where(b.part               ? "part_of"
                                                : r.has("hydraulic") ? "hydraulic"
                                                                     : "mechanical");
  });
  s.boundary_parts_parents_first(); // refuses parts that form a loop
}

namespace {
/// What a material solved by Newton's method cannot yet be combined with, each
/// refused through `refuse`.
void refuse_newton_limits(const Scenario& s,
                          const std::function<void(const std::string&)>& refuse) {
  if (s.gravity_loading)
    refuse("with initial_state.method = \"gravity\"; use \"k0\"");
  if (s.numerics.solver == SolverChoice::iterative)
    refuse("with numerics.solver = \"iterative\" (its tangent is not symmetric); "
           "use \"direct\" or \"auto\"");
  for (const auto& stage : s.stages)
    if (stage.dig_level)
      refuse("in a model that is dug (stage '" + stage.name + "' has a dig_level)");
}

/// What a cam_clay material or a retention curve cannot yet be combined with,
/// refused at the material.
void check_newton_support(const Scenario& s) {
  for (const auto& [name, m] : s.materials) {
    const std::string where = s.location_of("materials." + name) + ": materials." + name;
    if (m.cam_clay) {
      const auto refuse = [&](const std::string& what) {
        throw InputError(where + ": a cam_clay material cannot yet be used " + what);
      };
      if (s.coupling == Coupling::flow_only)
        refuse("with coupling = \"flow_only\" (it has no skeleton to compute)");
      refuse_newton_limits(s, refuse);
    }
    if (m.retention) {
      const auto refuse = [&](const std::string& what) {
        throw InputError(where + ".retention: a retention curve cannot yet be used " +
                         what);
      };
      if (m.cam_clay)
        refuse("with model = \"cam_clay\"");
      refuse_newton_limits(s, refuse);
    }
  }
}
} // namespace

Scenario parse_scenario(const std::string& text, const std::string& name) {
  const toml::table root = parse_toml(text, name);
  Scenario s;
  s.source_path = name;
  const TableReader top(root, "", "", name);
  s.title = top.text("title");
  const std::string analysis = top.text("analysis");
  if (analysis == "axisymmetric")
    s.analysis = AnalysisType::axisymmetric;
  else if (analysis != "plane_strain")
    top.fail("analysis", "must be plane_strain or axisymmetric (got '" + analysis + "')");
  s.gamma_w = top.number("unit_weight_water");
  const std::string coupling = top.text("coupling");
  if (coupling == "flow_only")
    s.coupling = Coupling::flow_only;
  else if (coupling != "biot")
    top.fail("coupling", "must be biot or flow_only (got '" + coupling + "')");
  if (!(s.gamma_w > 0.0))
    top.fail("unit_weight_water", "must be positive");
  parse_materials(top, s);
  parse_geometry(top, s);
  parse_groundwater(top, s);
  parse_initial_state(top, s);
  parse_boundaries(top, s);
  parse_stages(top, s);
  parse_output(top, s);
  parse_checks(top, s);
  check_newton_support(s);
  if (s.coupling == Coupling::flow_only &&
      (!s.neighbours.empty() || !s.output.columns.empty()))
    top.fail("coupling", "flow_only computes no movement, so it has no settlement for "
                         "[[neighbours]] or [[output.columns]]; remove them or use biot");
  return s;
}

Scenario read_scenario(const std::string& path) {
  if (const auto problem = input_file_problem(path, largest_text_input_bytes);
      !problem.empty())
    throw InputError(path + ": " + problem);
  std::ifstream in(path);
  if (!in)
    throw InputError(path + ": cannot open the scenario file");
  std::ostringstream text;
  text << in.rdbuf();
  return parse_scenario(text.str(), path);
}

} // namespace settlewell::scenario
