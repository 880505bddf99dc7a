#include "settlewell/report/document.h"

#include <openssl/evp.h>

#include <fstream>
#include <sstream>

namespace settlewell::report {

Section& Section::paragraph(std::string text) {
  blocks.push_back({Block::Kind::paragraph, std::move(text), {}, {}, {}});
  return *this;
}
Section& Section::note(std::string text) {
  blocks.push_back({Block::Kind::note, std::move(text), {}, {}, {}});
  return *this;
}
Section& Section::list(std::vector<std::string> items) {
  blocks.push_back({Block::Kind::list, {}, std::move(items), {}, {}});
  return *this;
}
Section& Section::table(Table t) {
  blocks.push_back({Block::Kind::table, {}, {}, std::move(t), {}});
  return *this;
}
Section& Section::image(std::string path, std::string caption) {
  blocks.push_back({Block::Kind::image, std::move(caption), {}, {}, std::move(path)});
  return *this;
}

Section& Document::add(std::string heading) {
  sections.push_back({std::move(heading), {}});
  return sections.back();
}

namespace {

std::string escape(const std::string& s) {
  std::string out;
  for (const char c : s) {
    switch (c) {
    case '<':
      out += "&lt;";
      break;
    case '>':
      out += "&gt;";
      break;
    case '&':
      out += "&amp;";
      break;
    case '"':
      out += "&quot;";
      break;
    default:
      out += c;
    }
  }
  return out;
}

std::string base64_of_file(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in)
    return "";
  const std::string bytes((std::istreambuf_iterator<char>(in)), {});
  std::string out(4 * ((bytes.size() + 2) / 3) + 1, '\0');
  const int n = EVP_EncodeBlock(reinterpret_cast<unsigned char*>(out.data()),
                                reinterpret_cast<const unsigned char*>(bytes.data()),
                                static_cast<int>(bytes.size()));
  out.resize(static_cast<std::size_t>(n));
  return out;
}

const char* const style = R"(
body { font-family: "DejaVu Sans", Arial, sans-serif; color: #1d2327; margin: 0 auto;
       max-width: 62rem; padding: 1.5rem 2rem; line-height: 1.45; }
h1 { font-size: 1.7rem; margin-bottom: 0.2rem; }
.subtitle { color: #56606a; margin-top: 0; }
h2 { font-size: 1.25rem; border-bottom: 2px solid #2b5f75; padding-bottom: 0.2rem;
     margin-top: 2.2rem; }
table { border-collapse: collapse; margin: 0.8rem 0; font-size: 0.9rem; }
th, td { border: 1px solid #b9c2c9; padding: 0.25rem 0.55rem; text-align: left;
         vertical-align: top; }
th { background: #e8eef1; }
td.ok { background: #e3f2e1; }
td.attention { background: #fbe4c8; font-weight: bold; }
.note { border-left: 4px solid #c7771d; background: #fdf4e8; padding: 0.5rem 0.8rem; }
figure { margin: 1rem 0; }
figure img { max-width: 100%; border: 1px solid #d5dbe0; }
figcaption { color: #56606a; font-size: 0.9rem; }
@media print { body { max-width: none; padding: 0; } h2 { page-break-after: avoid; }
               figure, table { page-break-inside: avoid; } }
)";

void html_table(std::ostringstream& out, const Table& t) {
  out << "<table>\n<tr>";
  for (const auto& h : t.header)
    out << "<th>" << escape(h) << "</th>";
  out << "</tr>\n";
  for (const auto& row : t.rows) {
    out << "<tr>";
    for (const auto& c : row) {
      const char* cls = c.flag == Cell::Flag::ok          ? " class=\"ok\""
                        : c.flag == Cell::Flag::attention ? " class=\"attention\""
                                                          : "";
      out << "<td" << cls << ">" << escape(c.text) << "</td>";
    }
    out << "</tr>\n";
  }
  out << "</table>\n";
}

void html_block(std::ostringstream& out, const Block& b, const std::string& folder) {
  switch (b.kind) {
  case Block::Kind::paragraph:
    out << "<p>" << escape(b.text) << "</p>\n";
    break;
  case Block::Kind::note:
    out << "<p class=\"note\">" << escape(b.text) << "</p>\n";
    break;
  case Block::Kind::list:
    out << "<ul>\n";
    for (const auto& item : b.items)
      out << "<li>" << escape(item) << "</li>\n";
    out << "</ul>\n";
    break;
  case Block::Kind::table:
    html_table(out, b.table);
    break;
  case Block::Kind::image: {
    const std::string data = base64_of_file(folder + "/" + b.image);
    if (data.empty()) {
      out << "<p class=\"note\">The figure " << escape(b.image) << " is missing.</p>\n";
      break;
    }
    out << "<figure><img alt=\"" << escape(b.text) << "\" src=\"data:image/png;base64,"
        << data << "\"><figcaption>" << escape(b.text) << "</figcaption></figure>\n";
    break;
  }
  }
}

std::string markdown_cell(const Cell& c) {
  std::string text = c.text;
  for (std::size_t i = 0; (i = text.find('|', i)) != std::string::npos; i += 2)
    text.replace(i, 1, "\\|");
  return c.flag == Cell::Flag::attention ? "**" + text + "**" : text;
}

} // namespace

std::string to_html(const Document& d, const std::string& folder) {
  std::ostringstream out;
  out << "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n<title>"
      << escape(d.title) << "</title>\n<style>" << style << "</style>\n</head>\n<body>\n";
  out << "<h1>" << escape(d.title) << "</h1>\n<p class=\"subtitle\">"
      << escape(d.subtitle) << "</p>\n";
  for (const auto& s : d.sections) {
    out << "<h2>" << escape(s.heading) << "</h2>\n";
    for (const auto& b : s.blocks)
      html_block(out, b, folder);
  }
  out << "</body>\n</html>\n";
  return out.str();
}

std::string to_markdown(const Document& d) {
  std::ostringstream out;
  out << "# " << d.title << "\n\n_" << d.subtitle << "_\n";
  for (const auto& s : d.sections) {
    out << "\n## " << s.heading << "\n";
    for (const auto& b : s.blocks) {
      out << '\n';
      switch (b.kind) {
      case Block::Kind::paragraph:
        out << b.text << '\n';
        break;
      case Block::Kind::note:
        out << "> " << b.text << '\n';
        break;
      case Block::Kind::list:
        for (const auto& item : b.items)
          out << "- " << item << '\n';
        break;
      case Block::Kind::table:
        for (const auto& h : b.table.header)
          out << "| " << h << ' ';
        out << "|\n";
        for (std::size_t i = 0; i < b.table.header.size(); ++i)
          out << "| --- ";
        out << "|\n";
        for (const auto& row : b.table.rows) {
          for (const auto& c : row)
            out << "| " << markdown_cell(c) << ' ';
          out << "|\n";
        }
        break;
      case Block::Kind::image:
        out << "![" << b.text << "](" << b.image << ")\n";
        break;
      }
    }
  }
  return out.str();
}

} // namespace settlewell::report
