#pragma once
// JSON has no infinity and no NaN. Every JSON document twinprobe writes
// (calc, analyze, report) gives an infinite estimate or bound as "Inf" or
// "-Inf", as R prints it, and an undefined value as null.
#include <cmath>

#include <nlohmann/json.hpp>

namespace twinprobe {

inline nlohmann::json JsonNumber(double v) {
  if (std::isinf(v)) return v > 0 ? "Inf" : "-Inf";
  if (std::isnan(v)) return nullptr;
  return v;
}

}  // namespace twinprobe
