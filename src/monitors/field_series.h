#pragma once

// Private to src/monitors: the fields at output times (fields/fields.pvd and its
// VTU or PVTU files).
#include "settlewell/monitors/monitor.h"
#include "settlewell/output/field_writer.h"

#include <optional>

namespace settlewell::monitors {

class FieldSeries : public Monitor {
public:
  explicit FieldSeries(const RunContext& run);
  void start(const RunView& view) override;
  void at_output_time(const RunView& view) override;
  void visit_state(StateArchive& a) override;

private:
  InitialFields initial_;
  std::optional<FieldWriter> writer_;
};

} // namespace settlewell::monitors
