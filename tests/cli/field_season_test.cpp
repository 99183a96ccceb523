// The numbers follow what happened in the field, at every moment: the
// example study (400 vacancies, paired, 28-day window) driven through time
// with the clock pinned (TWINPROBE_NOW), analysed before any sending, a few
// hours after a set's last sending, and after its window with a late answer.
#include <catch2/catch.hpp>

#include <nlohmann/json.hpp>

#include "core/store.h"
#include "testing/testing.h"

using namespace twinprobe;
using testing::RunCli;

namespace {

struct Season {
  testing::TempDir dir;
  std::string study = dir / "s";
  std::string reference, other;  // the two probes of the first vacancy
  Season() {
    REQUIRE(RunCli({"--study", study, "init"}).exit_code == 0);
    REQUIRE(RunCli({"--study", study, "plan"}).exit_code == 0);
    auto store = Store::Open(study + "/study.db", false);
    REQUIRE(store.ok());
    Stmt q = store.value()->Prepare(
        "SELECT p.ref, a.is_reference FROM current_probe p JOIN arm a ON a.id = p.arm_id "
        "WHERE p.vacancy_id = (SELECT min(vacancy_id) FROM current_probe)");
    while (q.Step()) (q.Int(1) ? reference : other) = q.Text(0);
    REQUIRE(!reference.empty());
    REQUIRE(!other.empty());
  }
  void Run(const std::vector<std::string>& args, const std::string& now) {
    std::vector<std::string> all = {"--study", study};
    all.insert(all.end(), args.begin(), args.end());
    auto r = RunCli(all, {"TWINPROBE_NOW=" + now});
    INFO(r.err);
    REQUIRE(r.exit_code == 0);
  }
  testing::CliRun Analyze(const std::string& now, bool json) {
    std::vector<std::string> args = {"--study", study, "analyze"};
    if (json) args.insert(args.begin(), "--json");
    auto r = RunCli(args, {"TWINPROBE_NOW=" + now});
    INFO(r.err);
    REQUIRE(r.exit_code == 0);
    return r;
  }
};

}  // namespace

TEST_CASE("field season: nothing sent reads as nothing sent, not as a finding") {
  Season s;
  const auto text = s.Analyze("2027-02-01T00:00:00Z", false).out;
  const auto j = nlohmann::json::parse(s.Analyze("2027-02-01T00:00:00Z", true).out);
  const std::string early =
      "No application has been sent yet, so there is nothing to analyse: send the sets on the schedule "
      "('twinprobe schedule'), record each sending with 'twinprobe sent', and analyse again.";
  CHECK(j["early_state"] == early);
  CHECK(j["arms"][0]["rate"].is_null());
  CHECK(j["flow"]["vacancies_planned"] == 400);
  CHECK(j["flow"]["excluded"][0]["reason"] == "not_sent");
  CHECK(j["flow"]["excluded"][0]["sets"] == 400);
  CHECK(j["flow"]["sets_analysed"] == 0);
  CHECK(text.find("went to") == std::string::npos);
  std::string words;  // the summary wraps lines: one space for every run of spaces and newlines
  for (char c : text)
    if (!((c == ' ' || c == '\n') && !words.empty() && words.back() == ' ')) words += (c == '\n' ? ' ' : c);
  CHECK(words.find("are planned for 400 vacancies: each vacancy is to receive one application") != std::string::npos);
  CHECK(words.find("could not be used") == std::string::npos);
  CHECK(text.find("0.0%") == std::string::npos);
  CHECK(text.find("Paired table") == std::string::npos);
  CHECK(text.find("  400 vacancies planned\n    400 sets left out: no application sent yet\n"
                  "  0 sets with every application sent\n  0 sets closed (answered or window over)\n"
                  "  0 sets analysed\n") != std::string::npos);
}

TEST_CASE("field season: a set hours after its last sending is open, a late answer counts as no answer") {
  Season s;
  s.Run({"sent", s.reference, "--at", "2027-03-01T09:00"}, "2027-03-01T09:05:00Z");
  s.Run({"sent", s.other, "--at", "2027-03-02T09:00"}, "2027-03-02T09:05:00Z");

  // A few hours after the second sending: open, not "neither answered".
  auto j = nlohmann::json::parse(s.Analyze("2027-03-02T12:00:00Z", true).out);
  CHECK(j["counts"]["sets_open"] == 1);
  CHECK(j["counts"]["sets_analysed"] == 0);
  CHECK(j["open_sets"] == "1 set is still within its 28-day window and is not analysed yet.");
  CHECK(j["flow"]["sets_sent"] == 1);
  CHECK(j["flow"]["sets_closed"] == 0);
  CHECK(j["flow"]["excluded"][2]["reason"] == "still_open");
  CHECK(j["flow"]["excluded"][2]["sets"] == 1);
  CHECK(j["flow"]["excluded"][0]["sets"] == 399);
  const auto text = s.Analyze("2027-03-02T12:00:00Z", false).out;
  CHECK(text.find("1 set is still within its 28-day window and is not analysed yet.") != std::string::npos);
  CHECK(text.find("No set of applications is closed yet") != std::string::npos);
  CHECK(text.find("0.0%") == std::string::npos);

  // The reference's invitation comes on 31 March, after its window (29 March 09:00).
  s.Run({"record", s.reference, "invitation", "--at", "2027-03-31T10:00"}, "2027-03-31T11:00:00Z");
  j = nlohmann::json::parse(s.Analyze("2027-04-01T00:00:00Z", true).out);
  CHECK(j["counts"]["sets_open"] == 0);
  CHECK(j["counts"]["sets_analysed"] == 1);
  CHECK(j["counts"]["responses_late"] == 1);
  CHECK(j["flow"]["responses_late"] == 1);
  CHECK(j["open_sets"].is_null());
  CHECK(j["early_state"].is_null());
  CHECK(j["paired"]["table"]["d"] == 1);  // the late invitation is no answer
  CHECK(j["paired"]["table"]["b"] == 0);
  CHECK(j["arms"][0]["positive"] == 0);
  const auto after = s.Analyze("2027-04-01T00:00:00Z", false).out;
  CHECK(after.find("1 answer after the window kept as late, counted as no answer") != std::string::npos);
}
