// core/fieldwork.h: the one reading of the plan's sets that analyze, report
// and monitor share, on a small store written row by row.
#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>

#include "core/clock.h"
#include "core/fieldwork.h"
#include "core/store.h"

using namespace twinprobe;

namespace {

// Three vacancies, two arms (inland is the reference):
//   V1 Orlinde: inland sent + invitation after 2 days, coastal sent + rejection
//   V2 Orlinde: the same outcomes, coastal's invitation corrected to a rejection
//   V3 Tessvale: inland sent, coastal never sent and no response (incomplete)
std::unique_ptr<Store> SmallStudy() {
  auto opened = Store::Open(":memory:", true);
  REQUIRE(opened.ok());
  std::unique_ptr<Store> store = std::move(opened.value());
  store->Exec(R"SQL(
INSERT INTO plan(id, origin, kind, seed, created_at, audit_seq) VALUES (1, 'plan', 'paired', 7, '2027-02-01T00:00:00Z', 1);
INSERT INTO arm(id, plan_id, label, is_reference, audit_seq) VALUES (1, 1, 'origin=coastal', 0, 1), (2, 1, 'origin=inland', 1, 1);
INSERT INTO vacancy(id, plan_id, ref, employer_key, audit_seq) VALUES (1, 1, 'V1', 'E-1', 1), (2, 1, 'V2', 'E-1', 1), (3, 1, 'V3', NULL, 1);
INSERT INTO vacancy_stratum(vacancy_id, name, value, audit_seq) VALUES (1, 'region', 'Orlinde', 1), (2, 'region', 'Orlinde', 1), (3, 'region', 'Tessvale', 1);
INSERT INTO probe(id, plan_id, ref, vacancy_id, arm_id, template, send_order, planned_at, audit_seq) VALUES
  (1, 1, 'P1', 1, 2, 'a.md', 1, '2027-03-01T09:00', 1), (2, 1, 'P2', 1, 1, 'b.md', 2, '2027-03-02T09:00', 1),
  (3, 1, 'P3', 2, 2, 'a.md', 1, '2027-03-01T09:00', 1), (4, 1, 'P4', 2, 1, 'b.md', 2, '2027-03-02T09:00', 1),
  (5, 1, 'P5', 3, 2, 'a.md', 1, '2027-03-01T09:00', 1), (6, 1, 'P6', 3, 1, 'b.md', 2, '2027-03-02T09:00', 1);
INSERT INTO sending(probe_id, sent_at, entered_by, entered_at, audit_seq) VALUES
  (1, '2027-03-01T09:00:00Z', 't', 'x', 1), (2, '2027-03-02T09:00:00Z', 't', 'x', 1),
  (3, '2027-03-01T09:00:00Z', 't', 'x', 1), (4, '2027-03-02T09:00:00Z', 't', 'x', 1),
  (5, '2027-03-01T09:00:00Z', 't', 'x', 1);
INSERT INTO response(id, probe_id, code, received_at, origin, entered_by, entered_at, supersedes, audit_seq) VALUES
  (1, 1, 'invitation', '2027-03-03T09:00:00Z', 'record', 't', 'x', NULL, 1),
  (2, 2, 'rejection', '2027-03-04T21:00:00Z', 'record', 't', 'x', NULL, 1),
  (3, 4, 'invitation', '2027-03-05T09:00:00Z', 'record', 't', 'x', NULL, 1),
  (4, 3, 'invitation', '2027-03-03T09:00:00Z', 'record', 't', 'x', NULL, 1),
  (5, 4, 'rejection', '2027-03-05T09:00:00Z', 'record', 't', 'x', 3, 1);
)SQL");
  return store;
}

}  // namespace

TEST_CASE("fieldwork: a set is complete when every probe is closed") {
  CHECK(IsSetComplete({{0, true, false, false}, {1, true, true, true}}));
  CHECK(IsSetComplete({{0, false, true, false}, {1, true, false, false}}));  // imported outcome, no sending
  CHECK_FALSE(IsSetComplete({{0, true, true, true}, {1, false, false, false}}));
  CHECK_FALSE(IsSetComplete({}));
  CHECK_FALSE(IsSetComplete({{0, true, false, false, true, false}, {1, true, true, true}}));  // one still open
}

