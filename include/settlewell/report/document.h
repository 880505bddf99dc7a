#pragma once

#include <string>
#include <vector>

/// A small document model rendered both as one self-contained HTML file (images
/// embedded) and as Markdown (images linked), so that the two never disagree.
namespace settlewell::report {

struct Cell {
  enum class Flag { none, ok, attention };
  std::string text;
  Flag flag = Flag::none;
};

struct Table {
  std::vector<std::string> header;
  std::vector<std::vector<Cell>> rows;
};

struct Block {
  enum class Kind { paragraph, note, list, table, image };
  Kind kind = Kind::paragraph;
  std::string text;               ///< paragraph, note, or image caption
  std::vector<std::string> items; ///< list
  Table table;
  std::string image; ///< path relative to the report's folder
};

struct Section {
  std::string heading;
  std::vector<Block> blocks;

  Section& paragraph(std::string text);
  Section& note(std::string text);
  Section& list(std::vector<std::string> items);
  Section& table(Table t);
  Section& image(std::string path, std::string caption);
};

struct Document {
  std::string title;
  std::string subtitle;
  std::vector<Section> sections;
  Section& add(std::string heading);
};

/// HTML with inline style; images read from `folder` and embedded as data URIs.
/// An image that cannot be read becomes a note saying so.
std::string to_html(const Document& document, const std::string& folder);
std::string to_markdown(const Document& document);

} // namespace settlewell::report
