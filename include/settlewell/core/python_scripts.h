#pragma once

#include <iosfwd>
#include <string>
#include <vector>

namespace settlewell {

/// Runs postprocess/<script> with `arguments` using a Python that has VTK and
/// matplotlib (SETTLEWELL_PYTHON, else /usr/bin/python3, else python3 on the
/// PATH), its output going to `log_file`. The scripts are those of this source
/// tree, or of SETTLEWELL_POSTPROCESS_DIR when set. Returns "" on success, or why
/// it could not run.
std::string run_postprocess(const std::string& script,
                            const std::vector<std::string>& arguments,
                            const std::string& log_file,
                            std::ostream& log);

} // namespace settlewell