TEST_CASE("fieldwork: sets of one shape are counted once, corrections replace what they supersede") {
  auto store = SmallStudy();
  // The clock after every window has ended.
  const Fieldwork f =
      ReadFieldwork(*store, OutcomeScheme{}, {.completion_order = true, .now = ParseIsoTime("2027-06-01")});
  REQUIRE(f.has_plan);
  CHECK(f.kind == "paired");
  REQUIRE(f.arms.size() == 2);
  CHECK(f.arms[0].label == "origin=inland");  // the reference arm comes first
  CHECK(f.vacancies == 3);
  CHECK(f.probes_planned == 6);
  CHECK(f.probes_sent == 5);
  CHECK(f.responses == 4);
  CHECK(f.responses_superseded == 1);
  CHECK(f.sets_complete == 2);
  CHECK(f.sets_incomplete == 1);
  // V1 and V2 are one shape: inland positive, coastal rejected (after the correction).
  REQUIRE(f.sets.size() == 2);
  CHECK(f.sets[0].count == 2);
  CHECK(f.sets[0].complete);
  CHECK(f.sets[0].strata == std::vector<std::pair<std::string, std::string>>{{"region", "Orlinde"}});
  std::vector<SetProbe> probes = f.sets[0].probes;
  std::sort(probes.begin(), probes.end());
  CHECK(probes == std::vector<SetProbe>{{0, true, true, true}, {1, true, true, false}});
  CHECK_FALSE(f.sets[1].complete);
  REQUIRE(f.employers.size() == 1);
  CHECK(f.employers[0].employer_key == "E-1");
  CHECK(f.employers[0].count == 2);
  CHECK(f.first_sent_at == "2027-03-01T09:00:00Z");
  CHECK(f.last_sent_at == "2027-03-02T09:00:00Z");
  // Completion: a set closes with the last answer that closes one of its
  // probes: V1 at 4 March 21:00 (P2's rejection), V2 at 5 March 09:00 (P4's).
  REQUIRE(f.completed.size() == 2);
  CHECK(f.completed[0].vacancy_id == 1);
  CHECK(FormatIsoTime(f.completed[0].completed_at) == "2027-03-04T21:00:00Z");
  CHECK(FormatIsoTime(f.completed[1].completed_at) == "2027-03-05T09:00:00Z");
}

TEST_CASE("fieldwork: response times run from the first sending to the first current response") {
  auto store = SmallStudy();
  const Fieldwork f = ReadFieldwork(*store, OutcomeScheme{});
  REQUIRE(f.sent.size() == 5);
  // Probe 1 (inland, V1): sent 1 March 09:00, invitation 3 March 09:00 -> 2 days.
  CHECK(f.sent[0].arm == 0);
  CHECK(f.sent[0].first_any_days == 2.0);
  CHECK(f.sent[0].first_positive_days == 2.0);
  CHECK(f.codes[static_cast<size_t>(f.sent[0].code)] == "invitation");
  // Probe 2 (coastal, V1): rejection 2.5 days after sending, nothing positive.
  CHECK(f.sent[1].first_any_days == 2.5);
  CHECK(std::isnan(f.sent[1].first_positive_days));
  // Probe 4: its invitation was corrected to a rejection: no positive time remains.
  CHECK(f.codes[static_cast<size_t>(f.sent[3].code)] == "rejection");
  CHECK(std::isnan(f.sent[3].first_positive_days));
  // Probe 5: sent, no response.
  CHECK(f.codes[static_cast<size_t>(f.sent[4].code)] == "none");
  CHECK(std::isnan(f.sent[4].first_any_days));
  // Balance tallies: templates by arm.
  CHECK(f.balance.templates.at({0, "a.md"}) == 3);
  CHECK(f.balance.templates.at({1, "b.md"}) == 3);
  CHECK(f.balance.strata.at("region").at({1, "Tessvale"}) == 1);
}

TEST_CASE("fieldwork: a sent probe is open until an answer within the window or the window's end") {
  const int64_t sent = *ParseIsoTime("2027-03-01T09:00");
  const int64_t window_end = sent + 28 * 86400;  // 2027-03-29T09:00
  const ProbeClock unanswered{sent, false, std::nullopt};
  CHECK_FALSE(IsClosed(unanswered, sent + 3 * 3600, 28));
  CHECK_FALSE(IsClosed(unanswered, window_end - 1, 28));
  CHECK(IsClosed(unanswered, window_end, 28));
  const ProbeClock answered{sent, true, sent + 2 * 86400};
  CHECK(IsClosed(answered, sent + 2 * 86400, 28));
  CHECK_FALSE(IsLate(answered, 28));
  // An answer one second after the window is late: it does not close the probe early.
  const ProbeClock late{sent, true, window_end + 1};
  CHECK(IsLate(late, 28));
  CHECK_FALSE(IsClosed(late, window_end - 1, 28));
  CHECK(IsClosed(late, window_end, 28));
  CHECK(ClosesAt(late, 28) == window_end);
  CHECK(ClosesAt(answered, 28) == sent + 2 * 86400);
  // An answer without a time cannot be judged late; it closes the probe.
  CHECK(IsClosed(ProbeClock{sent, true, std::nullopt}, sent, 28));
  // Unsent: closed only with an imported outcome.
  CHECK_FALSE(IsClosed(ProbeClock{}, window_end, 28));
  CHECK(IsClosed(ProbeClock{}, window_end, 28, true));
}

