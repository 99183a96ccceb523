#include "collector/mail_header.h"

#include <algorithm>
#include <cctype>
#include <cstdio>
#include <set>

#include "collector/mail_codec.h"
#include "core/clock.h"
#include "core/text.h"

namespace twinprobe {
namespace {

bool EqualsNoCase(std::string_view a, std::string_view b) {
  if (a.size() != b.size()) return false;
  for (size_t i = 0; i < a.size(); ++i)
    if (std::tolower(static_cast<unsigned char>(a[i])) != std::tolower(static_cast<unsigned char>(b[i]))) return false;
  return true;
}

// One encoded word starting at `pos` ("=?cs?E?text?="): fills its parts and
// returns the position after it, or npos if there is none here.
size_t ReadEncodedWord(std::string_view s, size_t pos, std::string& charset, std::string& bytes) {
  if (s.compare(pos, 2, "=?") != 0) return std::string_view::npos;
  size_t q1 = s.find('?', pos + 2);
  if (q1 == std::string_view::npos || q1 == pos + 2 || q1 + 3 > s.size() || s[q1 + 2] != '?')
    return std::string_view::npos;
  char enc = static_cast<char>(std::toupper(static_cast<unsigned char>(s[q1 + 1])));
  if (enc != 'B' && enc != 'Q') return std::string_view::npos;
  size_t end = s.find("?=", q1 + 3);
  if (end == std::string_view::npos) return std::string_view::npos;
  std::string_view cs = s.substr(pos + 2, q1 - pos - 2);
  if (cs.find_first_of(" \t\r\n") != std::string_view::npos) return std::string_view::npos;
  std::string_view text = s.substr(q1 + 3, end - q1 - 3);
  charset = Lower(cs);
  if (size_t star = charset.find('*'); star != std::string::npos) charset.resize(star);
  bytes = enc == 'B' ? DecodeBase64(text) : DecodeQEncoding(text);
  return end + 2;
}

// Splits on ';' outside double quotes.
std::vector<std::string_view> SplitParams(std::string_view s) {
  std::vector<std::string_view> out;
  bool quoted = false;
  size_t start = 0;
  for (size_t i = 0; i < s.size(); ++i) {
    if (s[i] == '\\' && quoted)
      ++i;
    else if (s[i] == '"')
      quoted = !quoted;
    else if (s[i] == ';' && !quoted) {
      out.push_back(s.substr(start, i - start));
      start = i + 1;
    }
  }
  out.push_back(s.substr(start));
  return out;
}

std::string Unquote(std::string_view v) {
  v = Trim(v);
  if (v.size() < 2 || v.front() != '"') return std::string(v);
  std::string out;
  for (size_t i = 1; i < v.size(); ++i) {
    if (v[i] == '"') break;
    if (v[i] == '\\' && i + 1 < v.size()) ++i;
    out += v[i];
  }
  return out;
}

std::string PercentDecode(std::string_view s) {
  std::string out;
  for (size_t i = 0; i < s.size(); ++i) {
    if (s[i] == '%' && i + 2 < s.size() && std::isxdigit(static_cast<unsigned char>(s[i + 1])) &&
        std::isxdigit(static_cast<unsigned char>(s[i + 2]))) {
      out += static_cast<char>(std::stoi(std::string(s.substr(i + 1, 2)), nullptr, 16));
      i += 2;
    } else {
      out += s[i];
    }
  }
  return out;
}

bool IsLocalChar(char c) {
  return std::isalnum(static_cast<unsigned char>(c)) ||
         std::string_view("!#$%&'*+/=?^_`{|}~.-").find(c) != std::string_view::npos;
}
bool IsDomainChar(char c) { return std::isalnum(static_cast<unsigned char>(c)) || c == '.' || c == '-'; }

int MonthNumber(std::string_view name) {
  static const char* kMonths[] = {"jan", "feb", "mar", "apr", "may", "jun", "jul", "aug", "sep", "oct", "nov", "dec"};
  std::string n = Lower(name.substr(0, 3));
  for (int m = 0; m < 12; ++m)
    if (n == kMonths[m] && name.size() >= 3) return m + 1;
  return 0;
}

std::vector<std::string_view> Words(std::string_view s) {
  std::vector<std::string_view> out;
  size_t i = 0;
  while (i < s.size()) {
    while (i < s.size() && (std::isspace(static_cast<unsigned char>(s[i])) || s[i] == ',')) ++i;
    size_t start = i;
    while (i < s.size() && !std::isspace(static_cast<unsigned char>(s[i])) && s[i] != ',') ++i;
    if (i > start) out.push_back(s.substr(start, i - start));
  }
  return out;
}

bool AllDigits(std::string_view s) {
  return !s.empty() &&
         std::all_of(s.begin(), s.end(), [](char c) { return std::isdigit(static_cast<unsigned char>(c)); });
}

// The value of a run of 1..max_digits digits; nullopt for anything else.
// std::stoi would throw on a run too long for an int (the mail fuzzer found
// an mbox "From " line with a 60-digit year), and a damaged header must be
// read as far as it goes, never stop the reading.
std::optional<int> SmallNumber(std::string_view s, size_t max_digits) {
  if (s.size() > max_digits || !AllDigits(s)) return std::nullopt;
  int v = 0;
  for (char c : s) v = v * 10 + (c - '0');
  return v;
}

// "HH:MM[:SS]" → seconds of the day; -1 if malformed.
int ParseClock(std::string_view t) {
  int h = 0, m = 0, s = 0;
  char tail = 0;
  std::string text(t);
  int n = std::sscanf(text.c_str(), "%2d:%2d:%2d%c", &h, &m, &s, &tail);
  if (n < 2 || n == 4 || h > 23 || m > 59 || s > 60) return -1;
  if (n == 2) s = 0;
  return h * 3600 + m * 60 + std::min(s, 59);
}

std::optional<int64_t> EpochOf(int year, int month, int day, int seconds_of_day) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%04d-%02d-%02d", year, month, day);
  auto t = ParseIsoTime(buf);
  if (!t) return std::nullopt;
  return *t + seconds_of_day;
}

// Zone as seconds east of UTC: +hhmm / -hhmm, or an RFC 5322 obsolete name.
// Unknown names count as UTC (RFC 5322 section 4.3: "-0000").
int ZoneOffset(std::string_view z) {
  if ((z.size() == 5) && (z[0] == '+' || z[0] == '-') && AllDigits(z.substr(1))) {
    int hh = std::stoi(std::string(z.substr(1, 2))), mm = std::stoi(std::string(z.substr(3, 2)));
    int off = hh * 3600 + mm * 60;
    return z[0] == '-' ? -off : off;
  }
  static const std::pair<const char*, int> kNames[] = {{"ut", 0},   {"gmt", 0},  {"z", 0},    {"est", -5},
                                                       {"edt", -4}, {"cst", -6}, {"cdt", -5}, {"mst", -7},
                                                       {"mdt", -6}, {"pst", -8}, {"pdt", -7}};
  std::string n = Lower(z);
  for (const auto& [name, hours] : kNames)
    if (n == name) return hours * 3600;
  return 0;
}

}  // namespace

