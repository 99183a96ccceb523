#include "core/schema.h"

#include <sqlite3.h>

#include <memory>
#include <string>

#include "core/store.h"

namespace twinprobe {
namespace {

// Every table that holds observations carries `audit_seq`, the audit row of
// the command that wrote it; rows are never updated, only added (a
// correction is a new row that supersedes the old one).
constexpr const char* kMigration1 = R"SQL(
CREATE TABLE meta(
  id INTEGER PRIMARY KEY,
  key TEXT NOT NULL,
  value TEXT NOT NULL,
  audit_seq INTEGER NOT NULL);           -- the newest row of a key is its value
CREATE INDEX meta_key ON meta(key);

CREATE TABLE secret(                      -- not sealed; purge clears it
  name TEXT PRIMARY KEY,
  value TEXT NOT NULL);

CREATE TABLE plan(
  id INTEGER PRIMARY KEY,
  origin TEXT NOT NULL CHECK (origin IN ('plan', 'import')),
  kind TEXT NOT NULL,                     -- paired | sets | unpaired
  design_sha256 TEXT,
  seed INTEGER,
  created_at TEXT NOT NULL,
  audit_seq INTEGER NOT NULL);

CREATE TABLE factor(
  id INTEGER PRIMARY KEY,
  plan_id INTEGER NOT NULL REFERENCES plan(id),
  name TEXT NOT NULL,
  audit_seq INTEGER NOT NULL,
  UNIQUE(plan_id, name));

CREATE TABLE level(
  id INTEGER PRIMARY KEY,
  factor_id INTEGER NOT NULL REFERENCES factor(id),
  name TEXT NOT NULL,
  is_reference INTEGER NOT NULL DEFAULT 0,
  audit_seq INTEGER NOT NULL,
  UNIQUE(factor_id, name));

CREATE TABLE arm(
  id INTEGER PRIMARY KEY,
  plan_id INTEGER NOT NULL REFERENCES plan(id),
  label TEXT NOT NULL,
  is_reference INTEGER NOT NULL DEFAULT 0,
  audit_seq INTEGER NOT NULL,
  UNIQUE(plan_id, label));

CREATE TABLE arm_level(
  arm_id INTEGER NOT NULL REFERENCES arm(id),
  level_id INTEGER NOT NULL REFERENCES level(id),
  audit_seq INTEGER NOT NULL,
  PRIMARY KEY(arm_id, level_id));

CREATE TABLE employer(                    -- the only identifying table; purge empties it
  key TEXT PRIMARY KEY,                   -- keyed pseudonym (HMAC of the name)
  name TEXT,
  contact TEXT);

CREATE TABLE vacancy(
  id INTEGER PRIMARY KEY,
  plan_id INTEGER NOT NULL REFERENCES plan(id),
  ref TEXT NOT NULL,
  employer_key TEXT,
  source TEXT,
  opened_on TEXT,
  closed_on TEXT,
  audit_seq INTEGER NOT NULL,
  UNIQUE(plan_id, ref));

CREATE TABLE vacancy_stratum(
  vacancy_id INTEGER NOT NULL REFERENCES vacancy(id),
  name TEXT NOT NULL,
  value TEXT NOT NULL,
  audit_seq INTEGER NOT NULL,
  PRIMARY KEY(vacancy_id, name));

CREATE TABLE profile(
  id INTEGER PRIMARY KEY,
  plan_id INTEGER NOT NULL REFERENCES plan(id),
  arm_id INTEGER NOT NULL REFERENCES arm(id),
  display_name TEXT NOT NULL,
  mailbox TEXT,
  phone TEXT,
  fields TEXT NOT NULL DEFAULT '{}',     -- JSON object of the profile's template fields
  audit_seq INTEGER NOT NULL);

CREATE TABLE probe(
  id INTEGER PRIMARY KEY,
  plan_id INTEGER NOT NULL REFERENCES plan(id),
  ref TEXT NOT NULL,                      -- what people type: P00001 …
  vacancy_id INTEGER NOT NULL REFERENCES vacancy(id),
  profile_id INTEGER REFERENCES profile(id),
  arm_id INTEGER NOT NULL REFERENCES arm(id),
  template TEXT,
  send_order INTEGER NOT NULL DEFAULT 1,
  planned_at TEXT,
  audit_seq INTEGER NOT NULL,
  UNIQUE(plan_id, ref));
CREATE INDEX probe_vacancy ON probe(vacancy_id);

CREATE TABLE sending(                     -- a probe was sent (append-only)
  id INTEGER PRIMARY KEY,
  probe_id INTEGER NOT NULL REFERENCES probe(id),
  sent_at TEXT NOT NULL,
  entered_by TEXT NOT NULL,
  entered_at TEXT NOT NULL,
  audit_seq INTEGER NOT NULL);
CREATE INDEX sending_probe ON sending(probe_id);

CREATE TABLE response(
  id INTEGER PRIMARY KEY,
  probe_id INTEGER NOT NULL REFERENCES probe(id),
  code TEXT NOT NULL,
  received_at TEXT,
  channel TEXT,
  note TEXT,                              -- free text; purge clears it
  note_sha256 TEXT,                       -- sealed in its place
  origin TEXT NOT NULL,                   -- record | import | mail-review | demo
  flags TEXT NOT NULL DEFAULT '',         -- e.g. 'late' (outside the observation window)
  entered_by TEXT NOT NULL,
  entered_at TEXT NOT NULL,
  supersedes INTEGER REFERENCES response(id),
  audit_seq INTEGER NOT NULL);
CREATE INDEX response_probe ON response(probe_id);

CREATE TABLE import_file(                 -- makes a second import of the same file a no-op
  id INTEGER PRIMARY KEY,
  kind TEXT NOT NULL,
  sha256 TEXT NOT NULL,
  path TEXT NOT NULL,
  rows_landed INTEGER NOT NULL,
  rows_rejected INTEGER NOT NULL,
  audit_seq INTEGER NOT NULL);

CREATE TABLE listing(
  id INTEGER PRIMARY KEY,
  source TEXT NOT NULL,
  query TEXT,
  location TEXT,
  page INTEGER,
  seen_by TEXT,                           -- profile or account that saw the list (personalised listings)
  fetched_at TEXT NOT NULL,
  url TEXT,
  http_status INTEGER,
  snapshot_sha256 TEXT,
  extraction TEXT NOT NULL DEFAULT 'ok',  -- ok | failed
  extraction_error TEXT,
  audit_seq INTEGER NOT NULL);

CREATE TABLE listing_item(
  id INTEGER PRIMARY KEY,
  listing_id INTEGER NOT NULL REFERENCES listing(id),
  position INTEGER NOT NULL,
  item_key TEXT NOT NULL,
  fields TEXT NOT NULL DEFAULT '{}',      -- JSON object of extracted fields
  audit_seq INTEGER NOT NULL);
CREATE INDEX listing_item_listing ON listing_item(listing_id);

CREATE TABLE item_label(                  -- item key -> group level (labels file)
  id INTEGER PRIMARY KEY,
  item_key TEXT NOT NULL,
  factor TEXT NOT NULL,
  level TEXT NOT NULL,
  audit_seq INTEGER NOT NULL);

CREATE TABLE fetch_log(                   -- every URL considered by fetch, fetched or not
  id INTEGER PRIMARY KEY,
  url TEXT NOT NULL,
  at TEXT NOT NULL,
  outcome TEXT NOT NULL,                  -- fetched | robots | allowlist | limit | failed
  http_status INTEGER,
  detail TEXT,
  snapshot_sha256 TEXT,
  audit_seq INTEGER NOT NULL);

CREATE TABLE mail_message(
  id INTEGER PRIMARY KEY,
  message_id TEXT NOT NULL UNIQUE,
  mailbox TEXT,
  from_addr TEXT,
  to_addr TEXT,
  subject TEXT,
  sent_date TEXT,
  body_sha256 TEXT,
  excerpt TEXT,                           -- purge clears it
  probe_id INTEGER REFERENCES probe(id),  -- NULL: unmatched, waits in the review queue
  match_reason TEXT,
  suggested_code TEXT,
  evidence TEXT,
  audit_seq INTEGER NOT NULL);

CREATE TABLE review_decision(
  id INTEGER PRIMARY KEY,
  mail_message_id INTEGER NOT NULL REFERENCES mail_message(id),
  decision TEXT NOT NULL,                 -- confirmed | changed | dismissed
  response_id INTEGER REFERENCES response(id),
  decided_by TEXT NOT NULL,
  decided_at TEXT NOT NULL,
  audit_seq INTEGER NOT NULL);

CREATE TABLE audit(
  seq INTEGER PRIMARY KEY,
  at TEXT NOT NULL,
  actor TEXT NOT NULL,
  command TEXT NOT NULL,
  summary TEXT NOT NULL,
  content_sha256 TEXT NOT NULL,           -- digest of every sealed row carrying this seq
  prev_hash TEXT NOT NULL,
  hash TEXT NOT NULL);

-- verify and sealing read the rows of one audit entry at a time.
CREATE INDEX meta_seq ON meta(audit_seq);
CREATE INDEX plan_seq ON plan(audit_seq);
CREATE INDEX factor_seq ON factor(audit_seq);
CREATE INDEX level_seq ON level(audit_seq);
CREATE INDEX arm_seq ON arm(audit_seq);
CREATE INDEX arm_level_seq ON arm_level(audit_seq);
CREATE INDEX vacancy_seq ON vacancy(audit_seq);
CREATE INDEX vacancy_stratum_seq ON vacancy_stratum(audit_seq);
CREATE INDEX profile_seq ON profile(audit_seq);
CREATE INDEX probe_seq ON probe(audit_seq);
CREATE INDEX sending_seq ON sending(audit_seq);
CREATE INDEX response_seq ON response(audit_seq);
CREATE INDEX import_file_seq ON import_file(audit_seq);
CREATE INDEX listing_seq ON listing(audit_seq);
CREATE INDEX listing_item_seq ON listing_item(audit_seq);
CREATE INDEX item_label_seq ON item_label(audit_seq);
CREATE INDEX fetch_log_seq ON fetch_log(audit_seq);
CREATE INDEX mail_message_seq ON mail_message(audit_seq);
CREATE INDEX review_decision_seq ON review_decision(audit_seq);

-- What analysis reads: the newest plan, and the current response of each probe.
CREATE VIEW current_plan AS SELECT * FROM plan WHERE id = (SELECT max(id) FROM plan);
CREATE VIEW current_probe AS SELECT * FROM probe WHERE plan_id = (SELECT max(id) FROM plan);
CREATE VIEW current_response AS
  SELECT r.* FROM response r
  WHERE NOT EXISTS (SELECT 1 FROM response s WHERE s.supersedes = r.id);
)SQL";

// Version 2: declines of invitations (ethics safeguard) as an append-only event.
constexpr const char* kMigration2 = R"SQL(
CREATE TABLE decline(                     -- the invitation/offer to a probe was declined
  id INTEGER PRIMARY KEY,
  probe_id INTEGER NOT NULL REFERENCES probe(id),
  declined_at TEXT NOT NULL,
  channel TEXT,
  entered_by TEXT NOT NULL,
  entered_at TEXT NOT NULL,
  audit_seq INTEGER NOT NULL);
CREATE INDEX decline_probe ON decline(probe_id);
CREATE INDEX decline_seq ON decline(audit_seq);
)SQL";

