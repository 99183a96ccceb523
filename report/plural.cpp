#include "report/plural.h"

namespace twinprobe {

std::string Count(int64_t n, const std::string& one, const std::string& many) {
  return std::to_string(n) + " " + (n == 1 ? one : many);
}

}  // namespace twinprobe
