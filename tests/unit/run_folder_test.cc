// Results folders never cost a user a file: --overwrite empties only a folder that
// Settlewell wrote, of exactly what it wrote, and never the current folder or one
// that holds an input.
#include "settlewell/core/errors.h"
#include "settlewell/core/file_writing.h"
#include "settlewell/output/csv_file.h"
#include "settlewell/output/run_folder.h"

#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>

namespace fs = std::filesystem;
using settlewell::FolderKind;
using settlewell::InputError;
using settlewell::prepare_run_folder;

namespace {

/// A fresh, empty folder for one test.
fs::path scratch() {
  const auto* test = ::testing::UnitTest::GetInstance()->current_test_info();
  const fs::path folder = fs::temp_directory_path() / "settlewell_run_folder" /
                          (std::string(test->test_suite_name()) + "." + test->name());
  fs::remove_all(folder);
  fs::create_directories(folder);
  return folder;
}

void touch(const fs::path& file) {
  fs::create_directories(file.parent_path());
  std::ofstream(file) << "kept\n";
}

/// The message of the InputError that preparing `folder` throws ("" if none).
std::string refusal(const fs::path& folder,
                    bool overwrite,
                    FolderKind kind = FolderKind::run,
                    const std::vector<std::string>& inputs = {}) {
  try {
    prepare_run_folder(folder.string(), overwrite, kind, inputs, MPI_COMM_WORLD);
  } catch (const InputError& e) {
    return e.what();
  }
  return "";
}

/// A folder as a finished run leaves it.
fs::path previous_run(const fs::path& folder) {
  EXPECT_EQ(refusal(folder, false), "");
  touch(folder / "steps.csv");
  touch(folder / "fields" / "fields_0000.vtu");
  touch(folder / "report.html");
  return folder;
}

} // namespace

TEST(RunFolder, RefusesTheCurrentFolderAndTheFoldersHoldingIt) {
  const fs::path here = scratch();
  touch(here / "scenario.toml");
  const fs::path before = fs::current_path();
  fs::current_path(here);
  const std::string dot = refusal(".", true);
  const std::string parent = refusal("..", true);
  fs::current_path(before);
  EXPECT_NE(dot.find("is the current folder or holds it"), std::string::npos) << dot;
  EXPECT_NE(parent.find("is the current folder or holds it"), std::string::npos)
      << parent;
  EXPECT_TRUE(fs::exists(here / "scenario.toml"));
}

TEST(RunFolder, RefusesAFolderHoldingAnInput) {
  const fs::path folder = scratch();
  touch(folder / "site" / "scenario.toml");
  const std::string input = (folder / "site" / "scenario.toml").string();
  const std::string message = refusal(folder, true, FolderKind::run, {input});
  EXPECT_NE(message.find("holds the input " + input), std::string::npos) << message;
  EXPECT_TRUE(fs::exists(input));
}

TEST(RunFolder, OverwriteLeavesAFolderSettlewellDidNotWrite) {
  const fs::path folder = scratch();
  touch(folder / "notes.txt");
  touch(folder / "steps.csv"); // a name a run writes, in the user's own folder
  const std::string message = refusal(folder, true);
  EXPECT_NE(message.find("holds files but no manifest.json of a run"), std::string::npos)
      << message;
  EXPECT_TRUE(fs::exists(folder / "notes.txt"));
  EXPECT_TRUE(fs::exists(folder / "steps.csv"));
}

TEST(RunFolder, OverwriteLeavesARunFolderThatHoldsAnythingElse) {
  const fs::path folder = previous_run(scratch());
  touch(folder / "my notes.txt");
  const std::string message = refusal(folder, true);
  EXPECT_NE(message.find("holds 'my notes.txt', which no run writes"), std::string::npos)
      << message;
  EXPECT_TRUE(fs::exists(folder / "my notes.txt"));
  EXPECT_TRUE(fs::exists(folder / "fields" / "fields_0000.vtu"));
}

TEST(RunFolder, OverwriteEmptiesAPreviousRunAndMarksTheNewOneRunning) {
  const fs::path folder = previous_run(scratch());
  EXPECT_NE(refusal(folder, false).find("add --overwrite"), std::string::npos);
  EXPECT_EQ(refusal(folder, true), "");
  std::vector<std::string> left;
  for (const auto& entry : fs::directory_iterator(folder))
    left.push_back(entry.path().filename().string());
  EXPECT_EQ(left, std::vector<std::string>{"manifest.json"});
  std::ifstream in(folder / "manifest.json");
  const std::string text((std::istreambuf_iterator<char>(in)),
                         std::istreambuf_iterator<char>());
  EXPECT_NE(text.find("\"state\" : \"running\""), std::string::npos) << text;
}

TEST(RunFolder, ARunDoesNotOverwriteASweepFolder) {
  const fs::path folder = scratch();
  EXPECT_EQ(refusal(folder, false, FolderKind::sweep), "");
  touch(folder / "variant_000" / "scenario.toml");
  const std::string message = refusal(folder, true, FolderKind::run);
  EXPECT_NE(message.find("no manifest.json of a run"), std::string::npos) << message;
  EXPECT_TRUE(fs::exists(folder / "variant_000" / "scenario.toml"));
  EXPECT_EQ(refusal(folder, true, FolderKind::sweep), "");
  EXPECT_FALSE(fs::exists(folder / "variant_000"));
}

TEST(OutputFiles, AFullDiskIsASystemErrorNamingTheFile) {
  // /dev/full takes a file open but refuses every byte with ENOSPC: the header,
  // written at once, fails.
  try {
    settlewell::CsvFile csv("/dev/full", {"time_days", "head_m"}, MPI_COMM_WORLD);
    csv.row({1.0, 2.0});
    FAIL() << "a table written to a full disk must throw";
  } catch (const settlewell::SystemError& e) {
    EXPECT_NE(std::string(e.what()).find("/dev/full: cannot write (No space left"),
              std::string::npos)
        << e.what();
  }
}

TEST(OutputFiles, AWholeFileAppearsOnlyWhenComplete) {
  const fs::path folder = scratch();
  const std::string path = (folder / "results.toml").string();
  EXPECT_THROW(settlewell::write_whole_file(path,
                                            [&](std::ostream& out) {
                                              out << "half";
                                              EXPECT_FALSE(fs::exists(path));
                                              throw std::runtime_error("killed");
                                            }),
               std::runtime_error);
  EXPECT_FALSE(fs::exists(path));
  EXPECT_FALSE(fs::exists(path + ".partial"));
  EXPECT_TRUE(settlewell::is_folder_entry(FolderKind::run, "results.toml.partial"));
  settlewell::write_whole_file(path, [](std::ostream& out) { out << "whole\n"; });
  std::ifstream in(path);
  std::string text;
  std::getline(in, text);
  EXPECT_EQ(text, "whole");
  EXPECT_FALSE(fs::exists(path + ".partial"));
  const std::string missing = (folder / "gone" / "x.csv").string();
  EXPECT_THROW(settlewell::write_whole_file(missing, [](std::ostream& out) { out << 1; }),
               settlewell::SystemError);
}
