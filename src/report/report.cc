#include "settlewell/report/report.h"

#include "settlewell/core/errors.h"
#include "settlewell/core/file_writing.h"
#include "settlewell/core/number_text.h"
#include "settlewell/core/python_scripts.h"
#include "settlewell/report/document.h"

#include <toml++/toml.h>

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <iomanip>
#include <ostream>
#include <sstream>

namespace settlewell::report {

namespace fs = std::filesystem;
using Flag = Cell::Flag;

namespace {

std::string num(double v, int digits = 3) {
  std::ostringstream os;
  os << std::setprecision(digits) << v;
  return os.str();
}

std::string fixed(double v, int decimals) {
  std::ostringstream os;
  os << std::fixed << std::setprecision(decimals) << v;
  return os.str();
}

template <typename View>
double get(const View& n, double fallback = 0.0) {
  return n.template value<double>().value_or(fallback);
}

template <typename View>
std::string text(const View& n) {
  return std::string(n.template value<std::string_view>().value_or(""));
}

/// A factor of safety (a number, inf when nothing drives the failure, or the words
/// "not evaluated") and its flag.
template <typename View>
Cell factor_cell(const View& node, double limit) {
  const auto f = node.template value<double>();
  if (!f)
    return {text(node).empty() ? "not evaluated" : text(node), Flag::ok};
  if (!std::isfinite(*f))
    return {"∞ (nothing drives it)", Flag::ok};
  return {fixed(*f, 2), *f >= limit ? Flag::ok : Flag::attention};
}

/// Runs the plotting script; returns "" or the reason it could not.
std::string make_plots(const std::string& run, std::ostream& log) {
  return settlewell::run_postprocess("plot_run.py", {run}, run + "/plots.log", log);
}

// --------------------------------------------------------------- sections

void cautions(Document& d) {
  d.add("Read this first")
      .note(
          "These results come from a two-dimensional poroelastic (Biot) model of "
          "the ground. They are an aid to design, not a design. They must be reviewed by "
          "a qualified geotechnical engineer before they are used, and checked against "
          "field observations as the works proceed. Local codes of practice, the "
          "applicable design standards and licensed professional practice govern; no "
          "partial factors are applied here.")
      .list({"Small strains, a linear-elastic isotropic soil skeleton (or Modified Cam "
             "Clay, Roscoe & Burland 1968, for materials with model = \"cam_clay\": "
             "yield from the preconsolidation, hardening on the e-log lines, solved by "
             "Newton's method), Darcy flow. Soil without a retention curve stays "
             "saturated at any suction (capillary saturation retained above the water "
             "table, its conductivity constant); soil with one (materials.<name>."
             "retention) drains above the water table along it (van Genuchten 1980 "
             "with Mualem's conductivity, or Gardner 1958), its conductivity falling "
             "with its saturation, and carries Bishop's effective stress with chi = "
             "S_r at its moist weight: the air stays at atmospheric pressure, the curve "
             "has no hysteresis, and such steps use implicit Euler.",
             "The pit is dug as the stages say (stages[].dig_level): the soil above "
             "each dig level leaves the model at the stage's start and the forces it "
             "carried are released over the ramp; the dug surface drains to the pit's "
             "water level. Soil that no stage digs stays in place, and the base checks "
             "apply from the first dig on.",
             "A plane-strain section treats wells as rows (line sinks) and the pit as "
             "infinitely long; corners and 3D flow are not modelled.",
             "Damage categories are a preliminary screening and do not replace a "
             "structural assessment of the buildings."});
}

void run_section(Document& d, const toml::table& r) {
  const bool balance_ok = r["water_balance"]["closes"].value_or(false);
  const auto& movement = r["plausibility"];
  const double steps_over = get(movement["steps_over_movement_limit"]);
  const double unsettled = get(r["water_balance"]["steps_one_way_unsettled"]);
  const double feeding = get(r["water_balance"]["steps_held_points_feeding"]);
  const auto& summary = r["summary"];
  const double suction_steps = get(summary["steps_over_suction_limit"]);
  double rise = 0.0, rise_steps = 0.0;
  if (const auto* stages = r["head_rise"]["stages"].as_array())
    for (const auto& stage : *stages) {
      rise = std::max(rise, get(stage.as_table()->at_path("largest_rise_m")));
      rise_steps += get(stage.as_table()->at_path("steps_over_limit"));
    }
  Section& run = d.add("Run");
  if (unsettled > 0.0)
    run.note("Attention: in " + num(unsettled, 8) +
             " steps the lines that take water only (wells, seepage faces, the dug "
             "surface) had not settled which of their points drain at the round "
             "limit; those steps keep their last solve (steps.csv drain_rounds).");
  if (feeding > 0.0)
    run.note("Attention: in " + num(feeding, 8) +
             " steps points of the lines that take water only, kept held because "
             "they would leave the draining set and come back, took in more than 1 % "
             "of the water the lines let out (largest " +
             significant(100 * get(r["water_balance"]["largest_held_inflow_share"])) +
             " %): the exit point of a seepage face is not resolved there, the face "
             "feeds the ground and the discharge is too low.");
  run.table(
      {{"item", "value"},
       {{{"scenario"}, {text(r["input"])}},
        {{"scenario SHA-256"}, {text(r["input_sha256"])}},
        {{"program"}, {"settlewell " + text(r["version"])}},
        {{"started / finished (UTC)"},
         {text(r["started"]) + " / " + text(r["finished"])}},
        {{"analysis"}, {text(r["analysis"])}},
        {{"mesh"},
         {num(get(r["cells"]), 8) + " cells, " + num(get(r["unknowns"]), 8) +
          " unknowns"}},
        {{"time steps"}, {num(get(r["steps"]), 8)}},
        {{"processes, wall time"},
         {num(get(r["processes"]), 4) + ", " + fixed(get(r["wall_time_s"]), 1) + " s"}},
        {{"water balance, worst step (relative)"},
         {num(get(r["water_balance"]["largest_relative_error"]), 2) + " (tolerance " +
              num(get(r["water_balance"]["tolerance"]), 2) + "; " +
              num(get(r["water_balance"]["steps_over_tolerance"]), 8) + " steps over it)",
          balance_ok ? Flag::ok : Flag::attention}},
        {{"largest movement of a step (small-strain limit: 5 % of the model's height)"},
         {significant(1000 * get(movement["largest_movement_m"])) + " mm (limit " +
              fixed(1000 * get(movement["movement_limit_m"]), 0) + " mm; " +
              num(steps_over, 8) + " steps over it)",
          steps_over > 0 ? Flag::attention : Flag::ok}},
        {{"largest suction held in saturated soil (kPa)"},
         {significant(get(summary["suction_largest_kPa"])) + " (limit " +
              significant(get(summary["suction_limit_kPa"])) +
              " unless a material gives its own; " + num(suction_steps, 8) +
              " steps over a limit)",
          suction_steps > 0 ? Flag::attention : Flag::ok}},
        {{"largest rise of a head in permeable soil in a stage that only lowers heads "
          "(m)"},
         {significant(rise) + " (limit " + significant(get(r["head_rise"]["limit_m"])) +
              "; " + num(rise_steps, 8) + " steps over it)",
          rise_steps > 0 ? Flag::attention : Flag::ok}}}});
  if (rise_steps > 0)
    run.paragraph(
        "In a stage that only lowers heads (it lowers held heads or pumps more, and "
        "raises none, digs nothing and changes no load), a head in permeable soil "
        "rose by more than the limit: water reaches the ground from somewhere the "
        "stage does not mean it to, most often a boundary held at a head above the "
        "start's water table, or a recharge. Check the boundaries' heads before "
        "using the discharge and the drawdown. (Low-permeability layers are not "
        "watched: their heads rise undrained where the ground beside them "
        "compresses.)");
  if (suction_steps > 0)
    run.paragraph(
        "Above the water table the model keeps the soil saturated, so a lowered "
        "water table leaves suction there that counts fully in the effective stress. "
        "Real soil drains beyond its air-entry value and keeps only the change of "
        "its moist weight, and gives up the water of its pores: where the suction "
        "exceeds the limit, the settlement there is overestimated, and that water is "
        "missing from the discharge and its timing (unsaturated flow is not "
        "modelled).");
}

void inputs_section(Document& d, const toml::table& r) {
  Section& s = d.add("Inputs");
  std::vector<std::string> geometry;
  if (const auto* g = r["inputs"]["geometry"].as_array())
    for (const auto& line : *g)
      geometry.push_back(std::string(line.value<std::string_view>().value_or("")));
  s.list(geometry);
  Table materials{{"region", "material", "unit weight (kN/m³)", "E' (kPa)", "ν'",
                   "mv (1/MPa)", "kx (m/s)", "ky (m/s)", "K0"},
                  {}};
  std::vector<std::string> clays;
  if (const auto* ms = r["inputs"]["materials"].as_array())
    for (const auto& node : *ms) {
      const auto& m = *node.as_table();
      // A Cam Clay's stiffness follows its stress: no single E' or mv.
      const bool clay = m.contains("cam_clay");
      if (clay)
        clays.push_back(text(m["region"]) + ": Modified Cam Clay, " +
                        text(m["cam_clay"]));
      materials.rows.push_back({{text(m["region"])},
                                {text(m["material"])},
                                {num(get(m["unit_weight"]))},
                                {clay ? "Cam Clay" : num(get(m["youngs_modulus_kPa"]))},
                                {num(get(m["poisson_ratio"]))},
                                {clay ? "Cam Clay" : num(1000 * get(m["mv_per_kPa"]))},
                                {num(get(m["kx"]))},
                                {num(get(m["ky"]))},
                                {num(get(m["k0"]))}});
    }
  s.table(materials);
  if (!clays.empty())
    s.list(clays);
  Table boundaries{{"boundary", "hydraulic, mechanical"}, {}};
  if (const auto* bs = r["inputs"]["boundaries"].as_array())
    for (const auto& node : *bs)
      boundaries.rows.push_back(
          {{text((*node.as_table())["name"])}, {text((*node.as_table())["role"])}});
  s.table(boundaries);
  Table stages{{"stage", "days", "ramp (days)", "changes"}, {}};
  if (const auto* st = r["inputs"]["stages"].as_array())
    for (const auto& node : *st) {
      const auto& t = *node.as_table();
      stages.rows.push_back(
          {{text(t["name"])},
           {num(get(t["start_days"]), 6) + " to " + num(get(t["end_days"]), 6)},
           {num(get(t["ramp_days"]), 6)},
           {text(t["changes"])}});
    }
  s.table(stages);
}

/// " at x 37.3 m, y 6.00 m (upper_sand), day 365" for a summary value `key` that
/// has a place (`key`_at), or "".
std::string place_of(const toml::table& summary, const std::string& key) {
  const auto* at = summary[key + "_at"].as_table();
  if (at == nullptr)
    return "";
  return " " + place_text(get((*at)["x_m"]), get((*at)["y_m"]), text((*at)["region"]),
                          get((*at)["time_days"]));
}

void glance_section(Document& d, const toml::table& r, const std::string& unit) {
  Section& s = d.add("Results at a glance");
  const auto& sum = *r["summary"].as_table();
  std::vector<std::string> items;
  const auto mm = [&](const std::string& key) {
    return significant(1000 * get(sum[key + "_m"])) + " mm" + place_of(sum, key);
  };
  const bool dug = sum.contains("floor_heave_m");
  if (sum.contains("settlement_inside_m"))
    items.push_back(std::string("Largest settlement inside the wall (pit surface") +
                    (dug ? ", until dug): " : "): ") + mm("settlement_inside"));
  if (dug)
    items.push_back(
        "Largest heave inside the wall (ground left in the pit, since the start): " +
        mm("floor_heave"));
  if (sum.contains("settlement_outside_m"))
    items.push_back("Largest settlement outside the wall (ground surface): " +
                    mm("settlement_outside"));
  items.push_back("Largest settlement anywhere: " + mm("settlement_anywhere"));
  if (sum.contains("drawdown_outside_m"))
    items.push_back("Largest drawdown outside the wall: " +
                    significant(get(sum["drawdown_outside_m"])) + " m" +
                    place_of(sum, "drawdown_outside"));
  if (const auto* regions = sum["drawdown_outside_by_region"].as_array()) {
    std::string each;
    for (const auto& node : *regions) {
      const auto& t = *node.as_table();
      each += (each.empty() ? "" : "; ") + text(t["region"]) + " " +
              significant(get(t["drawdown_m"])) + " m";
    }
    if (!each.empty())
      items.push_back("Largest drawdown outside the wall in each layer: " + each);
  }
  const bool half = r["modelled_half"].value_or(false);
  if (const auto* q = r["discharge"].as_array())
    for (const auto& node : *q) {
      const auto& t = *node.as_table();
      const double volume = get(t["volume_m3"]), rate = get(t["final_m3_per_day"]);
      items.push_back(
          "Pumped by " + text(t["line"]) + ": " + significant(volume) + " m³ " + unit +
          " in all, " + significant(rate) + " m³/day " + unit + " at the end" +
          (half ? " in the modelled half; the whole pit: " + significant(2 * volume) +
                      " m³ and " + significant(2 * rate) + " m³/day " + unit
                : ""));
    }
  s.list(items);
}

/// Where the pumped water came from: each line that holds a head or a flux, and
/// storage, as shares of the pumped volume and of the discharge at the end.
void budget_table(Section& s, const toml::table& r, const std::string& unit) {
  const auto* sources = r["water_budget"]["sources"].as_array();
  if (sources == nullptr)
    return;
  s.paragraph("Where the pumped water comes from (m³ " + unit +
              "): the net inflow through each boundary or line that holds a head or a "
              "flux, and the water released from storage (the soil's compression and "
              "the water's). The shares add up to the pumped total within the water "
              "balance; a negative share is water that left there.");
  Table t{{"source", "volume (m³)", "share of the pumped volume",
           "rate at the end (m³/day)", "share of the discharge at the end"},
          {}};
  const auto percent = [](double v) { return significant(100 * v) + " %"; };
  for (const auto& node : *sources) {
    const auto& src = *node.as_table();
    const std::string kind = text(src["kind"]);
    t.rows.push_back({{kind == "storage" ? "storage (released by the soil and the water)"
                                         : text(src["name"]) + " (" + kind + ")"},
                      {significant(get(src["volume_m3"]))},
                      {percent(get(src["share_of_pumped_volume"]))},
                      {significant(get(src["final_m3_per_day"]))},
                      {percent(get(src["share_of_final_discharge"]))}});
  }
  s.table(t);
  if (const auto drained = r["water_budget"]["drained_from_pores_m3"].value<double>())
    s.paragraph("Of the storage's share, " + significant(*drained) + " m³ " + unit +
                " drained from the pores of the soils with a retention curve, above "
                "the phreatic line (the dashed line p = 0 of the section views): the "
                "integral of the fall of their water content since the start.");
  if (const auto warning = r["water_budget"]["warning"].value<std::string>())
    s.note("Attention: " + *warning + ".");
}

/// The water level in a well of each plane-strain row that gives a spacing.
void well_level_table(Section& s, const toml::table& r) {
  const auto* rows = r["well_levels"].as_array();
  if (rows == nullptr || rows->empty())
    return;
  s.paragraph(
      "The section carries a row of wells as a line whose head is the row's average. "
      "In each well the water stands lower by the convergence loss of an infinite row "
      "of equal wells in steady flow, Q/(2πT)·ln(a/(2πr)) with Q the discharge of one "
      "well (the row's per metre run times the spacing a), T the horizontal "
      "conductivity integrated along the screen and r the well's radius (Muskat "
      "1937). Not included: the losses of the screen and filter pack (well "
      "efficiency) and of partial penetration, which lower the level in the well "
      "further.");
  Table t{{"row", "spacing / radius (m)", "T (m²/day)", "row average at the end (m)",
           "convergence loss (m)", "level in a well at the end (m)",
           "lowest level (m, day)", "screen bottom (m)"},
          {}};
  for (const auto& node : *rows) {
    const auto& w = *node.as_table();
    const bool dry = w["below_screen_bottom"].value_or(false);
    const auto lowest = w["lowest_level_m"].value<double>();
    t.rows.push_back(
        {{text(w["well"])},
         {significant(get(w["spacing_m"])) + " / " + significant(get(w["radius_m"]))},
         {significant(get(w["transmissivity_m2_per_day"]))},
         {significant(get(w["row_head_at_end_m"]))},
         {significant(get(w["convergence_loss_at_end_m"]))},
         {significant(get(w["level_at_end_m"]))},
         lowest ? Cell{significant(*lowest) + " (day " +
                           day_text(get(w["lowest_level_day"])) + ")",
                       dry ? Flag::attention : Flag::ok}
                : Cell{"not pumped"},
         {significant(get(w["screen_bottom_m"]))}});
    if (const auto warning = w["warning"].value<std::string>())
      s.note("Attention: " + *warning + ".");
  }
  s.table(t);
}

/// The steps in which a pumped line put water into the ground, was sealed where it
/// would have, or ran dry: a flagged column each, where any line has such steps.
void line_step_columns(Section& s, const toml::array& lines, Table& t) {
  struct Kind {
    const char* key;
    const char* header;
    const char* meaning;
  };
  const Kind kinds[] = {
      {"steps_injecting", "steps putting water into the ground",
       "A recharge well puts water into the ground by design; any other line with "
       "such steps had a discharge target below zero."},
      {"steps_stopped", "steps stopped (it would inject)",
       "A pumped line (a well, a held excavation level) takes water only: in the "
       "steps counted its held head stood above the ground's around it, so that "
       "held it would have put water in, and it stood stopped and sealed instead. "
       "Check its target heads: a line stopped all along pumps nothing."},
      {"steps_dry", "steps run dry",
       "A well whose target head lies below its screen has run dry: its screen "
       "drains at atmospheric pressure, and the head it was asked for is not "
       "reached."}};
  for (const auto& kind : kinds) {
    const auto any = std::any_of(lines.begin(), lines.end(), [&](const auto& node) {
      return get((*node.as_table())[kind.key]) > 0.0;
    });
    if (!any)
      continue;
    t.header.push_back(kind.header);
    for (std::size_t i = 0; i < lines.size(); ++i) {
      const auto& line = *lines[i].as_table();
      const double n = get(line[kind.key]);
      const bool expected = line["recharge"].value_or(false) && &kind == &kinds[0];
      t.rows[i].push_back({num(n, 8), n > 0.0 && !expected ? Flag::attention : Flag::ok});
    }
    s.paragraph(kind.meaning);
  }
}

void discharge_section(Document& d, const toml::table& r, const std::string& unit) {
  const auto* q = r["discharge"].as_array();
  if (q == nullptr || q->empty())
    return;
  Section& s = d.add("Pumped discharge");
  s.paragraph(
      "Discharges are the consistent flux at the pumped lines (the residual of the "
      "storage equation where heads are prescribed), in m³/day " +
      unit + ".");
  Table t{{"line", "rate at the end (m³/day)"}, {}};
  if (const auto* stages = r["stages"].as_array())
    for (const auto& st : *stages)
      t.header.push_back("volume in " + text((*st.as_table())["name"]) + " (m³)");
  t.header.push_back("total volume (m³)");
  for (const auto& node : *q) {
    const auto& line = *node.as_table();
    const bool recharge = line["recharge"].value_or(false);
    std::vector<Cell> row{{text(line["line"]) + (recharge ? " (recharge)" : "")},
                          {significant(get(line["final_m3_per_day"]))}};
    if (const auto* vs = line["stage_volumes_m3"].as_array())
      for (const auto& v : *vs)
        row.push_back({significant(v.value<double>().value_or(0.0))});
    row.push_back({significant(get(line["volume_m3"]))});
    t.rows.push_back(row);
  }
  line_step_columns(s, *q, t);
  s.table(t).image("plots/discharge.png", "Pumped discharge against time");
  budget_table(s, r, unit);
  well_level_table(s, r);
}

void base_stages_table(Section& s, const toml::table& b) {
  const auto* stages = b["stages"].as_array();
  if (stages == nullptr)
    return;
  Table t{{"stage", "dug to (m)", "least piping factor", "least heave factor",
           "least uplift factor"},
          {}};
  const double piping = get(b["piping"]["limit"]);
  const double heave = b["heave"][0]["limit"].value_or(0.0);
  const double uplift = b["uplift"][0]["limit"].value_or(0.0);
  for (const auto& node : *stages) {
    const auto& st = *node.as_table();
    const auto level = st["dig_level_m"].value<double>();
    t.rows.push_back({{text(st["name"])},
                      {level ? num(*level, 4) : text(st["dig_level_m"])},
                      factor_cell(st["least_piping_factor"], piping),
                      factor_cell(st["least_heave_factor"], heave),
                      factor_cell(st["least_uplift_factor"], uplift)});
  }
  s.table(t);
}

/// `figures_drawn`: the plotting script ran, so a chart it did not write has nothing
/// to show.
void base_section(Document& d,
                  const toml::table& r,
                  const std::string& run,
                  bool figures_drawn) {
  const auto* b = r["base_stability"].as_table();
  if (b == nullptr)
    return;
  Section& s = d.add("Base stability");
  if (b->contains("skipped")) {
    s.paragraph("Not checked: " + text((*b)["skipped"]) + ".");
    return;
  }
  s.paragraph(
      "Each factor is for the level the pit is dug to at each output time, on the "
      "field of that time with the pit as dug; a check that cannot apply (the pit not "
      "dug yet, the wall toe or a layer's underside above the floor) says why. "
      "\"Holds from\" is the first day after which the factor stays at or above its "
      "limit.");
  Table t{{"check", "method", "least", "at the end", "limit", "holds from (day)"}, {}};
  auto row = [&](const std::string& name, const std::string& method,
                 const toml::table& f) {
    const double limit = get(f["limit"]);
    if (!f["evaluated"].value_or(false)) {
      t.rows.push_back({{name},
                        {method},
                        {"not evaluated: " + text(f["reason"]), Flag::ok},
                        {"-"},
                        {fixed(limit, 2)},
                        {"-"}});
      return;
    }
    const auto holds = f["holds_from_days"].value<double>();
    t.rows.push_back(
        {{name},
         {method},
         factor_cell(f["least"], limit),
         factor_cell(f["at_end"], limit),
         {fixed(limit, 2)},
         holds ? Cell{num(*holds, 6), Flag::ok} : Cell{"never", Flag::attention}});
  };
  const std::string exit =
      (*b)["exit_gradient_at_end"].is_number()
          ? " (exit gradient " + num(get((*b)["exit_gradient_at_end"])) +
                " at the end, critical " + num(get((*b)["critical_gradient"])) + ")"
          : "";
  row("piping at the floor" + exit, "i_c / i_exit, i_c = γ'/γw (Terzaghi 1922, 1943)",
      *(*b)["piping"].as_table());
  if (const auto* heave = (*b)["heave"].as_array())
    for (const auto& h : *heave)
      row("heave beside the " + text((*h.as_table())["side"]) + " wall toe (prism " +
              num(get((*h.as_table())["depth_at_end_m"])) + " m deep, " +
              num(get((*h.as_table())["width_at_end_m"])) + " m wide at the end)",
          "γ' d / (γw h_a) on the prism d × d/2, or the whole floor when narrower "
          "(Terzaghi 1943)",
          *h.as_table());
  if (const auto why = (*b)["heave_not_checked"].value<std::string>())
    t.rows.push_back({{"heave beside the wall toe"},
                      {"Terzaghi (1943)"},
                      {"not evaluated: " + *why, Flag::ok},
                      {"-"},
                      {"-"},
                      {"-"}});
  if (const auto* uplift = (*b)["uplift"].as_array())
    for (const auto& u : *uplift)
      row("uplift of " + text((*u.as_table())["layer"]) + " (underside " +
              num(get((*u.as_table())["underside_m"])) + " m)",
          "Σγt / u at the underside (common practice; Terzaghi, Peck & Mesri 1996)",
          *u.as_table());
  s.table(t);
  base_stages_table(s, *b);
  if (figures_drawn && !fs::exists(run + "/plots/base_stability.png"))
    s.paragraph("No chart of the factors against time: no factor was evaluated below "
                "20 at any output time.");
  else
    s.image("plots/base_stability.png", "Factors of safety against time");
}

/// A value of a per-stage list ([[x.stages]] with a "stage" or "name" key).
const toml::table* stage_entry(const toml::node_view<const toml::node>& list,
                               const std::string& stage) {
  if (const auto* entries = list.as_array())
    for (const auto& e : *entries) {
      const auto& t = *e.as_table();
      if (text(t["stage"]) == stage || text(t["name"]) == stage)
        return &t;
    }
  return nullptr;
}

/// Per construction stage: the dig level, the least base factors, the props' and
/// the wall's largest forces and movements, and the settlement behind the wall.
void stages_section(Document& d, const toml::table& r) {
  const auto* stages = r["stages"].as_array();
  const bool digs = r["base_stability"]["dig_level_at_end_m"].is_number();
  if (stages == nullptr || (!digs && !r["props"].is_array()))
    return;
  Section& s = d.add("Construction stages");
  s.paragraph(
      "The largest values of each stage (its output times). Wall deflection is towards "
      "the pit; the bending moment is positive with the pit-side face in tension.");
  Table t{{"stage", "dug to (m)", "least piping / heave / uplift factor",
           "largest prop force", "largest wall deflection (mm)",
           "largest wall moment (kNm/m)", "largest settlement behind the wall (mm)"},
          {}};
  const auto base = r["base_stability"]["stages"];
  const auto wall = r["wall"]["sides"][0]["stages"];
  for (const auto& node : *stages) {
    const std::string name = text((*node.as_table())["name"]);
    std::vector<Cell> row{{name}};
    const auto* b = stage_entry(base, name);
    const auto level = b ? (*b)["dig_level_m"].value<double>() : std::nullopt;
    row.push_back({level ? num(*level, 4) : "not dug"});
    std::string factors;
    for (const char* key :
         {"least_piping_factor", "least_heave_factor", "least_uplift_factor"}) {
      const auto f = b ? (*b)[key].value<double>() : std::nullopt;
      factors += std::string(factors.empty() ? "" : " / ") +
                 (f ? (std::isfinite(*f) ? fixed(*f, 2) : "∞") : "-");
    }
    row.push_back({factors});
    std::string props;
    if (const auto* ps = r["props"].as_array())
      for (const auto& p : *ps) {
        const auto* e = stage_entry((*p.as_table())["stages"], name);
        const auto f = e ? (*e)["largest_force"].value<double>() : std::nullopt;
        props += std::string(props.empty() ? "" : "; ") + text((*p.as_table())["name"]) +
                 " " + (f ? num(*f, 3) : "-");
      }
    row.push_back({props.empty() ? "-" : props});
    const auto* w = stage_entry(wall, name);
    row.push_back({w ? significant(get((*w)["largest_deflection_mm"]["value"])) : "-"});
    row.push_back({w ? num(get((*w)["largest_moment_kNm_per_m"]["value"]), 4) : "-"});
    const auto* e = stage_entry(r["summary"]["stages"], name);
    row.push_back({e ? significant(1000 * get((*e)["settlement_outside_m"])) : "-"});
    t.rows.push_back(row);
  }
  s.table(t);
  if (r["props"].is_array())
    s.paragraph("Prop forces are " + text(r["props"][0]["unit"]) + ".");
  s.image("plots/wall.png",
          "Wall deflection and bending moment at the end of each stage");
}

/// Which clays with a stress history yielded, and where.
void clay_section(Document& d, const toml::table& r) {
  const auto* clays = r["clay_yield"].as_array();
  if (clays == nullptr || clays->empty())
    return;
  Section& s = d.add("Clays with a stress history");
  std::vector<std::string> items;
  for (const auto& node : *clays) {
    const auto& c = *node.as_table();
    const std::string name = text(c["region"]);
    if (get(c["yielded_points"]) == 0.0) {
      items.push_back(name + " stayed inside its yield surface everywhere: it "
                             "recompressed (Cr) and did not yield.");
      continue;
    }
    const double change = get(c["largest_change_of_yield_size_kpa"]);
    items.push_back(name + " yielded in " + fixed(100 * get(c["yielded_share"]), 0) +
                    " % of its points, within x " + num(get(c["x_from_m"])) + " to " +
                    num(get(c["x_to_m"])) + " m and elevation " +
                    num(get(c["elevation_from_m"])) + " to " +
                    num(get(c["elevation_to_m"])) + " m; its preconsolidation (p'c) " +
                    (change >= 0 ? "rose" : "fell") + " by up to " +
                    significant(std::abs(change)) + " kPa. Settlement there follows Cc.");
  }
  s.list(items);
  s.paragraph("Modified Cam Clay (Roscoe & Burland 1968): a point has yielded when its "
              "yield size p'c has changed from the start's. The yield_size and "
              "yield_ratio fields show where (yield_ratio 1: yielding at that time).");
}

/// Where the settlement under a building fell back by the end (the heads rose
/// again): how much of its largest remains.
void recovery_paragraph(Section& s, const toml::array& neighbours) {
  std::vector<std::string> items;
  for (const auto& node : neighbours) {
    const auto& n = *node.as_table();
    const double largest = get(n["largest_settlement_m"]);
    const double end = get(n["settlement_at_end_m"], largest);
    if (!(largest > 0.0) || end >= 0.98 * largest)
      continue;
    items.push_back(text(n["name"]) + ": " + significant(1000 * end) +
                    " mm at the end of " + significant(1000 * largest) + " mm at most, " +
                    fixed(100 * end / largest, 0) + " % of it");
  }
  if (items.empty())
    return;
  s.paragraph("The settlement fell back after its largest value (the heads rose "
              "again); what remains at the end of the run:");
  s.list(items);
}

void neighbours_section(Document& d, const toml::table& r) {
  const auto* ns = r["neighbours"].as_array();
  if (ns == nullptr || ns->empty())
    return;
  const double s_limit = get(r["neighbour_limits"]["settlement_m"]);
  const double b_limit = get(r["neighbour_limits"]["angular_distortion"]);
  Section& s = d.add("Neighbouring buildings");
  s.note("A preliminary damage screening from the computed ground movement at foundation "
         "level (greenfield, without the buildings' stiffness). It does not replace a "
         "structural assessment of the buildings.");
  Table t{{"building", "foundation", "largest settlement (mm)", "angular distortion",
           "deflection ratio", "horizontal strain", "tensile strain", "category",
           "at day"},
          {}};
  for (const auto& node : *ns) {
    const auto& n = *node.as_table();
    const double settlement = get(n["largest_settlement_m"]);
    const double beta = get(n["largest_angular_distortion"]);
    const int category = int(get(n["category"]));
    t.rows.push_back({{text(n["name"])},
                      {"x " + num(get(n["x_from_m"])) + " to " + num(get(n["x_to_m"])) +
                       " m at " + num(get(n["foundation_level_m"])) + " m"},
                      {significant(1000 * settlement),
                       settlement > s_limit ? Flag::attention : Flag::ok},
                      {"1/" + num(beta > 0 ? 1.0 / beta : 0.0, 4),
                       beta > b_limit ? Flag::attention : Flag::ok},
                      {num(get(n["deflection_ratio"]), 2) +
                       (n["hogging"].value_or(false) ? " hogging" : " sagging")},
                      {num(get(n["horizontal_strain"]), 2)},
                      {significant(100 * get(n["principal_strain"])) + " %"},
                      {std::to_string(category) + (category == 4 ? "-5 " : " ") +
                           text(n["degree"]) + " (" + text(n["crack_width"]) + ")",
                       category >= 3 ? Flag::attention : Flag::ok},
                      {num(get(n["time_days"]), 6)}});
  }
  s.table(t);
  recovery_paragraph(s, *ns);
  s.paragraph(
      "Measures as defined by Burland & Wroth (1974): tilt from the ends, angular "
      "distortion as the largest slope minus the tilt, deflection ratio from the "
      "chord. Category from the limiting tensile strain (Burland et al. 1977; "
      "Boscardin & Cording 1989; Burland 1995): the principal strain from the "
      "horizontal strain and angular distortion, and, where a height is given, the "
      "deep-beam bending and diagonal strains (Burland 1995; E/G = 2.6), whichever is "
      "worse. Flagged: settlement above " +
      fixed(1000 * s_limit, 0) + " mm, angular distortion above 1/" +
      num(1.0 / b_limit, 4) + ", category 3 (moderate) or worse.");
  s.image("plots/trough.png", "Settlement trough along the ground surface");
}

void columns_section(Document& d, const toml::table& r) {
  const auto* cs = r["columns"].as_array();
  if (cs == nullptr || cs->empty())
    return;
  Section& s = d.add("1D hand estimate against the 2D model");
  s.paragraph(
      "At each column the 1D method is applied to the regions the column crosses "
      "in the mesh, top down: the effective stress rises by γw·Δh in the draining "
      "layers; clays next to each other form one sequence, drained through each "
      "outer face that meets a draining layer (or a ground surface that holds its "
      "head), with the head fall at that face; through a sequence drained at both "
      "faces the final fall is that of steady seepage across it (each clay's share "
      "by H/k), with one drained face it is that face's fall; S = Σ mv·Δσ'·H; t50 "
      "and t90 from Tv = 0.197 and 0.848 (common practice), a sequence's drainage "
      "path by the transformed-thickness approximation (common practice); U(t) from "
      "Terzaghi (1925) for an instantaneous drop and Olson (1977) for the ramp. "
      "\"Design\" uses the head falls the scenario sets (the wells' target heads, "
      "in the layer of each screen); \"2D heads\" uses the heads the 2D model "
      "computes at the column, at each clay's own faces. What the notes under each "
      "table can show: heads that fall less than designed (distance, flow round the "
      "wall, recharge), consolidation lagging a ramp, and ground that is not in 1D "
      "strain (the wall, the 2D shape of the drawdown).");
  for (const auto& node : *cs) {
    const auto& c = *node.as_table();
    const std::string name = text(c["name"]);
    Table t{{"column " + name + " at x = " + num(get(c["x_m"])) + " m", "value"}, {}};
    t.rows.push_back({{"2D settlement at day " + num(get(c["end_days"]), 6)},
                      {significant(1000 * get(c["settlement_2d_end_m"])) + " mm"}});
    t.rows.push_back(
        {{"1D with the 2D heads, same day (ramped)"},
         {significant(1000 * get(c["settlement_1d_computed_end_m"])) +
          " mm; S2D/S1D = " + fixed(get(c["ratio_2d_to_1d_computed_end"]), 2)}});
    if (c.contains("design"))
      t.rows.push_back(
          {{"1D with the design drawdown, same day (ramped)"},
           {significant(1000 * get(c["settlement_1d_design_end_m"])) +
            " mm; S2D/S1D = " + fixed(get(c["ratio_2d_to_1d_design_end"]), 2)}});
    t.rows.push_back({{"ultimate 1D settlement (2D heads)"},
                      {significant(1000 * get(c["computed"]["ultimate_m"])) + " mm"}});
    t.rows.push_back(
        {{"time to half the settlement at the end: 2D / 1D (2D heads, ramped)"},
         {num(get(c["t50_2d_days"]), 4) + " / " + num(get(c["t50_1d_days"]), 4) +
          " days" +
          (get(c["t50_1d_days"]) > 0.0
               ? "; ratio " + fixed(get(c["t50_2d_days"]) / get(c["t50_1d_days"]), 2)
               : std::string())}});
    s.table(t);
    Table layers{{"layer", "drained faces", "Hdr (m)", "cv (m²/year)", "t50 (days)",
                  "t90 (days)", "S, 2D heads (mm)"},
                 {}};
    if (const auto* ls = c["computed"]["layers"].as_array())
      for (const auto& ln : *ls) {
        const auto& l = *ln.as_table();
        const bool consolidating = l["consolidating"].value_or(false);
        layers.rows.push_back(
            {{text(l["name"])},
             {consolidating ? num(get(l["drained_faces"])) : "draining"},
             {consolidating ? num(get(l["drainage_path_m"])) : "-"},
             {consolidating ? num(get(l["cv_m2_per_year"])) : "-"},
             {consolidating ? num(get(l["t50_days"]), 4) : "-"},
             {consolidating ? num(get(l["t90_days"]), 4) : "-"},
             {significant(1000 * get(l["settlement_m"]))}});
      }
    s.table(layers);
    std::vector<std::string> notes;
    if (const auto* ns = c["notes"].as_array())
      for (const auto& n : *ns)
        notes.push_back(std::string(n.value<std::string_view>().value_or("")));
    s.list(notes);
    s.image("plots/one_d_" + name + ".png",
            "Column " + name + ": settlement against time");
  }
}

void views_section(Document& d, const std::string& run) {
  Section& s = d.add("Section views and time histories");
  std::vector<std::string> files;
  if (fs::exists(run + "/plots"))
    for (const auto& entry : fs::directory_iterator(run + "/plots"))
      if (entry.path().filename().string().rfind("section_", 0) == 0)
        files.push_back(entry.path().filename().string());
  std::sort(files.begin(), files.end());
  for (const auto& f : files) {
    const bool drawdown = f.find("drawdown") != std::string::npos;
    const std::string day = f.substr(f.find("day") + 3, f.size() - f.find("day") - 7);
    s.image("plots/" + f, std::string(drawdown ? "Drawdown" : "Settlement") +
                              " over the section at day " + day +
                              " (layers, wall, wells and excavation level drawn in)");
  }
  s.image("plots/histories.png", "Drawdown and settlement at the monitoring points");
}

/// How the run started and where its movements are measured from.
std::string start_text(const toml::table& r) {
  const auto start = r["initial_state"];
  std::string line =
      text(start["method"]) == "gravity"
          ? "Initial heads hydrostatic below the water table or as given per layer; "
            "geostatic stress from a drained gravity-loading solve with the saturated "
            "unit weights (its movement is not reported)."
          : "Initial heads hydrostatic below the water table or as given per layer; "
            "geostatic stress from the saturated unit weights and K0 (above the water "
            "table, the moist weight and Bishop's stress of a soil with a retention "
            "curve), taken as in equilibrium.";
  if (const auto stage = start["displacements_from_stage"].value<std::string>())
    line += " Displacements, settlements and strains are reported from the start of "
            "stage '" +
            *stage + "' (before it, from the start of the analysis).";
  return line;
}

void limits_section(Document& d, const toml::table& r) {
  d.add("Assumptions and limits")
      .list(
          {"Quasi-static Biot consolidation, Taylor-Hood elements, BDF2 in time "
           "(implicit Euler at stage starts); "
           "verified against published solutions (settlewell verify).",
           "Conductivity is often uncertain by an order of magnitude; run bounding "
           "cases.",
           start_text(r),
           "Base checks are screening factors of common practice, without the partial "
           "factors of a design code.",
           "Ground movements are greenfield: the buildings' stiffness is not modelled."})
      .note(
          "Review by a qualified geotechnical engineer is required before these results "
          "are used. Local codes and licensed practice govern.");
}

} // namespace

void write_report(const std::string& run, std::ostream& log) {
  const std::string results_path = run + "/results.toml";
  if (!fs::exists(results_path))
    throw InputError(run + ": not a finished run folder (no results.toml)");
  toml::table r;
  try {
    r = toml::parse_file(results_path);
  } catch (const toml::parse_error& e) {
    throw InputError(results_path + ": cannot be read (" + std::string(e.description()) +
                     ")");
  }
  const std::string plot_problem = make_plots(run, log);
  const std::string unit = text(r["discharge_unit"]);
  Document d;
  d.title = "Settlewell report: " + text(r["title"]);
  d.subtitle = "Coupled seepage and consolidation of a dewatered excavation; run of " +
               text(r["finished"]) + " (UTC)";
  cautions(d);
  if (!plot_problem.empty())
    d.sections.front().note("Figures are missing from this report: " + plot_problem +
                            ".");
  glance_section(d, r, unit);
  run_section(d, r);
  inputs_section(d, r);
  discharge_section(d, r, unit);
  base_section(d, r, run, plot_problem.empty());
  stages_section(d, r);
  clay_section(d, r);
  neighbours_section(d, r);
  columns_section(d, r);
  views_section(d, run);
  limits_section(d, r);
  write_whole_file(run + "/report.html",
                   [&](std::ostream& out) { out << to_html(d, run); });
  write_whole_file(run + "/report.md", [&](std::ostream& out) { out << to_markdown(d); });
  log << "wrote " << run << "/report.html and " << run << "/report.md\n";
}

} // namespace settlewell::report
