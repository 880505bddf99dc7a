#pragma once

#include <iosfwd>
#include <string>
#include <vector>

namespace settlewell::verification {

/// One comparison of a computed quantity with its published reference.
struct CheckRow {
  std::string case_name;
  std::string quantity;
  double computed = 0.0;
  double reference = 0.0;
  /// The error is |computed - reference| / scale. The scale is |reference| unless
  /// the quantity says otherwise (e.g. an excess pressure relative to u0).
  double scale = 0.0;
  double tolerance = 0.0;
  std::string source;

  double error() const;
  bool passed() const;
};

/// A row whose error is relative to |reference|.
CheckRow relative_row(std::string case_name,
                      std::string quantity,
                      double computed,
                      double reference,
                      double tolerance,
                      std::string source);
/// A row whose error is relative to a stated scale.
CheckRow scaled_row(std::string case_name,
                    std::string quantity,
                    double computed,
                    double reference,
                    double scale,
                    double tolerance,
                    std::string source);

/// The table printed by `settlewell verify`.
void print_table(std::ostream& out, const std::vector<CheckRow>& rows);

/// A case's name and what it checks, for the Markdown summary.
struct CaseDescription {
  std::string name, description;
};

/// The Markdown the README's verification section holds (`settlewell verify
/// --markdown`): one summary row per case (checks, passed, the check nearest its
/// tolerance, the sources) and the full table in a collapsed block.
void print_markdown(std::ostream& out,
                    const std::vector<CaseDescription>& cases,
                    const std::vector<CheckRow>& rows);
bool all_passed(const std::vector<CheckRow>& rows);

} // namespace settlewell::verification
