// `twinprobe fetch` end to end: the real binary, a real study folder and
// store, and the invented job board served on 127.0.0.1 by the fixture.
#include <catch2/catch.hpp>

#include <filesystem>

#include <nlohmann/json.hpp>

#include "collector/fetch_fixture.h"
#include "core/store.h"
#include "testing/testing.h"

using namespace twinprobe;
using testing::FixtureServer;
using testing::ListingStudyToml;
using testing::RunCli;

namespace {

const std::vector<std::string> kEnv = {"no_proxy='*'", "http_proxy=", "https_proxy=", "TWINPROBE_ACTOR=tester"};

struct ListingStudy {
  testing::TempDir dir;
  std::string study = dir / "study";
  void Write(const std::string& toml) { testing::WriteFile(study + "/study.toml", toml); }
  int64_t Count(const std::string& sql) {
    auto store = Store::Open(study + "/study.db", false);
    REQUIRE(store.ok());
    return store.value()->QueryInt(sql);
  }
};

}  // namespace

TEST_CASE("fetch cli: one run fetches, skips and fails as the rules say, stores it all, and sums it up") {
  FixtureServer server;
  ListingStudy s;
  s.Write(ListingStudyToml(server));
  auto r = RunCli({"--study", s.study, "fetch"}, kEnv);
  INFO(r.out << r.err);
  CHECK(r.exit_code == 1);  // pages failed; what was fetched is stored all the same
  CHECK(r.out.find("Summary: 4 pages fetched, 3 skipped (robots 1, allowlist 1, limit 1), 1 failed; 2 listings "
                   "extracted with 8 items, 2 extraction failures.\n") != std::string::npos);
  CHECK(r.out.find("extraction failed: no list found: nothing matches the list selector 'ol#results'") != std::string::npos);
  CHECK(r.out.find("extraction failed: item 3: field 'name' not found (rule 'h3.name')") != std::string::npos);
  // The store: every fetched list, failures included, with its snapshot.
  CHECK(s.Count("SELECT count(*) FROM listing") == 4);
  CHECK(s.Count("SELECT count(*) FROM listing WHERE extraction = 'failed' AND snapshot_sha256 IS NOT NULL") == 2);
  CHECK(s.Count("SELECT count(*) FROM listing_item") == 8);
  CHECK(s.Count("SELECT max(position) FROM listing_item") == 8);
  CHECK(s.Count("SELECT count(*) FROM listing WHERE query = 'search' AND location = 'Orlinde' AND page = 1 "
                "AND http_status = 200 AND extraction = 'ok'") == 1);
  // fetch_log: what was considered and why.
  CHECK(s.Count("SELECT count(*) FROM fetch_log WHERE outcome = 'robots' AND url LIKE '%/private?%'") == 1);
  CHECK(s.Count("SELECT count(*) FROM fetch_log WHERE outcome = 'allowlist' AND url LIKE 'http://board.elsewhere.example/%'") == 1);
  CHECK(s.Count("SELECT count(*) FROM fetch_log WHERE outcome = 'limit' AND url LIKE '%/moved?%'") == 1);
  CHECK(s.Count("SELECT count(*) FROM fetch_log WHERE outcome = 'failed' AND http_status = 500") == 1);
  CHECK(s.Count("SELECT count(*) FROM fetch_log WHERE url LIKE '%/robots.txt' AND outcome = 'fetched'") == 1);
  // Every referenced snapshot is on disk; one audit entry for the run.
  auto store = Store::Open(s.study + "/study.db", false);
  Stmt q = store.value()->Prepare("SELECT DISTINCT snapshot_sha256 FROM fetch_log WHERE snapshot_sha256 IS NOT NULL");
  int snapshots = 0;
  while (q.Step()) {
    std::string sha = q.Text(0);
    CHECK(std::filesystem::exists(s.study + "/snapshots/" + sha.substr(0, 2) + "/" + sha));
    ++snapshots;
  }
  CHECK(snapshots >= 6);
  CHECK(s.Count("SELECT count(*) FROM audit WHERE command = 'fetch'") == 1);
  CHECK(server.CountRequests("/private") == 0);
  CHECK(server.CountRequests("/moved") == 0);
  auto verify = RunCli({"--study", s.study, "verify"}, kEnv);
  CHECK(verify.exit_code == 0);
}

