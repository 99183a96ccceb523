// Issue 17, items 1-3: times that cannot have happened and responses to
// probes never sent are refused by `sent`, `record`, `decline` and
// `import outcomes` with the same words, exit 1, and the store unchanged.
// The example study's schedule starts 2027-03-01T09:32:00Z (its first
// planned sending); the clock is pinned ten days in.
#include <catch2/catch.hpp>

#include <nlohmann/json.hpp>

#include "collector/collector_fixtures.h"

using namespace twinprobe;
using testing::RunCli;

namespace {

const std::vector<std::string> kNow = {"TWINPROBE_NOW=2027-03-10T12:00:00Z"};

struct Refusals {
  testing::PlannedStudy study;
  testing::CliRun Run(std::vector<std::string> args) {
    args.insert(args.begin(), {"--study", study.path});
    return RunCli(args, kNow);
  }
  // Runs a command that must be refused; returns its stderr after checking
  // exit 1, no output and an unchanged store.
  std::string Refused(const std::vector<std::string>& args) {
    const std::string before = testing::FingerprintOf(study.db());
    auto r = Run(args);
    CHECK(r.exit_code == 1);
    CHECK(r.out.empty());
    CHECK(testing::FingerprintOf(study.db()) == before);
    return r.err;
  }
};

}  // namespace

TEST_CASE("issue 17: sent years in the future or three months before the schedule is refused") {
  Refusals s;
  CHECK(s.Refused({"sent", "P00013", "--at", "2031-01-01"}) ==
        "twinprobe: the sending time 2031-01-01T00:00:00Z of P00013 is in the future (now is 2027-03-10T12:00:00Z) "
        "\u2014 check the date; record an event once it has happened\n");
  CHECK(s.Refused({"sent", "P00023", "--at", "2026-12-02"}) ==
        "twinprobe: the sending time 2026-12-02T00:00:00Z of P00023 is before the schedule starts "
        "(2027-03-01T09:32:00Z, less [schedule] early_days = 1) \u2014 check the date; if the applications really "
        "left earlier, raise [schedule] early_days in study.toml\n");
  CHECK(s.Refused({"sent", "P00023", "--at", "1969-12-31"}) ==
        "twinprobe: the sending time 1969-12-31T00:00:00Z of P00023 is in the year 1969, outside 1970\u20132200 "
        "\u2014 check the year; write the time as YYYY-MM-DD or YYYY-MM-DDTHH:MM\n");
  // The design's allowance moves the limit: three days early is then fine.
  testing::WriteFile(s.study.path + "/study.toml",
                     [&] {
                       std::string t = testing::ReadFile(s.study.path + "/study.toml");
                       return t.replace(t.find("sets_per_day = 20"), 17, "sets_per_day = 20\nearly_days = 3");
                     }());
  auto early = s.Run({"sent", "P00023", "--at", "2027-02-26T10:00"});
  INFO(early.err);
  CHECK(early.exit_code == 0);
}

TEST_CASE("issue 17: record in the future and a response before its sending are refused") {
  Refusals s;
  REQUIRE(s.Run({"sent", "P00002", "--at", "2027-03-03T13:04"}).exit_code == 0);
  CHECK(s.Refused({"record", "P00002", "invitation", "--at", "2028-01-01"}) ==
        "twinprobe: the response time 2028-01-01T00:00:00Z of P00002 is in the future (now is "
        "2027-03-10T12:00:00Z) \u2014 check the date; record an event once it has happened\n");
  CHECK(s.Refused({"record", "P00002", "invitation", "--at", "2027-03-02"}) ==
        "twinprobe: the response time 2027-03-02T00:00:00Z of P00002 is before its sending (2027-03-03T13:04:00Z) "
        "\u2014 check the date; if the sending time is wrong, correct it first with 'twinprobe sent P00002 --at "
        "TIME'\n");
}

TEST_CASE("issue 17: a decline before the offer it declines is refused") {
  Refusals s;
  REQUIRE(s.Run({"sent", "P00007", "--at", "2027-03-01"}).exit_code == 0);
  REQUIRE(s.Run({"record", "P00007", "offer", "--at", "2027-03-04"}).exit_code == 0);
  CHECK(s.Refused({"decline", "P00007", "--at", "2027-03-01"}) ==
        "twinprobe: the decline time 2027-03-01T00:00:00Z of P00007 is before the offer was received "
        "(2027-03-04T00:00:00Z) \u2014 check the date; a decline answers a response already received\n");
  CHECK(s.Refused({"decline", "P00007", "--at", "2027-03-11"}) ==
        "twinprobe: the decline time 2027-03-11T00:00:00Z of P00007 is in the future (now is 2027-03-10T12:00:00Z) "
        "\u2014 check the date; record an event once it has happened\n");
}

TEST_CASE("issue 17: record and import outcomes for a probe never sent are refused, schedule lists it to send only") {
  Refusals s;
  CHECK(s.Refused({"record", "P00002", "invitation", "--at", "2027-03-05"}) ==
        "twinprobe: P00002 has no sending recorded, so no response to it can have come \u2014 record the sending "
        "first with 'twinprobe sent P00002 --at TIME' (or 'twinprobe import sendings FILE.csv' for many)\n");
  testing::WriteFile(s.study.path + "/outcomes.csv", "probe,code,received_at\nP00002,invitation,2027-03-05\n");
  CHECK(s.Refused({"import", "outcomes", s.study.path + "/outcomes.csv"}) ==
        "twinprobe: " + s.study.path +
            "/outcomes.csv:2: P00002 has no sending recorded, so no response to it can have come \u2014 record the "
            "sending first with 'twinprobe sent P00002 --at TIME' (or 'twinprobe import sendings FILE.csv' for "
            "many)\n");
  // Nothing to decline, so the schedule cannot list P00002 both to decline and to send.
  auto schedule = s.Run({"--json", "schedule"});
  REQUIRE(schedule.exit_code == 0);
  auto doc = nlohmann::json::parse(schedule.out);
  CHECK(doc["declines"].empty());
  int listed = 0;
  for (const auto& p : doc["probes"]) listed += p["probe"] == "P00002";
  CHECK(listed == 1);
}

TEST_CASE("issue 17: sent and record take an ISO 8601 offset and store the time as UTC") {
  Refusals s;
  auto sent = s.Run({"sent", "P00001", "--at", "2027-03-01T09:14+01:00"});
  INFO(sent.err);
  REQUIRE(sent.exit_code == 0);
  CHECK(sent.out == "Marked P00001 as sent at 2027-03-01T08:14:00Z.\n" + testing::HeadLine(s.study.path));
  auto record = s.Run({"record", "P00001", "rejection", "--at", "2027-03-04T00:30+02:00"});
  INFO(record.err);
  REQUIRE(record.exit_code == 0);
  CHECK(record.out == "Recorded rejection for P00001 at 2027-03-03T22:30:00Z.\n" + testing::HeadLine(s.study.path));
}
