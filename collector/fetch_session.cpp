#include "collector/fetch_session.h"

#include <curl/curl.h>

#include <algorithm>
#include <cmath>
#include <thread>

#include <nlohmann/json.hpp>

#include "core/clock.h"

namespace twinprobe {
namespace {

using Clock = std::chrono::steady_clock;

const char* const kHeadersOfNote[] = {"content-type", "content-length", "last-modified", "etag",
                                      "date",         "retry-after",    "location"};

nlohmann::json HeadersOfNote(const HttpResponse& r) {
  nlohmann::json h = nlohmann::json::object();
  for (const char* name : kHeadersOfNote) {
    std::string v = r.Header(name);
    if (!v.empty()) h[name] = v;
  }
  return h;
}

bool IsRedirect(int status) {
  return status == 301 || status == 302 || status == 303 || status == 307 || status == 308;
}

std::string Seconds(double s) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%g", s);
  return buf;
}

}  // namespace

FetchPolicy PolicyFor(const Source& s) {
  FetchPolicy p;
  p.allow_hosts = s.allow_hosts;
  p.user_agent = s.UserAgentHeader();
  p.product_token = s.ProductToken();
  p.min_interval_seconds = s.min_interval_seconds;
  p.connect_timeout_seconds = s.connect_timeout_seconds;
  p.timeout_seconds = s.timeout_seconds;
  p.max_body_bytes = s.max_body_bytes;
  p.retries = s.retries;
  p.backoff_seconds = s.backoff_seconds;
  p.retry_after_cap_seconds = s.retry_after_cap_seconds;
  p.max_redirects = s.max_redirects;
  return p;
}

std::optional<double> ParseRetryAfter(std::string_view value, int64_t now_epoch) {
  while (!value.empty() && value.front() == ' ') value.remove_prefix(1);
  while (!value.empty() && value.back() == ' ') value.remove_suffix(1);
  if (value.empty()) return std::nullopt;
  if (std::all_of(value.begin(), value.end(), [](char c) { return c >= '0' && c <= '9'; })) {
    if (value.size() > 9) return 1e9;  // absurdly long: certainly above any cap
    return std::stod(std::string(value));
  }
  // HTTP-date (IMF-fixdate, or the obsolete RFC 850 and asctime forms);
  // curl_getdate reads all three without touching the network.
  std::string text(value);
  time_t t = curl_getdate(text.c_str(), nullptr);
  if (t == -1) return std::nullopt;
  return std::max<double>(0, static_cast<double>(t - now_epoch));
}

void FetchSession::Log(const std::string& url, const std::string& outcome, int status, const std::string& detail,
                       const std::string& sha, const std::string& at) {
  log_.push_back(FetchLogEntry{url, at.empty() ? NowIso() : at, outcome, status, detail, sha});
}

void FetchSession::LogLimit(const std::string& url, const std::string& reason) {
  Log(url, "limit", 0, nlohmann::json{{"reason", reason}}.dump(), "");
}

void FetchSession::Sleep(double seconds) {
  auto until = Clock::now() + std::chrono::duration_cast<Clock::duration>(std::chrono::duration<double>(seconds));
  while (Clock::now() < until && !cancelled())
    std::this_thread::sleep_for(std::min<Clock::duration>(until - Clock::now(), std::chrono::milliseconds(50)));
}

void FetchSession::WaitForHost(const std::string& authority, double interval_seconds) {
  auto it = last_request_.find(authority);
  if (it != last_request_.end()) {
    double since = std::chrono::duration<double>(Clock::now() - it->second).count();
    if (since < interval_seconds) Sleep(interval_seconds - since);
  }
  last_request_[authority] = Clock::now();
}