TEST_CASE("fetch cli: --json gives the summary and one entry per page") {
  FixtureServer server;
  ListingStudy s;
  s.Write(ListingStudyToml(server));
  auto r = RunCli({"--study", s.study, "--json", "fetch"}, kEnv);
  INFO(r.err);
  auto j = nlohmann::json::parse(r.out);
  CHECK(j["mode"] == "fetch");
  CHECK(j["summary"]["fetched"] == 4);
  CHECK(j["summary"]["skipped"] == nlohmann::json{{"robots", 1}, {"allowlist", 1}, {"limit", 1}});
  CHECK(j["summary"]["failed"] == 1);
  CHECK(j["summary"]["items"] == 8);
  REQUIRE(j["pages"].size() == 8);
  CHECK(j["pages"][0]["outcome"] == "fetched");
  CHECK(j["pages"][0]["extraction"]["items"] == 8);
  CHECK(j["pages"][1]["outcome"] == "robots");
  CHECK(j["pages"][5]["outcome"] == "allowlist");
  CHECK(j["audit_seq"].is_number());
}

TEST_CASE("fetch cli: --replay re-extracts from the snapshots without network and replaces only what changed") {
  ListingStudy s;
  std::string toml;
  {
    FixtureServer server;
    s.Write(ListingStudyToml(server));
    REQUIRE(RunCli({"--study", s.study, "fetch"}, kEnv).exit_code == 1);
    toml = ListingStudyToml(server, "h3.name", "[\"salary\", \"name\"]");  // the fixed rule: a name may be missing
  }  // the server is gone: the replay cannot use the network
  s.Write(toml);
  auto r = RunCli({"--study", s.study, "fetch", "--replay"}, kEnv);
  INFO(r.out << r.err);
  CHECK(r.exit_code == 1);  // the page without a list still fails
  CHECK(r.out.find("Replay: 4 listings re-extracted from their snapshots without network: 1 changed") != std::string::npos);
  CHECK(s.Count("SELECT count(*) FROM listing") == 5);
  CHECK(s.Count("SELECT count(*) FROM current_listing") == 4);
  CHECK(s.Count("SELECT count(*) FROM listing_replay") == 1);
  CHECK(s.Count("SELECT count(*) FROM current_listing WHERE extraction = 'failed'") == 1);
  CHECK(s.Count("SELECT count(*) FROM listing_item WHERE listing_id = (SELECT listing_id FROM listing_replay)") == 8);
  // A second replay with the same rules changes nothing and writes nothing.
  int64_t audits = s.Count("SELECT count(*) FROM audit");
  auto again = RunCli({"--study", s.study, "fetch", "--replay"}, kEnv);
  CHECK(again.out.find("0 changed") != std::string::npos);
  CHECK(s.Count("SELECT count(*) FROM audit") == audits);
  CHECK(RunCli({"--study", s.study, "verify"}, kEnv).exit_code == 0);
}

TEST_CASE("fetch cli: --dry-run lists URLs with robots verdicts, fetches only robots.txt and stores nothing") {
  FixtureServer server;
  ListingStudy s;
  s.Write(ListingStudyToml(server));
  auto r = RunCli({"--study", s.study, "fetch", "--dry-run"}, kEnv);
  INFO(r.out << r.err);
  CHECK(r.exit_code == 0);
  CHECK(r.out.find("robots    -    " + server.base() + "/private?where=Orlinde&page=1  robots.txt disallows it (line 7: "
                   "Disallow: /private)") != std::string::npos);
  CHECK(r.out.find("allowed   -    " + server.base() + "/search?where=Orlinde&page=1  robots.txt: line 6: Allow: /\n") !=
        std::string::npos);
  CHECK(r.out.find("limit     -    " + server.base() + "/moved?where=Orlinde&page=1  the page limit of 6 per run is "
                   "reached") != std::string::npos);
  CHECK(r.out.find("Dry run: 8 URLs planned; 1 disallowed by robots.txt") != std::string::npos);
  CHECK_FALSE(std::filesystem::exists(s.study + "/study.db"));
  CHECK_FALSE(std::filesystem::exists(s.study + "/snapshots"));
  auto seen = server.Requests();
  REQUIRE(seen.size() == 1);
  CHECK(seen[0].path == "/robots.txt");
}

