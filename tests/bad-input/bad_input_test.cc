// Every malformed scenario in this folder gives exactly its expected one-line error
// and exit status 2, through the command line as a user would see it; and a failed
// run leaves no run folder behind. The folder drives the test: each NAME.toml needs
// the line "NAME|message" in expected.txt, and the message is the whole line the
// program prints after "settlewell: error: " (run from this folder, so that paths
// in messages are the relative ones written here).
#include <gtest/gtest.h>

#include <array>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <map>
#include <sys/wait.h>

namespace {

namespace fs = std::filesystem;

const fs::path folder = BAD_INPUT_DIR;

/// expected.txt as name -> message.
std::map<std::string, std::string> expected_errors() {
  std::map<std::string, std::string> expected;
  std::ifstream in(folder / "expected.txt");
  for (std::string line; std::getline(in, line);) {
    const auto bar = line.find('|');
    if (bar != std::string::npos)
      expected[line.substr(0, bar)] = line.substr(bar + 1);
  }
  return expected;
}

std::vector<std::string> malformed_scenarios() {
  std::vector<std::string> names;
  for (const auto& entry : fs::directory_iterator(folder))
    if (entry.path().extension() == ".toml")
      names.push_back(entry.path().stem().string());
  std::sort(names.begin(), names.end());
  return names;
}

/// Runs the program in this folder; returns the exit status and its stderr.
std::pair<int, std::string> run(const std::string& arguments) {
  const std::string command = "cd '" + folder.string() + "' && " +
                              std::string(SETTLEWELL_BINARY) + " " + arguments +
                              " 2>&1 1>/dev/null";
  FILE* pipe = popen(command.c_str(), "r");
  std::string err;
  std::array<char, 4096> buffer;
  while (std::fgets(buffer.data(), buffer.size(), pipe))
    err += buffer.data();
  const int status = pclose(pipe);
  return {WIFEXITED(status) ? WEXITSTATUS(status) : -1, err};
}

class BadInput : public ::testing::TestWithParam<std::string> {};

} // namespace

TEST(BadInputCorpus, HoldsAtLeastTwentyFiveCases) {
  EXPECT_GE(malformed_scenarios().size(), 25u);
}

TEST(BadInputCorpus, EveryExpectationHasItsScenario) {
  const auto names = malformed_scenarios();
  for (const auto& [name, message] : expected_errors())
    EXPECT_TRUE(std::find(names.begin(), names.end(), name) != names.end())
        << "expected.txt names " << name << " but there is no " << name << ".toml";
}

TEST_P(BadInput, GivesItsWholeOneLineErrorAndStatusTwo) {
  const auto expected = expected_errors();
  const auto found = expected.find(GetParam());
  ASSERT_NE(found, expected.end())
      << GetParam() << ".toml has no line in expected.txt (add \"" << GetParam()
      << "|<the message>\")";
  const auto [status, err] = run("check " + GetParam() + ".toml");
  EXPECT_EQ(status, 2) << err;
  EXPECT_EQ(err, "settlewell: error: " + found->second + "\n");
}

INSTANTIATE_TEST_SUITE_P(Corpus,
                         BadInput,
                         ::testing::ValuesIn(malformed_scenarios()),
                         [](const auto& info) { return info.param; });

TEST(BadInputRun, WritesNothing) {
  const auto out = fs::temp_directory_path() / "settlewell_bad_run";
  fs::remove_all(out);
  const auto [status, err] = run("run well_outside_pit.toml -q -o " + out.string());
  EXPECT_EQ(status, 2) << err;
  EXPECT_FALSE(fs::exists(out));
}
