#pragma once

#include "settlewell/core/errors.h"

#include <sstream>
#include <string>

namespace settlewell::materials_detail {

/// Throws InputError "<where>: <what> (got <value>)" unless `ok`.
inline void
require(bool ok, const std::string& where, const std::string& what, double value) {
  if (ok)
    return;
  std::ostringstream os;
  os << where << ": " << what << " (got " << value << ")";
  throw InputError(os.str());
}

} // namespace settlewell::materials_detail
