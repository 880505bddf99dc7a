#pragma once

#include <iosfwd>
#include <string>

namespace settlewell::report {

/// Writes report.html (self-contained, plots embedded) and report.md into a run
/// folder, from its results.toml and tables. The plots are made first by
/// postprocess/plot_run.py with a Python that has VTK and matplotlib; without one
/// the report says so and is written without them. Progress goes to `log`.
/// Throws InputError if the folder is not a finished run.
void write_report(const std::string& run_folder, std::ostream& log);

} // namespace settlewell::report
