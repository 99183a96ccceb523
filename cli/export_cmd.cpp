// `export`: the study's data for R, pandas and other tools (collector/export.h,
// docs/export.md).
#include <iostream>

#include <nlohmann/json.hpp>

#include "cli/command.h"
#include "report/plural.h"
#include "collector/export.h"

namespace twinprobe {
namespace {

struct ExportCmdOptions {
  std::string out;
  std::string format = "csv";
  bool identities = false;
  bool raw_cells = false;
};

int RunExport(Context& ctx, const ExportCmdOptions& o) {
  auto store = OpenStudyStore(ctx, false);
  if (!store.ok()) return ReportError(store.error());
  auto settings = LoadStudySettings(ctx, *store.value());
  if (!settings.ok()) return ReportError(settings.error());
  ExportOptions options;
  options.format = o.format;
  options.identities = o.identities;
  options.raw_cells = o.raw_cells;
  std::string out = o.out.empty() ? StudyPath(ctx, o.format == "json" ? "export.json" : "export") : o.out;
  auto r = ExportStudy(*store.value(), settings.value().outcomes, out, options);
  if (!r.ok()) return ReportError(r.error());
  const ExportSummary& s = r.value();
  if (o.identities)
    Warn("the export holds employer names and contacts, profile mailboxes and notes: personal data; keep it as "
         "safe as the store and delete it when your retention period ends");
  if (s.listing_only) {  // a listing audit: ranked lists, no vacancies or probes
    if (ctx.json)
      std::cout << nlohmann::json{{"path", s.path},         {"format", o.format},
                                  {"identities", o.identities}, {"listing_places", s.listing_places},
                                  {"audit_head", s.audit_head}}
                       .dump(2)
                << "\n";
    else
      std::cout << "Exported " << Count(s.listing_places, "place", "places") << " in ranked lists to " << s.path
                << (o.format == "csv" ? " (listings.csv, manifest.json)" : "") << "; audit head "
                << s.audit_head.substr(0, 16) << "\u2026\n";
    return 0;
  }
  if (ctx.json) {
    std::cout << nlohmann::json{{"path", s.path},           {"format", o.format},     {"identities", o.identities},
                                {"vacancies", s.vacancies}, {"probes", s.probes},     {"responses", s.responses},
                                {"audit_head", s.audit_head}}
                     .dump(2)
              << "\n";
  } else {
    std::cout << "Exported " << s.vacancies << " vacancies, " << s.probes << " probes and " << s.responses
              << " responses to " << s.path << (o.format == "csv" ? " (vacancies.csv, probes.csv, responses.csv, sendings.csv, declines.csv, manifest.json)" : "")
              << ", " << (o.identities ? "with identities" : "pseudonymised") << "; audit head "
              << s.audit_head.substr(0, 16) << "\u2026\n";
  }
  return 0;
}

}  // namespace

void RegisterExport(CLI::App& app, Context& ctx) {
  auto o = std::make_shared<ExportCmdOptions>();
  auto* cmd = app.add_subcommand(
      "export", "Write vacancies, probes and responses as CSV files (or one JSON file) for R, pandas and others");
  cmd->add_option("--out", o->out, "Folder for CSV (default STUDY/export), file for JSON (default STUDY/export.json)");
  cmd->add_option("--format", o->format, "csv (a folder of files) or json (one document)")
      ->check(CLI::IsMember({"csv", "json"}))
      ->capture_default_str();
  cmd->add_flag("--identities", o->identities,
                "Also write employer names and contacts, profile mailboxes and phones, and notes (personal data)");
  cmd->add_flag("--raw-cells", o->raw_cells,
                "CSV cells as they are, for machine readers (by default a cell beginning with = + - @ gets a "
                "leading ' so spreadsheets show it as text)");
  cmd->callback([&ctx, o] { ctx.exit_code = RunExport(ctx, *o); });
}

}  // namespace twinprobe
