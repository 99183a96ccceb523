// Commands that keep the ethics safeguards: decline, purge.
#include <iostream>

#include <nlohmann/json.hpp>

#include "cli/command.h"
#include "collector/declines.h"
#include "collector/purge.h"
#include "core/clock.h"
#include "report/plural.h"

namespace twinprobe {
namespace {

struct DeclineOptions {
  std::string probe, at, channel;
};

int RunDecline(Context& ctx, const DeclineOptions& o) {
  auto store = OpenStudyStore(ctx, false);
  if (!store.ok()) return ReportError(store.error());
  auto settings = LoadStudySettings(ctx, *store.value());
  if (!settings.ok()) return ReportError(settings.error());
  auto r = RecordDecline(*store.value(), settings.value().outcomes, o.probe, o.at, o.channel);
  if (!r.ok()) return ReportError(r.error());
  const DeclineRecord& d = r.value();
  if (ctx.json)
    std::cout << nlohmann::json{{"probe", o.probe}, {"code", d.code}, {"declined_at", d.declined_at},
                                {"already_declined", d.already}}
                     .dump(2)
              << "\n";
  else
    std::cout << DeclineSentence(d) << "\n";
  if (!ctx.json && !d.already)
    if (std::string kept = DeclineKeptSentence(d, settings.value().ethics.decline_within_hours); !kept.empty())
      std::cout << kept << "\n";
  return 0;
}

int RunPurge(Context& ctx, bool dry_run) {
  auto store = OpenStudyStore(ctx, false);
  if (!store.ok()) return ReportError(store.error());
  auto settings = LoadStudySettings(ctx, *store.value());
  if (!settings.ok()) return ReportError(settings.error());
  int retention = settings.value().ethics.retention_days;
  if (retention <= 0)
    return ReportError(BadInput(StorePath(ctx), "the study states no retention period",
                                "set [ethics].retention_days in study.toml (see ethics/README.md)"));
  const int window = settings.value().outcomes.window_days;
  PurgeFileSpec files;
  if (const auto& design = settings.value().design) {
    files.vacancies_file = design->vacancies_file;
    files.keep_columns = design->strata;
    files.mailboxes = design->mail.mbox;
    files.mailboxes.insert(files.mailboxes.end(), design->mail.maildir.begin(), design->mail.maildir.end());
  }
  PurgeCounts c;
  if (dry_run) {
    auto planned = PlanPurge(*store.value(), ctx.study_dir, retention, window, files);
    if (!planned.ok()) return ReportError(planned.error());
    c = planned.value();
  } else {
    auto done = Purge(*store.value(), ctx.study_dir, retention, window, NowEpoch(), files);
    if (!done.ok()) return ReportError(done.error());
    c = done.value();
  }
  if (ctx.json) {
    nlohmann::json columns = nlohmann::json::array();
    for (const auto& col : c.vacancy_columns)
      columns.push_back({{"column", col.column}, {"action", col.action}, {"cells", col.cells}});
    nlohmann::json j{{"dry_run", dry_run},
                     {"fieldwork_end", c.fieldwork_end},
                     {"fieldwork_end_what", c.fieldwork_end_what},
                     {"retention_ends", c.retention_ends},
                     {"employers", c.employers},
                     {"secrets", c.secrets},
                     {"notes", c.notes},
                     {"mail_excerpts", c.mail_excerpts},
                     {"snapshot_files", c.snapshot_files},
                     {"material_files", c.material_files},
                     {"mailbox_files", c.mailbox_files},
                     {"outside_mailboxes", c.outside_mailboxes},
                     {"files_naming_employers", c.files_naming_employers},
                     {"vacancies_file", c.vacancies_file},
                     {"vacancy_columns", columns},
                     {"deleted_files", c.deleted_files}};
    std::cout << j.dump(2) << "\n";
    return 0;
  }
  std::cout << (dry_run ? "Purge would delete: " : "Purged: ") << Count(c.employers, "employer identity", "employer identities")
            << ", " << Count(c.notes, "free-text note", "free-text notes") << ", "
            << Count(c.mail_excerpts, "mail excerpt", "mail excerpts") << ", "
            << Count(c.snapshot_files, "raw snapshot", "raw snapshots") << ", "
            << Count(c.material_files, "rendered material file", "rendered material files") << ", "
            << Count(c.mailbox_files, "mailbox file", "mailbox files") << ".\n"
            << (c.fieldwork_end.empty() ? std::string("Nothing was sent, answered or fetched")
                : std::string(NowEpoch() >= ParseIsoTime(c.fieldwork_end).value_or(0) ? "The fieldwork ended "
                                                                                         : "The fieldwork ends ") +
                      c.fieldwork_end + " (" + c.fieldwork_end_what + ")")
            << "; the retention period " << (NowEpoch() >= ParseIsoTime(c.retention_ends).value_or(0) ? "ended " : "ends ")
            << c.retention_ends << ".\n";
  // Every file and column touched, so a data-protection officer can check
  // the list against the retention plan before anything goes.
  std::cout << (dry_run ? "It would touch:\n" : "It touched:\n");
  if (c.employers + c.secrets + c.notes + c.mail_excerpts > 0)
    std::cout << "  " << StorePath(ctx)
              << ": tables employer and secret emptied; columns response.note and mail_message.excerpt cleared\n";
  else if (c.vacancy_columns.empty() && c.deleted_files.empty())
    std::cout << "  nothing: no employer identity is left in the study folder\n";
  for (const auto& col : c.vacancy_columns)
    std::cout << "  " << StudyPath(ctx, c.vacancies_file) << ": column " << col.column
              << (col.action == "pseudonymised" ? " replaced by employer pseudonyms in " : " emptied in ")
              << Count(col.cells, "row", "rows") << "\n";
  for (const auto& f : c.deleted_files) std::cout << "  " << StudyPath(ctx, f) << ": deleted\n";
  for (const auto& f : c.files_naming_employers)
    Warn(StudyPath(ctx, f) + " names an employer or holds a contact address; purge did not write it and leaves it "
         "alone: delete it, or keep it only as your retention plan allows");
  for (const auto& m : c.outside_mailboxes)
    Warn("the mailbox " + m + " lies outside the study folder, so purge leaves it alone; it still holds every sender's "
         "address: delete it when your retention plan says so");
  std::cout << "Pseudonymised outcomes are kept; 'twinprobe analyze' gives the same numbers afterwards.\n";
  return 0;
}

}  // namespace

void RegisterEthicsCommands(CLI::App& app, Context& ctx) {
  auto d = std::make_shared<DeclineOptions>();
  auto* decline = app.add_subcommand(
      "decline", "Record that an invitation or offer was declined (do it within the study's decline deadline)");
  decline->add_option("probe", d->probe, "Probe reference, e.g. P00001")->required();
  decline->add_option("--at", d->at, "When the decline was sent (YYYY-MM-DD[THH:MM], UTC); default now");
  decline->add_option("--channel", d->channel, "mail, phone, letter or other");
  decline->callback([&ctx, d] { ctx.exit_code = RunDecline(ctx, *d); });

  auto dry = std::make_shared<bool>(false);
  auto* purge = app.add_subcommand(
      "purge",
      "After the retention period: delete employer identities, snapshots, materials and notes; keep pseudonymised "
      "outcomes");
  purge->add_flag("--dry-run", *dry, "Only show what would be deleted and when purge is allowed");
  purge->callback([&ctx, dry] { ctx.exit_code = RunPurge(ctx, *dry); });
}

}  // namespace twinprobe
