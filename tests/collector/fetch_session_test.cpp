// The fetch rules against a real HTTP server on 127.0.0.1 (the invented
// Veldmark Jobs Exchange of tests/fixtures/listing/server.py), through the
// real libcurl client. Each test names the rule it shows.
#include <catch2/catch.hpp>

#include <filesystem>

#include "collector/fetch_session.h"
#include "collector/fetch_fixture.h"
#include "core/sha256.h"

using namespace twinprobe;
using testing::FixtureServer;

namespace {

FetchPolicy PolicyFor(const FixtureServer& server) {
  FetchPolicy p;
  p.allow_hosts = {server.host()};
  p.user_agent = "VeldmarkListingAudit/1.0 (+listing-audit@newsroom.example)";
  p.product_token = "VeldmarkListingAudit";
  p.min_interval_seconds = 0.1;
  p.connect_timeout_seconds = 2;
  p.timeout_seconds = 5;
  p.retries = 2;
  p.backoff_seconds = 0.2;
  p.retry_after_cap_seconds = 10;
  return p;
}

struct Session {
  testing::TempDir dir;
  SnapshotStore snapshots{dir / "snapshots"};
  CurlHttpClient client;
  FetchSession session{&client, &snapshots, nullptr};
};

bool LogHas(const FetchSession& s, const std::string& outcome, const std::string& url_part) {
  for (const auto& e : s.log())
    if (e.outcome == outcome && e.url.find(url_part) != std::string::npos) return true;
  return false;
}

}  // namespace

TEST_CASE("fetch session: a page is fetched after robots.txt, with the identifying User-Agent, and kept as a snapshot") {
  FixtureServer server;
  Session s;
  PageFetch f = s.session.Fetch(server.base() + "/search?q=clerk&page=1", PolicyFor(server));
  REQUIRE(f.outcome == PageOutcome::kFetched);
  CHECK(f.http_status == 200);
  CHECK(f.body.find("Veldmark Jobs Exchange (invented)") != std::string::npos);
  // Content-addressed and byte-identical.
  CHECK(f.snapshot_sha256 == Sha256Hex(f.body));
  CHECK(testing::ReadFile(s.snapshots.PathOf(f.snapshot_sha256)) == f.body);
  auto seen = server.Requests();
  REQUIRE(seen.size() == 2);
  CHECK(seen[0].path == "/robots.txt");
  CHECK(seen[1].path == "/search?q=clerk&page=1");
  CHECK(seen[1].user_agent == "VeldmarkListingAudit/1.0 (+listing-audit@newsroom.example)");
  // robots.txt itself is evidence too.
  REQUIRE(s.session.log().size() == 2);
  CHECK(s.session.log()[0].outcome == "fetched");
  CHECK(std::filesystem::exists(s.snapshots.PathOf(s.session.log()[0].snapshot_sha256)));
}

TEST_CASE("fetch session: paths robots.txt disallows are never requested, the longest match decides") {
  FixtureServer server;
  Session s;
  FetchPolicy p = PolicyFor(server);
  PageFetch priv = s.session.Fetch(server.base() + "/private?q=x", p);
  CHECK(priv.outcome == PageOutcome::kRobots);
  CHECK(priv.reason == "robots.txt disallows it (line 7: Disallow: /private)");
  CHECK(s.session.Fetch(server.base() + "/staff?q=x", p).outcome == PageOutcome::kRobots);
  // "Disallow: /*?*sort=" — a wildcard rule over the query.
  CHECK(s.session.Fetch(server.base() + "/search?q=x&sort=new", p).outcome == PageOutcome::kRobots);
  // "Allow: /staff-board" (12 octets) beats "Disallow: /staff" (6 octets).
  CHECK(s.session.Fetch(server.base() + "/staff-board?q=x", p).outcome == PageOutcome::kFetched);
  CHECK(server.CountRequests("/private") == 0);
  CHECK(server.CountRequests("/staff?") == 0);
  CHECK(server.CountRequests("/search") == 0);
  CHECK(server.CountRequests("/robots.txt") == 1);  // read once per run
  CHECK(LogHas(s.session, "robots", "/private"));
}

TEST_CASE("fetch session: a crawler robots.txt does not name falls under '*', which disallows everything here") {
  FixtureServer server;
  Session s;
  FetchPolicy p = PolicyFor(server);
  p.product_token = "OtherAudit";
  p.user_agent = "OtherAudit/2.0 (+other@newsroom.example)";
  CHECK(s.session.Fetch(server.base() + "/search?q=x", p).outcome == PageOutcome::kRobots);
  CHECK(server.CountRequests("/search") == 0);
}

