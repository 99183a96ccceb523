#include "core/design.h"

#include <algorithm>

namespace twinprobe {

bool OutcomeScheme::is_positive(const std::string& code) const {
  return std::find(positive.begin(), positive.end(), code) != positive.end();
}

bool OutcomeScheme::has_code(const std::string& code) const {
  return std::find(codes.begin(), codes.end(), code) != codes.end();
}

}  // namespace twinprobe
