#include "collector/fetch_run.h"

#include <filesystem>

#include <map>

#include "collector/extract.h"
#include "collector/fetch_session.h"
#include "collector/listing_store.h"
#include "collector/snapshot_store.h"
#include "core/audit.h"
#include "core/suggest.h"

namespace twinprobe {
namespace {

struct SelectedSource {
  const Source* source;
  ListingRules rules;
};

Result<std::vector<SelectedSource>> SelectSources(const Design& design, const std::string& label,
                                                  const std::string& only) {
  if (design.sources.empty())
    return BadInput(label, "the design declares no [[source]] to fetch from",
                    "add a [[source]] section; see docs/fetch.md");
  std::vector<SelectedSource> out;
  std::vector<std::string> names;
  for (const Source& s : design.sources) {
    names.push_back(s.name);
    if (!only.empty() && s.name != only) continue;
    auto rules = CompileRules(s, label);
    if (!rules.ok()) return rules.error();
    out.push_back({&s, std::move(rules).value()});
  }
  if (out.empty())
    return BadInput("", "there is no source '" + only + "' in the design" + DidYouMean(only, names),
                    "use one of the [[source]] names");
  return out;
}

std::string Plural(int n, const std::string& word) { return std::to_string(n) + " " + word + (n == 1 ? "" : "s"); }

std::string SummaryLine(const FetchReport& r) {
  return Plural(r.fetched, "page") + " fetched, " + std::to_string(r.robots + r.allowlist + r.limit) +
         " skipped (robots " + std::to_string(r.robots) + ", allowlist " + std::to_string(r.allowlist) + ", limit " +
         std::to_string(r.limit) + "), " + std::to_string(r.failed) + " failed; " + Plural(r.listings_ok, "listing") +
         " extracted with " + Plural(r.items, "item") + ", " + std::to_string(r.extraction_failed) +
         " extraction failures" + (r.interrupted ? "; interrupted" : "");
}

}  // namespace

Status CheckFetchable(const Design& design, const std::string& label, const std::string& only) {
  auto selected = SelectSources(design, label, only);
  return selected.ok() ? Status() : Status(selected.error());
}

std::vector<PlannedPage> PlanPages(const Source& s) {
  std::vector<std::string> queries = s.queries.empty() ? std::vector<std::string>{""} : s.queries;
  std::vector<std::string> locations = s.locations.empty() ? std::vector<std::string>{""} : s.locations;
  std::vector<PlannedPage> out;
  for (const auto& q : queries)
    for (const auto& l : locations)
      for (int p = 1; p <= s.pages; ++p) out.push_back({s.name, q, l, p, ExpandUrlPattern(s.url, q, l, p)});
  return out;
}

Result<FetchReport> RunFetch(Store* store, const Design& design, const std::string& label,
                             const std::string& snapshot_dir, HttpClient& client, const FetchOptions& options) {
  auto selected = SelectSources(design, label, options.only_source);
  if (!selected.ok()) return selected.error();
  FetchReport report;
  report.mode = options.dry_run ? "dry-run" : "fetch";
  SnapshotStore snapshots(snapshot_dir);
  FetchSession session(&client, options.dry_run ? nullptr : &snapshots, options.cancel);
  // Hosts are paced across processes through files beside the snapshots
  // (STUDY/fetch-hosts); a dry run writes nothing, so it paces within itself.
  HostPacing pacing(options.dry_run ? std::string()
                                    : (std::filesystem::path(snapshot_dir).parent_path() / "fetch-hosts").string());
  session.SetHostPacing(&pacing);
  std::vector<Extraction> extractions;  // parallel to report.pages

  size_t total = 0;
  for (const auto& sel : selected.value()) total += PlanPages(*sel.source).size();
  size_t done = 0;
  for (const auto& sel : selected.value()) {
    const Source& source = *sel.source;
    FetchPolicy policy = PolicyFor(source);
    int requested = 0;
    for (const PlannedPage& page : PlanPages(source)) {
      if (session.cancelled()) {
        report.interrupted = true;
        break;
      }
      if (options.progress) options.progress(done, total, page.url);
      ++done;
      PageReport pr;
      pr.page = page;
      Extraction x;
      if (requested >= source.page_limit) {
        pr.outcome = "limit";
        pr.reason = "the page limit of " + std::to_string(source.page_limit) + " per run is reached";
        if (!options.dry_run) session.LogLimit(page.url, pr.reason);
        ++report.limit;
      } else if (options.dry_run) {
        PageFetch check = session.Precheck(page.url, policy, &pr.robots_rule);
        pr.outcome = check.outcome == PageOutcome::kFetched    ? "allowed"
                     : check.outcome == PageOutcome::kRobots   ? "robots"
                     : check.outcome == PageOutcome::kAllowlist ? "allowlist"
                                                                : "failed";
        pr.reason = check.reason;
        if (check.outcome == PageOutcome::kFetched) ++requested;
        if (check.outcome == PageOutcome::kRobots) ++report.robots;
        if (check.outcome == PageOutcome::kAllowlist) ++report.allowlist;
      } else {
        PageFetch f = session.Fetch(page.url, policy);
        pr.final_url = f.final_url;
        pr.http_status = f.http_status;
        pr.fetched_at = f.fetched_at;
        pr.snapshot_sha256 = f.snapshot_sha256;
        pr.reason = f.reason;
        switch (f.outcome) {
          case PageOutcome::kRobots:
            pr.outcome = "robots";
            ++report.robots;
            break;
          case PageOutcome::kAllowlist:
            pr.outcome = "allowlist";
            ++report.allowlist;
            // A refused redirect still cost a request to the first host.
            if (f.final_url != page.url) ++requested;
            break;
          case PageOutcome::kFailed:
            pr.outcome = "failed";
            ++report.failed;
            ++requested;
            break;
          case PageOutcome::kFetched:
            pr.outcome = "fetched";
            ++report.fetched;
            ++requested;
            x = ExtractListing(f.body, sel.rules);
            pr.extracted = true;
            pr.extraction_ok = x.ok;
            pr.extraction_error = x.error;
            pr.items = static_cast<int>(x.items.size());
            if (x.ok) {
              ++report.listings_ok;
              report.items += pr.items;
            } else {
              ++report.extraction_failed;
            }
            break;
        }
      }
      report.pages.push_back(std::move(pr));
      extractions.push_back(std::move(x));
    }
  }
  if (options.progress) options.progress(done, total, "");
  if (options.dry_run || !store) return report;

  AuditedWrite write(*store, "fetch");
  for (const FetchLogEntry& e : session.log()) InsertFetchLog(*store, write.seq(), e);
  for (size_t i = 0; i < report.pages.size(); ++i) {
    const PageReport& pr = report.pages[i];
    if (!pr.extracted) continue;
    ListingRow row;
    row.source = pr.page.source;
    row.query = pr.page.query;
    row.location = pr.page.location;
    row.page = pr.page.page;
    row.fetched_at = pr.fetched_at;
    row.url = pr.final_url;
    row.http_status = pr.http_status;
    row.snapshot_sha256 = pr.snapshot_sha256;
    InsertListing(*store, write.seq(), row, extractions[i]);
  }
  report.audit_seq = write.seq();
  report.audit_hash = write.Commit("fetch: " + SummaryLine(report));
  return report;
}

Result<FetchReport> ReplayListings(Store& store, const Design& design, const std::string& label,
                                   const std::string& snapshot_dir, const FetchOptions& options) {
  auto selected = SelectSources(design, label, options.only_source);
  if (!selected.ok()) return selected.error();
  FetchReport report;
  report.mode = "replay";
  SnapshotStore snapshots(snapshot_dir);
  AuditedWrite write(store, "fetch --replay");
  std::vector<std::pair<StoredListing, Extraction>> all;
  for (const auto& sel : selected.value())
    for (auto& l : CurrentListings(store, sel.source->name)) all.emplace_back(std::move(l), Extraction{});
  size_t done = 0;
  std::map<std::string, const ListingRules*> rules;
  for (const auto& sel : selected.value()) rules[sel.source->name] = &sel.rules;
  for (auto& [listing, x] : all) {
    if (options.progress) options.progress(done++, all.size(), listing.row.url);
    PageReport pr;
    pr.page = PlannedPage{listing.row.source, listing.row.query, listing.row.location, listing.row.page, listing.row.url};
    pr.final_url = listing.row.url;
    pr.fetched_at = listing.row.fetched_at;
    pr.http_status = listing.row.http_status;
    pr.snapshot_sha256 = listing.row.snapshot_sha256;
    auto bytes = snapshots.Get(listing.row.snapshot_sha256);
    if (!bytes.ok()) {
      pr.outcome = "failed";
      pr.reason = bytes.error().Message();
      ++report.missing;
      report.pages.push_back(std::move(pr));
      continue;
    }
    x = ExtractListing(bytes.value(), *rules[listing.row.source]);
    ++report.replayed;
    pr.extracted = true;
    pr.extraction_ok = x.ok;
    pr.extraction_error = x.error;
    pr.items = static_cast<int>(x.items.size());
    if (x.ok) {
      ++report.listings_ok;
      report.items += pr.items;
    } else {
      ++report.extraction_failed;
    }
    if (ExtractionFingerprint(x) == StoredFingerprint(store, listing.id)) {
      pr.outcome = "unchanged";
      ++report.unchanged;
    } else {
      pr.outcome = "changed";
      ++report.changed;
      int64_t id = InsertListing(store, write.seq(), listing.row, x);
      InsertReplay(store, write.seq(), id, listing.id);
    }
    report.pages.push_back(std::move(pr));
  }
  if (options.progress) options.progress(all.size(), all.size(), "");
  if (report.changed == 0) return report;  // nothing to record; the transaction rolls back
  report.audit_seq = write.seq();
  report.audit_hash = write.Commit("fetch --replay: " + Plural(report.replayed, "listing") + " re-extracted, " +
                                   std::to_string(report.changed) + " changed, " + std::to_string(report.unchanged) +
                                   " unchanged, " + std::to_string(report.missing) + " snapshots missing");
  return report;
}

}  // namespace twinprobe
