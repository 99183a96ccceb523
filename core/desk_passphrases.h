#pragma once
// The desk's passphrase rows (table desk_passphrase, migration 5): one row
// per passphrase a team member set, newest first. Only a salted slow hash is
// stored; hashing and checking are the desk's (desk/passphrase.h).
#include <cstdint>
#include <optional>
#include <string>

#include "core/store.h"

namespace twinprobe {

struct StoredPassphrase {
  std::string member;
  std::string scheme;  // "pbkdf2-sha256"
  int64_t iterations = 0;
  std::string salt_hex, hash_hex;
  std::string set_at;  // ISO time
};

// The member's newest passphrase, or nullopt when none was set yet.
std::optional<StoredPassphrase> ReadPassphrase(Store& store, const std::string& member);

// Appends a passphrase row under the caller's AuditedWrite (`seq`).
void InsertPassphrase(Store& store, int64_t seq, const StoredPassphrase& row);

}  // namespace twinprobe
