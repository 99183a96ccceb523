#pragma once
// `export`: the current plan's data as tables that R (read.csv) and pandas
// read directly, in the layout documented in docs/export.md:
//   vacancies  one row per vacancy, with one column per stratum
//   probes     one row per probe, with its newest sending, its current
//              response and its vacancy's strata (the analysis-ready table)
//   responses  every response row, superseded ones included
//   sendings   every sending row, superseded and repeated ones included
//   declines   one row per decline, with the response it declines, its
//              deadline and whether it was kept
// and one column per design factor in probes (each probe's level),
// plus a manifest (study, arms, outcome scheme, audit head) so an export
// can be tied to a verified state of the store.
//
// Pseudonymised by default: employers appear by their keyed pseudonym only;
// profiles by their (invented) display name, without mailbox or phone; free
// -text notes are left out. `identities` adds employer name and contact,
// profile mailbox and phone, and notes (what purge has removed stays empty).
//
// CSV cells beginning with '=', '+', '-', '@', a tab or a carriage return
// get a leading "'" (spreadsheets would run them as formulas) unless
// raw_cells.
//
// Values: missing is an empty CSV field / JSON null; yes-no columns are 1/0
// in CSV and true/false in JSON; times are UTC ISO 8601 text.
#include <cstdint>
#include <optional>
#include <string>

#include "core/design.h"
#include "core/status.h"
#include "core/store.h"

namespace twinprobe {

struct ExportOptions {
  bool identities = false;
  std::string format = "csv";  // csv: a folder of files; json: one document
  bool raw_cells = false;      // csv: no "'" before cells beginning with = + - @ tab CR
  // The study clock for probes.csv's `state` (core/fieldwork.h, the rule
  // analyze counts by); nullopt: NowEpoch() (the computer's, or $TWINPROBE_NOW).
  std::optional<int64_t> now;
};

struct ExportSummary {
  std::string path;  // the folder (csv) or file (json) written
  int64_t vacancies = 0;
  int64_t probes = 0;
  int64_t responses = 0;
  int64_t sendings = 0;  // every sending row, repeated ones included
  int64_t declines = 0;
  bool listing_only = false;   // a listing audit: the ranked lists, no plan
  int64_t listing_places = 0;  // rows of listings.csv (one per place in a list)
  std::string audit_head;
};

// Writes the export to `path`: for csv a folder holding vacancies.csv,
// probes.csv, responses.csv, sendings.csv, declines.csv and manifest.json, built beside `path` and
// swapped into place whole (an older export there is replaced; a folder
// holding any other file is refused); for json a single file, written
// beside and renamed. Nothing is written through a symbolic link. A listing
// audit's store (ranked lists, no plan) gives listings.csv instead: one row
// per place in a list (listing, query, location, seen_by, position, item, one
// column per factor). Errors: neither a plan nor a list in the store, an
// unwritable path, a folder that is not an export, a link at `path` (bad input).
Result<ExportSummary> ExportStudy(Store& store, const OutcomeScheme& scheme, const std::string& path,
                                  const ExportOptions& options);

}  // namespace twinprobe
