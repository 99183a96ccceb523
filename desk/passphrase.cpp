#include "desk/passphrase.h"

#include <openssl/crypto.h>
#include <openssl/evp.h>
#include <openssl/rand.h>

#include <stdexcept>
#include <vector>

namespace twinprobe {
namespace {

std::string Hex(const unsigned char* bytes, size_t n) {
  static const char* digits = "0123456789abcdef";
  std::string out;
  out.reserve(2 * n);
  for (size_t i = 0; i < n; ++i) {
    out += digits[bytes[i] >> 4];
    out += digits[bytes[i] & 15];
  }
  return out;
}

// Hex to bytes; empty on a malformed string (a damaged row never matches).
std::string Unhex(std::string_view hex) {
  if (hex.size() % 2) return {};
  std::string out;
  for (size_t i = 0; i < hex.size(); i += 2) {
    auto nibble = [](char c) -> int {
      if (c >= '0' && c <= '9') return c - '0';
      if (c >= 'a' && c <= 'f') return c - 'a' + 10;
      return -1;
    };
    int hi = nibble(hex[i]), lo = nibble(hex[i + 1]);
    if (hi < 0 || lo < 0) return {};
    out += static_cast<char>(hi * 16 + lo);
  }
  return out;
}

constexpr size_t kSaltBytes = 16;
constexpr size_t kHashBytes = 32;

}  // namespace

std::string Pbkdf2Sha256Hex(std::string_view passphrase, std::string_view salt, int iterations, size_t bytes) {
  std::vector<unsigned char> out(bytes);
  if (PKCS5_PBKDF2_HMAC(passphrase.data(), static_cast<int>(passphrase.size()),
                        reinterpret_cast<const unsigned char*>(salt.data()), static_cast<int>(salt.size()), iterations,
                        EVP_sha256(), static_cast<int>(bytes), out.data()) != 1)
    throw std::runtime_error("PKCS5_PBKDF2_HMAC failed");
  return Hex(out.data(), out.size());
}

Status CheckNewPassphrase(std::string_view passphrase, std::string_view repeated, const std::string& field) {
  if (passphrase.size() < kPassphraseMinLength)
    return BadInput(field,
                    "the passphrase has " + std::to_string(passphrase.size()) + " characters, fewer than " +
                        std::to_string(kPassphraseMinLength),
                    "choose a longer one, for example four unrelated words");
  if (passphrase.size() > kPassphraseMaxLength)
    return BadInput(field, "the passphrase is longer than " + std::to_string(kPassphraseMaxLength) + " characters",
                    "choose a shorter one");
  if (passphrase != repeated)
    return BadInput(field, "the two passphrases differ", "type the same passphrase in both fields");
  return {};
}

StoredPassphrase HashPassphrase(const std::string& member, std::string_view passphrase) {
  unsigned char salt[kSaltBytes];
  if (RAND_bytes(salt, sizeof salt) != 1) throw std::runtime_error("RAND_bytes failed");
  StoredPassphrase p;
  p.member = member;
  p.scheme = "pbkdf2-sha256";
  p.iterations = kPassphraseIterations;
  p.salt_hex = Hex(salt, sizeof salt);
  p.hash_hex = Pbkdf2Sha256Hex(passphrase, std::string_view(reinterpret_cast<const char*>(salt), sizeof salt),
                               kPassphraseIterations, kHashBytes);
  return p;
}

bool PassphraseMatches(const StoredPassphrase& stored, std::string_view passphrase) {
  if (stored.scheme != "pbkdf2-sha256" || stored.iterations < 1 || stored.iterations > 100000000) return false;
  if (passphrase.size() > kPassphraseMaxLength) return false;
  const std::string salt = Unhex(stored.salt_hex);
  if (salt.empty() || stored.hash_hex.size() != 2 * kHashBytes) return false;
  const std::string got = Pbkdf2Sha256Hex(passphrase, salt, static_cast<int>(stored.iterations), kHashBytes);
  return CRYPTO_memcmp(got.data(), stored.hash_hex.data(), got.size()) == 0;
}

}  // namespace twinprobe
