// Every malformed scenario in this folder gives exactly its expected one-line
// error and exit status 2, through the command line as a user would see it; and
// a failed run leaves no run folder behind.
#include <gtest/gtest.h>

#include <array>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sys/wait.h>

namespace {

struct Expected {
  std::string name, message;
};
void PrintTo(const Expected& e, std::ostream* os) {
  *os << e.name;
}

std::vector<Expected> expected_errors() {
  std::vector<Expected> list;
  std::ifstream in(std::string(BAD_INPUT_DIR) + "/expected.txt");
  for (std::string line; std::getline(in, line);) {
    const auto bar = line.find('|');
    if (bar != std::string::npos)
      list.push_back({line.substr(0, bar), line.substr(bar + 1)});
  }
  return list;
}

/// Runs a command line; returns the exit status and what it wrote to stderr.
std::pair<int, std::string> run(const std::string& arguments) {
  const std::string command =
      std::string(SETTLEWELL_BINARY) + " " + arguments + " 2>&1 1>/dev/null";
  FILE* pipe = popen(command.c_str(), "r");
  std::string err;
  std::array<char, 4096> buffer;
  while (std::fgets(buffer.data(), buffer.size(), pipe))
    err += buffer.data();
  const int status = pclose(pipe);
  return {WIFEXITED(status) ? WEXITSTATUS(status) : -1, err};
}

class BadInput : public ::testing::TestWithParam<Expected> {};

} // namespace

TEST(BadInputCorpus, HoldsAtLeastTwentyFiveCases) {
  EXPECT_GE(expected_errors().size(), 25u);
}

TEST_P(BadInput, GivesItsOneLineErrorAndStatusTwo) {
  const auto& e = GetParam();
  const auto [status, err] =
      run("check " + std::string(BAD_INPUT_DIR) + "/" + e.name + ".toml");
  EXPECT_EQ(status, 2) << err;
  ASSERT_FALSE(err.empty());
  EXPECT_EQ(err.find('\n'), err.size() - 1) << "more than one line:\n" << err;
  EXPECT_NE(err.find(e.message), std::string::npos) << err << "\nexpected: " << e.message;
}

INSTANTIATE_TEST_SUITE_P(Corpus,
                         BadInput,
                         ::testing::ValuesIn(expected_errors()),
                         [](const auto& info) { return info.param.name; });

TEST(BadInputRun, WritesNothing) {
  const auto folder = std::filesystem::temp_directory_path() / "settlewell_bad_run";
  std::filesystem::remove_all(folder);
  const auto [status, err] = run("run " + std::string(BAD_INPUT_DIR) +
                                 "/well_outside_pit.toml -q -o " + folder.string());
  EXPECT_EQ(status, 2) << err;
  EXPECT_FALSE(std::filesystem::exists(folder));
}
