#include "settlewell/output/run_folder.h"

#include "settlewell/core/errors.h"
#include "settlewell/core/file_writing.h"

#include <deal.II/base/mpi.h>

#include <openssl/evp.h>

#include <ctime>
#include <filesystem>
#include <fstream>
#include <iomanip>
#include <iterator>
#include <optional>
#include <regex>
#include <set>
#include <sstream>

namespace settlewell {

namespace fs = std::filesystem;

namespace {

std::string json_escaped(const std::string& text) {
  std::ostringstream out;
  for (const char c : text) {
    if (c == '"' || c == '\\')
      out << '\\' << c;
    else if (static_cast<unsigned char>(c) < 0x20)
      out << "\\u" << std::hex << std::setw(4) << std::setfill('0') << int(c) << std::dec;
    else
      out << c;
  }
  return out.str();
}

/// A refusal found on rank 0, sent to every rank as its message.
struct Refusal {
  std::string message;
};

fs::path canonical_or_absolute(const fs::path& p) {
  std::error_code ec;
  const fs::path c = fs::weakly_canonical(p, ec);
  return ec ? fs::absolute(p) : c;
}

/// Whether `inner` is `outer` or lies inside it (both canonical).
bool is_within(const fs::path& inner, const fs::path& outer) {
  auto i = inner.begin();
  for (auto o = outer.begin(); o != outer.end(); ++o, ++i)
    if (i == inner.end() || *i != *o)
      return false;
  return true;
}

bool written_by_settlewell(const fs::path& folder, FolderKind kind) {
  std::ifstream in(folder / "manifest.json");
  const std::string text((std::istreambuf_iterator<char>(in)),
                         std::istreambuf_iterator<char>());
  static const std::regex program(R"("program"\s*:\s*"settlewell")");
  static const std::regex any_kind(R"("kind"\s*:)");
  const std::regex this_kind(std::string(R"("kind"\s*:\s*")") + kind_name(kind) + '"');
  // Manifests from before folders had kinds are runs'.
  const bool kind_matches =
      std::regex_search(text, this_kind) ||
      (kind == FolderKind::run && !std::regex_search(text, any_kind));
  return std::regex_search(text, program) && kind_matches;
}

/// Empties a folder of a previous run or sweep, or says why it will not.
std::optional<Refusal> clear_previous(const fs::path& folder, FolderKind kind) {
  const std::string advice = "; --overwrite removes only what a " +
                             std::string(kind_name(kind)) +
                             " writes: choose another folder with -o";
  if (!written_by_settlewell(folder, kind))
    return Refusal{folder.string() + ": holds files but no manifest.json of a " +
                   kind_name(kind) + advice};
  std::vector<fs::path> entries;
  for (const auto& entry : fs::directory_iterator(folder)) {
    const std::string name = entry.path().filename().string();
    if (!is_folder_entry(kind, name))
      return Refusal{folder.string() + ": holds '" + name + "', which no " +
                     kind_name(kind) + " writes" + advice};
    entries.push_back(entry.path());
  }
  for (const auto& entry : entries)
    fs::remove_all(entry);
  return std::nullopt;
}

std::optional<Refusal> check_and_prepare(const fs::path& folder,
                                         bool overwrite,
                                         FolderKind kind,
                                         const std::vector<std::string>& inputs) {
  const std::string advice = "; give the results a folder of their own with -o";
  const fs::path here = canonical_or_absolute(folder);
  if (is_within(canonical_or_absolute(fs::current_path()), here))
    return Refusal{folder.string() + ": is the current folder or holds it" + advice};
  for (const auto& input : inputs)
    if (!input.empty() && is_within(canonical_or_absolute(input), here))
      return Refusal{folder.string() + ": holds the input " + input + advice};
  if (fs::exists(folder) && !fs::is_directory(folder))
    return Refusal{folder.string() + ": exists and is not a folder"};
  if (fs::exists(folder) && !fs::is_empty(folder)) {
    if (!overwrite)
      return Refusal{folder.string() +
                     ": the folder already holds results; choose another with -o or "
                     "add --overwrite"};
    if (auto refusal = clear_previous(folder, kind))
      return refusal;
  }
  fs::create_directories(folder);
  return std::nullopt;
}

} // namespace

const char* kind_name(FolderKind kind) {
  return kind == FolderKind::run ? "run" : "sweep";
}

bool is_folder_entry(FolderKind kind, const std::string& name) {
  static const std::set<std::string> run{
      "manifest.json", "scenario.toml", "results.toml", "steps.csv",
      "points.csv",    "fields",        "profiles",     "checks",
      "mesh",          "one_d",         "plots",        "plots.log",
      "report.html",   "report.md",     "checkpoint",   "checkpoint.old"};
  static const std::set<std::string> sweep{"manifest.json", "sweep_summary.csv",
                                           "sweep_chart.png", "sweep_chart.log"};
  static const std::regex variant("variant_[0-9]+");
  // A file being written (write_whole_file) when the run was killed.
  const std::string suffix = ".partial";
  if (name.size() > suffix.size() &&
      name.compare(name.size() - suffix.size(), suffix.size(), suffix) == 0)
    return is_folder_entry(kind, name.substr(0, name.size() - suffix.size()));
  if (kind == FolderKind::run)
    return run.count(name) != 0;
  return sweep.count(name) != 0 || std::regex_match(name, variant);
}

void prepare_run_folder(const std::string& path,
                        bool overwrite,
                        FolderKind kind,
                        const std::vector<std::string>& inputs,
                        MPI_Comm comm) {
  // A refusal starts with 'I' for the user's choice to correct (exit 2) or 'S' for
  // the system's (exit 4).
  std::string refusal;
  if (dealii::Utilities::MPI::this_mpi_process(comm) == 0) {
    try {
      if (const auto r = check_and_prepare(path, overwrite, kind, inputs))
        refusal = "I" + r->message;
    } catch (const fs::filesystem_error& e) {
      refusal = "S" + path + ": " + e.code().message();
    }
  }
  refusal = dealii::Utilities::MPI::broadcast(comm, refusal, 0);
  if (!refusal.empty() && refusal[0] == 'S')
    throw SystemError(refusal.substr(1));
  if (!refusal.empty())
    throw InputError(refusal.substr(1));
  write_folder_state(path, kind, "running", "", comm);
}

void write_folder_state(const std::string& folder,
                        FolderKind kind,
                        const std::string& state,
                        const std::string& detail,
                        MPI_Comm comm) {
  if (dealii::Utilities::MPI::this_mpi_process(comm) != 0)
    return;
  write_whole_file(folder + "/manifest.json", [&](std::ostream& out) {
    out << "{\n    \"program\" : \"settlewell\",\n    \"kind\" : \"" << kind_name(kind)
        << "\",\n    \"state\" : \"" << state << "\",\n    \"updated\" : \"" << utc_now()
        << '"';
    if (!detail.empty())
      out << ",\n    \"detail\" : \"" << json_escaped(detail) << '"';
    out << "\n}\n";
  });
}

std::string sha256_of_file(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in)
    throw InputError(path + ": cannot read");
  EVP_MD_CTX* ctx = EVP_MD_CTX_new();
  EVP_DigestInit_ex(ctx, EVP_sha256(), nullptr);
  char buffer[1 << 16];
  while (in.read(buffer, sizeof buffer) || in.gcount() > 0)
    EVP_DigestUpdate(ctx, buffer, static_cast<std::size_t>(in.gcount()));
  unsigned char digest[EVP_MAX_MD_SIZE];
  unsigned int length = 0;
  EVP_DigestFinal_ex(ctx, digest, &length);
  EVP_MD_CTX_free(ctx);
  std::ostringstream hex;
  for (unsigned int i = 0; i < length; ++i)
    hex << std::hex << std::setw(2) << std::setfill('0') << int(digest[i]);
  return hex.str();
}

std::string utc_now() {
  const std::time_t now = std::time(nullptr);
  std::tm tm{};
  gmtime_r(&now, &tm);
  std::ostringstream os;
  os << std::put_time(&tm, "%Y-%m-%dT%H:%M:%SZ");
  return os.str();
}

} // namespace settlewell
