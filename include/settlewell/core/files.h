#pragma once

#include <cstdint>
#include <string>

namespace settlewell {

/// The largest scenario or sweep file read (a TOML text), and the largest mesh file.
inline constexpr std::uintmax_t largest_text_input_bytes = 64ull << 20;
inline constexpr std::uintmax_t largest_mesh_file_bytes = 2ull << 30;

/// Why `path` cannot be read as an input file, or "" if it can: it must exist, be
/// a regular file (not a folder, device or pipe, which can block a reader for
/// ever), hold something, and be at most `largest_bytes` long.
std::string input_file_problem(const std::string& path, std::uintmax_t largest_bytes);

} // namespace settlewell
