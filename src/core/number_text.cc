#include "settlewell/core/number_text.h"

#include <cmath>
#include <iomanip>
#include <sstream>

namespace settlewell {

std::string significant(double v, int digits) {
  std::ostringstream out;
  const double magnitude = std::abs(v);
  if (v == 0.0 || !std::isfinite(v)) {
    out << v;
    return out.str();
  }
  if (magnitude < 1e-4 || magnitude >= 1e9) {
    out << std::setprecision(digits) << v;
    return out.str();
  }
  const int leading = static_cast<int>(std::floor(std::log10(magnitude)));
  const int decimals = std::max(0, digits - 1 - leading);
  out << std::fixed << std::setprecision(decimals) << v;
  return out.str();
}

std::string day_text(double day) {
  std::string text = significant(day);
  if (text.find('.') != std::string::npos && text.find('e') == std::string::npos) {
    text.erase(text.find_last_not_of('0') + 1);
    if (text.back() == '.')
      text.pop_back();
  }
  return text;
}

std::string place_text(double x, double y, const std::string& region, double day) {
  return "at x " + significant(x) + " m, y " + significant(y) + " m (" + region +
         "), day " + day_text(day);
}

} // namespace settlewell
