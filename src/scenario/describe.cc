#include "settlewell/scenario/describe.h"

#include "settlewell/core/units.h"

#include <algorithm>
#include <sstream>

namespace settlewell::scenario {

std::string role_text(const BoundarySpec& b) {
  using H = BoundarySpec::Hydraulic;
  using M = BoundarySpec::Mechanical;
  std::ostringstream h;
  if (b.hydraulic == H::fixed_head && b.head)
    h << "fixed head " << *b.head << " m";
  else if (b.hydraulic == H::fixed_head)
    h << "fixed head (the initial head)";
  else if (b.hydraulic == H::seepage_face)
    h << "seepage face (water leaves at atmospheric pressure, none enters)";
  else
    h << (b.hydraulic == H::no_flow ? "no flow" : "set by the stages");
  std::ostringstream m;
  if (b.mechanical == M::fixed)
    m << "fixed";
  else if (b.mechanical == M::roller)
    m << "roller (normal fixed)";
  else if (b.mechanical == M::rigid_plate)
    m << "rigid frictionless plate, mean pressure " << b.plate_pressure << " kPa";
  else
    m << "free";
  return h.str() + ", " + m.str();
}

std::string target_text(const Target& t) {
  std::ostringstream os;
  if (t.kind == Target::Kind::head)
    os << "head " << t.value << " m";
  else
    os << "discharge " << t.value * units::seconds_per_day << " m3/day";
  return os.str();
}

std::string stage_changes(const Stage& st) {
  std::ostringstream os;
  const char* sep = "";
  for (const auto& [well, target] : st.wells)
    os << sep << "well " << well << ": " << target_text(target), sep = "; ";
  for (const auto& [b, target] : st.boundary_targets)
    os << sep << b << " " << target_text(target), sep = "; ";
  if (st.dig_level)
    os << sep << "dig to " << *st.dig_level << " m", sep = "; ";
  if (st.pit_water_level)
    os << sep << "pit water at " << *st.pit_water_level << " m", sep = "; ";
  if (st.excavation_level_head)
    os << sep << "excavation level head " << *st.excavation_level_head << " m",
        sep = "; ";
  for (const auto& load : st.loads)
    os << sep << load.pressure << " kPa on " << load.boundary << " (x " << load.x_from
       << " to " << load.x_to << " m)",
        sep = "; ";
  const std::string text = os.str();
  return text.empty() ? "no change (held)" : text;
}

std::vector<std::string> geometry_lines(const Scenario& s) {
  std::vector<std::string> lines;
  std::ostringstream os;
  if (s.section) {
    const auto& sec = *s.section;
    os << "Parametric section: ground surface " << sec.ground_surface << " m, model base "
       << sec.bottom << " m, excavation " << sec.excavation_width << " m wide to "
       << sec.excavation_level() << " m, far boundary " << sec.far_distance
       << " m beyond the wall" << (sec.half_model ? ", half model" : ", full model");
    lines.push_back(os.str());
    if (sec.wall) {
      std::ostringstream w;
      w << "Cutoff wall: " << sec.wall->thickness << " m thick, toe at " << sec.wall->toe
        << " m, material " << sec.wall->material;
      lines.push_back(w.str());
    }
    for (const auto& well : sec.wells) {
      std::ostringstream w;
      w << (well.recharge ? "Recharge well " : "Well ") << well.name << ": x " << well.x
        << " m, screen " << well.screen_bottom << " to " << well.screen_top << " m";
      lines.push_back(w.str());
    }
    for (const auto& l : sec.layers) {
      std::ostringstream w;
      w << "Layer " << l.name << " (" << l.material << ") from " << l.top << " m";
      lines.push_back(w.str());
    }
  } else if (s.box) {
    os << "Layered box " << s.box->width << " m wide from x = " << s.box->x_origin
       << " m, base at " << s.box->bottom << " m";
    lines.push_back(os.str());
    for (const auto& l : s.box->layers)
      lines.push_back("Layer " + l.name + " (" + l.material + ") from " +
                      std::to_string(l.top) + " m");
  } else {
    lines.push_back("Mesh file " + s.mesh_file->path);
  }
  std::ostringstream gw;
  gw << "Initial water table " << s.groundwater.water_table << " m";
  for (const auto& [layer, head] : s.groundwater.layer_heads)
    gw << "; head " << head << " m in " << layer;
  lines.push_back(gw.str());
  lines.push_back(s.gravity_loading
                      ? "Initial stress: a drained gravity-loading solve (its movement "
                        "is not reported)"
                      : "Initial stress: each material's K0 state, taken as in "
                        "equilibrium");
  if (!s.output.displacements_from.empty())
    lines.push_back("Displacements reported from the start of stage '" +
                    s.output.displacements_from + "'");
  return lines;
}

namespace {

/// The least and largest horizontal conductivity of the layers a section's screen
/// crosses, m/s.
std::pair<double, double> screen_conductivities(const Scenario& s, const Well& w) {
  const auto& layers = s.section->layers;
  double least = 0.0, largest = 0.0;
  for (std::size_t k = 0; k < layers.size(); ++k) {
    const double top = layers[k].top;
    const double bottom = k + 1 < layers.size() ? layers[k + 1].top : s.section->bottom;
    if (!(w.screen_top > bottom && w.screen_bottom < top))
      continue;
    const double kx = s.materials.at(layers[k].material).poroelastic.conductivity_x;
    least = least == 0.0 ? kx : std::min(least, kx);
    largest = std::max(largest, kx);
  }
  return {least, largest};
}

} // namespace

std::vector<std::string> advisories(const Scenario& s) {
  std::vector<std::string> out;
  if (!s.section)
    return out;
  for (const auto& w : s.section->wells) {
    const bool by_discharge =
        std::any_of(s.stages.begin(), s.stages.end(), [&](auto& st) {
          const auto t = st.wells.find(w.name);
          return t != st.wells.end() && t->second.kind == Target::Kind::discharge;
        });
    const auto [least, largest] = screen_conductivities(s, w);
    if (by_discharge && least > 0.0 && largest > 10.0 * least) {
      std::ostringstream os;
      os << "well " << w.name << " is held at a discharge that is spread evenly over its "
         << "screen, which crosses layers whose conductivity ranges from " << least
         << " to " << largest
         << " m/s: a real well takes most of its water from the most permeable "
            "one; hold it at a head, or end the screen in that layer";
      out.push_back(os.str());
    }
  }
  return out;
}

} // namespace settlewell::scenario
