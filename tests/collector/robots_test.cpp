// robots.txt parsing and matching, checked against the examples printed in
// RFC 9309 (Robots Exclusion Protocol, IETF, September 2022). The example
// rules are quoted from the RFC text beside each test. The section 5.1
// example was compared with a verbatim copy of the RFC's example; the other
// examples are quoted from memory of the RFC text and marked so.
#include <catch2/catch.hpp>

#include "collector/robots.h"

using namespace twinprobe;

namespace {

// RFC 9309 section 5.1, "Simple Example".
constexpr const char* kRfc51 =
    "User-Agent: *\n"
    "Disallow: *.gif$\n"
    "Disallow: /example/\n"
    "Allow: /publications/\n"
    "\n"
    "User-Agent: foobot\n"
    "Disallow:/\n"
    "Allow:/example/page.html\n"
    "Allow:/example/allowed.gif\n"
    "\n"
    "User-Agent: barbot\n"
    "User-Agent: bazbot\n"
    "Disallow: /example/page.html\n"
    "\n"
    "User-Agent: quxbot\n"
    "\n"
    "EOF\n";

}  // namespace

TEST_CASE("robots: RFC 9309 section 5.1 — the '*' group applies to crawlers not named") {
  RobotsRules r = ParseRobots(kRfc51);
  CHECK(r.IsAllowed("otherbot", "/publications/report.html"));
  CHECK_FALSE(r.IsAllowed("otherbot", "/example/index.html"));
  CHECK_FALSE(r.IsAllowed("otherbot", "/images/logo.gif"));  // *.gif$
  CHECK(r.IsAllowed("otherbot", "/images/logo.gif.html"));   // $ anchors at the end
  CHECK(r.IsAllowed("otherbot", "/about"));
}

TEST_CASE("robots: RFC 9309 section 5.1 — foobot may fetch only the two allowed paths") {
  RobotsRules r = ParseRobots(kRfc51);
  CHECK(r.IsAllowed("foobot", "/example/page.html"));
  CHECK(r.IsAllowed("foobot", "/example/allowed.gif"));
  CHECK_FALSE(r.IsAllowed("foobot", "/example/other.html"));
  CHECK_FALSE(r.IsAllowed("foobot", "/"));
  CHECK_FALSE(r.IsAllowed("FooBot", "/publications/"));  // product tokens match case-insensitively
}

TEST_CASE("robots: RFC 9309 section 5.1 — barbot and bazbot share one group") {
  RobotsRules r = ParseRobots(kRfc51);
  CHECK_FALSE(r.IsAllowed("barbot", "/example/page.html"));
  CHECK_FALSE(r.IsAllowed("bazbot", "/example/page.html"));
  CHECK(r.IsAllowed("barbot", "/example/"));  // the '*' rules do not apply to a named crawler
  CHECK(r.IsAllowed("bazbot", "/images/logo.gif"));
}

TEST_CASE("robots: RFC 9309 section 5.1 — quxbot has an empty group, so everything is allowed") {
  RobotsRules r = ParseRobots(kRfc51);
  CHECK(r.IsAllowed("quxbot", "/example/page.html"));
  CHECK(r.IsAllowed("quxbot", "/images/logo.gif"));
}

TEST_CASE("robots: RFC 9309 section 5.2 — the longest match wins (rules from memory of the RFC text)") {
  // User-Agent: foobot / Allow: /example/page/ / Disallow: /example/page/disallowed.gif
  RobotsRules r = ParseRobots(
      "User-Agent: foobot\n"
      "Allow: /example/page/\n"
      "Disallow: /example/page/disallowed.gif\n");
  CHECK(r.IsAllowed("foobot", "/example/page/"));
  CHECK(r.IsAllowed("foobot", "/example/page/allowed.gif"));
  CHECK_FALSE(r.IsAllowed("foobot", "/example/page/disallowed.gif"));
  RobotsVerdict v = r.Check("foobot", "/example/page/disallowed.gif");
  REQUIRE(v.rule);
  CHECK(v.rule->line == 3);
}

TEST_CASE("robots: RFC 9309 section 2.2.1 — groups for one crawler are merged (example from memory)") {
  // user-agent: ExampleBot / disallow: /foo / disallow: /bar, then again user-agent: ExampleBot / disallow: /baz
  RobotsRules r = ParseRobots(
      "user-agent: ExampleBot\n"
      "disallow: /foo\n"
      "disallow: /bar\n"
      "\n"
      "user-agent: ExampleBot\n"
      "disallow: /baz\n");
  CHECK_FALSE(r.IsAllowed("ExampleBot", "/foo"));
  CHECK_FALSE(r.IsAllowed("examplebot", "/bar"));
  CHECK_FALSE(r.IsAllowed("ExampleBot", "/baz/qux"));
  CHECK(r.IsAllowed("ExampleBot", "/other"));
}

