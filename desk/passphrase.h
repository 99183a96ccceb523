#pragma once
// Passphrases of desk members: PBKDF2-HMAC-SHA-256 (RFC 8018, section 5.2)
// through libcrypto, with a 16-byte random salt and 600,000 iterations (the
// count OWASP's Password Storage Cheat Sheet recommends for PBKDF2-HMAC-SHA256,
// 2023 edition). The passphrase itself is never stored or logged.
#include <string>
#include <string_view>

#include "core/desk_passphrases.h"
#include "core/status.h"

namespace twinprobe {

constexpr int kPassphraseIterations = 600000;
constexpr size_t kPassphraseMinLength = 10;   // bytes of UTF-8
constexpr size_t kPassphraseMaxLength = 200;  // bounds the hashing cost of one request

// Why `passphrase` cannot be used (too short, too long, the two entries
// differ), as a bad-input error naming `field`; ok when it can.
Status CheckNewPassphrase(std::string_view passphrase, std::string_view repeated, const std::string& field);

// A fresh salt and the hash of `passphrase` for `member` (set_at left empty).
StoredPassphrase HashPassphrase(const std::string& member, std::string_view passphrase);

// True when `passphrase` hashes to `stored.hash_hex` (constant-time compare).
// False for an unknown scheme or a damaged row.
bool PassphraseMatches(const StoredPassphrase& stored, std::string_view passphrase);

// PBKDF2-HMAC-SHA-256 of `passphrase` and `salt` (raw bytes), `bytes` long,
// hex-encoded. Exposed for tests against RFC 7914 section 11's vectors.
std::string Pbkdf2Sha256Hex(std::string_view passphrase, std::string_view salt, int iterations, size_t bytes);

}  // namespace twinprobe
