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

void FieldSeries::visit_state(StateArchive& a) {
  if (a.loading())
    writer_.emplace(a.folder() + "/fields", "fields", a.comm(), initial_);
  a&* writer_;
}

} // namespace settlewell::monitors
