#pragma once
// `purge`: the end of the retention period (ethics/data-protection.md).
// Leaves no employer identity in the study folder: deletes employer names
// and contacts, the pseudonym secret, free-text notes and mail excerpts
// from the store, rewrites the vacancies file with pseudonyms in place of
// the employer names (and empties its contact and other free columns),
// and deletes raw web snapshots, rendered materials and the mailboxes kept
// in the study folder. Keeps the
// pseudonymised outcomes so the analysis still runs and gives the same
// numbers; records what it did in the audit chain. Mail senders and
// subjects are never stored in clear text outside the excerpt
// (collector/mail_intake.h), so clearing it leaves none.
#include <cstdint>
#include <string>
#include <vector>

#include "core/status.h"
#include "core/store.h"

namespace twinprobe {

// The study's vacancies file, as the design names it.
struct PurgeFileSpec {
  std::string vacancies_file;             // relative to the study folder; "" when the study has none
  std::vector<std::string> keep_columns;  // the design's stratum columns, kept as they are
  // [mail] mbox files and Maildir folders (relative to the study folder, or
  // absolute): the raw mail holds every sender's address and signature.
  // Those inside the study folder are deleted; those outside are named, not
  // touched (they belong to whoever runs the mailbox).
  std::vector<std::string> mailboxes;
};

// One column of the vacancies file that purge changes.
struct VacancyColumnChange {
  std::string column;
  std::string action;  // "pseudonymised" (employer) | "emptied"
  int64_t cells = 0;   // cells whose text changes
};

struct PurgeCounts {
  int64_t employers = 0;
  int64_t secrets = 0;
  int64_t notes = 0;           // response notes
  int64_t mail_excerpts = 0;   // excerpts of mail messages
  int64_t snapshot_files = 0;  // files under snapshots/
  int64_t material_files = 0;  // files under materials/
  int64_t mailbox_files = 0;   // files of [mail] mailboxes inside the study folder
  std::string vacancies_file;  // path as given in the design ("" when none or missing)
  std::vector<VacancyColumnChange> vacancy_columns;  // empty when nothing there changes
  std::vector<std::string> deleted_files;            // relative to the study folder, sorted
  std::vector<std::string> outside_mailboxes;        // [mail] paths outside the study folder, as given
  // Other files of the study folder that name an employer or hold a contact
  // address (a report written with --reveal-employers, an export, a copy of
  // the vacancies): purge did not write them, so it names them and leaves
  // them to the user. Relative to the study folder, sorted.
  std::vector<std::string> files_naming_employers;
  std::string fieldwork_end;   // ISO time the retention period counts from ("" when nothing was recorded)
  std::string fieldwork_end_what;  // which event set it, in words (ReadFieldworkEnd)
  std::string retention_ends;  // ISO time purge becomes allowed
  bool already_purged = false;
};

// Counts what a purge would delete or rewrite in the study folder
// `study_dir` and its store, and when it becomes allowed: `retention_days`
// after the fieldwork ends (ReadFieldworkEnd, with the design's observation
// window `window_days`). Fails (bad input) when the vacancies file cannot
// be read as CSV.
Result<PurgeCounts> PlanPurge(Store& store, const std::string& study_dir, int retention_days, int window_days,
                              const PurgeFileSpec& files = {});

// Performs the purge. Refuses (bad input) before the retention period has
// passed at `now`, unless nothing identifying is left. The new vacancies
// file is written beside the old one first; the store part is one audited
// transaction; only after it committed is the vacancies file replaced and
// are files deleted. A refusal leaves store and folder unchanged.
Result<PurgeCounts> Purge(Store& store, const std::string& study_dir, int retention_days, int window_days,
                          int64_t now, const PurgeFileSpec& files = {});

}  // namespace twinprobe
