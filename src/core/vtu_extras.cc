// VTK's XML format for the arrays deal.II does not write: an ASCII DataArray of
// Int32 per cell, and String arrays, whose ASCII form is each string's bytes as
// numbers, each string ended by a 0 (as VTK's own XML writer writes them).
#include "settlewell/core/vtu_extras.h"

#include <sstream>
#include <stdexcept>

namespace settlewell {

namespace {

void write_integers(std::ostream& out, const VtuExtras::Integers& a) {
  out << "<DataArray type=\"Int32\" Name=\"" << a.name << "\" format=\"ascii\">\n";
  for (std::size_t i = 0; i < a.values.size(); ++i)
    out << a.values[i] << ((i + 1) % 20 == 0 ? '\n' : ' ');
  out << "\n</DataArray>\n";
}

void write_texts(std::ostream& out, const VtuExtras::Texts& a) {
  out << "<Array type=\"String\" Name=\"" << a.name << "\" NumberOfTuples=\""
      << a.values.size() << "\" format=\"ascii\">\n";
  for (const auto& text : a.values) {
    for (const unsigned char c : text)
      out << static_cast<unsigned int>(c) << ' ';
    out << "0\n";
  }
  out << "</Array>\n";
}

std::size_t find_or_throw(const std::string& text, const std::string& what) {
  const auto at = text.find(what);
  if (at == std::string::npos)
    throw std::logic_error("VTU extras: the file written by deal.II has no " + what);
  return at;
}

std::size_t cell_count(const std::string& vtu) {
  const std::string key = "NumberOfCells=\"";
  const auto at = find_or_throw(vtu, key) + key.size();
  return std::stoul(vtu.substr(at, vtu.find('"', at) - at));
}

void require_one_per_cell(const std::string& name,
                          std::size_t values,
                          std::size_t cells) {
  if (values != cells)
    throw std::logic_error("VTU extras: cell array '" + name + "' has " +
                           std::to_string(values) + " values for " +
                           std::to_string(cells) + " cells");
}

std::string field_data(const std::string& vtu, const VtuExtras& extras, std::size_t& at) {
  std::ostringstream arrays;
  for (const auto& a : extras.field_texts)
    write_texts(arrays, a);
  const auto end = vtu.find("</FieldData>");
  if (end != std::string::npos) {
    at = end;
    return arrays.str();
  }
  at = find_or_throw(vtu, "<Piece");
  return "<FieldData>\n" + arrays.str() + "</FieldData>\n";
}

} // namespace

std::string with_vtu_extras(const std::string& vtu, const VtuExtras& extras) {
  const std::size_t cells = cell_count(vtu);
  std::ostringstream cell_data;
  cell_data << "<CellData>\n";
  for (const auto& a : extras.cell_integers) {
    require_one_per_cell(a.name, a.values.size(), cells);
    write_integers(cell_data, a);
  }
  for (const auto& a : extras.cell_texts) {
    require_one_per_cell(a.name, a.values.size(), cells);
    write_texts(cell_data, a);
  }
  cell_data << "</CellData>\n";

  std::string out = vtu;
  out.insert(find_or_throw(out, "</Piece>"), cell_data.str());
  if (!extras.field_texts.empty()) {
    std::size_t at = 0;
    const std::string fields = field_data(out, extras, at);
    out.insert(at, fields);
  }
  return out;
}

std::string with_pvtu_extras(const std::string& pvtu, const VtuExtras& extras) {
  std::ostringstream declared;
  declared << "<PCellData>\n";
  for (const auto& a : extras.cell_integers)
    declared << "<PDataArray type=\"Int32\" Name=\"" << a.name << "\"/>\n";
  for (const auto& a : extras.cell_texts)
    declared << "<PArray type=\"String\" Name=\"" << a.name << "\"/>\n";
  declared << "</PCellData>\n";
  std::string out = pvtu;
  out.insert(find_or_throw(out, "<Piece"), declared.str());
  return out;
}

} // namespace settlewell