FetchSession::Attempt FetchSession::Request(const std::string& url, const UrlParts& parts, const FetchPolicy& policy) {
  HttpRequest req{url, policy.user_agent, policy.connect_timeout_seconds, policy.timeout_seconds,
                  policy.max_body_bytes};
  for (int attempt = 0;; ++attempt) {
    Attempt a;
    if (cancelled()) {
      a.response.error = "interrupted";
      a.at = NowIso();
      return a;
    }
    WaitForHost(parts.Authority(), policy.min_interval_seconds);
    HostTurn turn;  // another process's requests to the host count too
    if (pacing_) turn = pacing_->Take(parts.Authority(), policy.min_interval_seconds, [this] { return cancelled(); });
    if (cancelled()) {
      a.response.error = "interrupted";
      a.at = NowIso();
      return a;
    }
    a.response = client_->Get(req);
    // The interval counts from the end of the answer, not the start of the
    // request: a slow answer then never shortens the host's quiet time.
    last_request_[parts.Authority()] = Clock::now();
    turn.Finish();
    a.at = NowIso();
    // Every body that arrived is evidence, error pages included.
    if (snapshots_ && (a.response.status > 0 || !a.response.body.empty())) {
      auto sha = snapshots_->Put(a.response.body);
      if (sha.ok()) a.snapshot_sha256 = sha.value();
      else a.response.error = sha.error().Message();
    }
    int status = a.response.status;
    if (!a.response.error.empty() || (status != 429 && status != 503)) return a;
    std::optional<double> asked = ParseRetryAfter(a.response.Header("retry-after"), NowEpoch());
    if (asked && *asked > policy.retry_after_cap_seconds) {
      a.give_up = "the server asked to wait " + Seconds(*asked) + " s (Retry-After), more than the cap of " +
                  Seconds(policy.retry_after_cap_seconds) + " s";
      return a;
    }
    if (attempt >= policy.retries) {
      a.give_up = "HTTP " + std::to_string(status) + " after " + std::to_string(attempt + 1) + " attempts";
      return a;
    }
    double wait = policy.backoff_seconds * std::pow(2.0, attempt);
    if (asked) wait = std::max(wait, *asked);
    wait = std::min(wait, policy.retry_after_cap_seconds);
    nlohmann::json detail{{"reason", "HTTP " + std::to_string(status) + "; waiting " + Seconds(wait) + " s"},
                          {"wait_seconds", wait},
                          {"headers", HeadersOfNote(a.response)}};
    Log(url, "retry", status, detail.dump(), a.snapshot_sha256, a.at);
    // The wait counts from this response, on top of the host interval.
    Sleep(wait);
  }
}

const RobotsRules& FetchSession::RobotsFor(const UrlParts& parts, const FetchPolicy& policy) {
  const std::string origin = parts.Origin();
  auto found = robots_.find(origin);
  if (found != robots_.end()) return found->second;
  // RFC 9309 section 2.3.1: follow up to five redirects; a redirect this
  // run may not follow (outside the allowlist) or more than five, and any
  // failure to get an answer, count as "unreachable": disallow everything.
  // This is stricter than the RFC's "MAY treat as unavailable" for too many
  // redirects, and for 429, which the RFC would read as unavailable (4xx).
  std::string url = origin + "/robots.txt";
  RobotsRules rules = RobotsRules::DisallowAll();
  for (int hop = 0; hop <= 5; ++hop) {
    auto hop_parts = ParseHttpUrl(url);
    if (!hop_parts || !HostAllowed(*hop_parts, policy.allow_hosts)) {
      Log(url, "allowlist", 0,
          nlohmann::json{{"reason", "robots.txt redirects to a host outside allow_hosts; everything on " + origin +
                                        " is treated as disallowed"}}
              .dump(),
          "");
      break;
    }
    FetchPolicy robots_policy = policy;
    robots_policy.max_body_bytes = std::max<int64_t>(policy.max_body_bytes, 500 * 1024);
    Attempt a = Request(url, *hop_parts, robots_policy);
    const HttpResponse& r = a.response;
    nlohmann::json detail{{"headers", HeadersOfNote(r)}};
    if (!r.error.empty()) {
      detail["reason"] = "robots.txt unreachable (" + r.error + "); everything is disallowed";
      Log(url, "failed", r.status, detail.dump(), a.snapshot_sha256, a.at);
      break;
    }
    if (IsRedirect(r.status) && !r.Header("location").empty()) {
      auto next = ResolveLocation(url, r.Header("location"));
      detail["reason"] = "robots.txt redirects";
      Log(url, "redirect", r.status, detail.dump(), a.snapshot_sha256, a.at);
      if (!next) break;
      url = *next;
      continue;
    }
    if (r.status >= 200 && r.status < 300) {
      rules = ParseRobots(r.body);
      detail["reason"] = "robots.txt read";
      Log(url, "fetched", r.status, detail.dump(), a.snapshot_sha256, a.at);
    } else if (r.status >= 400 && r.status < 500 && r.status != 429) {
      rules = RobotsRules::AllowAll();  // section 2.3.1.3: unavailable
      detail["reason"] = "robots.txt unavailable (HTTP " + std::to_string(r.status) + "); no rules apply";
      Log(url, "fetched", r.status, detail.dump(), a.snapshot_sha256, a.at);
    } else {
      detail["reason"] = "robots.txt unreachable (HTTP " + std::to_string(r.status) + "); everything is disallowed";
      if (!a.give_up.empty()) detail["reason"] = a.give_up + "; robots.txt unreachable, everything is disallowed";
      Log(url, "failed", r.status, detail.dump(), a.snapshot_sha256, a.at);
    }
    break;
  }
  return robots_.emplace(origin, std::move(rules)).first->second;
}

