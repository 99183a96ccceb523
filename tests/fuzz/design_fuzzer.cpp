// Fuzzes the design-file loader: any bytes must give a Design or a
// positioned error, never a crash, hang or sanitizer report.
#include <cstddef>
#include <cstdint>
#include <string_view>

#include "planner/design_file.h"

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  std::string_view text(reinterpret_cast<const char*>(data), size);
  auto design = twinprobe::ParseDesign(text, "study.toml", "");
  if (!design.ok() && design.error().Message().empty()) __builtin_trap();  // every refusal says why
  return 0;
}
