#include <catch2/catch.hpp>

#include "core/ethics_gate.h"

using namespace twinprobe;

namespace {

Design Complete() {
  Design d;
  d.ethics.present = true;
  d.ethics.approval = "VREB-2027-014 (invented)";
  d.ethics.retention_days = 365;
  d.ethics.decline_within_hours = 24;
  d.ethics.cap_per_employer = 2;
  return d;
}

}  // namespace

TEST_CASE("ethics gate: a design stating every safeguard passes") {
  CHECK(CheckEthicsGate(Complete(), "study.toml").ok());
}

TEST_CASE("ethics gate: each missing safeguard is refused with a message naming it") {
  Design d = Complete();
  std::string expected;
  SECTION("no section") {
    d.ethics = EthicsBlock{};
    expected = "study.toml: the design has no [ethics] section \u2014 add [ethics] with approval, retention_days, "
               "decline_within_hours and cap_per_employer (see ethics/README.md)";
  }
  SECTION("approval") {
    d.ethics.approval.clear();
    expected = "study.toml: [ethics].approval is missing \u2014 enter the reference of your ethics review board's "
               "approval (see ethics/README.md)";
  }
  SECTION("retention") {
    d.ethics.retention_days = 0;
    expected = "study.toml: [ethics].retention_days is missing \u2014 state how many days identifying data is kept "
               "after fieldwork (see ethics/README.md)";
  }
  SECTION("decline deadline") {
    d.ethics.decline_within_hours = 0;
    expected = "study.toml: [ethics].decline_within_hours is missing \u2014 state within how many hours every "
               "invitation is declined (see ethics/README.md)";
  }
  SECTION("cap") {
    d.ethics.cap_per_employer = 0;
    expected = "study.toml: [ethics].cap_per_employer is missing \u2014 state the most probes any one employer may "
               "receive (see ethics/README.md)";
  }
  SECTION("source without allowlist") {
    Source s;
    s.name = "jobs-exchange";
    s.user_agent = "VeldmarkStudy/1.0";
    s.contact = "research@board.example";
    d.sources.push_back(s);
    expected = "study.toml: source 'jobs-exchange' has no host allowlist \u2014 list the hosts you are permitted to "
               "collect from (see ethics/README.md)";
  }
  SECTION("source without identification") {
    Source s;
    s.name = "jobs-exchange";
    s.allow_hosts = {"jobs.example"};
    s.user_agent = "VeldmarkStudy/1.0";  // and no contact
    d.sources.push_back(s);
    expected = "study.toml: source 'jobs-exchange' does not identify the collector \u2014 give user_agent = "
               "\"Product/version\" and contact = an e-mail or web address, e.g. contact = \"research@org.example\" "
               "(see ethics/README.md)";
  }
  Status s = CheckEthicsGate(d, "study.toml");
  REQUIRE_FALSE(s.ok());
  CHECK(s.error().Message() == expected);
}

TEST_CASE("ethics gate: a source written as docs/fetch.md shows it (user_agent and contact) passes") {
  // Regression: the gate once looked for the contact inside user_agent, so
  // plan refused a [[source]] that fetch accepted.
  Design d = Complete();
  Source s;
  s.name = "kestrel-board";
  s.allow_hosts = {"jobs.kestrel.example"};
  s.user_agent = "VeldmarkListingAudit/1.0";
  s.contact = "listing-audit@newsroom.example";
  d.sources.push_back(s);
  CHECK(CheckEthicsGate(d, "study.toml").ok());
}

TEST_CASE("ethics gate: the decline deadline is the receipt time plus the stated hours") {
  Design d = Complete();
  CHECK(DeclineDeadline(d.ethics, 1000) == 1000 + 24 * 3600);
}

TEST_CASE("issue 24: a listing audit is asked for approval, retention and its sources' permission only") {
  Design d;
  d.kind = "listing";
  Source s;
  s.name = "veldmark-jobs";
  s.allow_hosts = {"jobs.veldmark.example"};
  s.user_agent = "VeldmarkListingAudit/1.0";
  s.contact = "listing-audit@newsroom.example";
  d.sources = {s};
  CHECK(CheckEthicsGate(d, "study.toml").error().Message() ==
        "study.toml: the design has no [ethics] section \u2014 add [ethics] with approval and retention_days (see "
        "ethics/README.md)");
  d.ethics.present = true;
  d.ethics.approval = "VREB-2027-031 (invented)";
  CHECK(CheckEthicsGate(d, "study.toml").error().Message() ==
        "study.toml: [ethics].retention_days is missing \u2014 state how many days identifying data is kept after "
        "fieldwork (see ethics/README.md)");
  d.ethics.retention_days = 180;
  CHECK(CheckEthicsGate(d, "study.toml").ok());  // no decline hours, no cap per employer
  d.sources[0].allow_hosts.clear();
  CHECK(CheckEthicsGate(d, "study.toml").error().Message() ==
        "study.toml: source 'veldmark-jobs' has no host allowlist \u2014 list the hosts you are permitted to collect "
        "from (see ethics/README.md)");
}

TEST_CASE("issue 17: the demo's invented approval in a study that is not the demo gets a warning") {
  Design d = Complete();
  d.study_id = "harbour-callbacks";
  auto w = DemoApprovalWarning(d, "s/study.toml");
  REQUIRE(w);
  CHECK(*w ==
        "s/study.toml: [ethics].approval is the demo's invented reference VREB-2027-014 in study 'harbour-callbacks' "
        "\u2014 enter the reference of your own ethics review board's approval (see ethics/README.md)");
}

TEST_CASE("ethics gate: the demo itself and a study with its own approval get no demo warning") {
  Design d = Complete();
  d.study_id = kDemoStudyId;
  CHECK_FALSE(DemoApprovalWarning(d, "study.toml"));
  d.study_id = "harbour-callbacks";
  d.ethics.approval = "HREC-2027-112 (Harbourside Ethics Board, invented)";
  CHECK_FALSE(DemoApprovalWarning(d, "study.toml"));
}
