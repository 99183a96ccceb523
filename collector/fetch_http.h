#pragma once
// One HTTP GET, behind a narrow interface so the rules around it (allowlist,
// robots.txt, intervals, retries, redirects: collector/fetch_session.h) are
// independent of libcurl. CurlHttpClient never follows redirects itself: the
// session checks every hop against the allowlist before any connection.
#include <atomic>
#include <cstdint>
#include <memory>
#include <string>
#include <utility>
#include <vector>

namespace twinprobe {

struct HttpRequest {
  std::string url;  // absolute http(s) URL, already allowlisted
  std::string user_agent;
  double connect_timeout_seconds = 10;
  double timeout_seconds = 30;
  int64_t max_body_bytes = 5 << 20;
};

struct HttpResponse {
  int status = 0;            // 0: no HTTP response (see error)
  std::string body;          // decoded body, at most max_body_bytes
  bool body_truncated = false;  // the body went past max_body_bytes and was cut there
  std::vector<std::pair<std::string, std::string>> headers;  // names lower case, in order
  std::string error;         // transport failure ("" when a response arrived)
  bool timed_out = false;
  // The last value of header `name` (lower case), or "".
  std::string Header(const std::string& name) const;
};

class HttpClient {
 public:
  virtual ~HttpClient() = default;
  virtual HttpResponse Get(const HttpRequest& request) = 0;
};

// libcurl, with TLS peer and host verification on, http and https only, no
// redirects followed, no cookies, compressed bodies accepted and decoded
// (the size cap applies to the decoded body). `cancel` (may be null) aborts
// a transfer in flight when it becomes true.
class CurlHttpClient : public HttpClient {
 public:
  explicit CurlHttpClient(const std::atomic<bool>* cancel = nullptr);
  ~CurlHttpClient() override;
  CurlHttpClient(const CurlHttpClient&) = delete;
  CurlHttpClient& operator=(const CurlHttpClient&) = delete;
  HttpResponse Get(const HttpRequest& request) override;

 private:
  struct Handle;
  std::unique_ptr<Handle> handle_;
  const std::atomic<bool>* cancel_;
};

}  // namespace twinprobe
