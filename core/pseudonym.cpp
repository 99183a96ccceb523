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

std::string EmployerKey(Store& store, const std::string& employer_name) {
  Stmt get = store.Prepare("SELECT value FROM secret WHERE name = 'employer_key'");
  std::string secret;
  if (get.Step()) {
    secret = get.Text(0);
  } else {
    secret = RandomHex(32);
    store.Prepare("INSERT INTO secret(name, value) VALUES ('employer_key', ?1)").Bind(1, secret).Run();
  }
  return "E-" + HmacSha256Hex(secret, NormaliseName(employer_name)).substr(0, 10);
}

void SeedEmployerKeySecret(Store& store, const std::string& secret) {
  store.Prepare("INSERT OR IGNORE INTO secret(name, value) VALUES ('employer_key', ?1)").Bind(1, secret).Run();
}

}  // namespace twinprobe
