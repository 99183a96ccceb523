// Commands of a listing audit: fetch (with --dry-run and --replay) and
// import labels. The work is in collector/fetch_run.h and
// collector/listing_labels.h; this file parses options and prints.
#include <csignal>
#include <filesystem>
#include <iostream>

#include <nlohmann/json.hpp>

#include "cli/command.h"
#include "collector/fetch_run.h"
#include "collector/listing_labels.h"
#include "core/progress.h"
#include "core/ethics_gate.h"
#include "planner/design_file.h"

namespace twinprobe {
namespace {

std::atomic<bool> g_interrupted{false};
extern "C" void OnInterrupt(int) { g_interrupted.store(true); }

// Ctrl-C during a fetch stops before the next request and still stores what
// was fetched (a second Ctrl-C is the default: quit at once).
class InterruptGuard {
 public:
  InterruptGuard() { previous_ = std::signal(SIGINT, &OnInterrupt); }
  ~InterruptGuard() { std::signal(SIGINT, previous_); }
  InterruptGuard(const InterruptGuard&) = delete;
  InterruptGuard& operator=(const InterruptGuard&) = delete;

 private:
  void (*previous_)(int) = nullptr;
};

struct FetchCmdOptions {
  std::string source;
  bool dry_run = false;
  bool replay = false;
};

nlohmann::json PageJson(const PageReport& p, bool dry_run) {
  nlohmann::json j{{"source", p.page.source}, {"query", p.page.query}, {"location", p.page.location},
                   {"page", p.page.page},     {"url", p.page.url},     {"outcome", p.outcome},
                   {"reason", p.reason}};
  if (dry_run) {
    j["robots_rule"] = p.robots_rule;
    return j;
  }
  j["final_url"] = p.final_url;
  j["http_status"] = p.http_status ? nlohmann::json(p.http_status) : nlohmann::json(nullptr);
  j["fetched_at"] = p.fetched_at;
  j["snapshot_sha256"] = p.snapshot_sha256.empty() ? nlohmann::json(nullptr) : nlohmann::json(p.snapshot_sha256);
  j["extraction"] = p.extracted ? nlohmann::json{{"ok", p.extraction_ok},
                                                 {"error", p.extraction_ok ? nlohmann::json(nullptr)
                                                                           : nlohmann::json(p.extraction_error)},
                                                 {"items", p.items}}
                                : nlohmann::json(nullptr);
  return j;
}

void PrintJson(const FetchReport& r) {
  nlohmann::json pages = nlohmann::json::array();
  for (const auto& p : r.pages) pages.push_back(PageJson(p, r.mode == "dry-run"));
  nlohmann::json summary{{"fetched", r.fetched},
                         {"skipped", {{"robots", r.robots}, {"allowlist", r.allowlist}, {"limit", r.limit}}},
                         {"failed", r.failed},
                         {"listings_ok", r.listings_ok},
                         {"extraction_failed", r.extraction_failed},
                         {"items", r.items},
                         {"interrupted", r.interrupted}};
  if (r.mode == "replay")
    summary = nlohmann::json{{"replayed", r.replayed},       {"changed", r.changed},
                             {"unchanged", r.unchanged},     {"snapshots_missing", r.missing},
                             {"listings_ok", r.listings_ok}, {"extraction_failed", r.extraction_failed},
                             {"items", r.items}};
  nlohmann::json j{{"mode", r.mode}, {"summary", summary}, {"pages", pages}};
  j["audit_seq"] = r.audit_seq ? nlohmann::json(r.audit_seq) : nlohmann::json(nullptr);
  j["audit_hash"] = r.audit_hash.empty() ? nlohmann::json(nullptr) : nlohmann::json(r.audit_hash);
  std::cout << j.dump(2) << "\n";
}

std::string PageLine(const PageReport& p) {
  std::string status = p.http_status ? std::to_string(p.http_status) : "-";
  std::string line = "  " + p.outcome + std::string(p.outcome.size() < 10 ? 10 - p.outcome.size() : 1, ' ') + status +
                     std::string(status.size() < 5 ? 5 - status.size() : 1, ' ') + p.page.url;
  if (p.extracted)
    line += p.extraction_ok ? "  (" + std::to_string(p.items) + " items)" : "  extraction failed: " + p.extraction_error;
  else if (!p.reason.empty())
    line += "  " + p.reason;
  else if (!p.robots_rule.empty())
    line += "  robots.txt: " + p.robots_rule;
  return line;
}

void PrintText(const FetchReport& r, const std::string& snapshot_dir) {
  for (const auto& p : r.pages) std::cout << PageLine(p) << "\n";
  if (r.mode == "dry-run") {
    std::cout << "Dry run: " << r.pages.size() << " URLs planned; " << r.robots << " disallowed by robots.txt, "
              << r.allowlist << " outside the allowlist, " << r.limit
              << " beyond the page limit. Nothing was fetched but robots.txt, and nothing was stored.\n";
    return;
  }
  if (r.mode == "replay") {
    std::cout << "Replay: " << r.replayed << " listings re-extracted from their snapshots without network: "
              << r.changed << " changed (stored as new rows that replace the old ones), " << r.unchanged
              << " unchanged, " << r.missing << " snapshots missing; " << r.extraction_failed
              << " extraction failures.\n";
  } else {
    std::cout << "Summary: " << r.fetched << " pages fetched, " << (r.robots + r.allowlist + r.limit)
              << " skipped (robots " << r.robots << ", allowlist " << r.allowlist << ", limit " << r.limit << "), "
              << r.failed << " failed; " << r.listings_ok << " listings extracted with " << r.items << " items, "
              << r.extraction_failed << " extraction failures.\n";
    if (r.interrupted) std::cout << "The run was interrupted; what was fetched before is stored.\n";
  }
  if (r.audit_seq)
    std::cout << "Stored under audit entry " << r.audit_seq << "; raw pages are in " << snapshot_dir << ".\n";
}

int RunFetchCmd(Context& ctx, const FetchCmdOptions& o) {
  if (o.dry_run && o.replay)
    return ReportError(Error{ErrorKind::kUsage, "", "--dry-run and --replay cannot be combined", "use one of them"});
  auto design = LoadDesign(ctx.study_dir);
  if (!design.ok()) return ReportError(design.error());
  const std::string label = DesignPath(ctx.study_dir);
  const std::string snapshot_dir = StudyPath(ctx, "snapshots");
  // The same ethics gate as check and plan, then the rules; both fail
  // before the store is opened (or created).
  if (Status gate = CheckEthicsGate(design.value(), label); !gate.ok()) return ReportError(gate.error());
  if (Status ok = CheckFetchable(design.value(), label, o.source); !ok.ok()) return ReportError(ok.error());
  Progress bar("fetching", 0);
  FetchOptions options;
  options.only_source = o.source;
  options.dry_run = o.dry_run;
  options.cancel = &g_interrupted;
  options.progress = [&bar](size_t done, size_t total, const std::string& url) {
    bar.SetTotal(static_cast<int64_t>(total));
    bar.SetDetail(url);
    bar.Update(static_cast<int64_t>(done));
  };
  g_interrupted.store(false);
  InterruptGuard guard;

  Result<FetchReport> report = Internal("not run");
  if (o.replay) {
    auto store = OpenStudyStore(ctx, false);
    if (!store.ok()) return ReportError(store.error());
    report = ReplayListings(*store.value(), design.value(), label, snapshot_dir, options);
  } else if (o.dry_run) {
    CurlHttpClient client(&g_interrupted);
    report = RunFetch(nullptr, design.value(), label, snapshot_dir, client, options);
  } else {
    auto store = OpenStudyStore(ctx, true);
    if (!store.ok()) return ReportError(store.error());
    CurlHttpClient client(&g_interrupted);
    report = RunFetch(store.value().get(), design.value(), label, snapshot_dir, client, options);
  }
  bar.Finish();
  if (!report.ok()) return ReportError(report.error());
  if (ctx.json) PrintJson(report.value());
  else PrintText(report.value(), snapshot_dir);
  return report.value().has_failures() ? 1 : 0;
}

struct LabelsCmdOptions {
  std::string file;
  bool from_profiles = false;
};

int RunImportLabels(Context& ctx, const LabelsCmdOptions& o) {
  if (o.file.empty() == !o.from_profiles)
    return ReportError(Error{ErrorKind::kUsage, "", "give either a labels FILE or --from-profiles", "not both, not neither"});
  auto store = OpenStudyStore(ctx, true);
  if (!store.ok()) return ReportError(store.error());
  Result<LabelImport> r = Internal("not run");
  if (o.from_profiles) {
    r = LabelsFromProfiles(*store.value());
  } else {
    std::optional<Design> design;
    if (std::filesystem::exists(DesignPath(ctx.study_dir))) {
      auto d = LoadDesign(ctx.study_dir);
      if (!d.ok()) return ReportError(d.error());
      design = d.value();
    }
    r = ImportLabels(*store.value(), design ? &*design : nullptr, o.file);
  }
  if (!r.ok()) return ReportError(r.error());
  const auto& v = r.value();
  if (ctx.json) {
    std::cout << nlohmann::json{{"labels", v.labels}, {"items", v.items}, {"already_imported", v.already_imported}}.dump(2)
              << "\n";
  } else if (v.already_imported) {
    std::cout << "This labels file was imported before; nothing was added.\n";
  } else {
    std::cout << "Imported " << v.labels << " labels for " << v.items << " items.\n";
  }
  return 0;
}

}  // namespace

void RegisterFetchCommands(CLI::App& app, Context& ctx) {
  auto o = std::make_shared<FetchCmdOptions>();
  auto* fetch = app.add_subcommand(
      "fetch",
      "Fetch the ranked lists of the design's [[source]]s (allowlist, robots.txt, polite intervals), keep every raw "
      "page under snapshots/ and store each list's items and positions");
  fetch->add_option("--source", o->source, "Only this [[source]] (by name)");
  fetch->add_flag("--dry-run", o->dry_run, "List the URLs with robots.txt verdicts; fetch nothing else, store nothing");
  fetch->add_flag("--replay", o->replay,
                  "Re-extract the stored listings from their snapshots with the current rules, without network");
  fetch->callback([&ctx, o] { ctx.exit_code = RunFetchCmd(ctx, *o); });
}

void AddImportLabels(CLI::App& import, Context& ctx) {
  auto lo = std::make_shared<LabelsCmdOptions>();
  auto* labels = import.add_subcommand(
      "labels", "Link listing items to groups: a CSV of item_key plus one column per factor, or --from-profiles");
  labels->add_option("file", lo->file, "CSV file: item_key,FACTOR[,FACTOR…]");
  labels->add_flag("--from-profiles", lo->from_profiles,
                   "Label items whose key is a profile's display name with that profile's levels");
  labels->callback([&ctx, lo] { ctx.exit_code = RunImportLabels(ctx, *lo); });
}

}  // namespace twinprobe
