#pragma once

#include "settlewell/scenario/scenario.h"

#include <string>
#include <vector>

/// The scenario's parts in words and units, as `check`, results.toml and the report
/// show them. Pure functions.
namespace settlewell::scenario {

/// "fixed head 3 m, roller (normal fixed)".
std::string role_text(const BoundarySpec& b);
/// "head -6 m" or "discharge 150 m3/day".
std::string target_text(const Target& t);
/// What a stage changes ("well W1: head -6 m; 20 kPa on ground_surface (x 0 to 10
/// m)"), or "no change (held)".
std::string stage_changes(const Stage& st);
/// One line per part of the geometry and the initial groundwater.
std::vector<std::string> geometry_lines(const Scenario& s);
/// What a valid scenario should still make its author think twice about, one
/// sentence each (`check` lists them, `run` prints them as warnings): a well held
/// at a discharge whose screen crosses layers of very different conductivity (the
/// discharge is spread evenly over the screen, where a real well takes most of its
/// water from the most permeable layer).
std::vector<std::string> advisories(const Scenario& s);

} // namespace settlewell::scenario
