// Runs every verification case (the same ones `settlewell verify` runs) and
// requires every comparison with its published solution to pass. The sources and
// the reasons for the tolerances are beside each check in src/verification/.
#include "settlewell/verification/cases.h"

#include <gtest/gtest.h>

#include <iostream>
#include <string>
#include <vector>

namespace v = settlewell::verification;

class VerificationCase : public ::testing::TestWithParam<std::string> {};

TEST_P(VerificationCase, EveryCheckPasses) {
  const auto& c = v::find_case(GetParam());
  const auto rows = c.run(v::CaseSettings{}, MPI_COMM_WORLD);
  v::print_table(std::cout, rows);
  ASSERT_FALSE(rows.empty());
  for (const auto& row : rows)
    EXPECT_TRUE(row.passed()) << row.quantity << ": computed " << row.computed
                              << ", reference " << row.reference << ", error "
                              << row.error() << " > " << row.tolerance << " ("
                              << row.source << ")";
}

std::vector<std::string> registered_cases() {
  std::vector<std::string> names;
  for (const auto& c : v::all_cases())
    names.push_back(c.name);
  return names;
}

// Every case in the registry, so that a new case cannot be left out of CTest.
INSTANTIATE_TEST_SUITE_P(Published,
                         VerificationCase,
                         ::testing::ValuesIn(registered_cases()),
                         [](const auto& info) {
                           std::string name = info.param;
                           for (auto& ch : name)
                             if (ch == '-')
                               ch = '_';
                           return name;
                         });
