#include "collector/mail_codec.h"

#include <iconv.h>

#include <cctype>
#include <cerrno>
#include <vector>

#include "core/text.h"

namespace twinprobe {
namespace {

int HexValue(char c) {
  if (c >= '0' && c <= '9') return c - '0';
  if (c >= 'A' && c <= 'F') return c - 'A' + 10;
  if (c >= 'a' && c <= 'f') return c - 'a' + 10;
  return -1;
}

int Base64Value(char c) {
  if (c >= 'A' && c <= 'Z') return c - 'A';
  if (c >= 'a' && c <= 'z') return c - 'a' + 26;
  if (c >= '0' && c <= '9') return c - '0' + 52;
  if (c == '+') return 62;
  if (c == '/') return 63;
  return -1;
}


// windows-1252 without iconv, so the fallback cannot fail. 0x80-0x9F per the
// WHATWG index (undefined bytes map to the C1 control of the same value).
std::string Windows1252ToUtf8(std::string_view bytes) {
  static const uint16_t kHigh[32] = {0x20AC, 0x0081, 0x201A, 0x0192, 0x201E, 0x2026, 0x2020, 0x2021,
                                     0x02C6, 0x2030, 0x0160, 0x2039, 0x0152, 0x008D, 0x017D, 0x008F,
                                     0x0090, 0x2018, 0x2019, 0x201C, 0x201D, 0x2022, 0x2013, 0x2014,
                                     0x02DC, 0x2122, 0x0161, 0x203A, 0x0153, 0x009D, 0x017E, 0x0178};
  std::string out;
  out.reserve(bytes.size());
  for (unsigned char c : bytes) {
    if (c < 0x80)
      out += static_cast<char>(c);
    else if (c < 0xA0)
      AppendUtf8(out, kHigh[c - 0x80]);
    else
      AppendUtf8(out, c);
  }
  return out;
}

// Converts with iconv; false if the charset is unknown or the input does not
// convert cleanly.
bool IconvToUtf8(std::string_view bytes, const std::string& charset, std::string& out) {
  iconv_t cd = iconv_open("UTF-8", charset.c_str());
  if (cd == reinterpret_cast<iconv_t>(-1)) return false;
  std::vector<char> in(bytes.begin(), bytes.end());
  char* in_ptr = in.data();
  size_t in_left = in.size();
  std::string result;
  std::vector<char> buf(4096);
  bool ok = true;
  while (in_left > 0) {
    char* out_ptr = buf.data();
    size_t out_left = buf.size();
    size_t rc = iconv(cd, &in_ptr, &in_left, &out_ptr, &out_left);
    result.append(buf.data(), buf.size() - out_left);
    if (rc == static_cast<size_t>(-1) && errno != E2BIG) {
      ok = false;
      break;
    }
  }
  if (ok) {  // flush a stateful encoding's shift sequence
    char* out_ptr = buf.data();
    size_t out_left = buf.size();
    iconv(cd, nullptr, nullptr, &out_ptr, &out_left);
    result.append(buf.data(), buf.size() - out_left);
  }
  iconv_close(cd);
  if (ok) out = std::move(result);
  return ok;
}

}  // namespace

void AppendUtf8(std::string& out, uint32_t cp) {
  if (cp < 0x80) {
    out += static_cast<char>(cp);
  } else if (cp < 0x800) {
    out += static_cast<char>(0xC0 | (cp >> 6));
    out += static_cast<char>(0x80 | (cp & 0x3F));
  } else if (cp < 0x10000) {
    out += static_cast<char>(0xE0 | (cp >> 12));
    out += static_cast<char>(0x80 | ((cp >> 6) & 0x3F));
    out += static_cast<char>(0x80 | (cp & 0x3F));
  } else {
    out += static_cast<char>(0xF0 | (cp >> 18));
    out += static_cast<char>(0x80 | ((cp >> 12) & 0x3F));
    out += static_cast<char>(0x80 | ((cp >> 6) & 0x3F));
    out += static_cast<char>(0x80 | (cp & 0x3F));
  }
}

std::string DecodeBase64(std::string_view text) {
  std::string out;
  out.reserve(text.size() * 3 / 4);
  uint32_t acc = 0;
  int bits = 0;
  for (char c : text) {
    if (c == '=') break;
    int v = Base64Value(c);
    if (v < 0) continue;
    acc = (acc << 6) | static_cast<uint32_t>(v);
    bits += 6;
    if (bits >= 8) {
      bits -= 8;
      out += static_cast<char>((acc >> bits) & 0xFF);
    }
  }
  return out;
}

std::string DecodeQuotedPrintable(std::string_view text) {
  std::string out;
  out.reserve(text.size());
  size_t i = 0;
  while (i < text.size()) {
    size_t eol = text.find('\n', i);
    bool has_eol = eol != std::string_view::npos;
    std::string_view line = text.substr(i, has_eol ? eol - i : std::string_view::npos);
    if (!line.empty() && line.back() == '\r') line.remove_suffix(1);
    while (!line.empty() && (line.back() == ' ' || line.back() == '\t')) line.remove_suffix(1);
    bool soft_break = !line.empty() && line.back() == '=';
    if (soft_break) line.remove_suffix(1);
    for (size_t k = 0; k < line.size(); ++k) {
      if (line[k] == '=' && k + 2 < line.size() && HexValue(line[k + 1]) >= 0 && HexValue(line[k + 2]) >= 0) {
        out += static_cast<char>(HexValue(line[k + 1]) * 16 + HexValue(line[k + 2]));
        k += 2;
      } else {
        out += line[k];
      }
    }
    if (has_eol && !soft_break) out += '\n';
    i = has_eol ? eol + 1 : text.size();
  }
  return out;
}

std::string DecodeQEncoding(std::string_view text) {
  std::string out;
  for (size_t k = 0; k < text.size(); ++k) {
    char c = text[k];
    if (c == '_')
      out += ' ';
    else if (c == '=' && k + 2 < text.size() && HexValue(text[k + 1]) >= 0 && HexValue(text[k + 2]) >= 0) {
      out += static_cast<char>(HexValue(text[k + 1]) * 16 + HexValue(text[k + 2]));
      k += 2;
    } else
      out += c;
  }
  return out;
}

bool IsUtf8(std::string_view s) {
  size_t i = 0;
  while (i < s.size()) {
    unsigned char c = static_cast<unsigned char>(s[i]);
    int extra;
    uint32_t cp;
    if (c < 0x80) {
      ++i;
      continue;
    }
    if (c >= 0xC2 && c <= 0xDF) {
      extra = 1;
      cp = c & 0x1F;
    } else if (c >= 0xE0 && c <= 0xEF) {
      extra = 2;
      cp = c & 0x0F;
    } else if (c >= 0xF0 && c <= 0xF4) {
      extra = 3;
      cp = c & 0x07;
    } else
      return false;
    if (i + extra >= s.size()) return false;
    for (int k = 1; k <= extra; ++k) {
      unsigned char cc = static_cast<unsigned char>(s[i + k]);
      if ((cc & 0xC0) != 0x80) return false;
      cp = (cp << 6) | (cc & 0x3F);
    }
    if ((extra == 2 && (cp < 0x800 || (cp >= 0xD800 && cp <= 0xDFFF))) ||
        (extra == 3 && (cp < 0x10000 || cp > 0x10FFFF)))
      return false;
    i += extra + 1;
  }
  return true;
}

namespace {

// UTF-16 (RFC 2781) to UTF-8 without iconv: every byte pattern has an answer.
// A lone surrogate or an odd last byte becomes U+FFFD, as the WHATWG Encoding
// Standard's UTF-16 decoder does.
std::string Utf16ToUtf8(std::string_view bytes, bool big_endian) {
  std::string out;
  out.reserve(bytes.size());
  auto unit = [&](size_t i) {
    const auto hi = static_cast<unsigned char>(bytes[big_endian ? i : i + 1]);
    const auto lo = static_cast<unsigned char>(bytes[big_endian ? i + 1 : i]);
    return static_cast<uint32_t>(hi << 8 | lo);
  };
  size_t i = 0;
  for (; i + 1 < bytes.size(); i += 2) {
    uint32_t u = unit(i);
    if (u >= 0xD800 && u <= 0xDBFF && i + 3 < bytes.size()) {
      uint32_t low = unit(i + 2);
      if (low >= 0xDC00 && low <= 0xDFFF) {
        AppendUtf8(out, 0x10000 + ((u - 0xD800) << 10) + (low - 0xDC00));
        i += 2;
        continue;
      }
    }
    AppendUtf8(out, u >= 0xD800 && u <= 0xDFFF ? 0xFFFD : u);
  }
  if (i < bytes.size()) AppendUtf8(out, 0xFFFD);
  return out;
}

// The byte order of a "utf-16" body: its byte order mark (dropped from
// `bytes`), else a guess from where the zero bytes stand. RFC 2781 section
// 4.3 says to assume big-endian without a mark, but mail clients on Windows
// write little-endian without one; text in Latin script has a zero high byte
// in most units, so the side with more zeros is the high byte.
bool Utf16IsBigEndian(std::string_view& bytes) {
  if (bytes.size() >= 2 && bytes[0] == '\xFE' && bytes[1] == '\xFF') {
    bytes.remove_prefix(2);
    return true;
  }
  if (bytes.size() >= 2 && bytes[0] == '\xFF' && bytes[1] == '\xFE') {
    bytes.remove_prefix(2);
    return false;
  }
  size_t zeros_even = 0, zeros_odd = 0;
  for (size_t i = 0; i < bytes.size(); ++i) (i % 2 == 0 ? zeros_even : zeros_odd) += bytes[i] == '\0';
  return zeros_even >= zeros_odd;
}

}  // namespace

std::string ToUtf8(std::string_view bytes, std::string_view charset) {
  std::string cs = Lower(charset);
  // RFC 2231 allows "charset*language"; the language is not ours to use.
  if (size_t star = cs.find('*'); star != std::string::npos) cs.resize(star);
  // Before the ASCII shortcut: UTF-16 text in Latin script is mostly bytes
  // below 0x80 (half of them zero), and would otherwise pass through raw.
  // A byte order mark that agrees with a labelled order is dropped too (the
  // WHATWG Encoding Standard's decode does the same).
  if (cs == "utf-16le" || cs == "utf-16be") {
    const bool big = cs == "utf-16be";
    if (bytes.size() >= 2 && bytes[0] == (big ? '\xFE' : '\xFF') && bytes[1] == (big ? '\xFF' : '\xFE'))
      bytes.remove_prefix(2);
    return Utf16ToUtf8(bytes, big);
  }
  if (cs == "utf-16" || cs == "utf16" || cs == "ucs-2") {
    const bool big = Utf16IsBigEndian(bytes);
    return Utf16ToUtf8(bytes, big);
  }
  bool ascii = true;
  for (unsigned char c : bytes) ascii = ascii && c < 0x80;
  if (ascii) return std::string(bytes);
  if (cs == "utf-8" || cs == "utf8") {
    if (IsUtf8(bytes)) return std::string(bytes);
    return Windows1252ToUtf8(bytes);
  }
  if (cs.empty() || cs == "us-ascii" || cs == "ascii" || cs == "iso-8859-1" || cs == "latin1" || cs == "iso_8859-1" ||
      cs == "l1" || cs == "windows-1252" || cs == "cp1252") {
    // Undeclared 8-bit text is most often UTF-8 these days.
    if ((cs.empty() || cs == "us-ascii" || cs == "ascii") && IsUtf8(bytes)) return std::string(bytes);
    return Windows1252ToUtf8(bytes);
  }
  std::string out;
  if (IconvToUtf8(bytes, cs, out) && IsUtf8(out)) return out;
  if (IsUtf8(bytes)) return std::string(bytes);
  return Windows1252ToUtf8(bytes);
}

}  // namespace twinprobe
