#pragma once
// The store side of `withdraw` (collector/withdrawals.h keeps the rules and
// messages): the append-only withdrawal rows of the current plan's
// vacancies. Which sets a withdrawal takes out of the analysis is decided in
// core/fieldwork.cpp (ReadFieldwork), which reads the same table. SQLite
// failures throw StoreError (core/store.h).
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

namespace twinprobe {

class Store;

struct WithdrawalRow {
  int64_t vacancy_id = 0;
  std::string reason, withdrawn_at;
  std::string entered_by, entered_at;
  int64_t audit_seq = 0;
};

void InsertWithdrawal(Store& store, const WithdrawalRow& row);

// A vacancy of the current plan by its reference; 0 when there is none.
int64_t FindVacancy(Store& store, const std::string& vacancy_ref);
// The current plan's vacancy references, in plan order (for "did you mean").
std::vector<std::string> VacancyRefs(Store& store);

struct Withdrawal {
  std::string vacancy_ref, reason, withdrawn_at;
};

// The vacancy's first withdrawal (the one that counts); none when it was
// never withdrawn.
std::optional<Withdrawal> WithdrawalOfVacancy(Store& store, int64_t vacancy_id);
// The withdrawal of the probe's vacancy; none when it was never withdrawn.
std::optional<Withdrawal> WithdrawalOfProbe(Store& store, int64_t probe_id);

// What a withdrawal of the vacancy leaves behind: its probes without a
// sending (they leave the schedule) and its responses (kept).
struct VacancyProbeCounts {
  int64_t probes = 0, unsent = 0, responses = 0;
};
VacancyProbeCounts CountVacancyProbes(Store& store, int64_t vacancy_id);

}  // namespace twinprobe
