#pragma once
// A planned study with a field team, its desk served in this process on a
// free 127.0.0.1 port, and a libcurl client that keeps cookies like a
// browser. Header-only (tests/CMakeLists.txt builds *_test.cpp).
#include <curl/curl.h>

#include <catch2/catch.hpp>
#include <memory>
#include <regex>
#include <string>
#include <thread>
#include <utility>
#include <vector>

#include "collector/collector_fixtures.h"
#include "desk/desk.h"
#include "desk/server.h"

namespace twinprobe::testing {

// The desk of the study in `path`, served in this process on a free
// 127.0.0.1 port with the clock pinned to `now`.
struct ServedDesk {
  std::unique_ptr<Desk> desk;
  std::unique_ptr<DeskServer> server;
  std::thread thread;

  ServedDesk(const std::string& path, const std::string& now) {
    setenv("TWINPROBE_NOW", now.c_str(), 1);
    auto d = Desk::Open(DeskOptions{path, false});
    INFO((d.ok() ? "" : d.error().Message()));
    REQUIRE(d.ok());
    desk = std::move(d).value();
    auto s = DeskServer::Bind(*desk, ServeOptions{"127.0.0.1", 0, "", ""});
    REQUIRE(s.ok());
    server = std::move(s).value();
    thread = std::thread([this] { server->Run(); });
  }
  ~ServedDesk() {
    server->Stop();
    thread.join();
    unsetenv("TWINPROBE_NOW");
  }
  std::string url() const { return server->url(); }
};

// Appends [team] members = ["Ada Moss", "Bo Lind"] to DIR/study.toml; returns DIR.
inline std::string WithTeam(const std::string& dir) {
  WriteFile(dir + "/study.toml", ReadFile(dir + "/study.toml") + "\n[team]\nmembers = [\"Ada Moss\", \"Bo Lind\"]\n");
  return dir;
}

// The Veldmark demo, planned, with its field team, on the first sending day.
struct DeskStudy {
  PlannedStudy study;
  ServedDesk served{WithTeam(study.path), "2027-03-01T12:00:00Z"};
  std::string url() const { return served.url(); }
};

struct HttpReply {
  long status = 0;
  std::string body;
  std::string location;
};

// One browser: a cookie jar and the pages it last saw.
class DeskClient {
 public:
  explicit DeskClient(std::string base) : base_(std::move(base)), curl_(curl_easy_init()) {
    curl_easy_setopt(curl_, CURLOPT_COOKIEFILE, "");  // cookies in memory
    curl_easy_setopt(curl_, CURLOPT_NOPROXY, "*");
    curl_easy_setopt(curl_, CURLOPT_WRITEFUNCTION, &DeskClient::Collect);
  }
  ~DeskClient() { curl_easy_cleanup(curl_); }
  DeskClient(const DeskClient&) = delete;
  DeskClient& operator=(const DeskClient&) = delete;

  HttpReply Get(const std::string& path) {
    curl_easy_setopt(curl_, CURLOPT_HTTPGET, 1L);
    return Perform(path);
  }
  // Posts form fields (name, value), URL-encoded.
  HttpReply Post(const std::string& path, const std::vector<std::pair<std::string, std::string>>& fields) {
    std::string body;
    for (const auto& [k, v] : fields) body += (body.empty() ? "" : "&") + Escape(k) + "=" + Escape(v);
    return PostRaw(path, body);
  }
  HttpReply PostRaw(const std::string& path, const std::string& body) {
    curl_easy_setopt(curl_, CURLOPT_POST, 1L);
    curl_easy_setopt(curl_, CURLOPT_POSTFIELDSIZE, static_cast<long>(body.size()));
    curl_easy_setopt(curl_, CURLOPT_COPYPOSTFIELDS, body.c_str());
    return Perform(path);
  }
  // Signs in as `member`, setting `passphrase` first when the desk asks.
  void SignIn(const std::string& member, const std::string& passphrase) {
    HttpReply page = Get("/signin");
    HttpReply r =
        Post("/signin", {{"signin", Hidden(page.body, "signin")}, {"member", member}, {"passphrase", passphrase}});
    if (r.status == 200 && r.body.find("has no passphrase yet") != std::string::npos)
      r = Post("/signin", {{"signin", Hidden(r.body, "signin")},
                           {"step", "set"},
                           {"member", member},
                           {"new_passphrase", passphrase},
                           {"repeat_passphrase", passphrase}});
    REQUIRE(r.status == 303);
    REQUIRE(r.location == "/today");
  }
  // The CSRF token of the forms on the last page fetched.
  std::string csrf() {
    if (csrf_.empty()) csrf_ = Hidden(Get("/study").body, "csrf");
    return csrf_;
  }

  // The value of the hidden input `name` in `html`, "" when absent.
  static std::string Hidden(const std::string& html, const std::string& name) {
    std::smatch m;
    std::regex re("name=\"" + name + "\" value=\"([^\"]*)\"");
    return std::regex_search(html, m, re) ? m[1].str() : "";
  }

 private:
  static size_t Collect(char* data, size_t size, size_t n, void* out) {
    static_cast<std::string*>(out)->append(data, size * n);
    return size * n;
  }
  std::string Escape(const std::string& s) {
    char* e = curl_easy_escape(curl_, s.c_str(), static_cast<int>(s.size()));
    std::string out(e);
    curl_free(e);
    return out;
  }
  HttpReply Perform(const std::string& path) {
    HttpReply r;
    std::string url = base_ + (path.empty() || path[0] != '/' ? path : path.substr(1));
    curl_easy_setopt(curl_, CURLOPT_URL, url.c_str());
    curl_easy_setopt(curl_, CURLOPT_WRITEDATA, &r.body);
    REQUIRE(curl_easy_perform(curl_) == CURLE_OK);
    curl_easy_getinfo(curl_, CURLINFO_RESPONSE_CODE, &r.status);
    char* location = nullptr;
    curl_easy_getinfo(curl_, CURLINFO_REDIRECT_URL, &location);
    if (location) r.location = std::string(location).substr(base_.size() - 1);
    return r;
  }

  std::string base_;
  CURL* curl_;
  std::string csrf_;
};

// Undoes the report's escaping of the five markup characters.
inline std::string Unescape(std::string s) {
  for (const auto& [from, to] : std::vector<std::pair<std::string, std::string>>{
           {"&lt;", "<"}, {"&gt;", ">"}, {"&quot;", "\""}, {"&#39;", "'"}, {"&amp;", "&"}}) {
    for (size_t at = s.find(from); at != std::string::npos; at = s.find(from, at + to.size()))
      s.replace(at, from.size(), to);
  }
  return s;
}

// The user text (inside <bdi>) of the first element whose class attribute
// starts with `cls`, unescaped; "" if none.
inline std::string ClassText(const std::string& html, const std::string& cls) {
  std::smatch m;
  std::regex re("class=\"" + cls + "[^\"]*\"[^>]*><bdi>([^<]*)</bdi>");
  return std::regex_search(html, m, re) ? Unescape(m[1].str()) : "";
}

}  // namespace twinprobe::testing
