#include "core/comma_list.h"

#include "core/text.h"

namespace twinprobe {

std::vector<std::string> SplitCommaList(std::string_view text) {
  std::vector<std::string> out;
  size_t start = 0;
  while (start <= text.size()) {
    size_t comma = text.find(',', start);
    if (comma == std::string_view::npos) comma = text.size();
    std::string_view item = Trim(text.substr(start, comma - start));
    if (!item.empty()) out.emplace_back(item);
    start = comma + 1;
  }
  return out;
}

}  // namespace twinprobe
