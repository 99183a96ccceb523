// `import outcomes`: responses to planned probes from CSV
// (collector/import_outcomes.h), on a store planned by the real binary.
#include <catch2/catch.hpp>

#include "collector/import_outcomes.h"
#include "collector/responses.h"
#include "collector/collector_fixtures.h"

using namespace twinprobe;

namespace {

struct Outcomes {
  testing::PlannedStudy study;
  std::unique_ptr<Store> store = study.Open();
  OutcomeScheme scheme;
  std::string csv = study.dir / "outcomes.csv";
  // A response needs a sending: the probes the files below answer were sent.
  Outcomes() {
    for (const char* probe : {"P00001", "P00002", "P00003", "P00004"}) {
      const bool sent = RecordSending(*store, probe, "2027-03-01T10:00").ok();
      REQUIRE(sent);
    }
  }
  Result<ImportSummary> Import(const std::string& text, bool skip_bad = false) {
    testing::WriteFile(csv, text);
    ImportOptions o;
    o.skip_bad = skip_bad;
    o.progress = false;
    return ImportOutcomes(*store, scheme, csv, o);
  }
  std::string At(int line) const { return csv + ":" + std::to_string(line) + ": "; }
};

}  // namespace

TEST_CASE("import outcomes: good rows land through the same checks as record") {
  Outcomes o;
  auto r = o.Import(
      "probe,code,received_at,channel,note\r\n"
      "P00001,invitation,2027-03-05T10:00,phone,\"called back, asked for \"\"Mira\"\"\"\r\n"
      "P00002,none,,,\r\n"
      "P00003,rejection,2027-03-07,letter,\"two\nlines\"\r\n");
  INFO((r.ok() ? "" : r.error().Message()));
  REQUIRE(r.ok());
  CHECK(r.value().rows_landed == 3);
  CHECK(r.value().rows_rejected == 0);
  CHECK(o.store->QueryInt("SELECT count(*) FROM response WHERE origin = 'import'") == 3);
  CHECK(o.store->QueryInt("SELECT count(*) FROM response WHERE code = 'none' AND received_at IS NULL") == 1);
  CHECK(o.store->QueryInt("SELECT count(*) FROM response WHERE note = 'called back, asked for \"Mira\"'") == 1);
  CHECK(o.store->QueryInt("SELECT count(*) FROM response WHERE note = 'two\nlines'") == 1);
  CHECK(VerifyAudit(*o.store).ok());
}

TEST_CASE("import outcomes: bad-row battery, each message exact, the store unchanged") {
  Outcomes o;
  REQUIRE(RecordSending(*o.store, "P00005", "2027-03-04T12:00").ok());
  const std::string before = testing::Fingerprint(*o.store);
  const std::string head = "probe,code,received_at\n";
  const std::string good = "P00001,invitation,2027-03-05\n";
  auto fails = [&](const std::string& bad_row) {
    auto r = o.Import(head + good + bad_row);
    REQUIRE_FALSE(r.ok());
    CHECK(testing::Fingerprint(*o.store) == before);
    return r.error().Message();
  };
  CHECK(fails("P99999,invitation,2027-03-05\n") ==
        o.At(3) + "unknown probe 'P99999' \u2014 use a probe reference from 'twinprobe schedule' or the plan (e.g. P00001)");
  CHECK(fails("P00002,invitaton,2027-03-05\n") ==
        o.At(3) + "'invitaton' is not a response code of this study (did you mean 'invitation'?) \u2014 use one of: "
                  "none, rejection, info_request, invitation, offer");
  CHECK(fails("P00002,rejection,5 March\n") ==
        o.At(3) + "received_at '5 March' is not a date or time \u2014 write it as YYYY-MM-DD or YYYY-MM-DDTHH:MM (UTC)");
  CHECK(fails("P00002,rejection,\n") ==
        o.At(3) + "received_at is empty \u2014 give the time the response arrived (YYYY-MM-DD or YYYY-MM-DDTHH:MM); "
                  "only code 'none' may leave it empty");
  CHECK(fails(",rejection,2027-03-05\n") == o.At(3) + "the probe is empty \u2014 give the probe reference, e.g. P00001");
  CHECK(fails("P00001,rejection,2027-03-06\n") ==
        o.At(3) + "probe 'P00001' appears twice (first on line 2) \u2014 keep one row per probe; to correct a recorded "
                  "response, import a later file or use 'record'");
  CHECK(fails("P00005,rejection,2027-03-04T11:00\n") ==
        o.At(3) + "the response time 2027-03-04T11:00:00Z of P00005 is before its sending (2027-03-04T12:00:00Z) "
                  "\u2014 check the date; if the sending time is wrong, correct it first with 'twinprobe sent P00005 "
                  "--at TIME'");
  CHECK(fails("P00002,rejection\n") == o.At(3) + "the row has 2 fields but the header has 3 \u2014 check for a missing "
                                                 "or extra comma, or quote fields that contain commas");
  auto no_column = o.Import("probe,code,when\nP00001,invitation,2027-03-05\n");
  CHECK(no_column.error().Message() ==
        o.At(1) + "the column 'received_at' is missing \u2014 an outcomes file has the columns probe,code,received_at "
                  "and optionally channel,note");
  auto empty = o.Import(head);
  CHECK(empty.error().Message() == o.At(2) + "the file has no data rows \u2014 add one row per response under the header");
  CHECK(testing::Fingerprint(*o.store) == before);
}

TEST_CASE("import outcomes: the same file twice adds nothing, --skip-bad keeps good rows and lists the bad") {
  Outcomes o;
  const std::string text = "probe,code,received_at,comment\nP00001,invitation,2027-03-05,x\nP00002,offer,2027-03-06,y\n";
  auto first = o.Import(text);
  REQUIRE(first.ok());
  CHECK(first.value().ignored_columns == std::vector<std::string>{"comment"});
  const std::string after_first = testing::Fingerprint(*o.store);
  auto second = o.Import(text);
  REQUIRE(second.ok());
  CHECK(second.value().already_imported);
  CHECK(testing::Fingerprint(*o.store) == after_first);

  auto mixed = o.Import("probe,code,received_at\nP00003,rejection,2027-03-05\nP0004,offer,2027-03-06\n"
                        "P00001,offer,2027-03-09\n",
                        true);
  REQUIRE(mixed.ok());
  CHECK(mixed.value().rows_landed == 2);
  CHECK(mixed.value().superseding == 1);  // P00001 had an invitation; the offer supersedes it
  CHECK(mixed.value().rows_rejected == 1);
  CHECK(testing::ReadFile(o.csv + ".rejects.csv") ==
        "reject_line,reject_reason,probe,code,received_at\r\n3,unknown probe 'P0004',P0004,offer,2027-03-06\r\n");
  CHECK(o.store->QueryInt("SELECT count(*) FROM response") == 4);
  CHECK(VerifyAudit(*o.store).ok());
}
