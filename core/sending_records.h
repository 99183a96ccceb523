#pragma once
// The store side of `sent`: a probe's sendings are append-only rows and the
// newest one counts. The checks stay with the collector (collector/responses.h).
// SQLite failures throw StoreError (core/store.h).
#include <cstdint>
#include <optional>
#include <string>

namespace twinprobe {

class Store;

struct SendingRow {
  int64_t probe_id = 0;
  std::string sent_at;
  std::string entered_by, entered_at;
  int64_t audit_seq = 0;
  std::string channel;  // how it left (mail, phone, letter, other); "" unknown
  std::string sent_by;  // who sent it, as the field team names them; "" unknown
};

// The probe's newest sending time, "" when it was never sent.
std::string LastSentAt(Store& store, int64_t probe_id);
// When the probe's current response arrived; none when it has no response
// with a time.
std::optional<std::string> CurrentResponseReceivedAt(Store& store, int64_t probe_id);
// Appends the sending; a channel or sender goes to sending_detail (schema
// version 9), so rows sealed before that version keep their digest.
void InsertSending(Store& store, const SendingRow& row);
// The earliest planned sending of the current plan ("YYYY-MM-DDTHH:MM:SSZ"),
// none when the plan has no planned times (an imported study).
std::optional<std::string> FirstPlannedSending(Store& store);

}  // namespace twinprobe
