// Commands that read the store: analyze, verify (report: cli/report_cmd.cpp).
#include <filesystem>
#include <fstream>
#include <iostream>
#include <memory>
#include <vector>

#include <nlohmann/json.hpp>

#include "analysis/analyze.h"
#include "report/plural.h"
#include "cli/command.h"
#include "cli/report_cmd.h"
#include "core/audit.h"
#include "core/terminal_text.h"
#include "core/verify.h"
#include "report/chain_warning.h"
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
  // A broken chain is said first, as verify would say it (issue 24); titles,
  // strata and arm names come from the study: escaped on a terminal.
  ReportContext chain;
  ReadChainState(StorePath(ctx), chain);
  std::cout << (ctx.json ? WithChainWarningJson(RenderJsonReport(r.value()), chain)
                         : ForTerminal(WithChainWarningText(RenderTextReport(r.value()), chain), LineBreaks::kKeep));
  return 0;
}

struct VerifyOptions {
  std::vector<std::string> heads;
  std::vector<std::string> witness_files;
};

int RunVerify(Context& ctx, const VerifyOptions& o) {
  std::vector<WitnessedHead> witnessed;
  for (const std::string& h : o.heads) {
    auto head = ParseHead(h, "--head");
    if (!head.ok()) return ReportError(head.error());
    witnessed.push_back({head.value(), "--head", 0});
  }
  for (const std::string& f : o.witness_files) {
    auto heads = ReadWitnessFile(f);
    if (!heads.ok()) return ReportError(heads.error());
    witnessed.insert(witnessed.end(), heads.value().begin(), heads.value().end());
  }
  auto verified = VerifyStore(StorePath(ctx), std::move(witnessed));
  if (!verified.ok()) return ReportError(verified.error());
  const StoreVerification& v = verified.value();
  const AuditReport& rep = v.audit;
  if (ctx.json) {
    nlohmann::json problems = nlohmann::json::array();
    for (const auto& p : rep.problems)
      problems.push_back({{"seq", p.seq}, {"what", p.what}, {"command", p.command}, {"actor", p.actor},
                          {"at", p.at}, {"summary", p.summary}});
    nlohmann::json witnessed_json = nlohmann::json::array();
    for (const auto& w : v.witnessed)
      witnessed_json.push_back({{"head", w.hash}, {"source", w.source},
                                {"seq", w.seq == 0 ? nlohmann::json(nullptr) : nlohmann::json(w.seq)}});
    std::cout << nlohmann::json{{"ok", rep.ok()},
                                {"entries", rep.entries},
                                {"sealed_rows", rep.sealed_rows},
                                {"head_hash", rep.head_hash},
                                {"schema_version", v.schema_version},
                                {"witnessed", witnessed_json},
                                {"problems", problems}}
                     .dump(2)
              << "\n";
  } else if (rep.ok()) {
    // The head in full: a shortened head cannot be compared with a witness's.
    std::cout << "The audit chain is intact: " << Count(rep.entries, "entry", "entries") << " sealing "
              << Count(rep.sealed_rows, "row", "rows") << "; head "
              << (rep.head_hash.empty() ? std::string("(none)") : rep.head_hash) << "\n";
    for (const auto& w : v.witnessed)
      std::cout << "  witnessed head " << w.hash << " (" << w.source << ") is entry " << w.seq
                << ": nothing up to it was removed or rewritten\n";
  } else {
    const AuditProblem& first = rep.problems.front();
    std::cout << "The audit chain is BROKEN. First broken link: " << ProblemPlace(first) << ": " << first.what << ".\n";
    if (!first.actor.empty())
      std::cout << "  entry " << first.seq << " was written by " << ForTerminal(first.actor) << " at "
                << ForTerminal(first.at) << ": " << ForTerminal(first.summary) << "\n";
    for (size_t i = 1; i < rep.problems.size(); ++i)
      std::cout << "  also " << ProblemPlace(rep.problems[i]) << ": " << rep.problems[i].what << "\n";
  }
  return rep.ok() ? 0 : 1;
}

}  // namespace

void RegisterAnalyzeCommands(CLI::App& app, Context& ctx) {
  app.add_subcommand("analyze", "Compute callback rates, the paired table and exact tests from the stored data")
      ->callback([&ctx] { ctx.exit_code = RunAnalyze(ctx); });
  // `report` lives in cli/report_cmd.cpp.
  auto verify_opts = std::make_shared<VerifyOptions>();
  CLI::App* verify =
      app.add_subcommand("verify", "Check the store's schema, its audit chain and every sealed row; report the first broken link");
  verify->add_option("--head", verify_opts->heads,
                     "A chain head kept outside the store (64 hex digits); verify proves it is in the chain");
  verify->add_option("--witness", verify_opts->witness_files,
                     "A file of chain heads the study's witness keeps (every 64-hex-digit word is one)");
  verify->callback([&ctx, verify_opts] { ctx.exit_code = RunVerify(ctx, *verify_opts); });
}

}  // namespace twinprobe
