#include "field_series.h"

namespace settlewell::monitors {

FieldSeries::FieldSeries(const RunContext& run)
    : initial_(run.initial.fields()) {}

void FieldSeries::start(const RunView& view) {
  writer_.emplace(view.folder + "/fields", "fields", view.comm(), initial_);
}

void FieldSeries::at_output_time(const RunView& view) {
  writer_->write(view.run.problem);
}

} // namespace settlewell::monitors
