#pragma once

// Private to src/monitors: the point histories (points.csv, every step) and the
// section-line profiles (profiles/<line>.csv, output times).
#include "settlewell/monitors/monitor.h"
#include "settlewell/output/csv_file.h"
#include "settlewell/output/samples.h"

#include <optional>

namespace settlewell::monitors {

class PointHistory : public Monitor {
public:
  explicit PointHistory(const RunContext& run);
  void visit_state(StateArchive& a) override;
  void start(const RunView& view) override;
  std::vector<double> after_step(const RunView& view) override;

private:
  void write(const RunView& view);
  SamplePoints points_;
  std::optional<CsvFile> table_;
};

class LineProfiles : public Monitor {
public:
  explicit LineProfiles(const RunContext& run);
  void visit_state(StateArchive& a) override;
  void start(const RunView& view) override;
  void at_output_time(const RunView& view) override;

private:
  std::vector<std::string> names_;
  std::vector<SamplePoints> lines_;
  std::vector<CsvFile> tables_;
};

} // namespace settlewell::monitors
