#include "core/text.h"

namespace twinprobe {
namespace {

// Not std::isspace/std::tolower: those follow the C locale of the process.
bool IsAsciiSpace(char c) { return c == ' ' || (c >= '\t' && c <= '\r'); }

}  // namespace

std::string Lower(std::string_view s) {
  std::string out(s);
  for (char& c : out)
    if (c >= 'A' && c <= 'Z') c = static_cast<char>(c - 'A' + 'a');
  return out;
}

size_t CodePoints(std::string_view text) {
  size_t n = 0;
  for (unsigned char c : text)
    if ((c & 0xC0) != 0x80) ++n;
  return n;
}

std::string PadRight(std::string_view text, size_t width) {
  std::string out(text);
  const size_t n = CodePoints(text);
  if (n < width) out.append(width - n, ' ');
  return out;
}

std::string PadLeft(std::string_view text, size_t width) {
  const size_t n = CodePoints(text);
  std::string out(n < width ? width - n : 0, ' ');
  out += text;
  return out;
}

std::string_view Trim(std::string_view s) {
  while (!s.empty() && IsAsciiSpace(s.front())) s.remove_prefix(1);
  while (!s.empty() && IsAsciiSpace(s.back())) s.remove_suffix(1);
  return s;
}

}  // namespace twinprobe
