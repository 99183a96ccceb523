// Commands that record fieldwork: sent, record, import outcomes, import pairs.
#include <filesystem>
#include <iostream>

#include <nlohmann/json.hpp>

#include "cli/command.h"
#include "cli/near_duplicate_output.h"
#include "collector/declines.h"
#include "collector/import_outcomes.h"
#include "collector/import_pairs.h"
#include "collector/responses.h"
#include "core/comma_list.h"
#include "core/clock.h"
#include "core/ethics_gate.h"
#include "planner/design_file.h"
#include "planner/materials_check.h"

namespace twinprobe {
namespace {

std::string JoinWords(const std::vector<std::string>& v, const std::string& last_sep = " and ") {
  std::string s;
  for (size_t i = 0; i < v.size(); ++i) s += (i == 0 ? "" : i + 1 == v.size() ? last_sep : ", ") + v[i];
  return s;
}

nlohmann::json OrNull(const std::string& s) { return s.empty() ? nlohmann::json(nullptr) : nlohmann::json(s); }

struct RecordOptions {
  std::string probe, code, at, channel, note;
};

int RunRecord(Context& ctx, const RecordOptions& o) {
  auto store = OpenStudyStore(ctx, false);
  if (!store.ok()) return ReportError(store.error());
  auto settings = LoadStudySettings(ctx, *store.value());
  if (!settings.ok()) return ReportError(settings.error());
  ResponseEntry e{o.probe, o.code, o.at, o.channel, o.note, "record"};
  auto r = RecordResponse(*store.value(), settings.value().outcomes, e);
  if (!r.ok()) return ReportError(r.error());
  const auto& v = r.value();
  if (v.late)
    Warn("the response came " + std::to_string(v.days_after_sending) + " days after " + v.probe_ref +
         " was sent, outside the observation window of " + std::to_string(settings.value().outcomes.window_days) +
         " days; it is stored with the flag 'late'");
  // An invitation holds a real vacancy for a fictitious applicant: say when
  // and how it must be declined, every time one is recorded.
  const EthicsBlock& ethics = settings.value().ethics;
  std::string decline_by;
  if (v.positive && ethics.decline_within_hours > 0)
    decline_by = FormatIsoTime(DeclineDeadline(ethics, ParseIsoTime(v.received_at).value_or(0)));
  if (ctx.json) {
    std::cout << nlohmann::json{{"response_id", v.response_id}, {"probe", v.probe_ref},     {"code", v.code},
                                {"decline_by", decline_by.empty() ? nlohmann::json(nullptr) : nlohmann::json(decline_by)},
                                {"received_at", v.received_at}, {"positive", v.positive},   {"late", v.late},
                                {"sent_at", OrNull(v.sent_at)},
                                {"supersedes", v.superseded ? nlohmann::json(v.superseded) : nlohmann::json(nullptr)}}
                     .dump(2)
              << "\n";
  } else {
    std::cout << "Recorded " << v.code << " for " << v.probe_ref << " at " << v.received_at
              << (v.positive ? " (positive callback)" : "");
    if (v.superseded) std::cout << "; it supersedes response " << v.superseded << ", which is kept";
    std::cout << ".\n";
    if (!decline_by.empty())
      std::cout << DeclineReminder(v.code, v.probe_ref, *ParseIsoTime(decline_by), ethics.decline_within_hours,
                                   "run '" + CommandFor(ctx, "decline " + v.probe_ref) + "'",
                                   StudyPath(ctx, kDeclineLetterPath))
                << "\n";
  }
  return 0;
}

int RunSent(Context& ctx, const std::string& probe, const std::string& at) {
  auto store = OpenStudyStore(ctx, false);
  if (!store.ok()) return ReportError(store.error());
  // The application about to leave must be the one rendered for this plan.
  if (Status m = CheckProbeMaterial(*store.value(), ctx.study_dir, probe); !m.ok()) return ReportError(m.error());
  auto settings = LoadStudySettings(ctx, *store.value());
  if (!settings.ok()) return ReportError(settings.error());
  auto r = RecordSending(*store.value(), probe, at, settings.value().early_days());
  if (!r.ok()) return ReportError(r.error());
  const SendingRecord& v = r.value();
  if (ctx.json) {
    std::cout << nlohmann::json{{"probe", v.probe_ref}, {"sent_at", v.sent_at}, {"replaces", OrNull(v.previous_sent_at)}}
                     .dump(2)
              << "\n";
  } else {
    std::cout << "Marked " << v.probe_ref << " as sent at " << v.sent_at;
    if (!v.previous_sent_at.empty())
      std::cout << "; this replaces the earlier sending time " << v.previous_sent_at << ", which is kept";
    std::cout << ".\n";
  }
  return 0;
}

struct ImportCmdOptions {
  std::string file;
  bool skip_bad = false;
  std::string rejects;
  bool raw_cells = false;
  std::string strata;  // import pairs: comma-separated
  bool strata_given = false;
  std::string reference;
  std::string study_id;
};

void WarnIgnoredColumns(const std::vector<std::string>& ignored, const std::string& kind) {
  if (ignored.empty()) return;
  std::vector<std::string> quoted;
  for (const auto& c : ignored) quoted.push_back("'" + c + "'");
  Warn(std::string(ignored.size() == 1 ? "the column " : "the columns ") + JoinWords(quoted) +
       (ignored.size() == 1 ? " is" : " are") + " not part of " + kind + " and " +
       (ignored.size() == 1 ? "was" : "were") + " ignored");
}

void WarnLate(int64_t late, int window_days) {
  if (late == 0) return;
  Warn(std::to_string(late) + (late == 1 ? " response arrived" : " responses arrived") +
       " outside the observation window of " + std::to_string(window_days) + " days; " +
       (late == 1 ? "it is" : "they are") + " stored with the flag 'late'");
}

int RunImportOutcomes(Context& ctx, const ImportCmdOptions& o) {
  auto store = OpenStudyStore(ctx, false);
  if (!store.ok()) return ReportError(store.error());
  auto settings = LoadStudySettings(ctx, *store.value());
  if (!settings.ok()) return ReportError(settings.error());
  ImportOptions options;
  options.skip_bad = o.skip_bad;
  options.reject_path = o.rejects;
  options.raw_cells = o.raw_cells;
  auto r = ImportOutcomes(*store.value(), settings.value().outcomes, o.file, options);
  if (!r.ok()) return ReportError(r.error());
  const auto& s = r.value();
  WarnIgnoredColumns(s.ignored_columns, "an outcomes file");
  WarnLate(s.late, settings.value().outcomes.window_days);
  if (ctx.json) {
    std::cout << nlohmann::json{{"file", o.file},
                                {"already_imported", s.already_imported},
                                {"rows_landed", s.rows_landed},
                                {"rows_rejected", s.rows_rejected},
                                {"late", s.late},
                                {"superseding", s.superseding},
                                {"reject_file", OrNull(s.reject_path)},
                                {"ignored_columns", s.ignored_columns},
                                {"audit_hash", OrNull(s.audit_hash)}}
                     .dump(2)
              << "\n";
  } else if (s.already_imported) {
    std::cout << "This file was imported before; nothing was added.\n";
  } else {
    std::cout << "Imported " << s.rows_landed << (s.rows_landed == 1 ? " response" : " responses") << " from " << o.file;
    if (s.superseding) std::cout << " (" << s.superseding << " of them supersede an earlier response, which is kept)";
    if (s.rows_rejected)
      std::cout << "; " << s.rows_rejected << (s.rows_rejected == 1 ? " bad row was" : " bad rows were")
                << " written with the reasons to " << s.reject_path;
    std::cout << ".\n";
  }
  return s.rows_rejected ? 1 : 0;
}

int RunImportPairs(Context& ctx, const ImportCmdOptions& o) {
  std::optional<Design> design;
  if (std::filesystem::exists(DesignPath(ctx.study_dir))) {
    auto d = LoadDesign(ctx.study_dir);
    if (!d.ok()) return ReportError(d.error());
    design = std::move(d).value();
  }
  PairsImportOptions options;
  options.strata = SplitCommaList(o.strata);
  options.strata_given = o.strata_given;
  options.reference = o.reference;
  options.skip_bad = o.skip_bad;
  options.reject_path = o.rejects;
  options.raw_cells = o.raw_cells;
  options.study_id = o.study_id;
  auto r = ImportPairs(StorePath(ctx), design ? &*design : nullptr, o.file, options);
  if (!r.ok()) return ReportError(r.error());
  const PairsImportSummary& s = r.value();
  WarnIgnoredColumns(s.ignored_columns, "a pairs file");
  WarnNearDuplicates(s.near_duplicates, "row", "rows");
  if (!s.already_imported) {
    auto store = OpenStudyStore(ctx, false);
    if (!store.ok()) return ReportError(store.error());
    auto settings = LoadStudySettings(ctx, *store.value());
    if (!settings.ok()) return ReportError(settings.error());
    WarnLate(s.late, settings.value().outcomes.window_days);
  }
  if (ctx.json) {
    std::cout << nlohmann::json{{"file", o.file},
                                {"already_imported", s.already_imported},
                                {"new_plan", s.new_plan},
                                {"plan_id", s.plan_id},
                                {"kind", s.kind},
                                {"arms", s.arms},
                                {"reference", s.arms.empty() ? nlohmann::json(nullptr) : nlohmann::json(s.arms[0])},
                                {"strata", s.strata},
                                {"rows_landed", s.rows_landed},
                                {"rows_rejected", s.rows_rejected},
                                {"vacancies_landed", s.vacancies_landed},
                                {"sendings", s.sendings},
                                {"late", s.late},
                                {"reject_file", OrNull(s.reject_path)},
                                {"ignored_columns", s.ignored_columns},
                                {"audit_hash", OrNull(s.audit_hash)}}
                     .dump(2)
              << "\n";
  } else if (s.already_imported) {
    std::cout << "This file was imported before; nothing was added.\n";
  } else {
    std::cout << (s.new_plan ? "Created " + std::string(s.kind == "unpaired" ? "an " : "a ") + s.kind + " study from " : "Added to the study from ") << o.file << ": "
              << s.rows_landed << (s.rows_landed == 1 ? " probe" : " probes") << " in " << s.vacancies_landed
              << (s.vacancies_landed == 1 ? " vacancy" : " vacancies");
    if (s.new_plan) {
      std::vector<std::string> others(s.arms.begin() + 1, s.arms.end());
      std::cout << "; reference arm " << s.arms[0] << ", compared with " << JoinWords(others);
      std::cout << "; strata " << (s.strata.empty() ? "none" : JoinWords(s.strata));
    }
    if (s.rows_rejected)
      std::cout << "; " << s.rows_rejected << (s.rows_rejected == 1 ? " row was" : " rows were")
                << " left out and written with the reasons to " << s.reject_path;
    std::cout << ".\nNext: " << CommandFor(ctx, "analyze") << "\n";
  }
  return s.rows_rejected ? 1 : 0;
}

}  // namespace

void RegisterCollectCommands(CLI::App& app, Context& ctx) {
  auto sent_probe = std::make_shared<std::string>();
  auto sent_at = std::make_shared<std::string>();
  auto* sent = app.add_subcommand("sent", "Mark a probe as sent (the time the application left)");
  sent->add_option("probe", *sent_probe, "Probe reference, e.g. P00001")->required();
  sent->add_option("--at", *sent_at, "When it was sent (YYYY-MM-DD[THH:MM], UTC); default now");
  sent->callback([&ctx, sent_probe, sent_at] { ctx.exit_code = RunSent(ctx, *sent_probe, *sent_at); });

  auto ro = std::make_shared<RecordOptions>();
  auto* record = app.add_subcommand(
      "record", "Record an employer's response to a probe; a second record for a probe supersedes the first, both kept");
  record->add_option("probe", ro->probe, "Probe reference, e.g. P00001")->required();
  record->add_option("code", ro->code, "Response code from the study's scheme, e.g. invitation")->required();
  record->add_option("--at", ro->at, "When the response arrived (YYYY-MM-DD[THH:MM], UTC); default now");
  record->add_option("--channel", ro->channel, "mail, phone, letter or other");
  record->add_option("--note", ro->note, "Free-text note (purge removes notes after the retention period)");
  record->callback([&ctx, ro] { ctx.exit_code = RunRecord(ctx, *ro); });
}

constexpr char kRawCellsHelp[] =
    "Write reject file cells as they are (no \"'\" before cells beginning with = + - @; for re-import and machine readers)";

void AddImportResponses(CLI::App& import, Context& ctx) {
  auto io = std::make_shared<ImportCmdOptions>();
  auto* outcomes = import.add_subcommand(
      "outcomes", "Import responses to planned probes: columns probe,code,received_at[,channel,note]; all or nothing");
  outcomes->add_option("file", io->file, "CSV file")->required();
  outcomes->add_flag("--skip-bad", io->skip_bad, "Land the good rows and write each bad row with its reason to a reject file");
  outcomes->add_option("--rejects", io->rejects, "Reject file for --skip-bad (default FILE.rejects.csv)");
  outcomes->add_flag("--raw-cells", io->raw_cells, kRawCellsHelp);
  outcomes->callback([&ctx, io] { ctx.exit_code = RunImportOutcomes(ctx, *io); });

  auto po = std::make_shared<ImportCmdOptions>();
  auto* pairs = import.add_subcommand(
      "pairs",
      "Import a whole dataset collected elsewhere, one row per probe: columns vacancy,arm,outcome[,sent_at,"
      "responded_at,probe,employer] and stratum columns; creates the study when the folder has none");
  pairs->add_option("file", po->file, "CSV file")->required();
  pairs->add_option("--strata", po->strata,
                    "Comma-separated stratum columns, e.g. occupation,region (default: the design's [strata]; \"\" for none)")
      ->each([po](const std::string&) { po->strata_given = true; });
  pairs->add_option("--reference", po->reference, "The reference arm (needed when the folder has no study.toml)");
  pairs->add_option("--id", po->study_id, "Study id for a new study without study.toml (default: the folder's name)");
  pairs->add_flag("--skip-bad", po->skip_bad,
                  "Land the good vacancies and write every row left out, with its reason, to a reject file");
  pairs->add_option("--rejects", po->rejects, "Reject file for --skip-bad (default FILE.rejects.csv)");
  pairs->add_flag("--raw-cells", po->raw_cells, kRawCellsHelp);
  pairs->callback([&ctx, po] { ctx.exit_code = RunImportPairs(ctx, *po); });
}

}  // namespace twinprobe
