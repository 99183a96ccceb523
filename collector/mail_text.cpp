#include "collector/mail_text.h"

#include "collector/mail_codec.h"
#include "core/text.h"

#include <locale.h>
#include <wctype.h>

#include <algorithm>
#include <cctype>

namespace twinprobe {
namespace {

// One code point of UTF-8 at `i`: its value and byte length. An invalid
// byte is one "code point" of its own (value 0xFFFD) so nothing is lost.
uint32_t DecodeAt(std::string_view s, size_t i, size_t& len) {
  unsigned char c = static_cast<unsigned char>(s[i]);
  int extra = c < 0x80 ? 0 : (c >> 5) == 0x6 ? 1 : (c >> 4) == 0xE ? 2 : (c >> 3) == 0x1E ? 3 : -1;
  if (extra < 0 || i + extra >= s.size()) {
    len = 1;
    return c < 0x80 ? c : 0xFFFD;
  }
  uint32_t cp = extra == 0 ? c : extra == 1 ? (c & 0x1F) : extra == 2 ? (c & 0x0F) : (c & 0x07);
  for (int k = 1; k <= extra; ++k) {
    unsigned char cc = static_cast<unsigned char>(s[i + k]);
    if ((cc & 0xC0) != 0x80) {
      len = 1;
      return 0xFFFD;
    }
    cp = (cp << 6) | (cc & 0x3F);
  }
  len = static_cast<size_t>(extra) + 1;
  return cp;
}

locale_t Utf8Locale() {
  static locale_t loc = newlocale(LC_CTYPE_MASK, "C.UTF-8", static_cast<locale_t>(nullptr));
  return loc;
}

uint32_t Lower(uint32_t cp) {
  if (cp < 0x80) return static_cast<uint32_t>(std::tolower(static_cast<int>(cp)));
  locale_t loc = Utf8Locale();
  return loc ? static_cast<uint32_t>(towlower_l(static_cast<wint_t>(cp), loc)) : cp;
}

bool IsWordChar(uint32_t cp) {
  if (cp < 0x80) return std::isalnum(static_cast<int>(cp)) != 0;
  if (cp == 0xFFFD) return false;
  locale_t loc = Utf8Locale();
  return loc ? iswalnum_l(static_cast<wint_t>(cp), loc) != 0 : true;
}

bool IsSpace(uint32_t cp) {
  return cp == ' ' || cp == '\t' || cp == '\n' || cp == '\r' || cp == '\f' || cp == '\v' || cp == 0xA0 ||
         (cp >= 0x2000 && cp <= 0x200B) || cp == 0x202F || cp == 0x205F || cp == 0x3000 || cp == 0xFEFF;
}

// Typographic quotes and dashes read as their plain forms, so "can’t"
// matches a rule written "can't".
uint32_t Plain(uint32_t cp) {
  if (cp == 0x2018 || cp == 0x2019 || cp == 0x201B || cp == 0x2032) return '\'';
  if (cp == 0x201C || cp == 0x201D || cp == 0x201E) return '"';
  if (cp >= 0x2010 && cp <= 0x2015) return '-';
  return cp;
}

// The code point ending just before byte `i`.
uint32_t PreviousCodePoint(std::string_view s, size_t i) {
  if (i == 0) return ' ';
  size_t start = i - 1;
  while (start > 0 && (static_cast<unsigned char>(s[start]) & 0xC0) == 0x80 && i - start < 4) --start;
  size_t len;
  return DecodeAt(s, start, len);
}

std::vector<std::string_view> Lines(std::string_view text) {
  std::vector<std::string_view> out;
  size_t pos = 0;
  while (pos <= text.size()) {
    size_t eol = text.find('\n', pos);
    std::string_view line = text.substr(pos, eol == std::string_view::npos ? std::string_view::npos : eol - pos);
    if (!line.empty() && line.back() == '\r') line.remove_suffix(1);
    out.push_back(line);
    if (eol == std::string_view::npos) break;
    pos = eol + 1;
  }
  return out;
}

bool StartsWithNoCase(std::string_view s, std::string_view prefix) {
  return s.size() >= prefix.size() && twinprobe::Lower(s.substr(0, prefix.size())) == prefix;
}

// "-----Original Message-----" in any number of dashes and any case.
bool IsOriginalMessageLine(std::string_view t) {
  std::string l = twinprobe::Lower(t);  // the ASCII one, not Lower(code point)
  size_t a = l.find_first_not_of('-');
  size_t b = l.find_last_not_of('-');
  if (a == std::string::npos || a < 2 || l.size() - 1 - b < 2) return false;
  return Trim(std::string_view(l).substr(a, b - a + 1)) == "original message";
}

bool IsForwardMarker(std::string_view t) {
  std::string l = twinprobe::Lower(t);  // the ASCII one, not Lower(code point)
  return l.find("forwarded message") != std::string::npos || l.rfind("begin forwarded message", 0) == 0 ||
         l.find("attached message") != std::string::npos;
}

bool IsHeaderBlockAt(const std::vector<std::string_view>& lines, size_t i) {
  if (!StartsWithNoCase(Trim(lines[i]), "from:")) return false;
  bool subject = false, date = false;
  for (size_t k = i + 1; k < lines.size() && k <= i + 5; ++k) {
    std::string_view t = Trim(lines[k]);
    while (!t.empty() && t.front() == '*') t.remove_prefix(1);
    subject = subject || StartsWithNoCase(t, "subject:");
    date = date || StartsWithNoCase(t, "sent:") || StartsWithNoCase(t, "date:");
  }
  return subject && date;
}

bool IsReplyBoundary(const std::vector<std::string_view>& lines, size_t i) {
  std::string_view t = Trim(lines[i]);
  std::string l = twinprobe::Lower(t);  // the ASCII one, not Lower(code point)
  if (l.size() >= 6 &&
      (l.compare(l.size() - 6, 6, "wrote:") == 0 || (l.size() >= 7 && l.compare(l.size() - 7, 7, "wrote :") == 0)))
    return true;
  return IsOriginalMessageLine(t) || IsHeaderBlockAt(lines, i);
}

}  // namespace

std::string FreshText(std::string_view body, std::string_view subject) {
  std::string_view s = Trim(subject);
  bool forward_subject = StartsWithNoCase(s, "fw:") || StartsWithNoCase(s, "fwd:") || StartsWithNoCase(s, "fw :");
  auto lines = Lines(body);
  std::string out;
  bool expect_forwarded_header = false;
  bool forward_seen = false;
  for (size_t i = 0; i < lines.size(); ++i) {
    std::string_view t = Trim(lines[i]);
    if (!t.empty() && t.front() == '>') continue;
    if (IsForwardMarker(t)) {
      expect_forwarded_header = true;
      forward_seen = true;
    } else if (IsReplyBoundary(lines, i)) {
      if (expect_forwarded_header || (forward_subject && !forward_seen)) {
        // The forwarded message starts here; a "-----Original Message-----"
        // line is followed by its header block, which belongs to it too.
        expect_forwarded_header = !IsHeaderBlockAt(lines, i);
        forward_seen = true;
      } else {
        break;
      }
    } else if (!t.empty() && !(expect_forwarded_header && t.find(':') != std::string_view::npos)) {
      expect_forwarded_header = false;
    }
    out.append(lines[i]);
    out += '\n';
  }
  while (!out.empty() && (out.back() == '\n' || out.back() == ' ')) out.pop_back();
  return out;
}

SearchText MakeSearchText(std::string_view text) {
  SearchText st;
  // Collapse whitespace first, so `plain` is what contexts are cut from.
  bool pending = false;
  st.plain.reserve(text.size());
  for (size_t i = 0; i < text.size();) {
    size_t len;
    uint32_t cp = DecodeAt(text, i, len);
    if (IsSpace(cp)) {
      pending = !st.plain.empty();
    } else {
      if (pending) st.plain += ' ';
      pending = false;
      st.plain.append(text.substr(i, len));
    }
    i += len;
  }
  st.folded.reserve(st.plain.size());
  st.origin.reserve(st.plain.size() + 1);
  for (size_t i = 0; i < st.plain.size();) {
    size_t len;
    uint32_t cp = DecodeAt(st.plain, i, len);
    size_t before = st.folded.size();
    if (cp == 0xFFFD && len == 1)
      st.folded += st.plain[i];
    else
      AppendUtf8(st.folded, Lower(Plain(cp)));
    for (size_t k = before; k < st.folded.size(); ++k) st.origin.push_back(static_cast<uint32_t>(i));
    i += len;
  }
  st.origin.push_back(static_cast<uint32_t>(st.plain.size()));
  return st;
}

std::string FoldPhrase(std::string_view phrase) { return MakeSearchText(phrase).folded; }

std::vector<size_t> FindWholeWords(std::string_view folded, std::string_view phrase) {
  std::vector<size_t> hits;
  if (phrase.empty()) return hits;
  size_t first_len, last_start = phrase.size() - 1;
  bool word_start = IsWordChar(DecodeAt(phrase, 0, first_len));
  while (last_start > 0 && (static_cast<unsigned char>(phrase[last_start]) & 0xC0) == 0x80) --last_start;
  size_t last_len;
  bool word_end = IsWordChar(DecodeAt(phrase, last_start, last_len));
  size_t pos = 0;
  while ((pos = folded.find(phrase, pos)) != std::string_view::npos) {
    size_t end = pos + phrase.size();
    bool ok = true;
    if (word_start && IsWordChar(PreviousCodePoint(folded, pos))) ok = false;
    if (ok && word_end && end < folded.size()) {
      size_t len;
      if (IsWordChar(DecodeAt(folded, end, len))) ok = false;
    }
    if (ok) hits.push_back(pos);
    pos += 1;
  }
  return hits;
}

bool IsNegated(std::string_view folded, size_t offset, const std::vector<std::string>& negations, int words) {
  // Walk back over at most `words` words, stopping at a sentence end.
  size_t start = offset;
  int seen = 0;
  size_t i = offset;
  while (i > 0 && seen < words) {
    while (i > 0 && folded[i - 1] == ' ') --i;
    if (i == 0) break;
    char c = folded[i - 1];
    if (c == '.' || c == '!' || c == '?' || c == ';') break;
    while (i > 0 && folded[i - 1] != ' ' && folded[i - 1] != '.' && folded[i - 1] != '!' && folded[i - 1] != '?' &&
           folded[i - 1] != ';')
      --i;
    ++seen;
    start = i;
  }
  std::string_view window = folded.substr(start, offset - start);
  for (const auto& n : negations)
    if (!FindWholeWords(window, n).empty()) return true;
  return false;
}

std::string ContextAround(std::string_view plain, size_t begin, size_t end, int chars) {
  size_t a = begin;
  for (int k = 0; k < chars && a > 0; ++k) {
    --a;
    while (a > 0 && (static_cast<unsigned char>(plain[a]) & 0xC0) == 0x80) --a;
  }
  size_t b = end;
  for (int k = 0; k < chars && b < plain.size(); ++k) {
    size_t len;
    DecodeAt(plain, b, len);
    b += len;
  }
  std::string out = a > 0 ? "…" : "";
  out += std::string(plain.substr(a, b - a));
  if (b < plain.size()) out += "…";
  return out;
}

std::string Clip(std::string_view text, int chars) {
  size_t b = 0;
  for (int k = 0; k < chars && b < text.size(); ++k) {
    size_t len;
    DecodeAt(text, b, len);
    b += len;
  }
  std::string out(text.substr(0, b));
  if (b < text.size()) out += "…";
  return out;
}

}  // namespace twinprobe
