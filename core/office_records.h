#pragma once
// The store side of several field offices working on one study
// (collector/handout.h, collector/merge.h keep the rules and messages):
//   - handout: which vacancies of the current plan went to which office, and
//     copying that part of the plan into the office's new store with the same
//     row ids (so a probe is the same probe in both stores);
//   - merge: reading an office's store (attached to the main one) and
//     appending its rows to the main store under one audit entry.
// Rows are copied by column name (the columns both stores have), so a column
// a later migration adds travels without a change here.
// SQLite failures throw StoreError (core/store.h).
#include <cstdint>
#include <map>
#include <optional>
#include <string>
#include <vector>

#include "core/audit_summaries.h"
#include "core/store.h"
#include "core/stored_codes.h"

namespace twinprobe {

// Attaches the store file at `path` to `store` under `alias` for as long as
// it lives ("src" for a handout, "office" for a merge). Must be made outside
// a transaction (SQLite refuses ATTACH inside one), i.e. before the
// AuditedWrite. Throws StoreError when SQLite cannot attach the file.
class AttachedStore {
 public:
  AttachedStore(Store& store, const std::string& path, const std::string& alias);
  ~AttachedStore();
  AttachedStore(const AttachedStore&) = delete;
  AttachedStore& operator=(const AttachedStore&) = delete;

 private:
  Store& store_;
  std::string alias_;
};

// The current plan as offices know it: its id, and its hash, the hash of the
// audit entry that wrote it (one chain entry names one plan, and an office
// store carries it to prove which plan it descends from).
struct PlanIdentity {
  int64_t plan_id = 0;
  std::string plan_hash;
  std::string study_id;
};
std::optional<PlanIdentity> ReadPlanIdentity(Store& store);

// A vacancy of the current plan, with the office it was handed out to ("" if none).
struct PlanVacancy {
  int64_t id = 0;
  std::string ref;
  std::string office;
};
std::vector<PlanVacancy> ReadPlanVacancies(Store& store);
// The current plan's vacancies whose stratum `name` is `value`, in id order.
std::vector<int64_t> VacanciesInStratum(Store& store, const std::string& name, const std::string& value);
// The values stratum `name` takes in the current plan, sorted ("" none: no such stratum).
std::vector<std::string> StratumValues(Store& store, const std::string& name);

// One handout as the main store sealed it, with what it holds.
struct HandoutRecord {
  std::string office, folder, plan_hash, office_head, handed_at;
  int64_t plan_id = 0;
  int64_t vacancies = 0, probes = 0;
};
std::vector<HandoutRecord> ReadHandouts(Store& store);
std::optional<HandoutRecord> FindHandout(Store& store, const std::string& office);
// Appends the handout row and one handout_vacancy row per vacancy under `seq`.
void InsertHandout(Store& store, int64_t seq, const HandoutRecord& handout, const std::vector<int64_t>& vacancy_ids);

// Where an office's store came from (its first entry seals it).
struct OfficeOrigin {
  std::string office, study_id, plan_hash, main_head, handed_at;
};
void InsertOfficeOrigin(Store& office, int64_t seq, const OfficeOrigin& origin);
std::optional<OfficeOrigin> ReadOfficeOrigin(Store& store);

// Copies into `office` (a new store with the main store attached as "src")
// the current plan's header rows (plan, factors, levels, arms), the newest
// value of every meta key, and of the given vacancies: the vacancy and
// stratum rows, their employers, their probes, the profiles those probes
// use and the material files rendered for them. Ids are kept. Returns the
// probes copied.
int64_t CopyPlanPart(Store& office, int64_t plan_id, const std::vector<int64_t>& vacancy_ids, int64_t seq);

// The material files sealed for the given vacancies' probes (current plan):
// folder and file as stored, to copy beside the office's store.
struct MaterialFileName {
  std::string folder, file;
};
std::vector<MaterialFileName> ReadHandoutMaterialFiles(Store& store, int64_t plan_id,
                                                       const std::vector<int64_t>& vacancy_ids);

// --- merge: `main` with the office's store attached as "office" ---

// The attached office store's origin and chain head (seq 0 when empty).
std::optional<OfficeOrigin> ReadAttachedOrigin(Store& main);
struct ChainPoint {
  int64_t seq = 0;
  std::string hash;
  std::string at;  // when (for a merge: when it was merged)
};
ChainPoint AttachedHead(Store& main);
// The hash of the attached office's entry `seq` ("" when it has none).
std::string AttachedEntryHash(Store& main, int64_t seq);
// True when the attached office holds exactly one plan and it is `plan_id`
// (an office that planned anew no longer shares the main store's probes).
bool AttachedPlanIs(Store& main, int64_t plan_id);
// The office heads merged so far, oldest first.
std::vector<ChainPoint> ReadMerges(Store& main, const std::string& office);

// One response row as a history shows it; `place` is "main" or the office
// it was merged from.
struct PlacedResponse {
  int64_t id = 0;
  std::string code, received_at, entered_by, entered_at, place;
  bool current = false;
};
// A probe the office answered after its entry `since_seq`: the office's
// history and current response, and the main store's (empty when none).
struct ProbeHistories {
  int64_t probe_id = 0;
  std::string probe_ref;
  std::vector<PlacedResponse> main, office;
  std::optional<PlacedResponse> main_current, office_current;
};
std::vector<ProbeHistories> ReadOfficeAnswers(Store& main, const std::string& office, int64_t since_seq);

// Appends to `main` the office's sendings, responses, declines, mail
// messages and review decisions written after its entry `since_seq`, in the
// office's order, with their original times and people, under `seq`; each
// with a merged_row. A merged response supersedes the probe's current
// response in the main store (one current response per probe). After them,
// each `choices` entry is sealed (merge_choice); for a choice of the main
// store, its current response before the merge (`main_response`) is restated
// as a new response (origin "merge", by `actor` at `at`) that supersedes the
// office's. Then the office_merge row seals `head`.
struct MergeChoice {
  int64_t probe_id = 0;
  MergePreference prefer = MergePreference::kMain;
  int64_t main_response = 0;  // the main store's current response before the merge
};
MergedRowCounts MergeOfficeRows(Store& main, const std::string& office, int64_t since_seq, const ChainPoint& head,
                                const std::vector<MergeChoice>& choices, const std::string& actor,
                                const std::string& at, int64_t seq);

// --- status ---

// Per office: its handout, and the probes of its vacancies the main store
// holds sendings for and those whose current response came from the office.
struct OfficeProbeState {
  int64_t probe_id = 0;
  std::optional<std::string> first_sent_at;     // first sending in the main store
  std::optional<std::string> current_code;      // current response's code
  std::optional<std::string> current_received;  // its received_at
};
std::vector<OfficeProbeState> ReadOfficeProbes(Store& main, const std::string& office);

}  // namespace twinprobe