// fetch --replay re-extracts a listing from its stored snapshot with the
// current rules. The result is a new listing row; listing_replay links it to
// the row it replaces (a new table, so rows sealed earlier keep their digest)
// and current_listing shows only rows not replaced.
constexpr const char* kMigration3 = R"SQL(
CREATE TABLE listing_replay(
  listing_id INTEGER PRIMARY KEY REFERENCES listing(id),      -- the new row
  replaces INTEGER NOT NULL UNIQUE REFERENCES listing(id),   -- the row it replaces
  audit_seq INTEGER NOT NULL);
CREATE INDEX listing_replay_seq ON listing_replay(audit_seq);
CREATE VIEW current_listing AS
  SELECT l.* FROM listing l WHERE NOT EXISTS (SELECT 1 FROM listing_replay r WHERE r.replaces = l.id);
)SQL";

// Version 4: current_response asks, for every response, whether another
// supersedes it; without an index that is a scan of the table per response,
// and analysis of a 40,000-probe import took minutes instead of a second.
constexpr const char* kMigration4 = R"SQL(
CREATE INDEX response_supersedes ON response(supersedes);
)SQL";

// Version 5: the desk (desk/). Each member of the design's [team] sets a
// passphrase on first use; only a salted PBKDF2 hash is stored. A new
// passphrase is a new row (the newest per member counts), so the table stays
// append-only and is sealed like every other: a slipped-in hash is found by
// `verify`.
constexpr const char* kMigration5DeskPassphrase = R"SQL(
CREATE TABLE desk_passphrase(
  id INTEGER PRIMARY KEY,
  member TEXT NOT NULL,                   -- as written in [team] members
  scheme TEXT NOT NULL,                   -- 'pbkdf2-sha256'
  iterations INTEGER NOT NULL,
  salt TEXT NOT NULL,                     -- hex
  hash TEXT NOT NULL,                     -- hex
  set_at TEXT NOT NULL,
  audit_seq INTEGER NOT NULL);
