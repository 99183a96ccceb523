#include "core/sha256.h"

#include <openssl/evp.h>
#include <openssl/hmac.h>
#include <openssl/rand.h>

#include <stdexcept>

namespace twinprobe {
namespace {

std::string ToHex(const unsigned char* data, size_t n) {
  static const char* kDigits = "0123456789abcdef";
  std::string out(n * 2, '0');
  for (size_t i = 0; i < n; ++i) {
    out[2 * i] = kDigits[data[i] >> 4];
    out[2 * i + 1] = kDigits[data[i] & 15];
  }
  return out;
}

}  // namespace

struct Sha256::Impl {
  EVP_MD_CTX* ctx = nullptr;
};

Sha256::Sha256() : impl_(std::make_unique<Impl>()) {
  impl_->ctx = EVP_MD_CTX_new();
  if (!impl_->ctx || EVP_DigestInit_ex(impl_->ctx, EVP_sha256(), nullptr) != 1)
    throw std::runtime_error("libcrypto: cannot start SHA-256");
}

Sha256::~Sha256() {
  if (impl_ && impl_->ctx) EVP_MD_CTX_free(impl_->ctx);
}

Sha256::Sha256(Sha256&&) noexcept = default;
Sha256& Sha256::operator=(Sha256&&) noexcept = default;

void Sha256::Update(std::string_view bytes) {
  EVP_DigestUpdate(impl_->ctx, bytes.data(), bytes.size());
}

std::string Sha256::HexDigest() {
  unsigned char md[EVP_MAX_MD_SIZE];
  unsigned int len = 0;
  EVP_DigestFinal_ex(impl_->ctx, md, &len);
  return ToHex(md, len);
}

std::string Sha256Hex(std::string_view bytes) {
  Sha256 h;
  h.Update(bytes);
  return h.HexDigest();
}

std::string HmacSha256Hex(std::string_view key, std::string_view message) {
  unsigned char md[EVP_MAX_MD_SIZE];
  unsigned int len = 0;
  HMAC(EVP_sha256(), key.data(), static_cast<int>(key.size()),
       reinterpret_cast<const unsigned char*>(message.data()), message.size(), md, &len);
  return ToHex(md, len);
}

std::string RandomHex(int n) {
  std::string bytes(static_cast<size_t>(n), '\0');
  if (RAND_bytes(reinterpret_cast<unsigned char*>(bytes.data()), n) != 1)
    throw std::runtime_error("libcrypto: no random bytes");
  return ToHex(reinterpret_cast<const unsigned char*>(bytes.data()), bytes.size());
}

}  // namespace twinprobe
