#include "core/purge_records.h"

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

std::optional<std::string> ReadFieldworkEnd(Store& store) {
  Stmt end = store.Prepare(
      "SELECT max(t) FROM (SELECT max(sent_at) AS t FROM sending UNION ALL SELECT max(received_at) FROM response "
      "UNION ALL SELECT max(fetched_at) FROM listing)");
  if (!end.Step() || end.IsNull(0)) return std::nullopt;
  return end.Text(0);
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
