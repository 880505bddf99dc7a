#include "settlewell/core/files.h"

#include <filesystem>

namespace settlewell {

std::string input_file_problem(const std::string& path, std::uintmax_t largest_bytes) {
  namespace fs = std::filesystem;
  std::error_code ec;
  const fs::file_status status = fs::status(path, ec);
  if (ec || !fs::exists(status))
    return "no such file";
  if (fs::is_directory(status))
    return "is a folder, not a file";
  if (!fs::is_regular_file(status))
    return "is not a regular file (a device, pipe or socket)";
  const std::uintmax_t size = fs::file_size(path, ec);
  if (ec)
    return "cannot read its size (" + ec.message() + ")";
  if (size == 0)
    return "is empty";
  if (size > largest_bytes)
    return "is " + std::to_string(size) + " bytes, more than the " +
           std::to_string(largest_bytes) + " bytes an input may have";
  return "";
}

} // namespace settlewell
