#include "collector/merge.h"

#include <unistd.h>

#include <chrono>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <set>
#include <thread>

#include "core/audit.h"
#include "core/clock.h"
#include "core/fieldwork.h"
#include "core/verify.h"

namespace twinprobe {
namespace fs = std::filesystem;
namespace {

std::string Short(const std::string& hash) { return hash.substr(0, 16); }

// A pinned point for the crash-consistency test (tests/cli/offices_test.cpp)
// and nothing else: with TWINPROBE_TEST_MERGE_PAUSE=FILE set, a merge that
// has written every row of an office but not committed creates FILE and
// waits, so the test can kill it there.
void TestPauseBeforeCommit() {
  const char* marker = std::getenv("TWINPROBE_TEST_MERGE_PAUSE");
  if (!marker || !*marker) return;
  std::ofstream(marker) << getpid() << "\n";
  std::this_thread::sleep_for(std::chrono::seconds(60));
}

// What the checks found for one office, before anything is written.
struct CheckedOffice {
  std::string folder, path;
  std::string office;
  ChainPoint head;
  int64_t since_seq = 0;  // office entries up to this one were merged before
  bool nothing_new = false;
  std::vector<ProbeHistories> answers;
};

Result<CheckedOffice> CheckOffice(Store& main, const std::string& folder, const PlanIdentity& plan) {
  CheckedOffice c;
  c.folder = folder;
  c.path = (fs::path(folder) / "study.db").string();
  auto verified = VerifyStore(c.path, {});
  if (!verified.ok()) return verified.error();
  if (!verified.value().ok())
    return BadInput(c.path, "the office's audit chain is broken at " + FirstBrokenLink(verified.value()),
                    "nothing was merged; get an intact copy of the office's store (its backup) and check it with "
                    "'twinprobe --study " + folder + " verify'");
  AttachedStore attached(main, c.path, "office");
  auto origin = ReadAttachedOrigin(main);
  if (!origin)
    return BadInput(c.path, "is not an office's store (it holds no handout)",
                    "merge folders that 'twinprobe handout' made");
  c.office = origin->office;
  auto handout = FindHandout(main, c.office);
  if (!handout)
    return BadInput(c.path, "was handed out to an office '" + c.office + "' that this study never handed out to",
                    "merge it into the study that handed it out");
  if (origin->plan_hash != plan.plan_hash || handout->plan_hash != plan.plan_hash)
    return BadInput(c.path,
                    "descends from plan " + Short(origin->plan_hash) + ", not from this study's current plan " +
                        Short(plan.plan_hash),
                    "merge it into the study and plan it was handed out from");
  if (AttachedEntryHash(main, 1) != handout->office_head || !AttachedPlanIs(main, handout->plan_id))
    return BadInput(c.path,
                    "does not descend from the handout this study sealed for office " + c.office + " (office head " +
                        Short(handout->office_head) + ")",
                    "merge the folder 'twinprobe handout' wrote for this office, not a copy planned or made anew");
  std::vector<ChainPoint> merges = ReadMerges(main, c.office);
  if (!merges.empty()) {
    const ChainPoint& last = merges.back();
    if (AttachedEntryHash(main, last.seq) != last.hash)
      return BadInput(c.path,
                      "its entry " + std::to_string(last.seq) + " is not the one merged at " + last.at +
                          " (head " + Short(last.hash) + "): the office's chain was rewritten after that merge",
                      "ask the office for the store it kept; entries of a chain never change once written");
    c.since_seq = last.seq;
  }
  c.head = AttachedHead(main);
  c.nothing_new = !merges.empty() && c.head.seq == c.since_seq;
  if (!c.nothing_new) c.answers = ReadOfficeAnswers(main, c.office, c.since_seq);
  return c;
}

// A probe answered in two places with different current responses.
bool IsConflict(const ProbeHistories& h, const std::string& office) {
  return h.main_current && h.office_current && h.main_current->place != office &&
         h.main_current->code != h.office_current->code;
}

}  // namespace

Result<MergeOutcome> MergeOffices(Store& main, const std::vector<std::string>& office_dirs,
                                  const std::optional<std::string>& prefer) {
  auto plan = ReadPlanIdentity(main);
  if (!plan) return BadInput(main.path(), "holds no plan to merge into", "merge into the study that handed out");
  std::vector<CheckedOffice> checked;
  std::set<std::string> names;
  for (const std::string& dir : office_dirs) {
    auto c = CheckOffice(main, dir, *plan);
    if (!c.ok()) return c.error();
    if (!names.insert(c.value().office).second)
      return Error{ErrorKind::kUsage, dir, "office " + c.value().office + " is named twice", "name each office folder once"};
    checked.push_back(std::move(c).value());
  }
  if (prefer && *prefer != "main" && !names.count(*prefer)) {
    std::string list = "main";
    for (const std::string& n : names) list += ", " + n;
    return Error{ErrorKind::kUsage, "--prefer", "'" + *prefer + "' is neither 'main' nor an office being merged",
                 "use one of: " + list};
  }

  MergeOutcome outcome;
  for (CheckedOffice& c : checked) {
    OfficeMergeOutcome o;
    o.office = c.office;
    o.folder = c.folder;
    o.head = c.head;
    o.nothing_new = c.nothing_new;
    for (ProbeHistories& h : c.answers) {
      if (!IsConflict(h, c.office)) continue;
      if (prefer && (*prefer == "main" || *prefer == c.office)) o.resolved.push_back({c.office, h});
      else outcome.conflicts.push_back({c.office, h});
    }
    outcome.offices.push_back(std::move(o));
  }
  if (!outcome.conflicts.empty()) return outcome;

  for (size_t i = 0; i < checked.size(); ++i) {
    CheckedOffice& c = checked[i];
    OfficeMergeOutcome& o = outcome.offices[i];
    if (c.nothing_new) continue;
    AttachedStore attached(main, c.path, "office");
    AuditedWrite write(main, "merge");
    const ChainPoint head = AttachedHead(main);
    if (head.seq != c.head.seq || head.hash != c.head.hash)
      return BadInput(c.path, "the office's store changed while it was being merged (its head is now entry " +
                                  std::to_string(head.seq) + ")",
                      "run the merge again once nobody writes in the office's folder");
    std::vector<MergeChoice> choices;
    for (const MergeConflict& r : o.resolved)
      choices.push_back({r.histories.probe_id, *prefer == "main" ? MergePreference::kMain : MergePreference::kOffice,
                         r.histories.main_current->id});
    o.counts = MergeOfficeRows(main, c.office, c.since_seq, head, choices, write.actor(), write.at(), write.seq());
    TestPauseBeforeCommit();
    write.Commit(MergeSummary(c.office, head.seq, head.hash, o.counts));
  }
  return outcome;
}

std::vector<OfficeStatus> ReadOfficeStatuses(Store& main, const OutcomeScheme& scheme, int64_t now) {
  std::vector<OfficeStatus> out;
  for (const HandoutRecord& h : ReadHandouts(main)) {
    OfficeStatus s;
    s.office = h.office;
    s.folder = h.folder;
    s.handed_at = h.handed_at;
    s.vacancies = h.vacancies;
    s.probes = h.probes;
    for (const OfficeProbeState& p : ReadOfficeProbes(main, h.office)) {
      ProbeClock clock;
      if (p.first_sent_at) clock.sent_at = ParseIsoTime(*p.first_sent_at);
      clock.answered = p.current_code && *p.current_code != "none";
      if (p.current_received) clock.answered_at = ParseIsoTime(*p.current_received);
      if (clock.sent_at) ++s.sent;
      if (IsClosed(clock, now, scheme.window_days, p.current_code.has_value())) ++s.closed;
    }
    s.merges = ReadMerges(main, h.office);
    out.push_back(std::move(s));
  }
  return out;
}

}  // namespace twinprobe
