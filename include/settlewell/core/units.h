#pragma once

/// Units inside the program: m, s, kN, kPa. Files the user reads and writes use
/// days for time; these constants convert at the edges.
namespace settlewell::units {

inline constexpr double seconds_per_day = 86400.0;
inline constexpr double seconds_per_year = 365.25 * seconds_per_day;
/// Unit weight of water, kN/m^3 (common practice; input may override).
inline constexpr double default_gamma_w = 9.81;
inline constexpr double pi = 3.14159265358979323846;

inline constexpr double days(double d) {
  return d * seconds_per_day;
}
inline constexpr double to_days(double s) {
  return s / seconds_per_day;
}

} // namespace settlewell::units