std::string HeaderBlock::Get(std::string_view name) const {
  for (const auto& f : fields)
    if (EqualsNoCase(f.name, name)) return f.value;
  return "";
}

std::vector<std::string> HeaderBlock::GetAll(std::string_view name) const {
  std::vector<std::string> out;
  for (const auto& f : fields)
    if (EqualsNoCase(f.name, name)) out.push_back(f.value);
  return out;
}

bool HeaderBlock::Has(std::string_view name) const {
  return std::any_of(fields.begin(), fields.end(), [&](const MailHeader& f) { return EqualsNoCase(f.name, name); });
}

void SplitHeaderBody(std::string_view message, std::string_view& header, std::string_view& body) {
  // The empty line may be the very first line (no headers at all).
  if (message.rfind("\n", 0) == 0 || message.rfind("\r\n", 0) == 0) {
    header = {};
    body = message.substr(message[0] == '\n' ? 1 : 2);
    return;
  }
  size_t lf = message.find("\n\n");
  size_t crlf = message.find("\r\n\r\n");
  if (lf == std::string_view::npos && crlf == std::string_view::npos) {
    header = message;
    body = {};
  } else if (crlf != std::string_view::npos && (lf == std::string_view::npos || crlf < lf)) {
    header = message.substr(0, crlf + 2);
    body = message.substr(crlf + 4);
  } else {
    header = message.substr(0, lf + 1);
    body = message.substr(lf + 2);
  }
}

