#pragma once
// The rules every request of a `fetch` run obeys, in this order:
//   1. the URL must be http(s) and its host on the source's allowlist
//      (checked before any connection, for every redirect hop too);
//   2. robots.txt of that scheme and host (fetched once per run under the
//      same rules) must allow the path for the source's product token
//      (collector/robots.h);
//   3. at least min_interval_seconds pass between two requests to one host;
//   4. a 429 or 503 is retried up to `retries` times, waiting the longer of
//      Retry-After and backoff_seconds * 2^attempt; a Retry-After above
//      retry_after_cap_seconds makes the fetch give up instead of waiting;
//   5. redirects (301, 302, 303, 307, 308) are followed by the session, at
//      most max_redirects hops, each hop starting again at rule 1.
// Every response body is stored in the snapshot store (when one is given)
// and every exchange or refusal is appended to log() for the fetch_log table.
#include <atomic>
#include <chrono>
#include <cstdint>
#include <map>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "collector/fetch_http.h"
#include "collector/fetch_url.h"
#include "collector/robots.h"
#include "collector/snapshot_store.h"
#include "core/design.h"
#include "core/host_pacing.h"
#include "core/listing_pages.h"

namespace twinprobe {

struct FetchPolicy {
  std::vector<std::string> allow_hosts;
  std::string user_agent;     // the full header value
  std::string product_token;  // matched against robots.txt groups
  double min_interval_seconds = 5;
  double connect_timeout_seconds = 10;
  double timeout_seconds = 30;
  int64_t max_body_bytes = 5 << 20;
  int retries = 3;
  double backoff_seconds = 2;
  double retry_after_cap_seconds = 120;
  int max_redirects = 5;
};
FetchPolicy PolicyFor(const Source& source);

// One row of fetch_log. outcome: fetched (a final response), redirect (a 3xx
// hop that was followed), retry (a 429/503 that was waited out), failed,
// robots, allowlist, limit. detail is a JSON object (reason, headers of
// note, wait).
// One URL considered, as fetch_log keeps it (core/listing_pages.h).
using FetchLogEntry = FetchLogRow;

enum class PageOutcome { kFetched, kRobots, kAllowlist, kFailed };

struct PageFetch {
  PageOutcome outcome = PageOutcome::kFailed;
  std::string final_url;
  int http_status = 0;
  std::string body;  // the final response body (kFetched)
  std::string snapshot_sha256;
  std::string fetched_at;
  std::string reason;  // why it was skipped or failed
};

// Seconds to wait from a Retry-After value (RFC 9110 section 10.2.3:
// delay-seconds or an HTTP-date), relative to `now_epoch`; nullopt if
// unreadable. A date in the past gives 0.
std::optional<double> ParseRetryAfter(std::string_view value, int64_t now_epoch);

class FetchSession {
 public:
  // `snapshots` may be null (dry run: nothing is stored); `cancel` may be
  // null, else waits end early and no new request starts once it is true.
  FetchSession(HttpClient* client, const SnapshotStore* snapshots, const std::atomic<bool>* cancel)
      : client_(client), snapshots_(snapshots), cancel_(cancel) {}

  // Keeps rule 3 across processes too (core/host_pacing.h): every request
  // waits its host's turn in `pacing`, which must outlive the session.
  void SetHostPacing(HostPacing* pacing) { pacing_ = pacing; }

  // Fetches one page under every rule above.
  PageFetch Fetch(const std::string& url, const FetchPolicy& policy);

  // Rules 1 and 2 only (fetching robots.txt if needed): what Fetch would do
  // first. Returns kFetched when the URL may be fetched, else kAllowlist or
  // kRobots, with `reason` and `robots_rule` describing why.
  PageFetch Precheck(const std::string& url, const FetchPolicy& policy, std::string* robots_rule = nullptr);

  // Records a URL that was not requested because of the page limit.
  void LogLimit(const std::string& url, const std::string& reason);

  const std::vector<FetchLogEntry>& log() const { return log_; }
  bool cancelled() const { return cancel_ && cancel_->load(); }

 private:
  struct Attempt {
    HttpResponse response;
    std::string snapshot_sha256;
    std::string at;
    std::string give_up;  // set when a 429/503 was not retried further
  };
  Attempt Request(const std::string& url, const UrlParts& parts, const FetchPolicy& policy);
  const RobotsRules& RobotsFor(const UrlParts& parts, const FetchPolicy& policy);
  void WaitForHost(const std::string& authority, double interval_seconds);
  void Sleep(double seconds);
  void Log(const std::string& url, const std::string& outcome, int status, const std::string& detail,
           const std::string& sha, const std::string& at = {});

  HttpClient* client_;
  const SnapshotStore* snapshots_;
  const std::atomic<bool>* cancel_;
  HostPacing* pacing_ = nullptr;
  std::map<std::string, RobotsRules> robots_;  // by origin, for this run
  std::map<std::string, std::chrono::steady_clock::time_point> last_request_;  // by authority
  std::vector<FetchLogEntry> log_;
};

}  // namespace twinprobe
