// Fuzzes the robots.txt parser and matcher (collector/robots.h, RFC 9309).
// Any bytes parse (the parser never fails); every group names at least one
// agent; every rule has a non-empty printable-ASCII pattern and a line number
// inside the text; a verdict's deciding rule belongs to the parsed rules,
// matches the path and gives the verdict; /robots.txt is always allowed; a
// pattern with no operators matches exactly the paths it is a prefix of.
#include <cstddef>
#include <cstdint>
#include <string>
#include <string_view>

#include "collector/robots.h"
#include "tests/fuzz/fuzz_check.h"

using namespace twinprobe;

namespace {

bool PrintableAscii(std::string_view s) {
  for (char c : s)
    if (static_cast<unsigned char>(c) <= 0x20 || static_cast<unsigned char>(c) >= 0x7F) return false;
  return true;
}

bool OwnedBy(const RobotsRules& rules, const RobotsRule* r) {
  for (const RobotsGroup& g : rules.groups())
    for (const RobotsRule& own : g.rules)
      if (&own == r) return true;
  return false;
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  std::string_view text(reinterpret_cast<const char*>(data), size);
  RobotsRules rules = ParseRobots(text);

  // Lines as the parser counts them: CR, LF and CRLF each end one.
  size_t lines = 1;
  for (size_t i = 0; i < size; ++i)
    if (text[i] == '\n' || (text[i] == '\r' && !(i + 1 < size && text[i + 1] == '\n'))) ++lines;
  int previous_group_line = 0;
  for (const RobotsGroup& g : rules.groups()) {
    FUZZ_CHECK(!g.agents.empty());
    for (const std::string& a : g.agents) {
      FUZZ_CHECK(!a.empty());
      if (a == "*") continue;
      for (char c : a) FUZZ_CHECK((c >= 'a' && c <= 'z') || c == '-' || c == '_');
    }
    FUZZ_CHECK(g.line > previous_group_line && static_cast<size_t>(g.line) <= lines);
    previous_group_line = g.line;
    int previous_rule_line = g.line;
    for (const RobotsRule& r : g.rules) {
      FUZZ_CHECK(!r.pattern.empty());
      FUZZ_CHECK(PrintableAscii(r.pattern));
      FUZZ_CHECK(r.line > previous_rule_line && static_cast<size_t>(r.line) <= lines);
      previous_rule_line = r.line;
    }
  }

  // The first line of the input doubles as a path to check.
  std::string_view first = text.substr(0, text.find_first_of("\r\n"));
  const std::string_view paths[] = {"/", "/search?q=nurse&sort=date", "/private/x", "/staff-board", "/a%2Fb*$", first};
  for (std::string_view token : {"VeldmarkListingAudit", "foobot", ""}) {
    for (std::string_view path : paths) {
      RobotsVerdict v = rules.Check(token, path);
      std::string normalised = NormaliseRobotsPath(path);
      FUZZ_CHECK(PrintableAscii(normalised));
      if (normalised == "/robots.txt") FUZZ_CHECK(v.allowed && !v.rule);
      if (v.rule) {
        FUZZ_CHECK(OwnedBy(rules, v.rule));
        FUZZ_CHECK(v.allowed == v.rule->allow);
        FUZZ_CHECK(RobotsPatternMatches(v.rule->pattern, normalised));
      } else {
        FUZZ_CHECK(v.allowed);
      }
      FUZZ_CHECK(!DescribeRobotsVerdict(v).empty());
    }
  }

  // A path normalised as a pattern has no operators left ('*' and '$' are
  // encoded), so it matches exactly the paths it is a prefix of.
  std::string pattern = NormaliseRobotsPath(first);
  for (std::string_view path : paths) {
    std::string p = NormaliseRobotsPath(path);
    FUZZ_CHECK(RobotsPatternMatches(pattern, p) == (p.rfind(pattern, 0) == 0));
  }
  return 0;
}