HeaderBlock ParseHeaderBlock(std::string_view header) {
  HeaderBlock block;
  size_t i = 0;
  bool last_ok = false;
  while (i < header.size()) {
    size_t eol = header.find('\n', i);
    std::string_view line = header.substr(i, eol == std::string_view::npos ? std::string_view::npos : eol - i);
    i = eol == std::string_view::npos ? header.size() : eol + 1;
    if (!line.empty() && line.back() == '\r') line.remove_suffix(1);
    if (line.empty()) continue;
    if (line[0] == ' ' || line[0] == '\t') {
      if (last_ok) block.fields.back().value += std::string(line);
      continue;
    }
    size_t colon = line.find(':');
    last_ok = colon != std::string_view::npos && colon > 0 &&
              line.substr(0, colon).find_first_of(" \t") == std::string_view::npos;
    if (!last_ok) continue;
    std::string_view value = line.substr(colon + 1);
    while (!value.empty() && (value.front() == ' ' || value.front() == '\t')) value.remove_prefix(1);
    block.fields.push_back({std::string(line.substr(0, colon)), std::string(value)});
  }
  for (auto& f : block.fields) {
    std::string_view v = Trim(f.value);
    f.value = std::string(v);
  }
  return block;
}

std::string DecodeHeaderText(std::string_view s) {
  std::string out;
  size_t i = 0;
  std::string run_charset, run_bytes;  // adjacent words of one charset decode together
  auto flush_run = [&] {
    if (!run_bytes.empty() || !run_charset.empty()) out += ToUtf8(run_bytes, run_charset);
    run_bytes.clear();
    run_charset.clear();
  };
  size_t plain_start = 0;
  bool after_word = false;
  while (i < s.size()) {
    size_t next = s.find("=?", i);
    if (next == std::string_view::npos) break;
    std::string charset, bytes;
    size_t end = ReadEncodedWord(s, next, charset, bytes);
    if (end == std::string_view::npos) {
      i = next + 2;
      continue;
    }
    std::string_view between = s.substr(plain_start, next - plain_start);
    bool only_space = between.find_first_not_of(" \t\r\n") == std::string_view::npos;
    if (after_word && only_space) {
      if (charset != run_charset) flush_run();
    } else {
      flush_run();
      out += ToUtf8(between, "");
    }
    run_charset = charset;
    run_bytes += bytes;
    after_word = true;
    i = plain_start = end;
  }
  flush_run();
  out += ToUtf8(s.substr(plain_start), "");
  return out;
}

std::string MimeValue::Param(const std::string& name) const {
  auto it = params.find(name);
  return it == params.end() ? "" : it->second;
}

MimeValue ParseMimeValue(std::string_view value) {
  MimeValue mv;
  auto parts = SplitParams(value);
  mv.type = Lower(Trim(parts[0]));
  struct Piece {
    std::string text;
    bool extended = false;
  };
  std::map<std::string, std::map<int, Piece>> continued;
  for (size_t k = 1; k < parts.size(); ++k) {
    std::string_view p = Trim(parts[k]);
    size_t eq = p.find('=');
    if (eq == std::string_view::npos) continue;
    std::string name = Lower(Trim(p.substr(0, eq)));
    std::string raw = Unquote(p.substr(eq + 1));
    bool extended = !name.empty() && name.back() == '*';
    if (extended) name.pop_back();
    int index = 0;
    if (size_t star = name.find('*'); star != std::string::npos) {
      std::string idx = name.substr(star + 1);
      name.resize(star);
      if (AllDigits(idx)) {
        auto n = SmallNumber(idx, 4);  // RFC 2231 section 3: sections are numbered 0, 1, 2 …
        if (!n) continue;              // an index no sender writes: drop that piece
        index = *n;
      }
    }
    continued[name][index] = {raw, extended};
  }
  for (auto& [name, pieces] : continued) {
    std::string charset, bytes;
    bool any_extended = false;
    for (auto& [index, piece] : pieces) {
      std::string text = piece.text;
      if (piece.extended) {
        any_extended = true;
        if (index == 0) {  // charset'language'value
          size_t a = text.find('\'');
          size_t b = a == std::string::npos ? std::string::npos : text.find('\'', a + 1);
          if (b != std::string::npos) {
            charset = text.substr(0, a);
            text = text.substr(b + 1);
          }
        }
        bytes += PercentDecode(text);
      } else {
        bytes += text;
      }
    }
    mv.params[name] = any_extended ? ToUtf8(bytes, charset) : DecodeHeaderText(bytes);
  }
  return mv;
}

