#pragma once
// The fixture web server of the listing tests (tests/fixtures/listing/
// server.py, an invented job board) started on 127.0.0.1 on a free port for
// one test and stopped by pid when the test ends. Nothing but loopback is
// ever contacted: the server binds 127.0.0.1 only, and every URL the tests
// fetch names 127.0.0.1 or a host outside the allowlist (refused before any
// connection). Proxies are switched off for the same reason.
#include <signal.h>
#include <spawn.h>
#include <sys/wait.h>
#include <unistd.h>

#include <chrono>
#include <cstdlib>
#include <filesystem>
#include <string>
#include <thread>
#include <vector>

#include <catch2/catch.hpp>
#include <nlohmann/json.hpp>

#include "testing/testing.h"

extern char** environ;

namespace twinprobe::testing {

inline void NoProxies() {
  for (const char* v : {"http_proxy", "https_proxy", "HTTP_PROXY", "HTTPS_PROXY", "ALL_PROXY", "all_proxy"}) unsetenv(v);
  setenv("no_proxy", "*", 1);
}

struct SeenRequest {
  double t = 0;
  std::string path;
  std::string user_agent;
};

class FixtureServer {
 public:
  // extra: more arguments for server.py, e.g. {"--robots", "status-500"}.
  explicit FixtureServer(std::vector<std::string> extra = {}) {
    NoProxies();
    std::string python = std::filesystem::exists("/usr/bin/python3") ? "/usr/bin/python3" : "python3";
    std::vector<std::string> args = {python, SourceDir() + "/tests/fixtures/listing/server.py", "--port-file",
                                     dir_ / "port", "--log", dir_ / "requests.jsonl"};
    args.insert(args.end(), extra.begin(), extra.end());
    std::vector<char*> argv;
    for (auto& a : args) argv.push_back(a.data());
    argv.push_back(nullptr);
    REQUIRE(posix_spawnp(&pid_, argv[0], nullptr, nullptr, argv.data(), environ) == 0);
    for (int i = 0; i < 300 && !std::filesystem::exists(dir_ / "port"); ++i)
      std::this_thread::sleep_for(std::chrono::milliseconds(50));
    REQUIRE(std::filesystem::exists(dir_ / "port"));
    port_ = std::stoi(ReadFile(dir_ / "port"));
  }
  ~FixtureServer() {
    if (pid_ > 0) {
      kill(pid_, SIGTERM);
      waitpid(pid_, nullptr, 0);
    }
  }
  FixtureServer(const FixtureServer&) = delete;
  FixtureServer& operator=(const FixtureServer&) = delete;

  int port() const { return port_; }
  std::string host() const { return "127.0.0.1:" + std::to_string(port_); }
  std::string base() const { return "http://" + host(); }

  // Every request the server has seen, in order.
  std::vector<SeenRequest> Requests() const {
    std::vector<SeenRequest> out;
    std::string text = ReadFile(dir_ / "requests.jsonl");
    size_t pos = 0;
    while (pos < text.size()) {
      size_t end = text.find('\n', pos);
      if (end == std::string::npos) break;
      auto j = nlohmann::json::parse(text.substr(pos, end - pos));
      out.push_back({j["t"].get<double>(), j["path"].get<std::string>(), j["ua"].get<std::string>()});
      pos = end + 1;
    }
    return out;
  }
  int CountRequests(const std::string& path_prefix) const {
    int n = 0;
    for (const auto& r : Requests()) n += r.path.rfind(path_prefix, 0) == 0;
    return n;
  }

 private:
  TempDir dir_;
  pid_t pid_ = -1;
  int port_ = 0;
};

// A listing study of the fixture board. Queries are the board's paths, so
// one source meets every kind of page in one run.
inline std::string ListingStudyToml(const FixtureServer& server, const std::string& name_rule = "h3.name",
                                    const std::string& optional = "[\"salary\"]") {
  return R"(# Listing audit of the Veldmark Jobs Exchange (invented), served by the test fixture.
[study]
id = "veldmark-listing-audit"
kind = "listing"

[[factor]]
name = "origin"
levels = ["inland", "coastal"]

[[source]]
name = "veldmark-jobs"
allow_hosts = [")" + server.host() + R"("]
url = "http://)" + server.host() + R"(/{query}?where={location}&page={page}"
queries = ["search", "private", "broken", "missing-field", "fail", "away", "empty", "moved"]
locations = ["Orlinde"]
page_limit = 6
min_interval_seconds = 0.1
user_agent = "VeldmarkListingAudit/1.0"
contact = "listing-audit@newsroom.example"
timeout_seconds = 5
retries = 1
backoff_seconds = 0.1

[source.extract]
list = "ol#results"
items = "li.candidate"
key = "id"
optional = )" + optional + R"(

[source.extract.fields]
id = "@data-candidate"
name = ")" + name_rule + R"("
profile = "a.profile @href"
salary = ".salary"

[ethics]
approval = "VREB-2027-031 - Veldmark Research Ethics Board, invented"
retention_days = 180
)";
}

}  // namespace twinprobe::testing