CREATE INDEX desk_passphrase_member ON desk_passphrase(member);
CREATE INDEX desk_passphrase_seq ON desk_passphrase(audit_seq);
)SQL";

// Version 6: every file `render` writes, with its SHA-256 and the plan it
// was rendered for, sealed in the chain: after `purge` the store still proves
// what was sent, and `schedule`/`sent` refuse a probe whose file on disk is
// not the one rendered for the current plan. `folder` is relative to the
// study folder when inside it.
constexpr const char* kMigration6 = R"SQL(
CREATE TABLE material_file(
  id INTEGER PRIMARY KEY,
  plan_id INTEGER NOT NULL REFERENCES plan(id),
  probe_id INTEGER NOT NULL REFERENCES probe(id),
  folder TEXT NOT NULL,
  file TEXT NOT NULL,
  sha256 TEXT NOT NULL,
  audit_seq INTEGER NOT NULL);
CREATE INDEX material_file_probe ON material_file(probe_id);
CREATE INDEX material_file_seq ON material_file(audit_seq);
)SQL";

// Version 7: a vacancy withdrawn from the study (the posting closed, the
// employer saw through the test, an error in the listing), as an
// append-only event. Its unsent probes leave the schedule and its set leaves
// the primary analysis (core/fieldwork.h); responses already recorded stay.
// The first withdrawal of a vacancy counts; a second is refused.
constexpr const char* kMigration7Withdrawal = R"SQL(
CREATE TABLE withdrawal(
  id INTEGER PRIMARY KEY,
  vacancy_id INTEGER NOT NULL REFERENCES vacancy(id),
  reason TEXT NOT NULL,
  withdrawn_at TEXT NOT NULL,
  entered_by TEXT NOT NULL,
  entered_at TEXT NOT NULL,
  audit_seq INTEGER NOT NULL);
