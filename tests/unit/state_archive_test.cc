// A checkpoint's archive gives back every value bit for bit, fails on a damaged or
// foreign checkpoint with an InputError, and reopens a run's CSV files at the length
// they had when it was saved.
#include "settlewell/core/errors.h"
#include "settlewell/core/state_archive.h"
#include "settlewell/output/csv_file.h"

#include <gtest/gtest.h>

#include <cmath>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <limits>
#include <sstream>

namespace fs = std::filesystem;
using settlewell::CsvFile;
using settlewell::InputError;
using settlewell::StateArchive;

namespace {

struct Sample {
  double value = 0.0;
  std::vector<bool> flags;
  std::map<std::string, std::vector<double>> series;
  std::optional<double> present, absent;
  std::string text;
  std::pair<int, std::size_t> pair;
};

void visit(StateArchive& a, Sample& s) {
  a& s.value& s.flags& s.series& s.present& s.absent& s.text& s.pair;
}

std::string saved(Sample s, const std::string& mark = "sample") {
  std::ostringstream out;
  StateArchive a(out, "run", MPI_COMM_WORLD);
  a.mark(mark);
  a& s;
  return out.str();
}

Sample loaded(const std::string& bytes, const std::string& mark = "sample") {
  std::istringstream in(bytes);
  StateArchive a(in, "state.bin", "run", MPI_COMM_WORLD);
  a.mark(mark);
  Sample s;
  s.absent = 1.0; // loading must clear it
  a& s;
  return s;
}

bool same_bits(double a, double b) {
  return std::memcmp(&a, &b, sizeof a) == 0;
}

} // namespace

TEST(StateArchive, GivesBackEveryValueBitForBit) {
  Sample s;
  s.value = std::nextafter(0.1, 1.0);
  s.flags = {true, false, true};
  s.series = {{"W1", {-0.0, std::numeric_limits<double>::denorm_min(), 1e300}}, {"", {}}};
  s.present = std::numeric_limits<double>::quiet_NaN();
  s.text = std::string("a\0b", 3);
  s.pair = {-7, 12345678901234};
  const Sample back = loaded(saved(s));
  EXPECT_TRUE(same_bits(back.value, s.value));
  EXPECT_EQ(back.flags, s.flags);
  ASSERT_EQ(back.series.size(), 2u);
  for (std::size_t i = 0; i < 3; ++i)
    EXPECT_TRUE(same_bits(back.series.at("W1")[i], s.series.at("W1")[i]));
  EXPECT_TRUE(back.series.at("").empty());
  ASSERT_TRUE(back.present.has_value());
  EXPECT_TRUE(std::isnan(*back.present));
  EXPECT_FALSE(back.absent.has_value());
  EXPECT_EQ(back.text, s.text);
  EXPECT_EQ(back.pair, s.pair);
}

TEST(StateArchive, RefusesAShortCheckpoint) {
  Sample s;
  s.series = {{"W1", std::vector<double>(10, 1.0)}};
  const std::string bytes = saved(s);
  for (const std::size_t cut : {std::size_t(0), std::size_t(5), bytes.size() - 1}) {
    try {
      loaded(bytes.substr(0, cut));
      ADD_FAILURE() << "a checkpoint cut at " << cut << " bytes was accepted";
    } catch (const InputError& e) {
      EXPECT_NE(std::string(e.what()).find("state.bin"), std::string::npos) << e.what();
    }
  }
}

TEST(StateArchive, RefusesTheStateOfAnotherPart) {
  try {
    loaded(saved(Sample{}, "extremes"), "water account");
    ADD_FAILURE() << "the state of another part was accepted";
  } catch (const InputError& e) {
    EXPECT_NE(std::string(e.what()).find("expected the state of 'water account' but "
                                         "found 'extremes'"),
              std::string::npos)
        << e.what();
  }
}

TEST(StateArchive, RefusesASizeNoRunReaches) {
  std::string bytes = saved(Sample{});
  // The flags' size follows the mark ("sample": an 8-byte size and 6 bytes) and the
  // value: set its highest byte.
  bytes[8 + 6 + 8 + 7] = char(0x7f);
  EXPECT_THROW(loaded(bytes), InputError);
}

TEST(StateArchive, ReopensACsvFileAtItsSavedLength) {
  const fs::path folder = fs::temp_directory_path() / "settlewell_state_archive";
  fs::remove_all(folder);
  fs::create_directories(folder);
  std::string state;
  {
    CsvFile table(folder.string() + "/table.csv", {"a", "b"}, MPI_COMM_WORLD);
    table.row({1.0, 2.0});
    std::ostringstream out;
    StateArchive a(out, folder.string(), MPI_COMM_WORLD);
    a& table;
    state = out.str();
    table.row({3.0, 4.0}); // after the checkpoint: dropped on resuming
  }
  CsvFile table;
  std::istringstream in(state);
  StateArchive a(in, "state.bin", folder.string(), MPI_COMM_WORLD);
  a& table;
  table.row({5.0, 6.0});
  std::ifstream file(folder / "table.csv");
  const std::string text((std::istreambuf_iterator<char>(file)),
                         std::istreambuf_iterator<char>());
  EXPECT_EQ(text, "a,b\n1,2\n5,6\n");
}
