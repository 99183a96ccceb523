// core/audit_summaries.h: the one wording of each audit summary that verify
// rebuilds (issue 17). The texts are a stored format: stores written before
// this file existed carry exactly these, so each is asserted in full.
#include <catch2/catch.hpp>

#include "core/audit_summaries.h"

using namespace twinprobe;

TEST_CASE("audit summaries: record, sent and decline keep their stored wording") {
  CHECK(RecordSummary("P00017", "invitation", false, 0) == "record P00017 invitation");
  CHECK(RecordSummary("P00017", "offer", true, 12) == "record P00017 offer (late) (supersedes response 12)");
  CHECK(SentSummary("P00017", "2027-03-01T09:14:00Z", "") == "sent P00017 at 2027-03-01T09:14:00Z");
  CHECK(SentSummary("P00017", "2027-03-02T08:30:00Z", "2027-03-01T00:00:00Z") ==
        "sent P00017 at 2027-03-02T08:30:00Z (replaces 2027-03-01T00:00:00Z)");
  CHECK(DeclineSummary("P00017", "2027-03-04T15:30:00Z") == "decline P00017 at 2027-03-04T15:30:00Z");
}

TEST_CASE("audit summaries: review and import outcomes keep their stored wording") {
  CHECK(ReviewDismissedSummary(7) == "review message 7: dismissed (no response recorded)");
  CHECK(ReviewRecordedSummary(7, "confirmed", "invitation", "P00017", 0) ==
        "review message 7: confirmed invitation for P00017");
  CHECK(ReviewRecordedSummary(8, "changed", "rejection", "P00018", 3) ==
        "review message 8: changed rejection for P00018 (supersedes response 3)");
  CHECK(ImportOutcomesSummary("in.csv", 3, 1) == "import outcomes in.csv: 3 rows landed, 1 rejected");
}

TEST_CASE("audit summaries: withdraw keeps its stored wording") {
  CHECK(WithdrawSummary("V0017", "2027-03-04T15:30:00Z", "the posting closed") ==
        "withdraw V0017 at 2027-03-04T15:30:00Z: the posting closed");
}
