#include "settlewell/output/csv_file.h"

#include "settlewell/core/errors.h"
#include "settlewell/core/file_writing.h"

#include <deal.II/base/mpi.h>

#include <cerrno>
#include <filesystem>
#include <iomanip>

namespace settlewell {

namespace {

/// A field as RFC 4180 writes it: quoted (quotes doubled) when it holds a comma,
/// a quote or a line break, as a user's stage or point name may.
std::string csv_field(const std::string& text) {
  if (text.find_first_of(",\"\r\n") == std::string::npos)
    return text;
  std::string quoted = "\"";
  for (const char c : text)
    quoted += c == '"' ? std::string("\"\"") : std::string(1, c);
  return quoted + "\"";
}

} // namespace

CsvFile::CsvFile(const std::string& path,
                 const std::vector<std::string>& header,
                 MPI_Comm comm) {
  if (dealii::Utilities::MPI::this_mpi_process(comm) != 0)
    return;
  errno = 0;
  out_ = std::make_unique<std::ofstream>(path);
  path_ = path;
  check_stream(*out_, path);
  for (std::size_t i = 0; i < header.size(); ++i)
    *out_ << (i ? "," : "") << csv_field(header[i]);
  // On disk at once: a checkpoint records the length written so far, also of a
  // table that never gets a row (a run without output points).
  *out_ << '\n' << std::flush;
  check_stream(*out_, path);
}

void CsvFile::row(const std::vector<double>& values,
                  const std::vector<std::string>& labels) {
  row_with_gaps(std::vector<std::optional<double>>(values.begin(), values.end()), labels);
}

void CsvFile::row_with_gaps(const std::vector<std::optional<double>>& values,
                            const std::vector<std::string>& labels) {
  if (!out_)
    return;
  bool first = true;
  for (const auto& l : labels)
    *out_ << (first ? "" : ",") << csv_field(l), first = false;
  for (const auto& v : values) {
    *out_ << (first ? "" : ",");
    if (v)
      *out_ << std::setprecision(9) << *v;
    first = false;
  }
  *out_ << '\n' << std::flush;
  check_stream(*out_, path_);
}

void visit(StateArchive& a, CsvFile& file) {
  const std::string prefix = a.folder() + "/";
  std::string name =
      file.path_.rfind(prefix, 0) == 0 ? file.path_.substr(prefix.size()) : file.path_;
  std::uint64_t length = file.out_ ? std::uint64_t(file.out_->tellp()) : 0;
  a& name& length;
  if (!a.loading() || dealii::Utilities::MPI::this_mpi_process(a.comm()) != 0)
    return;
  file.path_ = prefix + name;
  std::error_code error;
  const auto on_disk = std::filesystem::file_size(file.path_, error);
  if (error || on_disk < length)
    throw InputError(file.path_ + ": is missing or shorter than at the checkpoint; the "
                                  "run folder was changed and cannot be resumed");
  std::filesystem::resize_file(file.path_, length);
  errno = 0;
  file.out_ = std::make_unique<std::ofstream>(file.path_, std::ios::app);
  check_stream(*file.out_, file.path_);
}

} // namespace settlewell
