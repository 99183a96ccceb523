#include "core/terminal_text.h"

#include <cstdint>
#include <cstdio>

namespace twinprobe {
namespace {

void AppendHexByte(std::string& out, unsigned char byte) {
  char buf[8];
  std::snprintf(buf, sizeof buf, "\\x%02x", byte);
  out += buf;
}

void AppendCodePoint(std::string& out, uint32_t cp) {
  char buf[10];
  std::snprintf(buf, sizeof buf, "\\u%04x", static_cast<unsigned>(cp));
  out += buf;
}

// Length of the valid UTF-8 sequence starting at text[i] (RFC 3629: no
// overlong forms, no surrogates, nothing past U+10FFFF), or 0 when invalid.
size_t Utf8Length(std::string_view text, size_t i, uint32_t& cp) {
  auto b = [&](size_t k) { return static_cast<unsigned char>(text[i + k]); };
  auto cont = [&](size_t k) { return i + k < text.size() && (b(k) & 0xC0) == 0x80; };
  unsigned char lead = b(0);
  if (lead >= 0xC2 && lead <= 0xDF && cont(1)) {
    cp = ((lead & 0x1Fu) << 6) | (b(1) & 0x3Fu);
    return 2;
  }
  if (lead >= 0xE0 && lead <= 0xEF && cont(1) && cont(2)) {
    cp = ((lead & 0x0Fu) << 12) | ((b(1) & 0x3Fu) << 6) | (b(2) & 0x3Fu);
    if (cp < 0x800 || (cp >= 0xD800 && cp <= 0xDFFF)) return 0;
    return 3;
  }
  if (lead >= 0xF0 && lead <= 0xF4 && cont(1) && cont(2) && cont(3)) {
    cp = ((lead & 0x07u) << 18) | ((b(1) & 0x3Fu) << 12) | ((b(2) & 0x3Fu) << 6) | (b(3) & 0x3Fu);
    if (cp < 0x10000 || cp > 0x10FFFF) return 0;
    return 4;
  }
  return 0;
}

bool IsBidiControl(uint32_t cp) { return (cp >= 0x202A && cp <= 0x202E) || (cp >= 0x2066 && cp <= 0x2069); }

}  // namespace

std::string ForTerminal(std::string_view text, LineBreaks breaks) {
  std::string out;
  out.reserve(text.size());
  for (size_t i = 0; i < text.size();) {
    unsigned char c = static_cast<unsigned char>(text[i]);
    if (c < 0x80) {
      if (c == '\t' || (c == '\n' && breaks == LineBreaks::kKeep)) out += static_cast<char>(c);
      else if (c == '\n') out += "\\n";
      else if (c == '\r') out += "\\r";
      else if (c < 0x20 || c == 0x7F) AppendHexByte(out, c);
      else out += static_cast<char>(c);
      ++i;
      continue;
    }
    uint32_t cp = 0;
    size_t n = Utf8Length(text, i, cp);
    if (n == 0) {
      AppendHexByte(out, c);
      ++i;
      continue;
    }
    if ((cp >= 0x80 && cp <= 0x9F) || IsBidiControl(cp)) AppendCodePoint(out, cp);
    else out.append(text.substr(i, n));
    i += n;
  }
  return out;
}

}  // namespace twinprobe
