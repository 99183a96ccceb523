// `history PROBE` (collector/history.h, cli/history_cmd.cpp) on a real
// study through the real binary.
#include <catch2/catch.hpp>

#include <nlohmann/json.hpp>

#include "collector/collector_fixtures.h"

using namespace twinprobe;
using testing::RunCli;

TEST_CASE("history: sendings and every response with who and when, superseded ones included") {
  testing::PlannedStudy s;
  auto as = [&](const std::string& who, const std::string& now, std::vector<std::string> args) {
    args.insert(args.begin(), {"--study", s.path});
    auto r = RunCli(args, {"TWINPROBE_ACTOR=" + who, "TWINPROBE_NOW=" + now});
    INFO(r.err);
    REQUIRE(r.exit_code == 0);
  };
  as("ana", "2027-03-01T09:20", {"sent", "P00001", "--at", "2027-03-01T09:14"});
  as("ben", "2027-03-04T10:02", {"record", "P00001", "rejection", "--at", "2027-03-04", "--channel", "mail", "--note",
                                 "form letter"});
  as("ana", "2027-03-05T08:00", {"record", "P00001", "invitation", "--at", "2027-03-04T16:30", "--channel", "phone"});

  auto text = RunCli({"--study", s.path, "history", "P00001"});
  CHECK(text.exit_code == 0);
  const std::string pad(45, ' ');
  CHECK(text.out.substr(text.out.find("\n\n")) ==
        "\n\n  entered               audit  by            what\n"
        "  2027-03-01T09:20:00Z      2  ana           sent at 2027-03-01T09:14:00Z\n"
        "  2027-03-04T10:02:00Z      3  ben           response 1: rejection, received 2027-03-04T00:00:00Z by mail; "
        "superseded by 2\n" +
            pad + "note: form letter\n" +
            "  2027-03-05T08:00:00Z      4  ana           response 2: invitation (positive), received "
            "2027-03-04T16:30:00Z by phone; supersedes 1; current\n"
            "\nCurrent outcome: invitation (a positive callback), response 2.\n");
  CHECK(text.out.rfind("Probe P00001: vacancy V0001 (employer E-", 0) == 0);

  auto json = nlohmann::json::parse(RunCli({"--study", s.path, "--json", "history", "P00001"}).out);
  CHECK(json["probe"] == "P00001");
  CHECK(json["vacancy"] == "V0001");
  CHECK(json["current_response"] == 2);
  CHECK(json["current_code"] == "invitation");
  CHECK(json["strata"]["occupation"] == "bookkeeper");
  REQUIRE(json["events"].size() == 3);
  CHECK(json["events"][0]["kind"] == "sending");
  CHECK(json["events"][0]["entered_by"] == "ana");
  CHECK(json["events"][1]["superseded_by"] == 2);
  CHECK(json["events"][1]["current"] == false);
  CHECK(json["events"][1]["note"] == "form letter");
  CHECK(json["events"][2]["supersedes"] == 1);
  CHECK(json["events"][2]["current"] == true);
  CHECK(json["events"][2]["entered_at"] == "2027-03-05T08:00:00Z");
}

TEST_CASE("history: a probe with nothing recorded, and an unknown probe") {
  testing::PlannedStudy s;
  auto quiet = RunCli({"--study", s.path, "history", "P00002"});
  CHECK(quiet.exit_code == 0);
  CHECK(quiet.out.find("Nothing was recorded for it yet: no sending, no response.\n") != std::string::npos);
  auto unknown = RunCli({"--study", s.path, "history", "P0002"});
  CHECK(unknown.exit_code == 1);
  CHECK(unknown.err == "twinprobe: unknown probe 'P0002' \u2014 use a probe reference from 'twinprobe schedule' or the "
                       "plan (e.g. P00001)\n");
}
