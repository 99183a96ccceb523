#pragma once
// The field team's desk: a small web application over one study folder
// (docs/desk.md). It makes the same entries as `sent`, `record` and
// `decline`, through the same collector and planner functions, attributed to
// the signed-in member of the design's [team].
//
// Desk is the application without the network: it turns a DeskRequest into a
// DeskResponse, so the server (desk/server.h) only moves bytes. Thread-safe:
// every request opens its own connection to the store, and two members
// writing at once queue on the store's write lock (core/store.h).
#include <cstdint>
#include <map>
#include <memory>
#include <string>
#include <utility>
#include <vector>

#include "core/design.h"
#include "core/status.h"
#include "desk/sessions.h"

namespace twinprobe {

struct DeskRequest {
  std::string method;                              // GET | POST (anything else is refused)
  std::string path;                                // decoded, without the query
  std::multimap<std::string, std::string> params;  // the query (GET) or the form body (POST)
  std::map<std::string, std::string> cookies;
};

struct DeskResponse {
  int status = 200;
  std::string content_type = "text/html; charset=utf-8";
  std::string body;
  std::vector<std::pair<std::string, std::string>> headers;  // Location, Set-Cookie, …
};

struct DeskOptions {
  std::string study_dir;
  bool secure_cookies = false;  // served over TLS: cookies get the Secure flag
};

class Desk {
 public:
  // Reads the design. Fails when study.toml cannot be read, when it names no
  // [team], or when the study has no store.
  static Result<std::unique_ptr<Desk>> Open(const DeskOptions& options);

  DeskResponse Handle(const DeskRequest& request);

  const Design& design() const { return design_; }

 private:
  Desk(DeskOptions options, Design design) : options_(std::move(options)), design_(std::move(design)) {}

  // Sign-in, first passphrase and sign-out (desk/signin.cpp).
  DeskResponse SignInPage(const DeskRequest& request, const std::string& member, const std::string& error);
  DeskResponse SignIn(const DeskRequest& request);
  DeskResponse SignOut(const DeskRequest& request);

  DeskOptions options_;
  Design design_;
  SessionTable sessions_;
  SignInThrottle throttle_;
};

// Headers every desk response carries: no caching, no sniffing, no framing,
// and a content security policy that allows nothing from outside the page
// (the stylesheet is inline; there is no script).
std::vector<std::pair<std::string, std::string>> DeskSecurityHeaders();

}  // namespace twinprobe
