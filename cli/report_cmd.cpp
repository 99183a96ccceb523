// `twinprobe report`: the study report as self-contained HTML (with SVG
// charts), plain text or JSON. Employers appear by pseudonym unless
// --reveal-employers is given, which is recorded in the audit chain.
#include "cli/report_cmd.h"

#include <filesystem>
#include <fstream>
#include <iostream>

#include "core/read_employers.h"
#include "core/read_study.h"
#include "core/audit.h"
#include "core/clock.h"
#include "core/safe_write.h"
#include "core/terminal_text.h"
#include "core/text.h"
#include "core/verify.h"
#include "planner/design_file.h"
#include "report/chain_warning.h"
#include "report/html_report.h"
#include "report/json_report.h"
#include "report/text_report.h"

namespace twinprobe {
namespace fs = std::filesystem;

void ReadChainState(const std::string& store_path, ReportContext& rc) {
  auto verified = VerifyStore(store_path, {});
  if (!verified.ok()) {  // not a store verify could read: as broken as it gets
    rc.audit_intact = false;
    rc.audit_problem = verified.error().what;
    return;
  }
  const StoreVerification& v = verified.value();
  rc.audit_head = v.audit.head_hash;
  rc.audit_entries = v.audit.entries;
  rc.audit_intact = v.ok();
  rc.audit_problem = FirstBrokenLink(v);
}

ReportContext StudyReportContext(const Context& ctx, Store& store, bool reveal_employers) {
  ReportContext rc;
  rc.tool_version = TWINPROBE_VERSION;
  rc.generated_at = NowIso();
  ReadChainState(store.path(), rc);
  if (fs::exists(DesignPath(ctx.study_dir))) {
    auto design = LoadDesign(ctx.study_dir);
    if (design.ok()) rc.ethics_approval = design.value().ethics.approval;
  }
  rc.reveal_employers = reveal_employers;
  if (reveal_employers) rc.employer_names = ReadEmployerNames(store);
  return rc;
}

Result<AnalysisResult> AnalyzeStore(Store& store, const OutcomeScheme& scheme, const AnalysisPlan& plan,
                                    const Design* current_design, std::optional<int64_t> now) {
  const StudyReading reading = ReadStudy(store, scheme, FieldworkOptions{.completion_order = false, .now = now});
  return Analyze(reading, store.path(), scheme, plan, current_design);
}

namespace {

enum class Format { kText, kHtml, kJson };

struct ReportOptions {
  std::string out;
  bool html = false;
  bool text = false;
  bool reveal_employers = false;
};

bool EndsWith(const std::string& s, const std::string& suffix) {
  if (s.size() < suffix.size()) return false;
  return Lower(std::string_view(s).substr(s.size() - suffix.size())) == suffix;
}

Result<Format> ChooseFormat(const Context& ctx, const ReportOptions& o) {
  const int explicit_formats = int(o.html) + int(o.text) + int(ctx.json);
  if (explicit_formats > 1)
    return Error{ErrorKind::kUsage, "", "report takes one format, got more than one of --html, --text and --json",
                 "give one of them, or none and let --out's extension choose (.html, .json, anything else: text)"};
  if (o.html) return Format::kHtml;
  if (o.text) return Format::kText;
  if (ctx.json) return Format::kJson;
  if (EndsWith(o.out, ".html") || EndsWith(o.out, ".htm")) return Format::kHtml;
  if (EndsWith(o.out, ".json")) return Format::kJson;
  return Format::kText;
}

int RunReport(Context& ctx, const ReportOptions& o) {
  auto format = ChooseFormat(ctx, o);
  if (!format.ok()) return ReportError(format.error());
  auto store = OpenStudyStore(ctx, false);
  if (!store.ok()) return ReportError(store.error());
  Store& db = *store.value();
  auto settings = LoadStudySettings(ctx, db);
  if (!settings.ok()) return ReportError(settings.error());
  const auto& design = settings.value().design;  // compared with the frozen design (deviations)
  auto result = AnalyzeStore(db, settings.value().outcomes, settings.value().analysis, design ? &*design : nullptr);
  if (!result.ok()) return ReportError(result.error());

  if (o.reveal_employers) {
    // The audit chain records who put employer names into which report
    // before the names leave the store.
    AuditedWrite write(db, "report --reveal-employers");
    write.Commit("report with employer names written to " + (o.out.empty() ? std::string("standard output") : o.out));
  }
  const ReportContext rc = StudyReportContext(ctx, db, o.reveal_employers);

  std::string body;
  switch (format.value()) {
    case Format::kHtml: body = RenderHtmlReport(result.value(), rc); break;
    case Format::kJson: body = WithChainWarningJson(RenderJsonReport(result.value(), rc), rc); break;
    case Format::kText: body = WithChainWarningText(RenderTextReport(result.value(), rc), rc); break;
  }
  if (o.out.empty()) {
    // Titles, strata and notes come from the study: escaped on a terminal.
    std::cout << (format.value() == Format::kText ? ForTerminal(body, LineBreaks::kKeep) : body);
    return 0;
  }
  std::error_code ec;
  const fs::path parent = fs::path(o.out).parent_path();
  if (!parent.empty()) fs::create_directories(parent, ec);
  // A link planted at reports/report.html is replaced, never written through.
  if (Status written = WriteFileSafely(o.out, body); !written.ok()) return ReportError(written.error());
  std::cout << "Report written to " << ForTerminal(o.out) << "\n";
  return 0;
}

}  // namespace

void RegisterReport(CLI::App& app, Context& ctx) {
  auto ro = std::make_shared<ReportOptions>();
  auto* report = app.add_subcommand(
      "report", "Write the study report: plain text (the default), self-contained HTML with charts (--html), or JSON (--json)");
  report->add_option("--out", ro->out,
                     "Write to this file instead of standard output; FILE.html gives HTML, FILE.json JSON, other names text");
  report->add_flag("--html", ro->html, "HTML report (inline CSS and SVG charts; no external resources)");
  report->add_flag("--text", ro->text, "Plain-text report (the default when neither --html, --json nor --out FILE.html/.json is given)");
  report->add_flag("--reveal-employers", ro->reveal_employers,
                   "Show employer names beside their pseudonyms (recorded in the audit chain)");
  report->callback([&ctx, ro] { ctx.exit_code = RunReport(ctx, *ro); });
}

}  // namespace twinprobe
