// Issue 24, item 3: when verify would fail, analyze and report say so
// first (text, JSON, HTML), with the first broken link verify names.
#include <catch2/catch.hpp>

#include <nlohmann/json.hpp>

#include "collector/collector_fixtures.h"

using namespace twinprobe;
using testing::RunCli;

namespace {

const std::string kWarning =
    "The study's audit chain is broken. First broken link: entry 3: rows written by this entry (record) were "
    "changed, added or deleted since (tables now holding them: response). Stored data changed outside twinprobe; "
    "run 'twinprobe verify' before relying on these numbers.";

// A planned study with one sending (audit entry 2) and one recorded response (entry 3), then changed
// behind the tool's back.
struct TamperedStudy {
  testing::PlannedStudy s;
  TamperedStudy() {
    testing::SendProbes(s.path, {"P00001"}, "2027-03-01");
    REQUIRE(RunCli({"--study", s.path, "record", "P00001", "rejection", "--at", "2027-03-05"}).exit_code == 0);
  }
  void Tamper() { s.Open()->Exec("UPDATE response SET code = 'invitation' WHERE id = 1"); }
};

}  // namespace

TEST_CASE("issue 24: analyze and report lead with a broken chain in text, JSON and HTML") {
  TamperedStudy t;
  // Intact: no warning anywhere.
  auto intact = RunCli({"--study", t.s.path, "analyze"});
  REQUIRE(intact.exit_code == 0);
  CHECK(intact.out.find("WARNING") == std::string::npos);
  CHECK_FALSE(nlohmann::json::parse(RunCli({"--study", t.s.path, "--json", "analyze"}).out).contains("audit_warning"));
  t.Tamper();
  auto analyze = RunCli({"--study", t.s.path, "analyze"});
  CHECK(analyze.exit_code == 0);
  CHECK(analyze.out.rfind("WARNING: " + kWarning + "\n\n", 0) == 0);
  auto report = RunCli({"--study", t.s.path, "report", "--text"});
  CHECK(report.out.rfind("WARNING: " + kWarning + "\n\n", 0) == 0);
  auto analyze_json = nlohmann::json::parse(RunCli({"--study", t.s.path, "--json", "analyze"}).out);
  CHECK(analyze_json["audit_warning"] == kWarning);
  auto report_json = nlohmann::json::parse(RunCli({"--study", t.s.path, "report", "--json"}).out);
  CHECK(report_json["audit_warning"] == kWarning);
  CHECK(report_json["report"]["audit_intact"] == false);
  auto html = RunCli({"--study", t.s.path, "report", "--html"}).out;
  const size_t banner = html.find("<strong>The study's audit chain is broken.</strong> First broken link: entry 3: ");
  REQUIRE(banner != std::string::npos);
  CHECK(banner < html.find("class=\"headline\""));  // before the headline, in the masthead
}
