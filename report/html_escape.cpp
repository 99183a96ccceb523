#include "report/html_escape.h"

#include <cstdint>
#include <cstdio>

namespace twinprobe {
namespace {

constexpr const char* kReplacement = "\xEF\xBF\xBD";  // U+FFFD in UTF-8

bool IsBidiControl(uint32_t cp) {
  return cp == 0x061C || cp == 0x200E || cp == 0x200F || (cp >= 0x202A && cp <= 0x202E) ||
         (cp >= 0x2066 && cp <= 0x2069);
}

// Decodes one UTF-8 sequence at text[i]; returns its length, or 0 when the
// bytes are not a valid, shortest-form sequence of a Unicode scalar value.
size_t DecodeUtf8(std::string_view text, size_t i, uint32_t& cp) {
  const auto byte = [&](size_t k) { return static_cast<unsigned char>(text[k]); };
  const unsigned char b0 = byte(i);
  size_t len = 0;
  uint32_t min = 0;
  if (b0 < 0x80) return cp = b0, 1;
  if ((b0 & 0xE0) == 0xC0) len = 2, cp = b0 & 0x1F, min = 0x80;
  else if ((b0 & 0xF0) == 0xE0) len = 3, cp = b0 & 0x0F, min = 0x800;
  else if ((b0 & 0xF8) == 0xF0) len = 4, cp = b0 & 0x07, min = 0x10000;
  else return 0;
  if (i + len > text.size()) return 0;
  for (size_t k = 1; k < len; ++k) {
    if ((byte(i + k) & 0xC0) != 0x80) return 0;
    cp = (cp << 6) | (byte(i + k) & 0x3F);
  }
  if (cp < min || cp > 0x10FFFF || (cp >= 0xD800 && cp <= 0xDFFF)) return 0;
  return len;
}

}  // namespace

std::string EscapeHtml(std::string_view text) {
  std::string out;
  out.reserve(text.size() + text.size() / 8);
  for (size_t i = 0; i < text.size();) {
    uint32_t cp = 0;
    const size_t len = DecodeUtf8(text, i, cp);
    if (len == 0) {  // invalid byte: replace it and resynchronise on the next one
      out += kReplacement;
      ++i;
      continue;
    }
    switch (cp) {
      case '&': out += "&amp;"; break;
      case '<': out += "&lt;"; break;
      case '>': out += "&gt;"; break;
      case '"': out += "&quot;"; break;
      case '\'': out += "&#39;"; break;
      case '\t': case '\n': case '\r': out += static_cast<char>(cp); break;
      default:
        if (cp < 0x20 || cp == 0x7F || (cp >= 0x80 && cp < 0xA0)) {
          out += kReplacement;
        } else if (IsBidiControl(cp)) {
          char buf[16];
          std::snprintf(buf, sizeof buf, "&#x%X;", static_cast<unsigned>(cp));
          out += buf;
        } else {
          out.append(text.substr(i, len));
        }
    }
    i += len;
  }
  return out;
}

std::string UserText(std::string_view text) { return "<bdi>" + EscapeHtml(text) + "</bdi>"; }

}  // namespace twinprobe
