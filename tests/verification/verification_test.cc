// Runs every verification case (the same ones `settlewell verify` runs) and
// requires every comparison with its published solution to pass. The sources and
// the reasons for the tolerances are beside each check in src/verification/.
#include "settlewell/verification/cases.h"

#include <gtest/gtest.h>

#include <iostream>

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

INSTANTIATE_TEST_SUITE_P(Published,
                         VerificationCase,
                         ::testing::Values("terzaghi-drop-double",
                                           "terzaghi-drop-single",
                                           "terzaghi-load",
                                           "terzaghi-axisymmetric",
                                           "mandel",
                                           "thiem",
                                           "theis",
                                           "convergence"),
                         [](const auto& info) {
                           std::string name = info.param;
                           for (auto& ch : name)
                             if (ch == '-')
                               ch = '_';
                           return name;
                         });

TEST(VerificationCases, EveryRegisteredCaseIsTested) {
  EXPECT_EQ(v::all_cases().size(), 9u);
}
