// Issue 23: `start = "9999-12-30"` planned sendings in years past 9999 (the
// stored text no longer sorted or parsed), and `record --at 0000-01-01` was
// accepted. core/clock.h is the one parser of times; it now refuses a time
// outside 1900-01-01..2999-12-31 and every command says which range it takes.
#include <catch2/catch.hpp>

#include <filesystem>
#include <string>
#include <vector>

#include "core/audit.h"
#include "core/clock.h"
#include "core/store.h"
#include "testing/testing.h"

using namespace twinprobe;
namespace fs = std::filesystem;

TEST_CASE("issue 23: the clock refuses times outside 1900-01-01 to 2999-12-31 and says why") {
  CHECK(ParseIsoTime("1900-01-01") == kEarliestTime);
  CHECK(ParseIsoTime("2999-12-31T23:59:59Z") == kLatestTime);
  CHECK_FALSE(ParseIsoTime("1899-12-31T23:59:59Z"));
  CHECK_FALSE(ParseIsoTime("3000-01-01"));
  CHECK_FALSE(ParseIsoTime("9999-12-30"));
  CHECK_FALSE(ParseIsoTime("0000-01-01"));
  // The offset counts: 00:30 at +01:00 is the evening before, in 1899.
  CHECK_FALSE(ParseIsoTime("1900-01-01T00:30+01:00"));
  CHECK(FormatIsoTime(kLatestTime) == "2999-12-31T23:59:59Z");
  CHECK(WhyNotATime("0000-01-01", "is not a date") == "is outside the accepted range 1900-01-01 to 2999-12-31");
  CHECK(WhyNotATime("9999-12-30", "is not a date") == "is outside the accepted range 1900-01-01 to 2999-12-31");
  CHECK(WhyNotATime("2027-02-29", "is not a date") == "is not a date");
  CHECK(WhyNotATime("soon", "is not a time") == "is not a time");
}

TEST_CASE("issue 23: a design starting 9999-12-30 is refused at check and plan with the accepted range") {
  testing::TempDir dir;
  const std::string study = dir / "study";
  fs::copy(testing::SourceDir() + "/tests/robustness/fixture_study", study, fs::copy_options::recursive);
  std::string text = testing::ReadFile(study + "/study.toml");
  text.replace(text.find("2027-03-01"), 10, "9999-12-30");
  testing::WriteFile(study + "/study.toml", text);
  for (const char* command : {"check", "plan"}) {
    INFO(command);
    auto r = testing::RunCli({"--study", study, command});
    CHECK(r.exit_code == 1);
    CHECK(r.err == "twinprobe: " + study +
                       "/study.toml:42:9: [schedule].start '9999-12-30' is outside the accepted range 1900-01-01 to "
                       "2999-12-31 \u2014 write it as YYYY-MM-DD\n");
  }
  CHECK_FALSE(fs::exists(study + "/study.db"));
}

TEST_CASE("issue 23: --at 0000-01-01 is refused by every command that takes it, the store unchanged") {
  testing::TempDir dir;
  const std::string study = dir / "study";
  fs::copy(testing::SourceDir() + "/tests/robustness/fixture_study", study, fs::copy_options::recursive);
  REQUIRE(testing::RunCli({"--study", study, "plan"}).exit_code == 0);
  const std::vector<std::string> env = {"TWINPROBE_NOW=2027-03-20T12:00:00Z"};
  REQUIRE(testing::RunCli({"--study", study, "sent", "P00001", "--at", "2027-03-01"}, env).exit_code == 0);
  REQUIRE(testing::RunCli({"--study", study, "record", "P00001", "invitation", "--at", "2027-03-03"}, env).exit_code ==
          0);
  auto head = [&] {
    auto store = Store::Open(study + "/study.db", false);
    REQUIRE(store.ok());
    return AuditHead(*store.value());
  };
  const std::string before = head();
  const std::string range = "'0000-01-01' is outside the accepted range 1900-01-01 to 2999-12-31";
  struct Case {
    std::vector<std::string> args;
    std::string err;
  };
  const Case cases[] = {
      {{"sent", "P00002", "--at", "0000-01-01"}, range + " \u2014 write it as YYYY-MM-DD or YYYY-MM-DDTHH:MM (UTC)"},
      {{"record", "P00002", "rejection", "--at", "0000-01-01"},
       range + " \u2014 write it as YYYY-MM-DD or YYYY-MM-DDTHH:MM (UTC)"},
      {{"decline", "P00001", "--at", "0000-01-01"},
       range + " \u2014 write it as YYYY-MM-DD or YYYY-MM-DDTHH:MM (UTC, or with an offset such as +01:00)"},
      {{"schedule", "--due", "0000-01-01"}, "--due: " + range + " \u2014 write it as YYYY-MM-DD or YYYY-MM-DDTHH:MM"},
  };
  for (const Case& c : cases) {
    std::vector<std::string> args = {"--study", study};
    args.insert(args.end(), c.args.begin(), c.args.end());
    INFO(c.args[0]);
    auto r = testing::RunCli(args, env);
    CHECK(r.exit_code == 1);
    CHECK(r.err == "twinprobe: " + c.err + "\n");
  }
  CHECK(head() == before);
}
