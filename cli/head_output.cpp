#include "cli/head_output.h"

#include <cstring>
#include <iostream>
#include <sstream>
#include <string>

#include <nlohmann/json.hpp>

#include "core/committed_head.h"

namespace twinprobe {

struct HeadOutput::Held {
  std::ostringstream buffer;
  std::streambuf* original = nullptr;
};

HeadOutput::HeadOutput(bool json) : json_(json) {
  if (!json_) return;
  held_ = new Held;
  held_->original = std::cout.rdbuf(held_->buffer.rdbuf());
}

HeadOutput::~HeadOutput() { Release(false); }

void HeadOutput::Finish() {
  if (json_) {
    Release(true);
    return;
  }
  const std::string head = LastCommittedHead();
  if (!head.empty()) std::cout << "Audit head: " << head << "\n";
}

void HeadOutput::Release(bool add_head) {
  if (!held_) return;
  std::cout.rdbuf(held_->original);
  std::string out = held_->buffer.str();
  delete held_;
  held_ = nullptr;
  const std::string head = LastCommittedHead();
  if (add_head && !head.empty()) {
    // Commands print one JSON object made by nlohmann::json::dump(2); parsed
    // and dumped again it is the same text with the member added. Anything
    // else passes unchanged.
    auto doc = nlohmann::json::parse(out, nullptr, false);
    if (!doc.is_discarded() && doc.is_object()) {
      doc["audit_head"] = head;
      out = doc.dump(2) + "\n";
    }
  }
  std::cout << out << std::flush;
}

bool WantsJson(int argc, char** argv) {
  for (int i = 1; i < argc; ++i)
    if (std::strcmp(argv[i], "--json") == 0) return true;
  return false;
}

}  // namespace twinprobe
