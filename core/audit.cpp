#include "core/audit.h"

#include <sqlite3.h>

#include <charconv>
#include <cstdio>
#include <cstdlib>
#include <algorithm>
#include <map>

#include "core/clock.h"
#include "core/committed_head.h"
#include "core/desk_actor.h"
#include "core/schema.h"
#include "core/sha256.h"

namespace twinprobe {
namespace {

// Column list of a sealed table, without audit_seq and the unsealed columns.
std::string SealedColumns(Store& store, const SealedTable& table) {
  Stmt info = store.Prepare("SELECT name FROM pragma_table_info(?1) ORDER BY cid");
  info.Bind(1, table.name);
  std::string cols;
  while (info.Step()) {
    std::string name = info.Text(0);
    if (name == "audit_seq") continue;
    bool skip = false;
    for (const auto& u : table.unsealed_columns) skip = skip || u == name;
    if (skip) continue;
    if (!cols.empty()) cols += ", ";
    cols += "\"" + name + "\"";
  }
  return cols;
}

// Canonical, unambiguous serialisation of one row: a type tag per value,
// lengths before text so no separator can be forged:
//   "R" then per column "N" | "I<integer>;" | "F<%.17g>;" | "T<byte length>:<text>".
// Rows are appended to a buffer that is hashed in large pieces (the digest of
// the concatenation is the same; a million-row import seals much faster).
class RowHasher {
 public:
  // Reads the row straight from SQLite (no copies: sealing and verifying a
  // million-row import read every row once).
  void Add(sqlite3_stmt* row, int first_col) {
    buf_ += 'R';
    const int n = sqlite3_column_count(row);
    for (int c = first_col; c < n; ++c) {
      switch (sqlite3_column_type(row, c)) {
        case SQLITE_NULL: buf_ += 'N'; break;
        case SQLITE_INTEGER:
          buf_ += 'I';
          AppendNumber(sqlite3_column_int64(row, c));
          buf_ += ';';
          break;
        case SQLITE_FLOAT: {
          char num[40];
          std::snprintf(num, sizeof num, "%.17g", sqlite3_column_double(row, c));
          buf_ += 'F';
          buf_ += num;
          buf_ += ';';
          break;
        }
        default: {
          const char* text = reinterpret_cast<const char*>(sqlite3_column_text(row, c));
          const int bytes = sqlite3_column_bytes(row, c);
          buf_ += 'T';
          AppendNumber(bytes);
          buf_ += ':';
          if (text) buf_.append(text, static_cast<size_t>(bytes));
        }
      }
    }
    if (buf_.size() >= kFlushBytes) Flush();
  }
  // Hashes what is buffered and gives the memory back (verify keeps one
  // hasher per audit entry while it scans a table).
  void Park() {
    Flush();
    buf_.shrink_to_fit();
  }
  std::string HexDigest() {
    Flush();
    return h_.HexDigest();
  }

 private:
  static constexpr size_t kFlushBytes = 1 << 16;
  void AppendNumber(int64_t v) {
    char num[24];
    auto [end, ec] = std::to_chars(num, num + sizeof num, v);
    buf_.append(num, static_cast<size_t>(end - num));
  }
  void Flush() {
    if (!buf_.empty()) h_.Update(buf_);
    buf_.clear();
  }
  Sha256 h_;
  std::string buf_;
};

// A read-only query on the raw handle, finalized on scope exit.
class RawQuery {
 public:
  RawQuery(Store& store, const std::string& sql) : db_(store.handle()) {
    if (sqlite3_prepare_v2(db_, sql.c_str(), static_cast<int>(sql.size()), &stmt_, nullptr) != SQLITE_OK)
      throw StoreError("prepare '" + sql.substr(0, 80) + "': " + sqlite3_errmsg(db_));
  }
  ~RawQuery() { sqlite3_finalize(stmt_); }
  RawQuery(const RawQuery&) = delete;
  RawQuery& operator=(const RawQuery&) = delete;
  void Bind(int index, int64_t value) { sqlite3_bind_int64(stmt_, index, value); }
  bool Step() {
    int rc = sqlite3_step(stmt_);
    if (rc == SQLITE_ROW) return true;
    if (rc == SQLITE_DONE) return false;
    throw StoreError(std::string("step: ") + sqlite3_errmsg(db_));
  }
  sqlite3_stmt* get() { return stmt_; }

