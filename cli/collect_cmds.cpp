// Commands that record fieldwork: sent, record, import.
#include <iostream>

#include <nlohmann/json.hpp>

#include "cli/command.h"
#include "collector/responses.h"
#include "core/clock.h"
#include "core/ethics_gate.h"

namespace twinprobe {
namespace {

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
    Warn("the response arrived after the observation window of " + std::to_string(settings.value().outcomes.window_days) +
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
                                {"supersedes", v.superseded ? nlohmann::json(v.superseded) : nlohmann::json(nullptr)}}
                     .dump(2)
              << "\n";
  } else {
    std::cout << "Recorded " << v.code << " for " << v.probe_ref << " at " << v.received_at
              << (v.positive ? " (positive callback)" : "");
    if (v.superseded) std::cout << "; it supersedes response " << v.superseded << ", which is kept";
    std::cout << ".\n";
    if (!decline_by.empty())
      std::cout << "Decline it by " << decline_by << " (within " << ethics.decline_within_hours
                << " hours of receipt) with the letter in ethics/letters/decline-invitation.md, then run 'twinprobe "
                   "decline "
                << v.probe_ref << "'.\n";
  }
  return 0;
}

int RunSent(Context& ctx, const std::string& probe, const std::string& at) {
  auto store = OpenStudyStore(ctx, false);
  if (!store.ok()) return ReportError(store.error());
  auto r = MarkSent(*store.value(), probe, at);
  if (!r.ok()) return ReportError(r.error());
  if (ctx.json) std::cout << nlohmann::json{{"probe", probe}, {"sent_at", r.value()}}.dump(2) << "\n";
  else std::cout << "Marked " << probe << " as sent at " << r.value() << ".\n";
  return 0;
}

struct ImportCmdOptions {
  std::string file;
  bool skip_bad = false;
  std::string rejects;
};

int RunImportOutcomes(Context& ctx, const ImportCmdOptions& o) {
  auto store = OpenStudyStore(ctx, false);
  if (!store.ok()) return ReportError(store.error());
  auto settings = LoadStudySettings(ctx, *store.value());
  if (!settings.ok()) return ReportError(settings.error());
  auto r = ImportOutcomes(*store.value(), settings.value().outcomes, o.file, {o.skip_bad, o.rejects});
  if (!r.ok()) return ReportError(r.error());
  const auto& s = r.value();
  if (ctx.json) {
    std::cout << nlohmann::json{{"file", o.file}, {"rows_landed", s.rows_landed}, {"rows_rejected", s.rows_rejected},
                                {"already_imported", s.already_imported}}
                     .dump(2)
              << "\n";
  } else if (s.already_imported) {
    std::cout << "This file was imported before; nothing was added.\n";
  } else {
    std::cout << "Imported " << s.rows_landed << " responses from " << o.file;
    if (s.rows_rejected) std::cout << "; " << s.rows_rejected << " bad rows were written to the reject file";
    std::cout << ".\n";
  }
  return s.rows_rejected ? 1 : 0;
}

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

  auto* import = app.add_subcommand("import", "Import data from CSV files (RFC 4180, UTF-8)");
  import->require_subcommand(1);
  auto io = std::make_shared<ImportCmdOptions>();
  auto* outcomes = import->add_subcommand(
      "outcomes", "Import responses to planned probes: columns probe,code,received_at[,channel,note]; all or nothing");
  outcomes->add_option("file", io->file, "CSV file")->required();
  outcomes->add_flag("--skip-bad", io->skip_bad, "Land the good rows and write each bad row with its reason to a reject file");
  outcomes->add_option("--rejects", io->rejects, "Reject file for --skip-bad (default FILE.rejects.csv)");
  outcomes->callback([&ctx, io] { ctx.exit_code = RunImportOutcomes(ctx, *io); });
}

const bool kRegistered = RegisterCommand(40, &RegisterCollectCommands);

}  // namespace
}  // namespace twinprobe
