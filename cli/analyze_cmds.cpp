// Commands that read the store: analyze, verify (report: cli/report_cmd.cpp).
#include <filesystem>
#include <fstream>
#include <iostream>

#include <nlohmann/json.hpp>

#include "analysis/analyze.h"
#include "report/plural.h"
#include "cli/command.h"
#include "cli/report_cmd.h"
#include "core/audit.h"
#include "report/json_report.h"
#include "report/text_report.h"

namespace twinprobe {
namespace {

Result<AnalysisResult> AnalyzeStudy(Context& ctx) {
  auto store = OpenStudyStore(ctx, false);
  if (!store.ok()) return store.error();
  auto settings = LoadStudySettings(ctx, *store.value());
  if (!settings.ok()) return settings.error();
  const auto& design = settings.value().design;
  return AnalyzeStore(*store.value(), settings.value().outcomes, settings.value().analysis, design ? &*design : nullptr);
}

int RunAnalyze(Context& ctx) {
  auto r = AnalyzeStudy(ctx);
  if (!r.ok()) return ReportError(r.error());
  std::cout << (ctx.json ? RenderJsonReport(r.value()) : RenderTextReport(r.value()));
  return 0;
}

int RunVerify(Context& ctx) {
  auto store = OpenStudyStore(ctx, false);
  if (!store.ok()) return ReportError(store.error());
  AuditReport rep = VerifyAudit(*store.value());
  if (ctx.json) {
    nlohmann::json problems = nlohmann::json::array();
    for (const auto& p : rep.problems)
      problems.push_back({{"seq", p.seq}, {"what", p.what}, {"command", p.command}, {"actor", p.actor},
                          {"at", p.at}, {"summary", p.summary}});
    std::cout << nlohmann::json{{"ok", rep.ok()},
                                {"entries", rep.entries},
                                {"sealed_rows", rep.sealed_rows},
                                {"head_hash", rep.head_hash},
                                {"problems", problems}}
                     .dump(2)
              << "\n";
  } else if (rep.ok()) {
    std::cout << "The audit chain is intact: " << Count(rep.entries, "entry", "entries") << " sealing "
              << Count(rep.sealed_rows, "row", "rows") << "; head " << rep.head_hash.substr(0, 16) << "…\n";
  } else {
    std::cout << "The audit chain is BROKEN. First broken link: entry " << rep.problems.front().seq << ": "
              << rep.problems.front().what << ".\n";
    if (!rep.problems.front().actor.empty())
      std::cout << "  entry " << rep.problems.front().seq << " was written by " << rep.problems.front().actor << " at "
                << rep.problems.front().at << ": " << rep.problems.front().summary << "\n";
    for (size_t i = 1; i < rep.problems.size(); ++i)
      std::cout << "  also entry " << rep.problems[i].seq << ": " << rep.problems[i].what << "\n";
  }
  return rep.ok() ? 0 : 1;
}

}  // namespace

void RegisterAnalyzeCommands(CLI::App& app, Context& ctx) {
  app.add_subcommand("analyze", "Compute callback rates, the paired table and exact tests from the stored data")
      ->callback([&ctx] { ctx.exit_code = RunAnalyze(ctx); });
  // `report` lives in cli/report_cmd.cpp.
  app.add_subcommand("verify", "Recompute the audit chain and report the first broken link, if any")
      ->callback([&ctx] { ctx.exit_code = RunVerify(ctx); });
}

}  // namespace twinprobe
