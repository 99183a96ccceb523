#include "core/audit.h"

#include <sqlite3.h>

#include <cstdio>
#include <cstdlib>
#include <map>

#include "core/clock.h"
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
// lengths before text so no separator can be forged.
void SerializeRow(const Stmt& row, int first_col, Sha256& h) {
  std::string out = "R";
  for (int c = first_col; c < row.ColumnCount(); ++c) {
    switch (row.ColumnType(c)) {
      case SQLITE_NULL: out += "N"; break;
      // Appends piece by piece: g++ 12 at -O2 reports a false -Wrestrict on
      // chained temporaries here.
      case SQLITE_INTEGER: out.append("I").append(std::to_string(row.Int(c))).append(";"); break;
      case SQLITE_FLOAT: {
        char buf[40];
        std::snprintf(buf, sizeof buf, "%.17g", row.Double(c));
        out.append("F").append(buf).append(";");
        break;
      }
      default: {
        std::string t = row.Text(c);
        out.append("T").append(std::to_string(t.size())).append(":").append(t);
      }
    }
  }
  h.Update(out);
}

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

}  // namespace

std::string CurrentActor() {
  if (const char* a = std::getenv("TWINPROBE_ACTOR"); a && *a) return a;
  if (const char* u = std::getenv("USER"); u && *u) return u;
  return "unknown";
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
  return hash;
}

std::string ContentDigest(Store& store, int64_t seq) {
  std::vector<std::pair<std::string, std::string>> parts;
  for (const SealedTable& t : SealedTables()) {
    Stmt rows = store.Prepare("SELECT " + SealedColumns(store, t) + " FROM \"" + t.name +
                              "\" WHERE audit_seq = ?1 ORDER BY rowid");
    rows.Bind(1, seq);
    Sha256 h;
    bool any = false;
    while (rows.Step()) {
      SerializeRow(rows, 0, h);
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
  AuditReport report;
  // One ordered pass over each sealed table builds every entry's digest.
  std::map<int64_t, std::vector<std::pair<std::string, std::string>>> parts;
  for (const SealedTable& t : SealedTables()) {
    Stmt rows = store.Prepare("SELECT audit_seq, " + SealedColumns(store, t) + " FROM \"" + t.name +
                              "\" ORDER BY audit_seq, rowid");
    int64_t current = -1;
    std::unique_ptr<Sha256> h;
    auto flush = [&] {
      if (h) parts[current].emplace_back(t.name, h->HexDigest());
    };
    while (rows.Step()) {
      int64_t seq = rows.Int(0);
      if (seq != current) {
        flush();
        current = seq;
        h = std::make_unique<Sha256>();
      }
      SerializeRow(rows, 1, *h);
      ++report.sealed_rows;
    }
    flush();
  }

  Stmt audit = store.Prepare(
      "SELECT seq, at, actor, command, summary, content_sha256, prev_hash, hash FROM audit ORDER BY seq");
  std::string prev;
  int64_t expected_seq = 1;
  while (audit.Step()) {
    int64_t seq = audit.Int(0);
    ++report.entries;
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
  return report;
}

}  // namespace twinprobe
