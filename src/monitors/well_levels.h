#pragma once

// Private to src/monitors: the water level in a well of a plane-strain row. The
// section carries the row as a line sink whose head is the row's average; in each
// well the water stands lower by the convergence loss of an infinite row of wells
// (Muskat 1937), which needs the row's spacing and the wells' radius.
#include "settlewell/monitors/monitor.h"
#include "settlewell/output/samples.h"

#include <string>
#include <vector>

namespace settlewell::monitors {

class WellLevels : public Monitor {
public:
  /// The rows of the section that give a spacing. Collective.
  explicit WellLevels(const RunContext& run);
  void visit_state(StateArchive& a) override;
  std::vector<std::string> step_columns() const override;
  std::vector<double> after_step(const RunView& view) override;
  void finish(const RunView& view, toml::table& results) override;

  /// Whether the scenario has a row of wells with a spacing.
  static bool wanted(const scenario::Scenario& s);

private:
  struct Row {
    scenario::Well well;
    std::string line;            ///< the pumped line of the row
    SamplePoints screen;         ///< along the screen, for the row's average head
    double transmissivity = 0.0; ///< m^2/s: horizontal k along the screen
    double row_head = 0.0, loss = 0.0, level = 0.0; ///< at the last step, m
    double lowest = 0.0, lowest_at = 0.0;           ///< lowest level (m) and its time (s)
    bool pumped = false;                            ///< has pumped in a step so far
  };
  std::vector<Row> rows_;
};

} // namespace settlewell::monitors
