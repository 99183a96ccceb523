#pragma once
// A `fetch` run over the design's [[source]] tables: plan the list pages,
// fetch each under the session's rules (collector/fetch_session.h), extract
// the ranked list (collector/extract.h) and store everything. Also the dry
// run (URLs and robots verdicts, nothing stored) and the replay
// (re-extraction from stored snapshots, no network).
//
// Store writes: the network phase runs outside any transaction (a run can
// take hours at a polite interval and must not hold the store's write lock
// that long); the results are then written in ONE AuditedWrite. Snapshot
// files are written as responses arrive; if the run dies before the write,
// they stay as unreferenced files and the run can simply be repeated.
#include <atomic>
#include <cstddef>
#include <functional>
#include <string>
#include <vector>

#include "collector/fetch_http.h"
#include "core/design.h"
#include "core/status.h"
#include "core/store.h"

namespace twinprobe {

struct PlannedPage {
  std::string source;
  std::string query;
  std::string location;
  int page = 1;
  std::string url;
};

// Every list page of a source, in order: query, then location, then page.
std::vector<PlannedPage> PlanPages(const Source& source);

struct PageReport {
  PlannedPage page;
  // fetched | robots | allowlist | limit | failed; a dry run gives
  // "allowed" instead of fetched.
  std::string outcome;
  std::string reason;
  std::string robots_rule;  // dry run: the deciding robots.txt line
  int http_status = 0;
  std::string final_url;
  std::string fetched_at;
  std::string snapshot_sha256;
  bool extracted = false;  // a listing row was written
  bool extraction_ok = false;
  std::string extraction_error;
  int items = 0;
};

struct FetchReport {
  std::string mode;  // fetch | dry-run | replay
  std::vector<PageReport> pages;
  int fetched = 0, robots = 0, allowlist = 0, limit = 0, failed = 0;
  int listings_ok = 0, extraction_failed = 0, items = 0;
  // replay only
  int replayed = 0, changed = 0, unchanged = 0, missing = 0;
  bool interrupted = false;
  int64_t audit_seq = 0;  // 0: nothing written
  std::string audit_hash;
  bool has_failures() const { return failed > 0 || extraction_failed > 0 || missing > 0; }
};

struct FetchOptions {
  std::string only_source;  // "" = every source
  bool dry_run = false;
  // Called before each page: (pages done, pages planned, url).
  std::function<void(size_t, size_t, const std::string&)> progress;
  const std::atomic<bool>* cancel = nullptr;
};

// Checks what RunFetch and ReplayListings check before any work: the design
// has sources, `only_source` names one of them, and every selector parses.
Status CheckFetchable(const Design& design, const std::string& design_label, const std::string& only_source);

// Fetches every planned page of the selected sources. `design_label` is the
// design file's name for error positions. With options.dry_run only
// robots.txt files are fetched and nothing is stored (`store` may be null).
// Errors (exit 1, store unchanged): no [[source]], an unknown --source, a
// bad selector.
Result<FetchReport> RunFetch(Store* store, const Design& design, const std::string& design_label,
                             const std::string& snapshot_dir, HttpClient& client, const FetchOptions& options);

// Re-extracts every current listing of the selected sources from its
// snapshot with the design's current rules, without any network. A listing
// whose result differs is stored again as a new row that replaces the old
// one (listing_replay); unchanged listings are left alone. One AuditedWrite,
// only when something changed. A missing or altered snapshot is reported
// (missing) and that listing is left as it was.
Result<FetchReport> ReplayListings(Store& store, const Design& design, const std::string& design_label,
                                   const std::string& snapshot_dir, const FetchOptions& options);

}  // namespace twinprobe
