#pragma once
// Declining invitations and offers (ethics/README.md): every positive
// response must be declined within the study's decline deadline so the
// employer's vacancy is not held. `decline` records that it was done; the
// overdue list drives the reminders in `schedule` and `record`.
#include <cstdint>
#include <string>
#include <vector>

#include "core/design.h"
#include "core/status.h"
#include "core/store.h"

namespace twinprobe {

// Records that the invitation to `probe_ref` was declined at `declined_at`
// (ISO; "" = now). Fails for an unknown probe, an unreadable time, or a probe
// whose current response is not positive (nothing to decline).
Result<std::string> RecordDecline(Store& store, const OutcomeScheme& scheme, const std::string& probe_ref,
                                  const std::string& declined_at, const std::string& channel);

struct PendingDecline {
  std::string probe_ref;
  std::string vacancy_ref;
  std::string employer_key;
  std::string profile;
  std::string code;
  std::string received_at;
  int64_t deadline = 0;  // UTC seconds
  bool overdue = false;  // deadline < now
};

// Positive current responses with no decline recorded, most urgent first.
std::vector<PendingDecline> PendingDeclines(Store& store, const OutcomeScheme& scheme, int decline_within_hours,
                                            int64_t now);

}  // namespace twinprobe
