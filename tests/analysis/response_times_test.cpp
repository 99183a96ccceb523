// Time to first response and outcome codes per arm, on a real study store
// filled through the real binary (init, plan, sent, record). Expected values
// follow from the times chosen below, by hand.
#include <catch2/catch.hpp>

#include "core/read_study.h"
#include "analysis/design_summary.h"
#include "analysis/response_times.h"
#include "core/clock.h"
#include "core/meta.h"
#include "core/store.h"
#include "testing/testing.h"

using namespace twinprobe;
using testing::RunCli;

namespace {

// Fieldwork times may not lie in the future: the clock at the season's end.
const std::vector<std::string> kNow = {"TWINPROBE_NOW=2027-04-26T14:59:00Z"};

struct SentStudy {
  testing::TempDir dir;
  std::string study = dir / "s";
  std::vector<std::string> inland, coastal;  // probe refs by arm, in plan order

  SentStudy() {
    REQUIRE(RunCli({"--study", study, "init"}).exit_code == 0);
    REQUIRE(RunCli({"--study", study, "plan"}).exit_code == 0);
    auto store = Store::Open(study + "/study.db", false);
    REQUIRE(store.ok());
    Stmt q = store.value()->Prepare("SELECT p.ref, a.label FROM current_probe p JOIN arm a ON a.id = p.arm_id ORDER BY p.id");
    while (q.Step()) (q.Text(1) == "origin=inland" ? inland : coastal).push_back(q.Text(0));
    REQUIRE(inland.size() >= 3);
    REQUIRE(coastal.size() >= 4);
  }
  void Sent(const std::string& probe) {
    auto r = RunCli({"--study", study, "sent", probe, "--at", "2027-03-01T09:00"}, kNow);
    INFO(r.err);
    REQUIRE(r.exit_code == 0);
  }
  void Record(const std::string& probe, const std::string& code, const std::string& at) {
    auto r = RunCli({"--study", study, "record", probe, code, "--at", at}, kNow);
    INFO(r.err);
    REQUIRE(r.exit_code == 0);
  }
};

const ArmResponseTimes& ArmTimes(const ResponseTimes& rt, const std::string& label) {
  for (const auto& a : rt.arms)
    if (a.label == label) return a;
  FAIL("no arm " << label);
  throw;
}

int64_t Code(const ArmResponseTimes& a, const std::string& code) {
  for (const auto& c : a.codes)
    if (c.code == code) return c.probes;
  return -1;
}

}  // namespace

