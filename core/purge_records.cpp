#include "core/purge_records.h"

#include "core/clock.h"
#include "core/store.h"

namespace twinprobe {

PurgeableRows CountPurgeableRows(Store& store) {
  PurgeableRows c;
  c.employers = store.QueryInt("SELECT count(*) FROM employer WHERE name IS NOT NULL OR contact IS NOT NULL");
  c.secrets = store.QueryInt("SELECT count(*) FROM secret");
  c.notes = store.QueryInt("SELECT count(*) FROM response WHERE note IS NOT NULL");
  c.mail_excerpts = store.QueryInt("SELECT count(*) FROM mail_message WHERE excerpt IS NOT NULL");
  return c;
}

std::optional<FieldworkEnd> ReadFieldworkEnd(Store& store, int window_days) {
  const std::string window = std::to_string(window_days) + "-day window";
  const int64_t window_s = static_cast<int64_t>(window_days) * 86400;
  // (query, seconds added, what it means); the latest wins, the first on a tie.
  const struct {
    const char* sql;
    int64_t add;
    std::string what;
  } candidates[] = {
      {"SELECT max(first) FROM (SELECT min(sent_at) AS first FROM sending GROUP BY probe_id)", window_s,
       "the " + window + " of the last application sent"},
      {"SELECT max(planned_at) FROM probe WHERE plan_id = (SELECT max(id) FROM plan) "
       "AND id NOT IN (SELECT probe_id FROM sending)",
       window_s, "the " + window + " of the last application planned but not yet sent"},
      {"SELECT max(received_at) FROM response", 0, "the last answer received"},
      {"SELECT max(fetched_at) FROM listing", 0, "the last listing page fetched"},
  };
  std::optional<FieldworkEnd> end;
  for (const auto& c : candidates) {
    Stmt s = store.Prepare(c.sql);
    if (!s.Step() || s.IsNull(0)) continue;
    const auto t = ParseIsoTime(s.Text(0));
    if (!t) continue;
    if (!end || *t + c.add > end->at) end = FieldworkEnd{*t + c.add, c.what};
  }
  return end;
}

std::map<std::string, std::string> ReadVacancyEmployerKeys(Store& store) {
  Stmt s = store.Prepare(
      "SELECT ref, coalesce(employer_key, '') FROM vacancy WHERE plan_id = (SELECT max(id) FROM plan) ORDER BY id");
  std::map<std::string, std::string> keys;
  while (s.Step()) keys[s.Text(0)] = s.Text(1);
  return keys;
}

std::vector<std::string> ReadEmployerIdentities(Store& store) {
  Stmt s = store.Prepare(
      "SELECT name FROM employer WHERE coalesce(name, '') <> '' UNION SELECT contact FROM employer "
      "WHERE coalesce(contact, '') <> ''");
  std::vector<std::string> out;
  while (s.Step()) out.push_back(s.Text(0));
  return out;
}

bool WasPurged(Store& store) { return store.QueryInt("SELECT count(*) FROM meta WHERE key = 'purged_at'") > 0; }

void EnableSecureDelete(Store& store) { store.Exec("PRAGMA secure_delete = ON"); }

void EraseIdentities(Store& store, int64_t seq, const std::string& at) {
  store.Exec("DELETE FROM employer");
  store.Exec("DELETE FROM secret");
  store.Exec("UPDATE response SET note = NULL WHERE note IS NOT NULL");
  store.Exec("UPDATE mail_message SET excerpt = NULL WHERE excerpt IS NOT NULL");
  store.Prepare("INSERT INTO meta(key, value, audit_seq) VALUES ('purged_at', ?1, ?2)").Bind(1, at).Bind(2, seq).Run();
}

void CheckpointLog(Store& store) { store.Exec("PRAGMA wal_checkpoint(TRUNCATE)"); }

}  // namespace twinprobe
