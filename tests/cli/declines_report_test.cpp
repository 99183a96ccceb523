// Issue 17: the report's section on declines, on a study driven through time
// with TWINPROBE_NOW (the demo design: [ethics] decline_within_hours = 24).
#include <catch2/catch.hpp>

#include <nlohmann/json.hpp>

#include "collector/collector_fixtures.h"

using namespace twinprobe;
using testing::RunCli;

namespace {

void Run(const std::string& study, std::vector<std::string> args, const std::string& now) {
  args.insert(args.begin(), {"--study", study});
  auto r = RunCli(args, {"TWINPROBE_NOW=" + now});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
}

nlohmann::json Declines(const std::string& study, const std::string& now) {
  auto r = RunCli({"--study", study, "--json", "report"}, {"TWINPROBE_NOW=" + now});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  return nlohmann::json::parse(r.out)["declines"];
}

}  // namespace

TEST_CASE("issue 17: the report counts declines on time, late, missing and still within the deadline") {
  testing::PlannedStudy s;
  const std::string t0 = "2027-03-06T08:00:00Z";
  testing::SendProbes(s.path, {"P00001", "P00002", "P00003", "P00004"}, "2027-03-01", {"TWINPROBE_NOW=" + t0});
  Run(s.path, {"record", "P00001", "invitation", "--at", "2027-03-02T09:00"}, t0);
  Run(s.path, {"decline", "P00001", "--at", "2027-03-02T15:00"}, t0);  // 6 hours after: on time
  Run(s.path, {"record", "P00002", "offer", "--at", "2027-03-02T09:00"}, t0);
  Run(s.path, {"decline", "P00002", "--at", "2027-03-04T09:00"}, t0);  // 48 hours after: late
  Run(s.path, {"record", "P00003", "info_request", "--at", "2027-03-05T09:00"}, t0);  // due 2027-03-06T09:00
  Run(s.path, {"record", "P00004", "rejection", "--at", "2027-03-03T09:00"}, t0);   // nothing to decline

  // Before P00003's deadline it is still within it; one second after, it is missing.
  CHECK(Declines(s.path, t0) == nlohmann::json{{"decline_within_hours", 24},
                                               {"rule", "within 24 hours of receipt"},
                                               {"positive", 3},
                                               {"due", 3},
                                               {"on_time", 1},
                                               {"late", 1},
                                               {"missing", 0},
                                               {"within_deadline", 1}});
  auto passed = Declines(s.path, "2027-03-06T09:00:01Z");
  CHECK(passed["missing"] == 1);
  CHECK(passed["within_deadline"] == 0);

  auto text = RunCli({"--study", s.path, "report"}, {"TWINPROBE_NOW=2027-03-06T09:00:01Z"});
  REQUIRE(text.exit_code == 0);
  CHECK(text.out.find("\nDeclines of positive responses:\n"
                      "  positive responses                        3\n"
                      "  due (with a decline deadline)             3\n"
                      "  declined on time                          1\n"
                      "  declined late                             1\n"
                      "  missing (deadline passed, not declined)   1\n"
                      "  still within the deadline                 0\n"
                      "  Each positive response is to be declined within 24 hours of receipt;\n"
                      "  \"passed\" is judged at 2027-03-06T09:00:01Z.\n"
                      "  Declining promptly limits what the test costs employers, who would otherwise\n") !=
        std::string::npos);

  // The HTML report has the section, with the same rule.
  auto html = RunCli({"--study", s.path, "report", "--html"}, {"TWINPROBE_NOW=2027-03-06T09:00:01Z"});
  REQUIRE(html.exit_code == 0);
  CHECK(html.out.find("id=\"declines\"") != std::string::npos);
  CHECK(html.out.find("Each positive response is to be declined within 24 hours of receipt") != std::string::npos);
}