TEST_CASE("response times: first response per sent probe, censored at the window, corrections respected") {
  SentStudy f;
  // inland: 2.0 days rejection; 0.5 days invitation; rejection at 1 day corrected to invitation at 5 days.
  for (int i = 0; i < 3; ++i) f.Sent(f.inland[i]);
  f.Record(f.inland[0], "rejection", "2027-03-03T09:00");
  f.Record(f.inland[1], "invitation", "2027-03-01T21:00");
  f.Record(f.inland[2], "rejection", "2027-03-02T09:00");
  f.Record(f.inland[2], "invitation", "2027-03-06T09:00");
  // coastal: invitation after 40 days (late); nothing; info_request at 7 days; an explicit "none".
  for (int i = 0; i < 4; ++i) f.Sent(f.coastal[i]);
  f.Record(f.coastal[0], "invitation", "2027-04-10T09:00");
  f.Record(f.coastal[2], "info_request", "2027-03-08T09:00");
  f.Record(f.coastal[3], "none", "2027-03-05T09:00");

  auto store = Store::Open(f.study + "/study.db", false);
  REQUIRE(store.ok());
  // The clock after every window (sent 1 March + 28 days) has ended.
  const FieldworkOptions closed{.completion_order = false, .now = ParseIsoTime("2027-05-01")};
  const ResponseTimes rt = ComputeResponseTimes(ReadFieldwork(*store.value(), StoredOutcomeScheme(*store.value()), closed),
                                                StoredOutcomeScheme(*store.value()));
  CHECK(rt.available);
  CHECK(rt.window_days == 28);
  REQUIRE(rt.arms.size() == 2);
  CHECK(rt.arms[0].label == "origin=inland");  // reference first
  CHECK(rt.arms[0].is_reference);

  const auto& in = ArmTimes(rt, "origin=inland");
  CHECK(in.probes_sent == 3);
  CHECK(in.responded == 3);
  CHECK(in.responded_positive == 2);
  CHECK(in.late == 0);
  CHECK(in.median_days == Approx(2.0));
  REQUIRE(in.any.size() == 3);
  CHECK(in.any[0].day == Approx(0.5));
  CHECK(in.any[0].count == 1);
  CHECK(in.any[0].share == Approx(1.0 / 3));
  CHECK(in.any[1].day == Approx(2.0));
  CHECK(in.any[2].day == Approx(5.0));  // the corrected response, not the superseded one at day 1
  CHECK(in.any[2].share == Approx(1.0));
  REQUIRE(in.positive.size() == 2);
  CHECK(in.positive[1].day == Approx(5.0));
  CHECK(in.positive[1].share == Approx(2.0 / 3));
  CHECK(Code(in, "rejection") == 1);
  CHECK(Code(in, "invitation") == 2);
  CHECK(Code(in, "none") == 0);

  // Milestones 1, 2, 3, 7, 14, 21, 28; a response at exactly day 2 counts by day 2.
  REQUIRE(in.milestones.size() == 7);
  CHECK(in.milestones[0].day == 1);
  CHECK(in.milestones[0].any == 1);
  CHECK(in.milestones[1].day == 2);
  CHECK(in.milestones[1].any == 2);
  CHECK(in.milestones[1].positive == 1);
  CHECK(in.milestones[3].day == 7);
  CHECK(in.milestones[3].any == 3);
  CHECK(in.milestones[3].positive == 2);
  CHECK(in.milestones[3].positive_share == Approx(2.0 / 3));
  // Every day of the window (what --json writes): first answers at 0.5, 2
  // and 5 days, positive ones at 0.5 and 5, so by day 4 two answers and one
  // positive, by day 5 all three and two positive, unchanged to day 28.
  REQUIRE(in.by_day.size() == 28);
  CHECK(in.by_day[0].day == 1);
  CHECK(in.by_day[0].any == 1);
  CHECK(in.by_day[3].day == 4);
  CHECK(in.by_day[3].any == 2);
  CHECK(in.by_day[3].positive == 1);
  CHECK(in.by_day[4].day == 5);
  CHECK(in.by_day[4].any == 3);
  CHECK(in.by_day[4].positive == 2);
  CHECK(in.by_day[4].positive_share == Approx(2.0 / 3));
  CHECK(in.by_day[27].day == 28);
  CHECK(in.by_day[27].any_share == Approx(1.0));
  // The milestones are the same reading at their days.
  for (const auto& m : in.milestones) {
    INFO("day " << m.day);
    CHECK(in.by_day[static_cast<size_t>(m.day - 1)].any == m.any);
    CHECK(in.by_day[static_cast<size_t>(m.day - 1)].positive == m.positive);
  }

  const auto& co = ArmTimes(rt, "origin=coastal");
  CHECK(co.probes_sent == 4);
  CHECK(co.responded == 1);
  CHECK(co.responded_positive == 1);
  CHECK(co.late == 1);
  CHECK(co.median_days == Approx(7.0));
  REQUIRE(co.any.size() == 1);
  CHECK(co.any[0].day == Approx(7.0));
  CHECK(co.any[0].share == Approx(0.25));
  CHECK(co.milestones[2].any == 0);  // day 3
  CHECK(co.milestones[3].any == 1);  // day 7
  CHECK(co.milestones.back().day == 28);
  CHECK(co.milestones.back().any_share == Approx(0.25));
  // The late invitation counts as no answer (it stays in the store, flagged late).
  CHECK(Code(co, "none") == 3);  // one never answered, one recorded as none, one late
  CHECK(Code(co, "invitation") == 0);
  CHECK(Code(co, "info_request") == 1);

  const DesignSummary d = SummariseDesign(ReadFieldwork(*store.value(), OutcomeScheme{}), ReadStoredDesign(*store.value()));
  CHECK(d.first_sent_at == "2027-03-01T09:00:00Z");
  CHECK(d.last_sent_at == "2027-03-01T09:00:00Z");
  CHECK(d.window_days == 28);
  CHECK(d.employers == 400);
  REQUIRE(d.factors.size() == 1);
  CHECK(d.factors[0].name == "origin");
  CHECK(d.factors[0].reference == "inland");
  CHECK(d.has_seed);
  CHECK(d.design_sha256.size() == 64);
}

TEST_CASE("response times: nothing sent means not available, and no curve") {
  testing::TempDir dir;
  std::string study = dir / "s";
  REQUIRE(RunCli({"--study", study, "init"}).exit_code == 0);
  REQUIRE(RunCli({"--study", study, "plan"}).exit_code == 0);
  auto store = Store::Open(study + "/study.db", false);
  REQUIRE(store.ok());
  // The clock after every window (sent 1 March + 28 days) has ended.
  const FieldworkOptions closed{.completion_order = false, .now = ParseIsoTime("2027-05-01")};
  const ResponseTimes rt = ComputeResponseTimes(ReadFieldwork(*store.value(), StoredOutcomeScheme(*store.value()), closed),
                                                StoredOutcomeScheme(*store.value()));
  CHECK_FALSE(rt.available);
  REQUIRE(rt.arms.size() == 2);
  CHECK(rt.arms[0].probes_sent == 0);
  CHECK(rt.arms[0].any.empty());
  CHECK(rt.arms[0].milestones.empty());
  CHECK(rt.arms[0].by_day.empty());
}

TEST_CASE("response times: milestone days follow the window") {
  CHECK(MilestoneDays(28) == std::vector<int>{1, 2, 3, 7, 14, 21, 28});
  CHECK(MilestoneDays(10) == std::vector<int>{1, 2, 3, 7, 10});
  CHECK(MilestoneDays(60) == std::vector<int>{1, 2, 3, 7, 14, 21, 28, 42, 56, 60});
}
