#pragma once

// Numbers as a reader of a summary or report wants them: significant figures
// without an exponent, and the place where a headline value was reached.
#include <string>

namespace settlewell {

/// `v` to `digits` significant figures in plain decimals: 5146.4 -> "5146",
/// 15.32 -> "15.3", 0.01234 -> "0.0123" (digits left of the point are kept);
/// an exponent only below 1e-4 or from 1e9 on.
std::string significant(double v, int digits = 3);

/// A day of the run to three significant figures without trailing zeros: 60 ->
/// "60", 7.5 -> "7.5", 0.0375 -> "0.0375", 123.456 -> "123".
std::string day_text(double day);

/// "at x 14.8 m, y -17.2 m (aquifer_sand), day 365": where and when a headline
/// value was reached (x is the radius r in an axisymmetric model).
std::string place_text(double x, double y, const std::string& region, double day);

} // namespace settlewell
