#pragma once
// Command-line lists such as --strata occupation,region: items split at
// commas, each without surrounding white space, empty items dropped ("" is
// the empty list).
#include <string>
#include <string_view>
#include <vector>

namespace twinprobe {

std::vector<std::string> SplitCommaList(std::string_view text);

}  // namespace twinprobe