TEST_CASE("robots: RFC 9309 section 2.2.2 — an allow and a disallow of equal length: allow wins") {
  RobotsRules r = ParseRobots("User-agent: *\nDisallow: /page\nAllow: /page\n");
  CHECK(r.IsAllowed("anybot", "/page"));
}

TEST_CASE("robots: RFC 9309 section 2.2.2 — /robots.txt is always allowed") {
  RobotsRules r = ParseRobots("User-agent: *\nDisallow: /\n");
  CHECK(r.IsAllowed("anybot", "/robots.txt"));
  CHECK_FALSE(r.IsAllowed("anybot", "/index.html"));
}

TEST_CASE("robots: RFC 9309 section 2.2.2 — percent-encoding table (from memory of the RFC text)") {
  // Path /foo/bar/%62%61%7A matches the rule /foo/bar/baz (unreserved octets are decoded).
  CHECK_FALSE(ParseRobots("User-agent: *\nDisallow: /foo/bar/baz\n").IsAllowed("x", "/foo/bar/%62%61%7A"));
  // Path /foo/bar/U+E38384 (UTF-8 bytes) and /foo/bar/%E3%83%84 match the rule /foo/bar/%E3%83%84.
  RobotsRules r = ParseRobots("User-agent: *\nDisallow: /foo/bar/%E3%83%84\n");
  CHECK_FALSE(r.IsAllowed("x", "/foo/bar/\xE3\x83\x84"));
  CHECK_FALSE(r.IsAllowed("x", "/foo/bar/%e3%83%84"));
  // Path /foo/bar?baz=quz matches the rule /foo/bar?baz=quz (the query takes part).
  CHECK_FALSE(ParseRobots("User-agent: *\nDisallow: /foo/bar?baz=quz\n").IsAllowed("x", "/foo/bar?baz=quz"));
}

TEST_CASE("robots: RFC 9309 section 2.2.3 — special characters # $ * (examples from memory)") {
  // allow: / # comment in line ; allow: /this/path/exactly$ ; allow: /this/*/exactly
  RobotsRules r = ParseRobots(
      "User-agent: *\n"
      "Disallow: / # comment in line\n"
      "# comment on its own line\n"
      "Allow: /this/path/exactly$\n"
      "Allow: /this/*/exactly\n");
  CHECK(r.IsAllowed("x", "/this/path/exactly"));
  CHECK_FALSE(r.IsAllowed("x", "/this/path/exact"));      // neither Allow matches; Disallow: / does
  CHECK(r.IsAllowed("x", "/this/path/exactly/more"));     // not by the $ rule, but /this/*/exactly is a prefix match
  CHECK(r.IsAllowed("x", "/this/any/thing/exactly"));
  CHECK_FALSE(r.IsAllowed("x", "/other"));
  // Matching a special character verbatim: the pattern /path/file-with-a-%2A.html
  // matches the URI path /path/file-with-a-*.html; /path/foo-%24 matches /path/foo-$.
  RobotsRules verbatim = ParseRobots("User-agent: *\nDisallow: /path/file-with-a-%2A.html\nDisallow: /path/foo-%24\n");
  CHECK_FALSE(verbatim.IsAllowed("x", "/path/file-with-a-*.html"));
  CHECK(verbatim.IsAllowed("x", "/path/file-with-a-b.html"));
  CHECK_FALSE(verbatim.IsAllowed("x", "/path/foo-$"));
}

TEST_CASE("robots: rules before any user-agent line apply to no one, and unknown lines are ignored") {
  RobotsRules r = ParseRobots("Disallow: /\nSitemap: https://jobs.veldmark.example/sitemap.xml\nCrawl-delay: 10\n");
  CHECK(r.groups().empty());
  CHECK(r.IsAllowed("x", "/anything"));
}

TEST_CASE("robots: a user-agent value is read up to its product token, and CRLF lines work") {
  RobotsRules r = ParseRobots("User-agent: VeldmarkListingAudit/1.0\r\nDisallow: /private\r\n");
  CHECK_FALSE(r.IsAllowed("veldmarklistingaudit", "/private/x"));
  CHECK(r.IsAllowed("OtherAudit", "/private/x"));  // no group and no '*': nothing applies
}

TEST_CASE("robots: an unreachable robots.txt disallows everything but /robots.txt") {
  RobotsRules r = RobotsRules::DisallowAll();
  CHECK_FALSE(r.IsAllowed("x", "/"));
  CHECK(r.IsAllowed("x", "/robots.txt"));
  CHECK(DescribeRobotsVerdict(r.Check("x", "/a")) == "robots.txt could not be read, so everything is disallowed");
}

TEST_CASE("robots: wildcard matching is linear in the worst case, not exponential") {
  std::string pattern = "/";
  for (int i = 0; i < 200; ++i) pattern += "*a";
  RobotsRules r = ParseRobots("User-agent: *\nDisallow: " + pattern + "$\n");
  CHECK(r.IsAllowed("x", "/" + std::string(5000, 'a') + "b"));
  CHECK_FALSE(r.IsAllowed("x", "/" + std::string(5000, 'a')));
}
