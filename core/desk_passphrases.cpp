#include "core/desk_passphrases.h"

namespace twinprobe {

std::optional<StoredPassphrase> ReadPassphrase(Store& store, const std::string& member) {
  Stmt q = store.Prepare(
      "SELECT member, scheme, iterations, salt, hash, set_at FROM desk_passphrase WHERE member = ?1 "
      "ORDER BY id DESC LIMIT 1");
  q.Bind(1, member);
  if (!q.Step()) return std::nullopt;
  return StoredPassphrase{q.Text(0), q.Text(1), q.Int(2), q.Text(3), q.Text(4), q.Text(5)};
}

void InsertPassphrase(Store& store, int64_t seq, const StoredPassphrase& row) {
  Stmt q = store.Prepare(
      "INSERT INTO desk_passphrase(member, scheme, iterations, salt, hash, set_at, audit_seq) "
      "VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7)");
  q.Bind(1, row.member).Bind(2, row.scheme).Bind(3, row.iterations).Bind(4, row.salt_hex).Bind(5, row.hash_hex);
  q.Bind(6, row.set_at).Bind(7, seq);
  q.Run();
}

}  // namespace twinprobe