CREATE INDEX withdrawal_vacancy ON withdrawal(vacancy_id);
CREATE INDEX withdrawal_seq ON withdrawal(audit_seq);
)SQL";

// Version 8: every interim look `monitor` took (planned, unplanned or final),
// sealed in the chain with what it decided: a later look spends only the alpha
// these looks left (Lan & DeMets 1983), and `analyze` reads a stop from them.
// `lower` is the exact boundary (-1: too few discordant sets to stop);
// alpha_spent is cumulative; decision is continue | stop | final.
constexpr const char* kMigration8MonitorLook = R"SQL(
CREATE TABLE monitor_look(
  id INTEGER PRIMARY KEY,
  look INTEGER NOT NULL,                  -- 1, 2, ... in the order taken
  kind TEXT NOT NULL CHECK (kind IN ('planned', 'unplanned', 'final')),
  sets INTEGER NOT NULL,                  -- completed sets the look analysed
  planned_sets INTEGER NOT NULL,
  information REAL NOT NULL,              -- information fraction t in (0, 1]
  discordant INTEGER NOT NULL,
  reference_only INTEGER NOT NULL,
  other_only INTEGER NOT NULL,
  lower INTEGER NOT NULL,
  alpha REAL NOT NULL,
  spending TEXT NOT NULL,                 -- obf | pocock
  alpha_allowed REAL NOT NULL,
  alpha_spent REAL NOT NULL,
  decision TEXT NOT NULL CHECK (decision IN ('continue', 'stop', 'final')),
  taken_at TEXT NOT NULL,
  audit_seq INTEGER NOT NULL);
