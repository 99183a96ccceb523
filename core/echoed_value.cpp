#include "core/echoed_value.h"

namespace twinprobe {
std::string WithThousands(size_t n) {
  std::string digits = std::to_string(n), out;
  for (size_t i = 0; i < digits.size(); ++i) {
    if (i > 0 && (digits.size() - i) % 3 == 0) out += ',';
    out += digits[i];
  }
  return out;
}

namespace {

bool IsContinuation(unsigned char c) { return (c & 0xC0) == 0x80; }

}  // namespace

std::string Echoed(std::string_view value) {
  // Walks at most kEchoedCharacters characters: the cost does not grow with
  // the value.
  size_t pos = 0;
  for (size_t characters = 0; pos < value.size(); ++characters) {
    if (characters == kEchoedCharacters)
      return std::string(value.substr(0, pos)) + "\u2026 (" + WithThousands(value.size()) + " bytes)";
    ++pos;
    while (pos < value.size() && IsContinuation(static_cast<unsigned char>(value[pos]))) ++pos;
  }
  return std::string(value);
}

}  // namespace twinprobe