 private:
  sqlite3* db_;
  sqlite3_stmt* stmt_ = nullptr;
};

std::string CombineTableDigests(const std::vector<std::pair<std::string, std::string>>& parts) {
  std::string joined;
  for (const auto& [table, digest] : parts) joined += table + ":" + digest + "\n";
  return Sha256Hex(joined);
}

std::string ChainHash(const std::string& prev, int64_t seq, const std::string& at, const std::string& actor,
                      const std::string& command, const std::string& summary, const std::string& content) {
  return Sha256Hex(prev + "\n" + std::to_string(seq) + "\n" + at + "\n" + actor + "\n" + command + "\n" +
                   summary + "\n" + content);
}

// Written by Commit, read by the CLI once the command is done (one thread).
std::string& CommittedHead() {
  static std::string head;
  return head;
}


// Free text kept outside a row's digest (purge may empty it) must still hash
// to the SHA-256 sealed for it. `sql` selects (row id, audit_seq, text,
// sealed SHA-256); a mismatch is reported as `what_row` + id + " was changed
// after it was written" + `seal`.
void CheckSealedTexts(Store& store, const std::string& sql, const std::string& what_row, const std::string& seal,
                      std::vector<AuditProblem>& problems) {
  RawQuery rows(store, sql);
  while (rows.Step()) {
    sqlite3_stmt* r = rows.get();
    const char* text = reinterpret_cast<const char*>(sqlite3_column_text(r, 2));
    std::string value(text ? text : "", static_cast<size_t>(sqlite3_column_bytes(r, 2)));
    const char* sealed = reinterpret_cast<const char*>(sqlite3_column_text(r, 3));
    if (sealed && Sha256Hex(value) == sealed) continue;
    problems.push_back({sqlite3_column_int64(r, 1), what_row + std::to_string(sqlite3_column_int64(r, 0)) +
                                                        " was changed after it was written" + seal});
  }
}
}  // namespace

std::string LastCommittedHead() { return CommittedHead(); }

std::string CurrentActor() {
  if (!DeskActor().empty()) return DeskActor();  // a desk member (core/desk_actor.h)
  if (const char* a = std::getenv("TWINPROBE_ACTOR"); a && *a) return a;
  if (const char* u = std::getenv("USER"); u && *u) return u;
  return "unknown";
}

Status CheckActor() {
  const char* from = std::getenv("TWINPROBE_ACTOR") && *std::getenv("TWINPROBE_ACTOR") ? "TWINPROBE_ACTOR" : "USER";
  for (unsigned char c : CurrentActor())
    if (c < 0x20 || c == 0x7F)
      return BadInput(from, "holds a line break or another control character",
                      "set it to one line of text, e.g. TWINPROBE_ACTOR=ana");
  return {};
}

AuditedWrite::AuditedWrite(Store& store, std::string command)
    : store_(store), tx_(store), command_(std::move(command)), at_(NowIso()), actor_(CurrentActor()) {
  seq_ = store_.QueryInt("SELECT coalesce(max(seq), 0) + 1 FROM audit");
}

std::string AuditedWrite::Commit(const std::string& summary) {
  std::string content = ContentDigest(store_, seq_);
  std::string prev = AuditHead(store_);
  std::string hash = ChainHash(prev, seq_, at_, actor_, command_, summary, content);
  Stmt ins = store_.Prepare(
      "INSERT INTO audit(seq, at, actor, command, summary, content_sha256, prev_hash, hash) "
      "VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8)");
  ins.Bind(1, seq_).Bind(2, at_).Bind(3, actor_).Bind(4, command_).Bind(5, summary).Bind(6, content);
  ins.Bind(7, prev).Bind(8, hash).Run();
  tx_.Commit();
  CommittedHead() = hash;
  return hash;
}

std::string ContentDigest(Store& store, int64_t seq) {
  std::vector<std::pair<std::string, std::string>> parts;
  for (const SealedTable& t : SealedTables()) {
    // The rows of one entry were written by one transaction of an append-only
    // table, so they sit together at the end of the rowid range: find the
    // first through the audit_seq index, then read on in rowid order (much
    // faster than one index lookup per row for a large import). The filter
    // keeps the result exact whatever the layout.
    Stmt first = store.Prepare("SELECT rowid FROM \"" + t.name + "\" WHERE audit_seq = ?1 ORDER BY rowid LIMIT 1");
    first.Bind(1, seq);
    if (!first.Step()) continue;
    RawQuery rows(store, "SELECT " + SealedColumns(store, t) + " FROM \"" + t.name +
                             "\" WHERE rowid >= ?2 AND +audit_seq = ?1 ORDER BY rowid");
    rows.Bind(1, seq);
    rows.Bind(2, first.Int(0));
    RowHasher h;
    bool any = false;
    while (rows.Step()) {
      h.Add(rows.get(), 0);
      any = true;
    }
    if (any) parts.emplace_back(t.name, h.HexDigest());
  }
  return CombineTableDigests(parts);
}

std::string AuditHead(Store& store) {
  Stmt s = store.Prepare("SELECT hash FROM audit ORDER BY seq DESC LIMIT 1");
  return s.Step() ? s.Text(0) : std::string();
}

AuditReport VerifyAudit(Store& store) {
  // Every table and the chain are read from one snapshot: without it a
  // writer committing between two reads looks like tampering (report's and
  // export's "audit intact" stamp said BROKEN beside fieldwork). Inside a
  // caller's transaction (verify's) that one already holds.
  const bool own_transaction = sqlite3_get_autocommit(store.handle()) != 0;
  if (own_transaction) store.Exec("BEGIN");
  struct EndRead {
    Store& s;
    bool active;
    ~EndRead() {
      if (!active) return;
      try {
        s.Exec("COMMIT");
      } catch (...) {
      }
    }
  } end_read{store, own_transaction};
  AuditReport report;
  // One ordered pass over each sealed table builds every entry's digest.
  std::map<int64_t, std::vector<std::pair<std::string, std::string>>> parts;
  for (const SealedTable& t : SealedTables()) {
    // A store of an older schema version may not have every table yet (verify
    // reads without migrating); its schema is checked against that version.
    if (SealedColumns(store, t).empty()) continue;
    // Rowid order reads the table front to back (an index walk would seek
    // once per row); within an entry that is the order the digest uses.
    RawQuery rows(store, "SELECT audit_seq, " + SealedColumns(store, t) + " FROM \"" + t.name + "\" ORDER BY rowid");
    std::map<int64_t, RowHasher> hashers;
    RowHasher* h = nullptr;
    int64_t current = 0;
    while (rows.Step()) {
      int64_t seq = sqlite3_column_int64(rows.get(), 0);
      if (!h || seq != current) {
        if (h) h->Park();
        h = &hashers[seq];
        current = seq;
      }
      h->Add(rows.get(), 1);
      ++report.sealed_rows;
    }
    for (auto& [seq, hasher] : hashers) parts[seq].emplace_back(t.name, hasher.HexDigest());
  }

  // A free-text column outside the digest must still match its sealed hash.
  for (const SealedTable& t : SealedTables()) {
    for (const std::string& col : t.unsealed_columns) {
      Stmt has = store.Prepare("SELECT count(*) FROM pragma_table_info(?1) WHERE name = ?2");
      has.Bind(1, t.name).Bind(2, col + "_sha256");
      if (!has.Step() || has.Int(0) == 0) continue;
      CheckSealedTexts(store,
                       "SELECT rowid, audit_seq, \"" + col + "\", \"" + col + "_sha256\" FROM \"" + t.name +
                           "\" WHERE \"" + col + "\" IS NOT NULL ORDER BY rowid",
                       "the " + col + " of " + t.name + " row ", " (it no longer matches " + col + "_sha256)",
                       report.problems);
    }
  }

  // The review excerpt of a message is sealed through mail_excerpt_seal
  // (schema version 13): purge may empty it, nobody may change it. A store of
  // an older version has no such table, and messages stored before version
  // 13 have no seal to compare with.
  if (store.QueryInt("SELECT count(*) FROM sqlite_master WHERE type = 'table' AND name = 'mail_excerpt_seal'") > 0)
    CheckSealedTexts(store,
                     "SELECT m.id, m.audit_seq, m.excerpt, s.excerpt_sha256 FROM mail_message m "
                     "JOIN mail_excerpt_seal s ON s.mail_message_id = m.id WHERE m.excerpt IS NOT NULL ORDER BY m.id",
                     "the excerpt of mail_message row ", " (it no longer matches mail_excerpt_seal)", report.problems);

  Stmt audit = store.Prepare(
      "SELECT seq, at, actor, command, summary, content_sha256, prev_hash, hash FROM audit ORDER BY seq");
  std::map<int64_t, std::vector<std::string>> entry_of;  // seq -> command, actor, at, summary
  std::string prev;
  int64_t expected_seq = 1;
  while (audit.Step()) {
    int64_t seq = audit.Int(0);
    ++report.entries;
    entry_of[seq] = {audit.Text(3), audit.Text(2), audit.Text(1), audit.Text(4)};
    if (seq != expected_seq)
      report.problems.push_back({seq, "audit entries " + std::to_string(expected_seq) + " to " +
                                          std::to_string(seq - 1) + " are missing"});
    expected_seq = seq + 1;
    std::string content = audit.Text(5), stored_prev = audit.Text(6), stored_hash = audit.Text(7);
    if (stored_prev != prev)
      report.problems.push_back({seq, "the link to the previous entry is broken (prev_hash differs)"});
    std::string recomputed = ChainHash(stored_prev, seq, audit.Text(1), audit.Text(2), audit.Text(3),
                                       audit.Text(4), content);
    if (recomputed != stored_hash)
      report.problems.push_back({seq, "the entry itself was edited (its hash does not match its fields)"});
    auto it = parts.find(seq);
    std::string actual = CombineTableDigests(it == parts.end() ? decltype(it->second){} : it->second);
    if (actual != content) {
      std::string tables;
      if (it != parts.end())
        for (const auto& p : it->second) tables += (tables.empty() ? "" : ", ") + p.first;
      report.problems.push_back(
          {seq, "rows written by this entry (" + audit.Text(3) + ") were changed, added or deleted since" +
                    (tables.empty() ? std::string(" (no rows remain)") : " (tables now holding them: " + tables + ")")});
    }
    if (it != parts.end()) parts.erase(it);
    prev = stored_hash;
  }
  for (const auto& [seq, p] : parts)
    report.problems.push_back({seq, "rows carry audit seq " + std::to_string(seq) + " but no audit entry has it"});
  report.head_hash = prev;
  std::stable_sort(report.problems.begin(), report.problems.end(),
                   [](const AuditProblem& a, const AuditProblem& b) { return a.seq < b.seq; });
  for (AuditProblem& p : report.problems) {
    auto it = entry_of.find(p.seq);
    if (it == entry_of.end()) continue;
    p.command = it->second[0];
    p.actor = it->second[1];
    p.at = it->second[2];
    p.summary = it->second[3];
  }
  return report;
}

}  // namespace twinprobe
