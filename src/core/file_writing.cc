#include "settlewell/core/file_writing.h"

#include "settlewell/core/errors.h"

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <fstream>

namespace settlewell {

void check_stream(const std::ostream& out, const std::string& path) {
  if (!out)
    throw SystemError(path + ": cannot write (" +
                      (errno != 0 ? std::strerror(errno) : "the stream failed") + ")");
}

void write_whole_file(const std::string& path,
                      const std::function<void(std::ostream&)>& write) {
  const std::string partial = path + ".partial";
  try {
    errno = 0;
    std::ofstream out(partial, std::ios::binary);
    check_stream(out, partial);
    write(out);
    out.flush();
    check_stream(out, partial);
    out.close();
    check_stream(out, partial);
  } catch (...) {
    std::remove(partial.c_str()); // half a file helps nobody
    throw;
  }
  if (std::rename(partial.c_str(), path.c_str()) != 0)
    throw SystemError(path + ": cannot rename the finished file into place (" +
                      std::strerror(errno) + ")");
}

} // namespace settlewell
