#pragma once

// Helpers shared by the test executables.
#include <filesystem>
#include <string>
#include <utility>
#include <vector>

namespace test_support {

/// The (time, file) entries of a PVD series, in file order.
std::vector<std::pair<double, std::string>> read_pvd(const std::filesystem::path& pvd);

} // namespace test_support
