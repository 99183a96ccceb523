#pragma once
// The store side of `export` (collector/export.h chooses columns, formats
// and what identities to show): the current plan's vacancies, probes and
// responses, read in id order and handed to a callback one row at a time,
// so an export of a large study holds one row in memory. SQLite failures
// throw StoreError (core/store.h).
#include <cstdint>
#include <functional>
#include <optional>
#include <string>
#include <vector>

namespace twinprobe {

class Store;

struct ExportPlanRow {
  int64_t id = 0;
  std::string kind, origin;
};

struct ExportArmRow {
  std::string label;
  bool is_reference = false;
};

struct ExportVacancyRow {
  int64_t id = 0;
  std::string ref;
  std::optional<std::string> employer_key, employer_name, employer_contact, source, opened_on, closed_on;
};

struct ExportProbeRow {
  int64_t id = 0, vacancy_id = 0;
  std::string ref, vacancy_ref, arm;
  bool is_reference = false;
  std::optional<std::string> profile, mailbox, phone, template_name;
  int64_t send_order = 0;
  std::optional<std::string> planned_at;
  std::optional<std::string> sent_at;  // the newest sending
  std::optional<std::string> first_sent_at;  // the first sending (the window runs from it)
  bool withdrawn = false;                    // its vacancy was withdrawn
  // The current response (all none when the probe has none).
  std::optional<std::string> code, received_at, channel, flags;
  int64_t responses = 0;  // every response row, superseded ones included
};

struct ExportResponseRow {
  int64_t id = 0;
  std::string probe_ref, code;
  std::optional<std::string> received_at, channel, origin;
  std::string flags, entered_by, entered_at;
  std::optional<int64_t> supersedes, superseded_by;  // superseded_by: the oldest response superseding it
  std::optional<std::string> note;
  bool current = false;  // the probe's current response
};

// One sending row: every sending of a probe is kept, a later one replaces the
// time (the newest counts, `current`); channel and sender from sending_detail.
struct ExportSendingRow {
  int64_t id = 0;
  std::string probe_ref, sent_at;
  std::optional<std::string> channel, sent_by;
  std::string entered_by, entered_at;
  bool current = false;  // the probe's newest sending
};

// One decline row, with the response it declines: the probe's newest
// response entered before the decline (none if the store holds none).
struct ExportDeclineRow {
  int64_t id = 0;
  std::string probe_ref, vacancy_ref;
  std::optional<int64_t> response_id;
  std::optional<std::string> code, received_at;
  std::string declined_at;
  std::optional<std::string> channel;
  std::string entered_by, entered_at;
};

// The current plan; none when the store holds no plan.
std::optional<ExportPlanRow> ReadExportPlan(Store& store);
// The plan's arms, reference first, then by id.
std::vector<ExportArmRow> ReadExportArms(Store& store, int64_t plan_id);
// The stratum names the plan's vacancies carry, sorted.
std::vector<std::string> ReadVacancyStratumNames(Store& store, int64_t plan_id);
// Every stratum value of the plan's vacancies.
void ForEachVacancyStratum(Store& store, int64_t plan_id,
                           const std::function<void(int64_t vacancy_id, const std::string& name,
                                                    const std::string& value)>& fn);
void ForEachExportVacancy(Store& store, int64_t plan_id, const std::function<void(const ExportVacancyRow&)>& fn);
void ForEachExportProbe(Store& store, int64_t plan_id, const std::function<void(const ExportProbeRow&)>& fn);
void ForEachExportResponse(Store& store, int64_t plan_id, const std::function<void(const ExportResponseRow&)>& fn);
// Every sending of the plan's probes, superseded and repeated ones included, by id.
void ForEachExportSending(Store& store, int64_t plan_id, const std::function<void(const ExportSendingRow&)>& fn);
// Every decline of the plan's probes, by id.
void ForEachExportDecline(Store& store, int64_t plan_id, const std::function<void(const ExportDeclineRow&)>& fn);

}  // namespace twinprobe
