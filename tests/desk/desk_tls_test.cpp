// The desk over TLS (--tls-cert/--tls-key): a self-signed certificate made
// with the openssl tool, served on 127.0.0.1, cookies marked Secure.
#include <curl/curl.h>

#include <catch2/catch.hpp>
#include <cstdlib>
#include <thread>

#include "desk/desk_fixture.h"

using namespace twinprobe;

namespace {

size_t Append(char* data, size_t size, size_t n, void* out) {
  static_cast<std::string*>(out)->append(data, size * n);
  return size * n;
}

}  // namespace

TEST_CASE("desk tls: serves HTTPS with Secure cookies, and refuses a certificate it cannot load") {
  testing::PlannedStudy study;
  testing::WithTeam(study.path);
  const std::string cert = study.dir / "cert.pem", key = study.dir / "key.pem";
  const std::string make = "openssl req -x509 -newkey rsa:2048 -nodes -days 2 -subj /CN=127.0.0.1 -keyout '" + key +
                           "' -out '" + cert + "' >/dev/null 2>&1";
  REQUIRE(std::system(make.c_str()) == 0);

  auto desk = Desk::Open(DeskOptions{study.path, true});
  REQUIRE(desk.ok());
  auto bad = DeskServer::Bind(*desk.value(), ServeOptions{"127.0.0.1", 0, study.dir / "missing.pem", key});
  REQUIRE_FALSE(bad.ok());
  CHECK(bad.error().Message() == study.dir / "missing.pem" +
                                     ": the TLS certificate or key could not be loaded \u2014 give a PEM certificate "
                                     "with --tls-cert and its unencrypted PEM key with --tls-key");

  auto server = DeskServer::Bind(*desk.value(), ServeOptions{"127.0.0.1", 0, cert, key});
  REQUIRE(server.ok());
  CHECK(server.value()->url().rfind("https://127.0.0.1:", 0) == 0);
  std::thread run([&] { server.value()->Run(); });
  std::string headers, body;
  CURL* curl = curl_easy_init();
  const std::string url = server.value()->url() + "signin";
  curl_easy_setopt(curl, CURLOPT_URL, url.c_str());
  curl_easy_setopt(curl, CURLOPT_NOPROXY, "*");
  curl_easy_setopt(curl, CURLOPT_CAINFO, cert.c_str());  // trust exactly this certificate
  curl_easy_setopt(curl, CURLOPT_SSL_VERIFYHOST, 0L);    // its name is an address, not a host
  curl_easy_setopt(curl, CURLOPT_HEADERFUNCTION, &Append);
  curl_easy_setopt(curl, CURLOPT_HEADERDATA, &headers);
  curl_easy_setopt(curl, CURLOPT_WRITEFUNCTION, &Append);
  curl_easy_setopt(curl, CURLOPT_WRITEDATA, &body);
  const CURLcode rc = curl_easy_perform(curl);
  long status = 0;
  curl_easy_getinfo(curl, CURLINFO_RESPONSE_CODE, &status);
  curl_easy_cleanup(curl);
  server.value()->Stop();
  run.join();
  REQUIRE(rc == CURLE_OK);
  CHECK(status == 200);
  CHECK(headers.find("; Path=/; HttpOnly; SameSite=Strict; Secure\r\n") != std::string::npos);
  CHECK(body.find("<h1>Sign in</h1>") != std::string::npos);
}