std::vector<std::string> ExtractAddresses(std::string_view text) {
  std::vector<std::string> out;
  std::set<std::string> seen;
  size_t at = 0;
  while ((at = text.find('@', at)) != std::string_view::npos) {
    size_t start = at;
    while (start > 0 && IsLocalChar(text[start - 1])) --start;
    size_t end = at + 1;
    while (end < text.size() && IsDomainChar(text[end])) ++end;
    std::string_view local = text.substr(start, at - start);
    std::string_view domain = text.substr(at + 1, end - at - 1);
    while (!local.empty() && local.front() == '.') local.remove_prefix(1);
    while (!domain.empty() && (domain.back() == '.' || domain.back() == '-')) domain.remove_suffix(1);
    at = end;
    if (local.empty() || domain.find('.') == std::string_view::npos || domain.front() == '.') continue;
    std::string addr = Lower(local) + "@" + Lower(domain);
    if (seen.insert(addr).second) out.push_back(addr);
  }
  return out;
}

std::string AddressDomain(std::string_view address) {
  size_t at = address.rfind('@');
  return at == std::string_view::npos ? "" : Lower(address.substr(at + 1));
}

std::optional<int64_t> ParseMailDate(std::string_view value) {
  // Comments such as "(CET)" carry nothing the zone does not.
  std::string text;
  int depth = 0;
  for (char c : value) {
    if (c == '(')
      ++depth;
    else if (c == ')' && depth > 0)
      --depth;
    else if (depth == 0)
      text += c;
  }
  auto w = Words(text);
  // Mail clients write forwarded dates as "Fri, 5 Mar 2027 at 11:02".
  w.erase(std::remove_if(w.begin(), w.end(), [](std::string_view x) { return Lower(x) == "at"; }), w.end());
  size_t k = 0;
  if (k < w.size() && !AllDigits(w[k])) ++k;  // day of week
  if (k + 2 >= w.size()) return std::nullopt;
  auto day = SmallNumber(w[k], 2);  // RFC 5322 section 3.3: day = 1*2DIGIT
  int month = MonthNumber(w[k + 1]);
  auto year_number = SmallNumber(w[k + 2], 4);
  if (!day || !month || !year_number) return std::nullopt;
  int year = *year_number;
  if (w[k + 2].size() <= 2)
    year += year < 50 ? 2000 : 1900;  // RFC 5322 section 4.3
  else if (w[k + 2].size() == 3)
    year += 1900;
  int clock = 0;
  if (k + 3 < w.size()) {
    clock = ParseClock(w[k + 3]);
    if (clock < 0) return std::nullopt;
  }
  int offset = k + 4 < w.size() ? ZoneOffset(w[k + 4]) : 0;
  auto t = EpochOf(year, month, *day, clock);
  if (!t) return std::nullopt;
  return *t - offset;
}

std::optional<int64_t> ParseMboxFromLineDate(std::string_view line) {
  auto w = Words(line);
  // From SENDER DOW MON DAY HH:MM:SS YEAR
  for (size_t k = 2; k + 3 < w.size(); ++k) {
    int month = MonthNumber(w[k]);
    auto day = SmallNumber(w[k + 1], 2), year = SmallNumber(w[k + 3], 4);
    if (!month || w[k].size() != 3 || !day || !year) continue;
    int clock = ParseClock(w[k + 2]);
    if (clock < 0) continue;
    return EpochOf(*year, month, *day, clock);
  }
  return std::nullopt;
}

}  // namespace twinprobe
