#include "test_support.h"

#include <fstream>
#include <regex>

namespace test_support {

std::vector<std::pair<double, std::string>> read_pvd(const std::filesystem::path& pvd) {
  std::ifstream in(pvd);
  const std::string text((std::istreambuf_iterator<char>(in)), {});
  const std::regex entry("timestep=\"([^\"]+)\"[^>]*file=\"([^\"]+)\"");
  std::vector<std::pair<double, std::string>> series;
  for (auto it = std::sregex_iterator(text.begin(), text.end(), entry);
       it != std::sregex_iterator(); ++it)
    series.emplace_back(std::stod((*it)[1]), (*it)[2]);
  return series;
}

} // namespace test_support
