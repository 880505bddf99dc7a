#include "settlewell/verification/check_row.h"

#include <algorithm>
#include <cmath>
#include <iomanip>
#include <ostream>
#include <sstream>

namespace settlewell::verification {

double CheckRow::error() const {
  const double s = scale > 0.0 ? scale : std::abs(reference);
  return s > 0.0 ? std::abs(computed - reference) / s : std::abs(computed - reference);
}

bool CheckRow::passed() const {
  return std::isfinite(computed) && std::isfinite(error()) && error() <= tolerance;
}

CheckRow relative_row(std::string case_name,
                      std::string quantity,
                      double computed,
                      double reference,
                      double tolerance,
                      std::string source) {
  return {std::move(case_name), std::move(quantity), computed,         reference,
          std::abs(reference),  tolerance,           std::move(source)};
}

CheckRow scaled_row(std::string case_name,
                    std::string quantity,
                    double computed,
                    double reference,
                    double scale,
                    double tolerance,
                    std::string source) {
  return {
      std::move(case_name), std::move(quantity), computed, reference, scale, tolerance,
      std::move(source)};
}

namespace {
std::string number(double v, int digits = 6) {
  std::ostringstream os;
  os << std::setprecision(digits) << v;
  return os.str();
}
std::string percent(double v) {
  std::ostringstream os;
  os << std::setprecision(2) << std::scientific << v;
  return os.str();
}
} // namespace

void print_table(std::ostream& out, const std::vector<CheckRow>& rows) {
  const std::vector<std::string> head{"case",  "quantity",  "computed", "reference",
                                      "error", "tolerance", "source",   "result"};
  std::vector<std::vector<std::string>> cells;
  for (const auto& r : rows)
    cells.push_back({r.case_name, r.quantity, number(r.computed), number(r.reference),
                     percent(r.error()), percent(r.tolerance), r.source,
                     r.passed() ? "PASS" : "FAIL"});
  std::vector<std::size_t> width(head.size());
  for (std::size_t c = 0; c < head.size(); ++c) {
    width[c] = head[c].size();
    for (const auto& row : cells)
      width[c] = std::max(width[c], row[c].size());
  }
  auto print_line = [&](const std::vector<std::string>& line) {
    for (std::size_t c = 0; c < line.size(); ++c)
      out << std::left << std::setw(int(width[c])) << line[c]
          << (c + 1 < line.size() ? "  " : "\n");
  };
  print_line(head);
  std::vector<std::string> rule;
  for (const auto w : width)
    rule.push_back(std::string(w, '-'));
  print_line(rule);
  for (const auto& row : cells)
    print_line(row);
  const auto n_pass = std::count_if(rows.begin(), rows.end(),
                                    [](const CheckRow& r) { return r.passed(); });
  out << n_pass << " of " << rows.size()
      << " checks passed. The error is relative to the "
      << "reference unless the quantity names another scale.\n";
}

namespace {

/// The check of a case whose error is nearest its tolerance.
const CheckRow& nearest_to_tolerance(const std::vector<const CheckRow*>& rows) {
  const CheckRow* worst = rows.front();
  for (const auto* r : rows)
    if (r->error() / r->tolerance > worst->error() / worst->tolerance)
      worst = r;
  return *worst;
}

std::string sources_of(const std::vector<const CheckRow*>& rows) {
  std::vector<std::string> sources;
  for (const auto* r : rows)
    if (std::find(sources.begin(), sources.end(), r->source) == sources.end())
      sources.push_back(r->source);
  std::string text;
  for (const auto& s : sources)
    text += (text.empty() ? "" : "; ") + s;
  return text;
}

} // namespace

void print_markdown(std::ostream& out,
                    const std::vector<CaseDescription>& cases,
                    const std::vector<CheckRow>& rows) {
  out << "| case | what it checks | checks | passed | nearest its tolerance: error "
         "(tolerance), quantity | sources |\n"
      << "| --- | --- | --- | --- | --- | --- |\n";
  for (const auto& c : cases) {
    std::vector<const CheckRow*> own;
    for (const auto& r : rows)
      if (r.case_name == c.name)
        own.push_back(&r);
    if (own.empty())
      continue;
    const auto passed = std::count_if(own.begin(), own.end(),
                                      [](const CheckRow* r) { return r->passed(); });
    const CheckRow& worst = nearest_to_tolerance(own);
    out << "| " << c.name << " | " << c.description << " | " << own.size() << " | "
        << passed << " | " << percent(worst.error()) << " (" << percent(worst.tolerance)
        << "), " << worst.quantity << " | " << sources_of(own) << " |\n";
  }
  out << "\n<details><summary>The full table as <code>settlewell verify</code> prints "
         "it</summary>\n\n```\n";
  print_table(out, rows);
  out << "```\n\n</details>\n";
}

bool all_passed(const std::vector<CheckRow>& rows) {
  return !rows.empty() && std::all_of(rows.begin(), rows.end(),
                                      [](const CheckRow& r) { return r.passed(); });
}

} // namespace settlewell::verification
