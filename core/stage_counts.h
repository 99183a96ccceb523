#pragma once
// How many applications of the current plan carry each current response
// code, by arm: what the hiring-stage analysis (analysis/stages.h) needs
// when the outcome is the furthest stage an application reached
// (`import applications --stages`). Counts only; no applicant is named.
#include <cstdint>
#include <string>
#include <vector>

namespace twinprobe {

class Store;

struct StageCodeCount {
  std::string arm;   // arm label
  std::string code;  // current response code
  int64_t applications = 0;
};

// Every (arm, code) with at least one application; empty without a plan.
std::vector<StageCodeCount> ReadCodeCounts(Store& store);

}  // namespace twinprobe
