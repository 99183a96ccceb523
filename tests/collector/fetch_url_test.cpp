// URL patterns, the host allowlist and redirect resolution (no network).
#include <catch2/catch.hpp>

#include "collector/fetch_session.h"
#include "collector/fetch_url.h"

using namespace twinprobe;

TEST_CASE("fetch url: placeholders are filled and percent-encoded") {
  CHECK(ExpandUrlPattern("https://jobs.veldmark.example/search?q={query}&where={location}&page={page}",
                         "warehouse clerk", "Brakkeport/Nord", 3) ==
        "https://jobs.veldmark.example/search?q=warehouse%20clerk&where=Brakkeport%2FNord&page=3");
  CHECK(PercentEncode("Tessv\xC3\xA1le & co") == "Tessv%C3%A1le%20%26%20co");
}

TEST_CASE("fetch url: only absolute http and https URLs are accepted") {
  auto u = ParseHttpUrl("https://Jobs.Veldmark.example/search?q=x#top");
  REQUIRE(u);
  CHECK(u->host == "jobs.veldmark.example");
  CHECK(u->port == 443);
  CHECK(u->path_and_query == "/search?q=x");
  CHECK(u->Authority() == "jobs.veldmark.example");
  CHECK_FALSE(ParseHttpUrl("ftp://jobs.veldmark.example/"));
  CHECK_FALSE(ParseHttpUrl("file:///etc/passwd"));
  CHECK_FALSE(ParseHttpUrl("/search?q=x"));
  CHECK_FALSE(ParseHttpUrl("https://user:pw@jobs.veldmark.example/"));
}

TEST_CASE("fetch url: the allowlist matches host and port exactly, without subdomains") {
  std::vector<std::string> allow = {"jobs.veldmark.example", "127.0.0.1:8123"};
  CHECK(HostAllowed(*ParseHttpUrl("https://jobs.veldmark.example/x"), allow));
  CHECK(HostAllowed(*ParseHttpUrl("http://jobs.veldmark.example/x"), allow));
  CHECK_FALSE(HostAllowed(*ParseHttpUrl("https://jobs.veldmark.example:8443/x"), allow));
  CHECK_FALSE(HostAllowed(*ParseHttpUrl("https://cdn.jobs.veldmark.example/x"), allow));
  CHECK_FALSE(HostAllowed(*ParseHttpUrl("https://jobs.veldmark.example.elsewhere.example/x"), allow));
  CHECK(HostAllowed(*ParseHttpUrl("http://127.0.0.1:8123/x"), allow));
  CHECK_FALSE(HostAllowed(*ParseHttpUrl("http://127.0.0.1:8124/x"), allow));
  CHECK_FALSE(HostAllowed(*ParseHttpUrl("http://localhost:8123/x"), allow));
}

TEST_CASE("fetch url: Location headers resolve against the page they came from") {
  CHECK(ResolveLocation("http://127.0.0.1:8123/moved?q=a", "/search?q=a") == "http://127.0.0.1:8123/search?q=a");
  CHECK(ResolveLocation("http://127.0.0.1:8123/a/b", "c") == "http://127.0.0.1:8123/a/c");
  CHECK(ResolveLocation("http://127.0.0.1:8123/a", "http://board.elsewhere.example/x#frag") ==
        "http://board.elsewhere.example/x");
}

TEST_CASE("fetch url: Retry-After as seconds or as an HTTP-date (RFC 9110 section 10.2.3)") {
  CHECK(ParseRetryAfter("120", 0) == 120.0);
  CHECK(ParseRetryAfter(" 1 ", 0) == 1.0);
  // IMF-fixdate example of RFC 9110 section 5.6.7: Sun, 06 Nov 1994 08:49:37 GMT = 784111777.
  CHECK(ParseRetryAfter("Sun, 06 Nov 1994 08:49:37 GMT", 784111777 - 30) == 30.0);
  CHECK(ParseRetryAfter("Sun, 06 Nov 1994 08:49:37 GMT", 784111777 + 30) == 0.0);
  CHECK_FALSE(ParseRetryAfter("soon", 0));
  CHECK_FALSE(ParseRetryAfter("", 0));
}