CREATE INDEX monitor_look_seq ON monitor_look(audit_seq);
)SQL";

// Version 9: how and by whom a probe was sent (`import sendings` reads them
// from the team's log). A table of its own rather than new columns of
// `sending`: the digest of a sealed row covers all of its columns, so new
// columns would change the digest of every sending sealed before and break
// the chain of every existing store.
constexpr const char* kMigration9SendingDetail = R"SQL(
CREATE TABLE sending_detail(
  sending_id INTEGER PRIMARY KEY REFERENCES sending(id),
  channel TEXT,                           -- mail | phone | letter | other
  sent_by TEXT,                           -- as the field team names the sender
  audit_seq INTEGER NOT NULL);
CREATE INDEX sending_detail_seq ON sending_detail(audit_seq);
)SQL";

// Version 13: the excerpt of a message that `review` shows as evidence is
// sealed through its SHA-256. mail_message.excerpt stays outside the row's
// digest because purge clears it; its digest lives in a new table (a new
// column would change the digest of rows sealed earlier) written in the same
// entry as the message, so an edited excerpt no longer matches and a removed
// seal breaks the entry. Messages stored before version 13 have no seal.
constexpr const char* kMigration13ExcerptSeal = R"SQL(
CREATE TABLE mail_excerpt_seal(
  mail_message_id INTEGER PRIMARY KEY REFERENCES mail_message(id),
  excerpt_sha256 TEXT NOT NULL,           -- of mail_message.excerpt as written
  audit_seq INTEGER NOT NULL);
CREATE INDEX mail_excerpt_seal_seq ON mail_excerpt_seal(audit_seq);
)SQL";

// Version 11: how each factor varies (within or between vacancies), the
// display labels and scores of factors and levels, and which template fields
// signal a factor (its name fields, its own fields). New tables rather than
// new columns, so rows sealed earlier keep their digest; a factor or level
// without a row is one varied within vacancies, signalled by the name, with
// neither label nor score (every plan before this version).
constexpr const char* kMigration11 = R"SQL(
CREATE TABLE factor_design(
  factor_id INTEGER PRIMARY KEY REFERENCES factor(id),
  vary TEXT NOT NULL CHECK (vary IN ('within', 'between')),
  label TEXT,                             -- display label; NULL = the factor's name
  signal_by_name INTEGER NOT NULL,        -- 1: the name pools are keyed by it
  signal_fields TEXT NOT NULL,            -- template fields it sets, comma-separated
  audit_seq INTEGER NOT NULL);
CREATE INDEX factor_design_seq ON factor_design(audit_seq);
CREATE TABLE level_design(
  level_id INTEGER PRIMARY KEY REFERENCES level(id),
  label TEXT,                             -- display label; NULL = the level's name
  score REAL,                             -- ordered levels' score; NULL = none
  audit_seq INTEGER NOT NULL);
CREATE INDEX level_design_seq ON level_design(audit_seq);
)SQL";

