#include "core/spreadsheet_cell.h"

namespace twinprobe {

bool LooksLikeFormula(std::string_view cell) {
  if (cell.empty()) return false;
  switch (cell.front()) {
    case '=': case '+': case '-': case '@': case '\t': case '\r': return true;
    default: return false;
  }
}

std::string NeutraliseCell(std::string_view cell) {
  if (!LooksLikeFormula(cell)) return std::string(cell);
  return "'" + std::string(cell);
}

}  // namespace twinprobe
