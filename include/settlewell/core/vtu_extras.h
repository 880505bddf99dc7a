#pragma once

#include <string>
#include <vector>

namespace settlewell {

/// What deal.II's VTU writer leaves out: arrays with one value per cell (VTK
/// CellData, which deal.II writes as point data constant over a cell) and arrays
/// that describe the whole dataset (VTK FieldData: region names, units). They are
/// written as ASCII arrays into the XML deal.II wrote; any VTK reader reads both.
struct VtuExtras {
  struct Integers {
    std::string name;
    std::vector<int> values;
  };
  struct Texts {
    std::string name;
    std::vector<std::string> values;
  };
  std::vector<Integers> cell_integers; ///< one value per cell, in the file's cell order
  std::vector<Texts> cell_texts;       ///< one value per cell, in the file's cell order
  std::vector<Texts> field_texts;      ///< any number of values
};

/// `vtu` (the text of a one-piece VTU file) with the extras written in. Throws
/// std::logic_error when the file has no piece or a cell array's length differs
/// from the piece's NumberOfCells.
std::string with_vtu_extras(const std::string& vtu, const VtuExtras& extras);

/// `pvtu` (a parallel record) with the extras' cell arrays declared, so that a
/// reader takes them from each piece.
std::string with_pvtu_extras(const std::string& pvtu, const VtuExtras& extras);

} // namespace settlewell
