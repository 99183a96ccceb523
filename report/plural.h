#pragma once
// Counted nouns for report and command text: "1 pair", "2 pairs", "0 pairs".
// One helper, so no output says "1 entries" or "In the 1 pairs".
#include <cstdint>
#include <string>

namespace twinprobe {

// "N one" when n == 1, else "N many" (English: zero takes the plural).
std::string Count(int64_t n, const std::string& one, const std::string& many);

}  // namespace twinprobe
