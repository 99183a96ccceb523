#include "core/pseudonym.h"

#include <cctype>

#include "core/sha256.h"
#include "core/store.h"

namespace twinprobe {

std::string NormaliseName(const std::string& name) {
  std::string out;
  bool space = false;
  for (unsigned char c : name) {
    if (std::isspace(c)) {
      space = !out.empty();
      continue;
    }
    if (space) out += ' ';
    space = false;
    out += static_cast<char>(std::tolower(c));
  }
  return out;
}

namespace {

// The study's secret, created on first use.
std::string StudySecret(Store& store) {
  Stmt get = store.Prepare("SELECT value FROM secret WHERE name = 'employer_key'");
  if (get.Step()) return get.Text(0);
  std::string secret = RandomHex(32);
  store.Prepare("INSERT INTO secret(name, value) VALUES ('employer_key', ?1)").Bind(1, secret).Run();
  return secret;
}

}  // namespace

std::string EmployerKey(Store& store, const std::string& employer_name) {
  return "E-" + HmacSha256Hex(StudySecret(store), NormaliseName(employer_name)).substr(0, 10);
}

std::string KeyedDigest(Store& store, const std::string& value) {
  return "hmac:" + HmacSha256Hex(StudySecret(store), value);
}

void SeedEmployerKeySecret(Store& store, const std::string& secret) {
  store.Prepare("INSERT OR IGNORE INTO secret(name, value) VALUES ('employer_key', ?1)").Bind(1, secret).Run();
}

}  // namespace twinprobe