PageFetch FetchSession::Precheck(const std::string& url, const FetchPolicy& policy, std::string* robots_rule) {
  PageFetch out;
  out.final_url = url;
  auto parts = ParseHttpUrl(url);
  if (!parts || !HostAllowed(*parts, policy.allow_hosts)) {
    out.outcome = PageOutcome::kAllowlist;
    out.reason = parts ? "the host " + parts->Authority() + " is not in allow_hosts"
                       : "not an http or https URL";
    return out;
  }
  RobotsVerdict v = RobotsFor(*parts, policy).Check(policy.product_token, parts->path_and_query);
  if (robots_rule) *robots_rule = DescribeRobotsVerdict(v);
  if (!v.allowed) {
    out.outcome = PageOutcome::kRobots;
    out.reason = "robots.txt disallows it (" + DescribeRobotsVerdict(v) + ")";
    return out;
  }
  out.outcome = PageOutcome::kFetched;
  return out;
}

PageFetch FetchSession::Fetch(const std::string& start_url, const FetchPolicy& policy) {
  std::string url = start_url;
  for (int hop = 0;; ++hop) {
    PageFetch check = Precheck(url, policy);
    if (check.outcome != PageOutcome::kFetched) {
      if (hop > 0) check.reason = "redirected to " + url + ", which was refused: " + check.reason;
      Log(url, check.outcome == PageOutcome::kRobots ? "robots" : "allowlist", 0,
          nlohmann::json{{"reason", check.reason}}.dump(), "");
      return check;
    }
    auto parts = ParseHttpUrl(url);
    Attempt a = Request(url, *parts, policy);
    const HttpResponse& r = a.response;
    PageFetch out;
    out.final_url = url;
    out.http_status = r.status;
    out.snapshot_sha256 = a.snapshot_sha256;
    out.fetched_at = a.at;
    nlohmann::json detail{{"headers", HeadersOfNote(r)}};
    if (!r.error.empty()) {
      out.reason = r.timed_out ? "timed out after " + Seconds(policy.timeout_seconds) + " s (" + r.error + ")" : r.error;
    } else if (r.body_truncated) {
      out.reason = "the body is larger than max_body_bytes (" + std::to_string(policy.max_body_bytes) +
                   "); the first part is kept as the snapshot";
    } else if (IsRedirect(r.status)) {
      std::string location = r.Header("location");
      auto next = location.empty() ? std::nullopt : ResolveLocation(url, location);
      if (!next) {
        out.reason = "HTTP " + std::to_string(r.status) + " without a usable Location header";
      } else if (hop >= policy.max_redirects) {
        out.reason = "more than " + std::to_string(policy.max_redirects) + " redirects";
      } else {
        detail["reason"] = "redirect to " + *next;
        Log(url, "redirect", r.status, detail.dump(), a.snapshot_sha256, a.at);
        url = *next;
        continue;
      }
    } else if (!a.give_up.empty()) {
      out.reason = a.give_up;
    } else if (r.status < 200 || r.status >= 300) {
      out.reason = "HTTP " + std::to_string(r.status);
    } else {
      out.outcome = PageOutcome::kFetched;
      out.body = r.body;
      Log(url, "fetched", r.status, detail.dump(), a.snapshot_sha256, a.at);
      return out;
    }
    out.outcome = PageOutcome::kFailed;
    detail["reason"] = out.reason;
    Log(url, "failed", r.status, detail.dump(), a.snapshot_sha256, a.at);
    return out;
  }
}

}  // namespace twinprobe