TEST_CASE("fetch cli: a bad selector is one positioned error line, exit 1, and no store is made") {
  FixtureServer server;
  ListingStudy s;
  s.Write(ListingStudyToml(server, "h3..name"));
  auto r = RunCli({"--study", s.study, "fetch"}, kEnv);
  CHECK(r.exit_code == 1);
  CHECK(r.err == "twinprobe: " + s.study + "/study.toml:32:8: field 'name': bad selector 'h3..name': column 4: '.' must "
                 "be followed by a class name \u2014 see docs/fetch.md, \"Selectors\"\n");
  CHECK_FALSE(std::filesystem::exists(s.study + "/study.db"));
  CHECK(server.Requests().empty());
}

TEST_CASE("issue 24: check and fetch ask a listing audit for the same safeguards, and nothing about declines") {
  FixtureServer server;
  ListingStudy s;
  std::string toml = ListingStudyToml(server);
  s.Write(toml.substr(0, toml.find("retention_days = 180\n")));
  const std::string missing = "twinprobe: " + s.study + "/study.toml: [ethics].retention_days is missing \u2014 state "
                              "how many days identifying data is kept after fieldwork (see ethics/README.md)\n";
  auto check = RunCli({"--study", s.study, "check"}, kEnv);
  CHECK(check.exit_code == 1);
  CHECK(check.err == missing);
  auto fetch = RunCli({"--study", s.study, "fetch"}, kEnv);
  CHECK(fetch.exit_code == 1);
  CHECK(fetch.err == missing);
  CHECK_FALSE(std::filesystem::exists(s.study + "/study.db"));
  CHECK(server.Requests().empty());
  s.Write(toml);  // approval and retention, no decline hours or cap per employer
  auto valid = RunCli({"--study", s.study, "check"}, kEnv);
  CHECK(valid.exit_code == 0);
  CHECK(valid.out == "Design veldmark-listing-audit is valid: a listing audit with 1 source (nothing to plan; collect "
                     "with 'twinprobe fetch').\n");
}

TEST_CASE("fetch cli: an unknown --source is named with a suggestion") {
  FixtureServer server;
  ListingStudy s;
  s.Write(ListingStudyToml(server));
  auto r = RunCli({"--study", s.study, "fetch", "--source", "veldmark-job"}, kEnv);
  CHECK(r.exit_code == 1);
  CHECK(r.err == "twinprobe: there is no source 'veldmark-job' in the design (did you mean 'veldmark-jobs'?) \u2014 use "
                 "one of the [[source]] names\n");
}

TEST_CASE("fetch cli: import labels links item keys to factor levels, bad levels are refused with their line") {
  FixtureServer server;
  ListingStudy s;
  s.Write(ListingStudyToml(server));
  testing::WriteFile(s.dir / "labels.csv", "item_key,origin\nvjx-2301,coastal\nvjx-3251,inland\nvjx-9730,\n");
  auto r = RunCli({"--study", s.study, "import", "labels", s.dir / "labels.csv"}, kEnv);
  INFO(r.err);
  CHECK(r.exit_code == 0);
  CHECK(r.out == "Imported 2 labels for 3 items.\n" + testing::HeadLine(s.study));
  CHECK(s.Count("SELECT count(*) FROM item_label WHERE item_key = 'vjx-2301' AND factor = 'origin' AND level = 'coastal'") == 1);
  auto again = RunCli({"--study", s.study, "import", "labels", s.dir / "labels.csv"}, kEnv);
  CHECK(again.out == "This labels file was imported before; nothing was added.\n");
  testing::WriteFile(s.dir / "bad.csv", "item_key,origin\nvjx-1,coastal\nvjx-2,costal\n");
  auto bad = RunCli({"--study", s.study, "import", "labels", s.dir / "bad.csv"}, kEnv);
  CHECK(bad.exit_code == 1);
  CHECK(bad.err == "twinprobe: " + s.dir / "bad.csv" + ":3: 'costal' is not a level of factor 'origin' (did you mean "
                   "'coastal'?) \u2014 use one of its levels, or leave the cell empty when unknown\n");
  CHECK(s.Count("SELECT count(*) FROM item_label") == 2);
}