namespace {

// One vacancy, two probes sent 1 and 2 March 09:00; P1 answered with an
// invitation on 31 March 10:00 (after its window ended on 29 March 09:00),
// P2 never answered.
std::unique_ptr<Store> LateAnswerStudy() {
  auto opened = Store::Open(":memory:", true);
  REQUIRE(opened.ok());
  std::unique_ptr<Store> store = std::move(opened.value());
  store->Exec(R"SQL(
INSERT INTO plan(id, origin, kind, seed, created_at, audit_seq) VALUES (1, 'plan', 'paired', 7, '2027-02-01T00:00:00Z', 1);
INSERT INTO arm(id, plan_id, label, is_reference, audit_seq) VALUES (1, 1, 'origin=coastal', 0, 1), (2, 1, 'origin=inland', 1, 1);
INSERT INTO vacancy(id, plan_id, ref, employer_key, audit_seq) VALUES (1, 1, 'V1', 'E-1', 1);
INSERT INTO probe(id, plan_id, ref, vacancy_id, arm_id, template, send_order, planned_at, audit_seq) VALUES
  (1, 1, 'P1', 1, 2, 'a.md', 1, '2027-03-01T09:00', 1), (2, 1, 'P2', 1, 1, 'b.md', 2, '2027-03-02T09:00', 1);
INSERT INTO sending(probe_id, sent_at, entered_by, entered_at, audit_seq) VALUES
  (1, '2027-03-01T09:00:00Z', 't', 'x', 1), (2, '2027-03-02T09:00:00Z', 't', 'x', 1);
INSERT INTO response(id, probe_id, code, received_at, origin, entered_by, entered_at, supersedes, audit_seq) VALUES
  (1, 1, 'invitation', '2027-03-31T10:00:00Z', 'record', 't', 'x', NULL, 1);
)SQL");
  return store;
}

}  // namespace

TEST_CASE("fieldwork: a set a few hours after its last sending is open, not 'neither answered'") {
  auto store = LateAnswerStudy();
  const Fieldwork f = ReadFieldwork(*store, OutcomeScheme{}, {.completion_order = true, .now = ParseIsoTime("2027-03-02T12:00")});
  CHECK(f.sets_complete == 0);
  CHECK(f.sets_open == 1);
  CHECK(f.sets_incomplete == 0);
  CHECK(f.probes_open == 2);
  CHECK(f.completed.empty());
  REQUIRE(f.sent.size() == 2);
  CHECK(f.sent[0].open);
  CHECK(f.sent[1].open);
}

TEST_CASE("fieldwork: an answer after the window is kept as late and counts as no answer") {
  auto store = LateAnswerStudy();
  const Fieldwork f = ReadFieldwork(*store, OutcomeScheme{}, {.completion_order = true, .now = ParseIsoTime("2027-04-01")});
  CHECK(f.sets_complete == 1);
  CHECK(f.sets_open == 0);
  CHECK(f.probes_open == 0);
  CHECK(f.responses_late == 1);
  REQUIRE(f.sets.size() == 1);
  std::vector<SetProbe> probes = f.sets[0].probes;
  std::sort(probes.begin(), probes.end());
  // inland (arm 0) sent, its invitation late: no answer, not positive.
  CHECK(probes == std::vector<SetProbe>{{0, true, false, false, false, true}, {1, true, false, false, false, false}});
  REQUIRE(f.sent.size() == 2);
  CHECK(f.codes[static_cast<size_t>(f.sent[0].code)] == "none");
  // The set closed when P2's window ended: 2 March 09:00 + 28 days.
  REQUIRE(f.completed.size() == 1);
  CHECK(FormatIsoTime(f.completed[0].completed_at) == "2027-03-30T09:00:00Z");
}

TEST_CASE("fieldwork: a store without a plan reads as no plan") {
  auto opened = Store::Open(":memory:", true);
  REQUIRE(opened.ok());
  CHECK_FALSE(ReadFieldwork(*opened.value(), OutcomeScheme{}).has_plan);
}