TEST_CASE("fetch session: a URL outside the allowlist is refused before any connection") {
  FixtureServer server;
  Session s;
  FetchPolicy p = PolicyFor(server);
  PageFetch f = s.session.Fetch("http://board.elsewhere.example/search?q=x", p);
  CHECK(f.outcome == PageOutcome::kAllowlist);
  CHECK(f.reason == "the host board.elsewhere.example is not in allow_hosts");
  p.allow_hosts = {"127.0.0.1"};  // the default port only, so the fixture's port is not allowed
  CHECK(s.session.Fetch(server.base() + "/search?q=x", p).outcome == PageOutcome::kAllowlist);
  CHECK(server.Requests().empty());  // not even robots.txt
  CHECK(LogHas(s.session, "allowlist", "board.elsewhere.example"));
}

TEST_CASE("fetch session: a redirect to a host outside the allowlist is refused and that host never contacted") {
  FixtureServer outside;  // a second server on loopback that is not allowlisted
  FixtureServer server({"--outside", "http://localhost:" + std::to_string(outside.port()) + "/search?q=x"});
  Session s;
  FetchPolicy p = PolicyFor(server);
  PageFetch f = s.session.Fetch(server.base() + "/away-local?q=x", p);
  CHECK(f.outcome == PageOutcome::kAllowlist);
  CHECK(f.reason == "redirected to http://localhost:" + std::to_string(outside.port()) +
                        "/search?q=x, which was refused: the host localhost:" + std::to_string(outside.port()) +
                        " is not in allow_hosts");
  CHECK(outside.Requests().empty());
  PageFetch away = s.session.Fetch(server.base() + "/away?q=x", p);
  CHECK(away.outcome == PageOutcome::kAllowlist);
  CHECK(LogHas(s.session, "redirect", "/away?q=x"));
  CHECK(LogHas(s.session, "allowlist", "board.elsewhere.example"));
}

TEST_CASE("fetch session: a redirect inside the allowlist is followed by the session, hop by hop") {
  FixtureServer server;
  Session s;
  PageFetch f = s.session.Fetch(server.base() + "/moved?q=x", PolicyFor(server));
  REQUIRE(f.outcome == PageOutcome::kFetched);
  CHECK(f.final_url == server.base() + "/search?q=x");
  CHECK(LogHas(s.session, "redirect", "/moved?q=x"));
  CHECK(LogHas(s.session, "fetched", "/search?q=x"));
}

TEST_CASE("fetch session: a slow endpoint fails at the total timeout") {
  FixtureServer server;
  Session s;
  FetchPolicy p = PolicyFor(server);
  p.timeout_seconds = 1;
  auto start = std::chrono::steady_clock::now();
  PageFetch f = s.session.Fetch(server.base() + "/slow?q=x", p);
  double took = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  CHECK(f.outcome == PageOutcome::kFailed);
  CHECK(f.reason.rfind("timed out after 1 s", 0) == 0);
  CHECK(took < 2.5);  // the fixture answers only after 3 s
}

TEST_CASE("fetch session: a 429 with Retry-After is waited out, then retried") {
  FixtureServer server;
  Session s;
  PageFetch f = s.session.Fetch(server.base() + "/busy?q=x", PolicyFor(server));
  REQUIRE(f.outcome == PageOutcome::kFetched);
  std::vector<double> times;
  for (const auto& r : server.Requests())
    if (r.path == "/busy?q=x") times.push_back(r.t);
  REQUIRE(times.size() == 2);
  CHECK(times[1] - times[0] >= 0.95);  // Retry-After: 1 (above the 0.2 s backoff)
  REQUIRE(LogHas(s.session, "retry", "/busy"));
  CHECK(s.session.log()[1].http_status == 429);
  CHECK(nlohmann::json::parse(s.session.log()[1].detail)["wait_seconds"] == 1.0);
}

TEST_CASE("fetch session: a 503 is retried with doubling backoff, then given up") {
  FixtureServer server;
  Session s;
  PageFetch f = s.session.Fetch(server.base() + "/unavailable?q=x", PolicyFor(server));
  CHECK(f.outcome == PageOutcome::kFailed);
  CHECK(f.reason == "HTTP 503 after 3 attempts");
  std::vector<double> times;
  for (const auto& r : server.Requests())
    if (r.path == "/unavailable?q=x") times.push_back(r.t);
  REQUIRE(times.size() == 3);  // 1 + retries
  CHECK(times[1] - times[0] >= 0.19);  // backoff 0.2 s
  CHECK(times[2] - times[1] >= 0.39);  // then 0.4 s
}