// Version 12: several field offices, one study (collector/handout.h,
// collector/merge.h). The main store seals each handout (the office, the
// office chain's first head, and its vacancies: a vacancy is handed out once,
// so handout_vacancy's key is the vacancy). The office store seals where it
// came from (office_origin). Each merge seals the office chain's head it
// brought in (office_merge), which office row every merged row came from
// (merged_row: a later merge adds only rows the office wrote after that head,
// and maps an office's response ids to the main store's), and every choice
// made on a conflict (merge_choice).
constexpr const char* kMigration12Offices = R"SQL(
CREATE TABLE handout(
  id INTEGER PRIMARY KEY,
  office TEXT NOT NULL UNIQUE,
  folder TEXT NOT NULL,
  plan_id INTEGER NOT NULL REFERENCES plan(id),
  plan_hash TEXT NOT NULL,                -- hash of the audit entry that wrote the plan
  office_head TEXT NOT NULL,              -- the office chain's head after its handout entry
  handed_at TEXT NOT NULL,
  audit_seq INTEGER NOT NULL);
CREATE TABLE handout_vacancy(
  vacancy_id INTEGER PRIMARY KEY REFERENCES vacancy(id),  -- handed out once
  handout_id INTEGER NOT NULL REFERENCES handout(id),
  audit_seq INTEGER NOT NULL);
CREATE TABLE office_origin(
  id INTEGER PRIMARY KEY,
  office TEXT NOT NULL,
  study_id TEXT NOT NULL,
  plan_hash TEXT NOT NULL,
  main_head TEXT NOT NULL,                -- the main chain's head when it was handed out
  handed_at TEXT NOT NULL,
  audit_seq INTEGER NOT NULL);
CREATE TABLE office_merge(
  id INTEGER PRIMARY KEY,
  office TEXT NOT NULL,
  office_head TEXT NOT NULL,              -- the office chain's head that was merged
  office_head_seq INTEGER NOT NULL,
  audit_seq INTEGER NOT NULL);
CREATE TABLE merged_row(
  id INTEGER PRIMARY KEY,
  office TEXT NOT NULL,
  tbl TEXT NOT NULL,                      -- sending | response | decline | mail_message | review_decision
  office_row INTEGER NOT NULL,
  main_row INTEGER NOT NULL,
  audit_seq INTEGER NOT NULL);
CREATE INDEX merged_row_main ON merged_row(tbl, main_row);
CREATE INDEX merged_row_office ON merged_row(office, tbl, office_row);
CREATE TABLE merge_choice(
  id INTEGER PRIMARY KEY,
  office TEXT NOT NULL,
  probe_id INTEGER NOT NULL REFERENCES probe(id),
  prefer TEXT NOT NULL,                   -- main | office
  main_response INTEGER REFERENCES response(id),
  office_response INTEGER REFERENCES response(id),
  audit_seq INTEGER NOT NULL);
CREATE INDEX handout_seq ON handout(audit_seq);
CREATE INDEX handout_vacancy_seq ON handout_vacancy(audit_seq);
CREATE INDEX office_origin_seq ON office_origin(audit_seq);
CREATE INDEX office_merge_seq ON office_merge(audit_seq);
CREATE INDEX merged_row_seq ON merged_row(audit_seq);
CREATE INDEX merge_choice_seq ON merge_choice(audit_seq);
)SQL";

// Version 14: the covariates `import applications --covariates` keeps with
// each application (years of experience, a degree), for the logistic model
// that adjusts the groups' odds ratios (analysis/covariate_model.h). Sealed
// like the probe it belongs to: it is evidence, and a covariate edited after
// the import would change the adjusted result. Values are stored as the file
// wrote them; whether a covariate is a number or a category is decided from
// its values by one rule (core/covariate_records.h).
constexpr const char* kMigration14Covariate = R"SQL(
CREATE TABLE application_covariate(
  probe_id INTEGER NOT NULL REFERENCES probe(id),
  name TEXT NOT NULL,                     -- the file's column name
  value TEXT NOT NULL,                    -- the cell as written (never empty)
  audit_seq INTEGER NOT NULL,
  PRIMARY KEY(probe_id, name));
CREATE INDEX application_covariate_seq ON application_covariate(audit_seq);
)SQL";

