#include "settlewell/output/run_folder.h"

#include "settlewell/core/errors.h"

#include <deal.II/base/mpi.h>

#include <openssl/evp.h>

#include <ctime>
#include <filesystem>
#include <fstream>
#include <iomanip>
#include <sstream>

namespace settlewell {

namespace fs = std::filesystem;

void prepare_run_folder(const std::string& path, bool overwrite, MPI_Comm comm) {
  int problem = 0;
  if (dealii::Utilities::MPI::this_mpi_process(comm) == 0) {
    std::error_code ec;
    const bool exists = fs::exists(path, ec);
    const bool folder = exists && fs::is_directory(path, ec);
    const bool holds_files = folder && !fs::is_empty(path, ec);
    if (exists && !folder) {
      problem = 1;
    } else if (holds_files && !overwrite) {
      problem = 2;
    } else {
      if (holds_files)
        fs::remove_all(path, ec);
      fs::create_directories(path, ec);
      problem = ec ? 3 : 0;
    }
  }
  MPI_Bcast(&problem, 1, MPI_INT, 0, comm);
  if (problem == 1)
    throw InputError(path + ": exists and is not a folder");
  if (problem == 2)
    throw InputError(path +
                     ": the run folder already holds results; choose another with -o "
                     "or add --overwrite");
  if (problem == 3)
    throw InputError(path + ": cannot create the run folder");
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
