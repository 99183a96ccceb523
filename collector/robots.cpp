#include "collector/robots.h"

#include <algorithm>
#include <cctype>

#include "core/text.h"

namespace twinprobe {
namespace {

constexpr size_t kMaxParsedBytes = 500 * 1024;  // RFC 9309 section 2.5: at least 500 KiB

bool IsUnreserved(unsigned char c) {
  return std::isalnum(c) || c == '-' || c == '.' || c == '_' || c == '~';
}

int HexValue(char c) {
  if (c >= '0' && c <= '9') return c - '0';
  if (c >= 'a' && c <= 'f') return c - 'a' + 10;
  if (c >= 'A' && c <= 'F') return c - 'A' + 10;
  return -1;
}

// Shared by paths and patterns; a pattern keeps "*" and "$" as operators,
// a path encodes them so a pattern can match them verbatim as %2A / %24
// (RFC 9309 section 2.2.3).
std::string Normalise(std::string_view in, bool is_pattern) {
  static const char* kHex = "0123456789ABCDEF";
  std::string out;
  out.reserve(in.size());
  for (size_t i = 0; i < in.size(); ++i) {
    unsigned char c = static_cast<unsigned char>(in[i]);
    if (c == '%' && i + 2 < in.size()) {
      int hi = HexValue(in[i + 1]);
      int lo = HexValue(in[i + 2]);
      if (hi >= 0 && lo >= 0) {
        unsigned char decoded = static_cast<unsigned char>(hi * 16 + lo);
        if (IsUnreserved(decoded)) out += static_cast<char>(decoded);
        else {
          out += '%';
          out += kHex[hi];
          out += kHex[lo];
        }
        i += 2;
        continue;
      }
    }
    bool encode = c <= 0x20 || c >= 0x7F || (!is_pattern && (c == '*' || c == '$'));
    if (encode) {
      out += '%';
      out += kHex[c >> 4];
      out += kHex[c & 15];
    } else {
      out += static_cast<char>(c);
    }
  }
  return out;
}

// The product token at the start of a user-agent value (RFC 9309 section
// 2.2.1 grammar: letters, "-" and "_"), lower-cased; "*" for the wildcard.
std::string AgentToken(std::string_view value) {
  if (!value.empty() && value.front() == '*') return "*";
  size_t n = 0;
  while (n < value.size() && (std::isalpha(static_cast<unsigned char>(value[n])) || value[n] == '-' || value[n] == '_'))
    ++n;
  return Lower(value.substr(0, n));
}

}  // namespace

std::string NormaliseRobotsPath(std::string_view path) { return Normalise(path.empty() ? "/" : path, false); }

bool RobotsPatternMatches(std::string_view pattern, std::string_view path) {
  bool anchored = !pattern.empty() && pattern.back() == '$';
  if (anchored) pattern.remove_suffix(1);
  // The set of path offsets the pattern prefix read so far can end at; "*"
  // widens it to every later offset. O(|pattern| * |path|) at worst, which
  // bounds the cost of hostile patterns.
  std::vector<size_t> ends = {0};
  std::vector<size_t> next;
  for (char p : pattern) {
    next.clear();
    if (p == '*') {
      for (size_t i = ends.front(); i <= path.size(); ++i) next.push_back(i);
    } else {
      for (size_t e : ends)
        if (e < path.size() && path[e] == p) next.push_back(e + 1);
    }
    if (next.empty()) return false;
    ends.swap(next);
  }
  return !anchored || ends.back() == path.size();
}

RobotsRules ParseRobots(std::string_view text) {
  RobotsRules out;
  if (text.size() > kMaxParsedBytes) text = text.substr(0, kMaxParsedBytes);
  if (text.substr(0, 3) == "\xEF\xBB\xBF") text.remove_prefix(3);
  bool group_has_rule = true;  // so the first user-agent line opens a group
  int line_no = 0;
  size_t pos = 0;
  while (pos <= text.size()) {
    size_t end = text.find_first_of("\r\n", pos);
    if (end == std::string_view::npos) end = text.size();
    std::string_view line = text.substr(pos, end - pos);
    ++line_no;
    pos = end + 1;
    if (end < text.size() && text[end] == '\r' && end + 1 < text.size() && text[end + 1] == '\n') ++pos;
    if (auto hash = line.find('#'); hash != std::string_view::npos) line = line.substr(0, hash);
    auto colon = line.find(':');
    if (colon == std::string_view::npos) {
      if (end == text.size()) break;
      continue;
    }
    std::string key = Lower(Trim(line.substr(0, colon)));
    std::string_view value = Trim(line.substr(colon + 1));
    if (key == "user-agent") {
      std::string token = AgentToken(value);
      if (token.empty()) continue;
      if (group_has_rule) {
        out.groups_.push_back(RobotsGroup{{}, {}, line_no});
        group_has_rule = false;
      }
      out.groups_.back().agents.push_back(token);
    } else if (key == "allow" || key == "disallow") {
      if (out.groups_.empty()) continue;  // a rule outside any group applies to no one
      group_has_rule = true;
      if (value.empty()) continue;  // "Disallow:" with no path disallows nothing
      out.groups_.back().rules.push_back(RobotsRule{key == "allow", Normalise(value, true), line_no});
    }
    if (end == text.size()) break;
  }
  return out;
}

RobotsRules RobotsRules::DisallowAll() {
  RobotsRules r;
  r.disallow_all_ = true;
  return r;
}

RobotsVerdict RobotsRules::Check(std::string_view product_token, std::string_view path_and_query) const {
  RobotsVerdict verdict;
  std::string path = NormaliseRobotsPath(path_and_query);
  if (path == "/robots.txt") return verdict;  // section 2.2.2: implicitly allowed
  if (disallow_all_) {
    verdict.allowed = false;
    return verdict;
  }
  std::string token = Lower(product_token);
  auto applies = [&](const std::string& who) {
    return std::any_of(groups_.begin(), groups_.end(), [&](const RobotsGroup& g) {
      return std::find(g.agents.begin(), g.agents.end(), who) != g.agents.end();
    });
  };
  std::string who = applies(token) ? token : "*";
  size_t best_length = 0;
  for (const RobotsGroup& g : groups_) {
    if (std::find(g.agents.begin(), g.agents.end(), who) == g.agents.end()) continue;
    for (const RobotsRule& r : g.rules) {
      if (!RobotsPatternMatches(r.pattern, path)) continue;
      size_t length = r.pattern.size();
      bool better = !verdict.rule || length > best_length || (length == best_length && r.allow && !verdict.rule->allow);
      if (better) {
        verdict.rule = &r;
        best_length = length;
        verdict.allowed = r.allow;
      }
    }
  }
  return verdict;
}

std::string DescribeRobotsVerdict(const RobotsVerdict& v) {
  if (!v.rule) return v.allowed ? "no rule applies" : "robots.txt could not be read, so everything is disallowed";
  return "line " + std::to_string(v.rule->line) + ": " + (v.rule->allow ? "Allow: " : "Disallow: ") + v.rule->pattern;
}

}  // namespace twinprobe
