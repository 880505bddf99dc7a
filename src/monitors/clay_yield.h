#pragma once

// Private to src/monitors: where each clay with a stress history (Cam Clay) has
// yielded by the end of the run, for the results and the report.
#include "settlewell/monitors/monitor.h"

namespace settlewell::monitors {

class ClayYield : public Monitor {
public:
  void finish(const RunView& view, toml::table& results) override;
};

} // namespace settlewell::monitors
