#pragma once

#include <functional>
#include <ostream>
#include <string>

namespace settlewell {

/// Writes a whole file on the calling process: into `path` + ".partial" first,
/// renamed to `path` once complete, so that no reader (nor a run killed half way)
/// leaves half a file under the real name. Throws SystemError naming the file and
/// the system's reason if the file cannot be written or renamed (a full disk, a
/// folder that vanished).
void write_whole_file(const std::string& path,
                      const std::function<void(std::ostream&)>& write);

/// Throws SystemError naming `path` and errno's reason if `out` has failed.
void check_stream(const std::ostream& out, const std::string& path);

} // namespace settlewell
