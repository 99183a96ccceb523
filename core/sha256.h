#pragma once
// SHA-256 and HMAC-SHA-256 through libcrypto (OpenSSL), hex-encoded.
#include <memory>
#include <string>
#include <string_view>

namespace twinprobe {

// Streaming SHA-256. Feed bytes with Update(), then HexDigest() once.
class Sha256 {
 public:
  Sha256();
  ~Sha256();
  Sha256(const Sha256&) = delete;
  Sha256& operator=(const Sha256&) = delete;
  Sha256(Sha256&&) noexcept;
  Sha256& operator=(Sha256&&) noexcept;

  void Update(std::string_view bytes);
  std::string HexDigest();  // lowercase, 64 characters; finishes the hash

 private:
  struct Impl;
  std::unique_ptr<Impl> impl_;
};

std::string Sha256Hex(std::string_view bytes);
std::string HmacSha256Hex(std::string_view key, std::string_view message);
// `n` cryptographically random bytes, hex-encoded (2n characters).
std::string RandomHex(int n);

}  // namespace twinprobe
