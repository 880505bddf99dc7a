#pragma once

#include <iosfwd>
#include <string>
#include <vector>

namespace settlewell::report {

/// Writes report.html (self-contained, plots embedded) and report.md into a run
/// folder, from its results.toml and tables. The plots are made first by
/// postprocess/plot_run.py with a Python that has VTK and matplotlib; without one
/// the report says so and is written without them. Progress goes to `log`.
/// Throws InputError if the folder is not a finished run.
void write_report(const std::string& run_folder, std::ostream& log);

/// Runs postprocess/<script> with `arguments` using a Python that has VTK and
/// matplotlib (SETTLEWELL_PYTHON, /usr/bin/python3 or python3), its output going
/// to `log_file`. Returns "" on success, or why it could not.
std::string run_postprocess(const std::string& script,
                            const std::vector<std::string>& arguments,
                            const std::string& log_file,
                            std::ostream& log);

} // namespace settlewell::report
