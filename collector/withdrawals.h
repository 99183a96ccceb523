#pragma once
// Withdrawing a vacancy from the study: the posting closed before every
// application went out, the employer saw through the test, or the listing
// was an error. A withdrawal is an audited, append-only record; it does not
// delete anything. What it changes is read from it by the one fieldwork
// rule (core/fieldwork.h): the vacancy's unsent probes leave the schedule
// and `sent` refuses them, and its set leaves the primary analysis and is
// counted in the flow table as "withdrawn". Responses already recorded stay
// in the store and in `history`.
#include <cstdint>
#include <string>

#include "core/status.h"
#include "core/store.h"

namespace twinprobe {

struct WithdrawalRecord {
  std::string vacancy_ref;
  std::string reason;
  std::string withdrawn_at;  // as stored; the first withdrawal's when `already`
  bool already = false;      // withdrawn before: nothing written
  int64_t probes = 0;        // the vacancy's probes
  int64_t unsent = 0;        // of those, never sent: they leave the schedule
  int64_t responses = 0;     // responses recorded for them (kept)
};

// Withdraws the current plan's vacancy `vacancy_ref` for `reason` (one line
// of text) at `withdrawn_at` (ISO, a date alone allowed; "" = now). A vacancy
// withdrawn before is reported with `already` set, its first reason and
// time, and nothing is written. Errors (bad input, store unchanged): no
// plan, an unknown vacancy (with the nearest reference), an empty reason or
// one with a line break or control character, an unreadable time.
Result<WithdrawalRecord> WithdrawVacancy(Store& store, const std::string& vacancy_ref, const std::string& reason,
                                         const std::string& withdrawn_at);

}  // namespace twinprobe