TEST_CASE("fetch session: a Retry-After above the cap gives up at once instead of coming back sooner") {
  FixtureServer server;
  Session s;
  PageFetch f = s.session.Fetch(server.base() + "/toolong?q=x", PolicyFor(server));
  CHECK(f.outcome == PageOutcome::kFailed);
  CHECK(f.reason == "the server asked to wait 3600 s (Retry-After), more than the cap of 10 s");
  CHECK(server.CountRequests("/toolong") == 1);
}

TEST_CASE("fetch session: the minimum interval per host holds between all requests") {
  FixtureServer server;
  Session s;
  FetchPolicy p = PolicyFor(server);
  p.min_interval_seconds = 0.4;
  for (int page = 1; page <= 3; ++page)
    REQUIRE(s.session.Fetch(server.base() + "/search?q=x&page=" + std::to_string(page), p).outcome ==
            PageOutcome::kFetched);
  auto seen = server.Requests();
  REQUIRE(seen.size() == 4);  // robots.txt and three pages
  for (size_t i = 1; i < seen.size(); ++i) CHECK(seen[i].t - seen[i - 1].t >= 0.39);
}

TEST_CASE("fetch session: a body above the size cap fails, the part read is kept as the snapshot") {
  FixtureServer server;
  Session s;
  FetchPolicy p = PolicyFor(server);
  p.max_body_bytes = 64 * 1024;
  PageFetch f = s.session.Fetch(server.base() + "/big?q=x", p);
  CHECK(f.outcome == PageOutcome::kFailed);
  CHECK(f.reason == "the body is larger than max_body_bytes (65536); the first part is kept as the snapshot");
  REQUIRE_FALSE(f.snapshot_sha256.empty());
  CHECK(testing::ReadFile(s.snapshots.PathOf(f.snapshot_sha256)).size() <= 64 * 1024);
}

TEST_CASE("fetch session: robots.txt unreachable (HTTP 500) disallows everything (RFC 9309 section 2.3.1.4)") {
  FixtureServer server({"--robots", "status-500"});
  Session s;
  PageFetch f = s.session.Fetch(server.base() + "/search?q=x", PolicyFor(server));
  CHECK(f.outcome == PageOutcome::kRobots);
  CHECK(f.reason == "robots.txt disallows it (robots.txt could not be read, so everything is disallowed)");
  CHECK(server.CountRequests("/search") == 0);
  CHECK(server.CountRequests("/robots.txt") == 1);  // only 429 and 503 are retried
}

TEST_CASE("fetch session: robots.txt unavailable (HTTP 404) means no rules apply (RFC 9309 section 2.3.1.3)") {
  FixtureServer server({"--robots", "status-404"});
  Session s;
  CHECK(s.session.Fetch(server.base() + "/private?q=x", PolicyFor(server)).outcome == PageOutcome::kFetched);
}

TEST_CASE("fetch session: robots.txt that redirects outside the allowlist disallows everything") {
  FixtureServer server({"--robots", "redirect-outside"});
  Session s;
  CHECK(s.session.Fetch(server.base() + "/search?q=x", PolicyFor(server)).outcome == PageOutcome::kRobots);
  CHECK(server.CountRequests("/search") == 0);
  CHECK(LogHas(s.session, "allowlist", "rules.elsewhere.example"));
}

TEST_CASE("fetch session: TLS certificates are verified, a self-signed one is refused") {
  std::string fixtures = testing::SourceDir() + "/tests/fixtures/listing/";
  FixtureServer server({"--tls-cert", fixtures + "selfsigned.crt", "--tls-key", fixtures + "selfsigned.key"});
  CurlHttpClient client;
  HttpResponse r = client.Get(HttpRequest{"https://127.0.0.1:" + std::to_string(server.port()) + "/search?q=x",
                                          "VeldmarkListingAudit/1.0 (+listing-audit@newsroom.example)", 2, 5, 1 << 20});
  CHECK(r.status == 0);
  CHECK_FALSE(r.error.empty());
  CHECK(server.Requests().empty());  // the handshake failed before any HTTP request
}
