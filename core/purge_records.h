#pragma once
// The store side of `purge` (collector/purge.h keeps the retention rule and
// the files): what identifying data the store still holds, when fieldwork
// ended, and erasing it. SQLite failures throw StoreError (core/store.h).
#include <cstdint>
#include <map>
#include <optional>
#include <string>
#include <vector>

namespace twinprobe {

class Store;

struct PurgeableRows {
  int64_t employers = 0;      // employer rows with a name or contact
  int64_t secrets = 0;        // pseudonym secrets
  int64_t notes = 0;          // response notes
  int64_t mail_excerpts = 0;  // excerpts of mail messages
};

PurgeableRows CountPurgeableRows(Store& store);
// When the fieldwork ends, which is when the retention period starts: the
// latest of the last application's window end (its first sending plus
// `window_days`), the window end of the last application planned but not
// yet sent (its planned time plus the window: the fieldwork is not over
// while the schedule still has applications to send), the last answer
// received and the last listing fetched. None when the store holds none of
// them. `what` says which one it was, in words for the purge message.
struct FieldworkEnd {
  int64_t at = 0;  // epoch seconds
  std::string what;
};
std::optional<FieldworkEnd> ReadFieldworkEnd(Store& store, int window_days);
// Vacancy reference -> employer pseudonym ("" when none) of the current
// plan: what purge writes into the vacancies file in place of the names.
std::map<std::string, std::string> ReadVacancyEmployerKeys(Store& store);
// Every employer name and contact address the store still holds (none
// after purge): what purge looks for in the files it does not handle.
std::vector<std::string> ReadEmployerIdentities(Store& store);
// True once a purge was recorded (meta key purged_at).
bool WasPurged(Store& store);

// Turns on overwriting of freed pages (SQLite's secure_delete), so deleted
// names do not linger in the file. Call before the purge's transaction.
void EnableSecureDelete(Store& store);
// Inside the purge's audited write `seq`: empties the employer and secret
// tables, clears response notes and mail excerpts (their digests stay
// sealed) and records purged_at = `at`.
void EraseIdentities(Store& store, int64_t seq, const std::string& at);
// After the purge committed: old page images may survive in the
// write-ahead log until a checkpoint, so force one.
void CheckpointLog(Store& store);

}  // namespace twinprobe
