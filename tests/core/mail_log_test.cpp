// core/mail_log.h and core/mail_reviews.h on an in-memory store: the rows
// `mail` and `review` write, and what reading them gives back.
#include <catch2/catch.hpp>

#include "core/mail_log.h"
#include "core/mail_reviews.h"
#include "core/store.h"

using namespace twinprobe;

namespace {

std::unique_ptr<Store> MemoryStore() {
  auto store = Store::Open(":memory:", true);
  REQUIRE(store.ok());
  return std::move(store.value());
}

MailMessageRow Unmatched(const std::string& key) {
  MailMessageRow row;
  row.key = key;
  row.source = "mbox:inbox.mbox";
  row.body_sha256 = "ab12";
  row.excerpt = R"({"from":"hr@firm.example"})";
  row.match_reason = "unmatched: no profile's mailbox is among the recipients, the senders or the text";
  row.evidence = R"({"match":"unmatched"})";
  return row;
}

}  // namespace

TEST_CASE("mail log: a stored key is found again, an unknown key is not") {
  auto store = MemoryStore();
  MailLog log(*store);
  CHECK_FALSE(log.Find("mid:1").has_value());
  const int64_t id = log.Insert(7, Unmatched("mid:1"));
  CHECK(log.Find("mid:1") == id);
  CHECK_FALSE(log.Find("mid:2").has_value());
  CHECK(store->QueryInt("SELECT audit_seq FROM mail_message WHERE id = 1") == 7);
}

TEST_CASE("mail log: absent sender, profile, subject, date, probe and code are stored as NULL") {
  auto store = MemoryStore();
  MailLog(*store).Insert(1, Unmatched("raw:9"));
  CHECK(store->QueryInt("SELECT count(*) FROM mail_message WHERE from_addr IS NULL AND to_addr IS NULL AND "
                        "subject IS NULL AND sent_date IS NULL AND probe_id IS NULL AND suggested_code IS NULL") == 1);
}

TEST_CASE("mail log: a store without a plan has no probes to match") {
  auto store = MemoryStore();
  CHECK(ReadMailProbes(*store).empty());
  CHECK_FALSE(ReadProbeMailbox(*store, "P00001").has_value());
}

TEST_CASE("mail reviews: a waiting message reads back with its texts, then with its decision") {
  auto store = MemoryStore();
  MailMessageRow row = Unmatched("mid:5");
  row.sent_date = "2026-03-02T09:15:00Z";
  row.suggested_code = "invitation";
  const int64_t id = MailLog(*store).Insert(1, row);

  auto waiting = ReadMailReviews(*store, false);
  REQUIRE(waiting.size() == 1);
  CHECK(waiting[0].message == id);
  CHECK(waiting[0].source == "mbox:inbox.mbox");
  CHECK(waiting[0].date == "2026-03-02T09:15:00Z");
  CHECK(waiting[0].probe_ref == "");
  CHECK(waiting[0].suggested_code == "invitation");
  CHECK(waiting[0].excerpt_json == std::optional<std::string>(R"({"from":"hr@firm.example"})"));
  CHECK_FALSE(waiting[0].decision.has_value());

  InsertReviewDecision(*store, 2, id, ReviewDecision::kDismissed, std::nullopt, "ana", "2026-03-03T10:00:00Z");
  CHECK(ReadMailReviews(*store, false).empty());
  auto decided = ReadMailReview(*store, id);
  REQUIRE(decided.has_value());
  CHECK(decided->decision == ReviewDecision::kDismissed);
  CHECK(decided->decided_by == "ana");
  CHECK(decided->decided_at == "2026-03-03T10:00:00Z");
  CHECK(decided->response_id == 0);
  CHECK(store->QueryInt("SELECT count(*) FROM review_decision WHERE decision = 'dismissed' AND response_id IS NULL") ==
        1);
  CHECK_FALSE(ReadMailReview(*store, id + 1).has_value());
}

TEST_CASE("mail reviews: a decision spelling this version does not know is a store error, not a guess") {
  auto store = MemoryStore();
  const int64_t id = MailLog(*store).Insert(1, Unmatched("mid:6"));
  store->Exec("INSERT INTO review_decision(mail_message_id, decision, decided_by, decided_at, audit_seq) "
              "VALUES (1, 'escalated', 'ana', '2026-03-03T10:00:00Z', 2)");
  CHECK_THROWS_WITH(ReadMailReview(*store, id),
                    "review_decision of mail message 1 holds unknown decision 'escalated'");
}
