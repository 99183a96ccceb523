// `twinprobe import sendings FILE.csv`: the field team's log of sendings, with
// the checks of `sent` on every row (collector/import_sendings.h).
#include <iostream>

#include <nlohmann/json.hpp>

#include "cli/command.h"
#include "collector/import_sendings.h"
#include "planner/materials_check.h"
#include "report/plural.h"

namespace twinprobe {
namespace {

struct SendingsCmdOptions {
  std::string file;
  bool skip_bad = false;
  std::string rejects;
  bool raw_cells = false;
};

nlohmann::json OrNull(const std::string& s) { return s.empty() ? nlohmann::json(nullptr) : nlohmann::json(s); }

int RunImportSendings(Context& ctx, const SendingsCmdOptions& o) {
  auto store = OpenStudyStore(ctx, false);
  if (!store.ok()) return ReportError(store.error());
  auto settings = LoadStudySettings(ctx, *store.value());
  if (!settings.ok()) return ReportError(settings.error());
  ImportOptions options;
  options.skip_bad = o.skip_bad;
  options.reject_path = o.rejects;
  options.raw_cells = o.raw_cells;
  Store& s = *store.value();
  // As `sent` does: the application that left must be the one rendered for
  // this plan.
  auto material = [&s, &ctx](const std::string& probe) { return CheckProbeMaterial(s, ctx.study_dir, probe); };
  auto r = ImportSendings(s, o.file, options, settings.value().early_days(), material);
  if (!r.ok()) return ReportError(r.error());
  const SendingsImportSummary& v = r.value();
  if (!v.ignored_columns.empty()) {
    std::string names;
    for (const auto& c : v.ignored_columns) names += (names.empty() ? "'" : ", '") + c + "'";
    Warn("not part of a sendings file and ignored: " + names);
  }
  if (ctx.json) {
    std::cout << nlohmann::json{{"file", o.file},
                                {"already_imported", v.already_imported},
                                {"rows_landed", v.rows_landed},
                                {"rows_unchanged", v.rows_unchanged},
                                {"rows_rejected", v.rows_rejected},
                                {"reject_file", OrNull(v.reject_path)},
                                {"ignored_columns", v.ignored_columns},
                                {"audit_hash", OrNull(v.audit_hash)}}
                     .dump(2)
              << "\n";
  } else if (v.already_imported) {
    std::cout << "This file was imported before; nothing was added.\n";
  } else {
    std::cout << "Imported " << Count(v.rows_landed, "sending", "sendings") << " from " << o.file;
    if (v.rows_unchanged)
      std::cout << "; " << Count(v.rows_unchanged, "row was", "rows were") << " already recorded at that time";
    if (v.rows_rejected)
      std::cout << "; " << Count(v.rows_rejected, "bad row was", "bad rows were") << " written with the reasons to "
                << v.reject_path;
    std::cout << ".\n";
  }
  return v.rows_rejected ? 1 : 0;
}

}  // namespace

void RegisterImportSendings(CLI::App& import, Context& ctx) {
  auto o = std::make_shared<SendingsCmdOptions>();
  auto* cmd = import.add_subcommand(
      "sendings", "Import the sendings log: columns probe,sent_at[,channel,by]; the checks of 'sent'; all or nothing");
  cmd->add_option("file", o->file, "CSV file")->required();
  cmd->add_flag("--skip-bad", o->skip_bad, "Land the good rows and write each bad row with its reason to a reject file");
  cmd->add_option("--rejects", o->rejects, "Reject file for --skip-bad (default FILE.rejects.csv)");
  cmd->add_flag("--raw-cells", o->raw_cells,
                "Write reject file cells as they are (no \"'\" before cells beginning with = + - @; for re-import and "
                "machine readers)");
  cmd->callback([&ctx, o] { ctx.exit_code = RunImportSendings(ctx, *o); });
}

}  // namespace twinprobe
