#pragma once
// robots.txt as defined by RFC 9309 (Robots Exclusion Protocol, IETF 2022).
// Pure functions on strings: fetching robots.txt is collector/fetch_session.h.
//
// What is implemented, by section of RFC 9309:
// - 2.1/2.2: lines "user-agent", "allow", "disallow" (names case-insensitive,
//   "#" starts a comment); other lines (sitemap, crawl-delay …) are ignored.
//   A group is one or more user-agent lines followed by rules; a user-agent
//   line after a rule starts a new group; rules before any user-agent line
//   belong to no group.
// - 2.2.1: the crawler's product token is matched case-insensitively against
//   each group's user-agent values (only the leading run of letters, '-' and
//   '_' of a value counts, as the product-token grammar allows nothing else);
//   every matching group is merged into one; with no match the "*" groups
//   apply; with neither, nothing is disallowed.
// - 2.2.2: the rule with the longest pattern (in octets, after the encoding
//   below) that matches the path and query wins; an allow and a disallow of
//   the same length: allow wins; no match: allowed; "/robots.txt" is always
//   allowed. Before comparison, patterns and paths are normalised: octets
//   outside printable ASCII are percent-encoded, "%xx" of an unreserved
//   character (RFC 3986: letters, digits, "-._~") is decoded, and the hex
//   digits of other "%xx" are upper-cased.
// - 2.2.3: "*" matches any run of octets, "$" at the end of a pattern
//   anchors it at the end of the path; elsewhere "$" is an ordinary octet.
// - 2.5: only the first 500 KiB are parsed.
#include <string>
#include <string_view>
#include <vector>

namespace twinprobe {

struct RobotsRule {
  bool allow = false;
  std::string pattern;  // normalised; never empty (an empty rule is dropped)
  int line = 0;         // 1-based line in robots.txt
};

struct RobotsGroup {
  std::vector<std::string> agents;  // lower-cased product tokens, or "*"
  std::vector<RobotsRule> rules;
  int line = 0;  // line of the group's first user-agent line
};

struct RobotsVerdict {
  bool allowed = true;
  const RobotsRule* rule = nullptr;  // the deciding rule; null when none matched
};

class RobotsRules {
 public:
  // What applies to `product_token` (RFC 9309 section 2.2.1), for the path
  // and query of a URL ("/search?q=x"; "" is read as "/").
  RobotsVerdict Check(std::string_view product_token, std::string_view path_and_query) const;
  bool IsAllowed(std::string_view product_token, std::string_view path_and_query) const {
    return Check(product_token, path_and_query).allowed;
  }
  const std::vector<RobotsGroup>& groups() const { return groups_; }

  // The rules of a robots.txt that was unreachable (RFC 9309 section
  // 2.3.1.4: a server error or no answer means "disallow everything").
  static RobotsRules DisallowAll();
  // The rules when robots.txt is unavailable (section 2.3.1.3: a 4xx status
  // means the crawler may access anything).
  static RobotsRules AllowAll() { return RobotsRules(); }

 private:
  friend RobotsRules ParseRobots(std::string_view text);
  std::vector<RobotsGroup> groups_;
  bool disallow_all_ = false;
};

// Parses robots.txt text. Never fails: lines it cannot read are ignored, as
// RFC 9309 section 2.2 asks of crawlers.
RobotsRules ParseRobots(std::string_view text);

// The normalised form of a pattern or a path (see the header comment).
std::string NormaliseRobotsPath(std::string_view path);

// True if `pattern` (normalised, with "*" and a final "$") matches the start
// of `path` (normalised).
bool RobotsPatternMatches(std::string_view pattern, std::string_view path);

// "line 4: Disallow: /private/" — for dry runs and logs.
std::string DescribeRobotsVerdict(const RobotsVerdict& verdict);

}  // namespace twinprobe