struct Migration {
  int version;
  const char* sql;
};

const Migration kMigrations[] = {{1, kMigration1}, {2, kMigration2}, {3, kMigration3}, {4, kMigration4},
                               {5, kMigration5DeskPassphrase}, {6, kMigration6},
                               {7, kMigration7Withdrawal}, {8, kMigration8MonitorLook}, {9, kMigration9SendingDetail},
                               {11, kMigration11}, {12, kMigration12Offices}, {13, kMigration13ExcerptSeal},
                               {14, kMigration14Covariate}};

// sqlite_master without SQLite's own objects (sqlite_autoindex_* follow from
// the tables' SQL, which is compared; sqlite_stat* only guide the planner).
std::vector<SchemaObject> ReadSchema(sqlite3* db) {
  Stmt q(db,
         "SELECT type, name, tbl_name, coalesce(sql, '') FROM sqlite_master WHERE name NOT LIKE 'sqlite\\_%' ESCAPE '\\' "
         "ORDER BY type, name");
  std::vector<SchemaObject> out;
  while (q.Step()) out.push_back({q.Text(0), q.Text(1), q.Text(2), q.Text(3)});
  return out;
}

}  // namespace

void Migrate(Store& store) {
  // The caller read the version without a lock; another process may have
  // migrated since (two first imports into one empty folder), so read it
  // again under the write lock before creating anything.
  Transaction tx(store);
  const int current = store.schema_version();
  if (current >= kSchemaVersion) return;  // rolls back an empty transaction
  for (const Migration& m : kMigrations) {
    if (m.version <= current) continue;
    store.Exec(m.sql);
    store.Exec("PRAGMA user_version = " + std::to_string(m.version));
  }
  tx.Commit();
}

std::vector<SchemaObject> ReferenceSchema(int version) {
  // A private in-memory database, not a Store: Store::Open would migrate it
  // to the newest version, and verify needs the schema of the store's own.
  sqlite3* raw = nullptr;
  if (sqlite3_open_v2(":memory:", &raw, SQLITE_OPEN_READWRITE, nullptr) != SQLITE_OK) {
    sqlite3_close(raw);
    throw StoreError("cannot open an in-memory database");
  }
  std::unique_ptr<sqlite3, decltype(&sqlite3_close)> db(raw, &sqlite3_close);
  for (const Migration& m : kMigrations) {
    if (m.version > version) break;
    char* err = nullptr;
    if (sqlite3_exec(db.get(), m.sql, nullptr, nullptr, &err) != SQLITE_OK) {
      std::string msg = err ? err : "unknown error";
      sqlite3_free(err);
      throw StoreError("migration " + std::to_string(m.version) + ": " + msg);
    }
  }
  return ReadSchema(db.get());
}

std::vector<SchemaObject> StoredSchema(Store& store) { return ReadSchema(store.handle()); }

const std::vector<SealedTable>& SealedTables() {
  static const std::vector<SealedTable> tables = {
      {"meta", {}},          {"plan", {}},           {"factor", {}},       {"level", {}},
      {"arm", {}},           {"arm_level", {}},      {"vacancy", {}},      {"vacancy_stratum", {}},
      {"profile", {}},       {"probe", {}},          {"sending", {}},      {"response", {"note"}},
      {"import_file", {}},   {"listing", {}},        {"listing_item", {}}, {"item_label", {}},
      {"fetch_log", {}},     {"mail_message", {"excerpt"}}, {"review_decision", {}},
      {"decline", {}},
      {"listing_replay", {}},
      {"desk_passphrase", {}},
      {"material_file", {}},
      {"withdrawal", {}},
      {"monitor_look", {}},
      {"sending_detail", {}},
      {"mail_excerpt_seal", {}},
      {"factor_design", {}},
      {"level_design", {}},
      {"handout", {}},       {"handout_vacancy", {}}, {"office_origin", {}}, {"office_merge", {}},
      {"merged_row", {}},    {"merge_choice", {}},
      {"application_covariate", {}},
  };
  return tables;
}

}  // namespace twinprobe
