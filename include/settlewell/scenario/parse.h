#pragma once

#include "settlewell/scenario/scenario.h"

#include <string>

namespace settlewell::scenario {

/// Reads and validates a scenario file. Throws InputError with one line
/// "FILE:LINE:COL: message" for any problem; reads nothing else from disk
/// except to check that a referenced mesh file exists.
Scenario read_scenario(const std::string& path);

/// The same from text (for tests); `name` stands in for the file name.
Scenario parse_scenario(const std::string& text, const std::string& name);

} // namespace settlewell::scenario
