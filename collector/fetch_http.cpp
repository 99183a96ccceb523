#include "collector/fetch_http.h"

#include <curl/curl.h>

#include <algorithm>
#include <cctype>

#include "core/text.h"

namespace twinprobe {

std::string HttpResponse::Header(const std::string& name) const {
  for (auto it = headers.rbegin(); it != headers.rend(); ++it)
    if (it->first == name) return it->second;
  return {};
}

// The easy handle lives as long as the client so connections are reused
// between requests to one host (fewer connections is also more polite).
struct CurlHttpClient::Handle {
  CURL* curl = curl_easy_init();
  ~Handle() {
    if (curl) curl_easy_cleanup(curl);
  }
};

namespace {

struct Transfer {
  HttpResponse* response;
  int64_t cap;
  const std::atomic<bool>* cancel;
};

size_t OnBody(char* data, size_t size, size_t count, void* user) {
  auto* t = static_cast<Transfer*>(user);
  size_t n = size * count;
  int64_t room = t->cap - static_cast<int64_t>(t->response->body.size());
  if (static_cast<int64_t>(n) > room) {
    t->response->body.append(data, static_cast<size_t>(std::max<int64_t>(room, 0)));
    t->response->body_truncated = true;
    return 0;  // makes curl stop with CURLE_WRITE_ERROR
  }
  t->response->body.append(data, n);
  return n;
}

size_t OnHeader(char* data, size_t size, size_t count, void* user) {
  auto* t = static_cast<Transfer*>(user);
  size_t n = size * count;
  std::string line(data, n);
  while (!line.empty() && (line.back() == '\n' || line.back() == '\r')) line.pop_back();
  if (line.rfind("HTTP/", 0) == 0) {
    t->response->headers.clear();  // a new response (e.g. after 100 Continue)
    return n;
  }
  auto colon = line.find(':');
  if (colon == std::string::npos) return n;
  std::string name = Lower(std::string_view(line).substr(0, colon));
  size_t v = colon + 1;
  while (v < line.size() && (line[v] == ' ' || line[v] == '\t')) ++v;
  t->response->headers.emplace_back(name, line.substr(v));
  return n;
}

int OnProgress(void* user, curl_off_t, curl_off_t, curl_off_t, curl_off_t) {
  auto* t = static_cast<Transfer*>(user);
  return t->cancel && t->cancel->load() ? 1 : 0;
}

}  // namespace

CurlHttpClient::CurlHttpClient(const std::atomic<bool>* cancel) : handle_(new Handle), cancel_(cancel) {}
CurlHttpClient::~CurlHttpClient() = default;

HttpResponse CurlHttpClient::Get(const HttpRequest& request) {
  HttpResponse response;
  CURL* c = handle_->curl;
  if (!c) {
    response.error = "libcurl could not start";
    return response;
  }
  Transfer t{&response, request.max_body_bytes, cancel_};
  curl_easy_reset(c);
  curl_easy_setopt(c, CURLOPT_URL, request.url.c_str());
  curl_easy_setopt(c, CURLOPT_PROTOCOLS_STR, "http,https");
  curl_easy_setopt(c, CURLOPT_FOLLOWLOCATION, 0L);
  curl_easy_setopt(c, CURLOPT_SSL_VERIFYPEER, 1L);
  curl_easy_setopt(c, CURLOPT_SSL_VERIFYHOST, 2L);
  curl_easy_setopt(c, CURLOPT_USERAGENT, request.user_agent.c_str());
  curl_easy_setopt(c, CURLOPT_ACCEPT_ENCODING, "");
  curl_easy_setopt(c, CURLOPT_CONNECTTIMEOUT_MS, static_cast<long>(request.connect_timeout_seconds * 1000));
  curl_easy_setopt(c, CURLOPT_TIMEOUT_MS, static_cast<long>(request.timeout_seconds * 1000));
  curl_easy_setopt(c, CURLOPT_MAXFILESIZE_LARGE, static_cast<curl_off_t>(request.max_body_bytes));
  curl_easy_setopt(c, CURLOPT_NOSIGNAL, 1L);
  curl_easy_setopt(c, CURLOPT_WRITEFUNCTION, &OnBody);
  curl_easy_setopt(c, CURLOPT_WRITEDATA, &t);
  curl_easy_setopt(c, CURLOPT_HEADERFUNCTION, &OnHeader);
  curl_easy_setopt(c, CURLOPT_HEADERDATA, &t);
  curl_easy_setopt(c, CURLOPT_XFERINFOFUNCTION, &OnProgress);
  curl_easy_setopt(c, CURLOPT_XFERINFODATA, &t);
  curl_easy_setopt(c, CURLOPT_NOPROGRESS, 0L);
  CURLcode rc = curl_easy_perform(c);
  long status = 0;
  curl_easy_getinfo(c, CURLINFO_RESPONSE_CODE, &status);
  response.status = static_cast<int>(status);
  if (rc == CURLE_FILESIZE_EXCEEDED) response.body_truncated = true;
  if (rc != CURLE_OK && !response.body_truncated) {
    response.timed_out = rc == CURLE_OPERATION_TIMEDOUT;
    response.error = rc == CURLE_ABORTED_BY_CALLBACK ? "interrupted" : curl_easy_strerror(rc);
  }
  return response;
}

}  // namespace twinprobe
