#include "collector/responses.h"

#include <algorithm>
#include <fstream>
#include <sstream>

#include "core/audit.h"
#include "core/clock.h"
#include "core/csv.h"
#include "core/sha256.h"
#include "core/suggest.h"

namespace twinprobe {
namespace {

const std::vector<std::string> kChannels = {"mail", "phone", "letter", "other"};

std::string Prefix(const std::string& where) { return where; }

}  // namespace

int64_t FindProbe(Store& store, const std::string& probe_ref) {
  Stmt s = store.Prepare("SELECT id FROM current_probe WHERE ref = ?1");
  s.Bind(1, probe_ref);
  return s.Step() ? s.Int(0) : 0;
}

Result<RecordedResponse> AddResponse(Store& store, const OutcomeScheme& scheme, const ResponseEntry& e,
                                     int64_t seq, const std::string& actor, const std::string& at,
                                     const std::string& where) {
  int64_t probe_id = FindProbe(store, e.probe_ref);
  if (probe_id == 0)
    return BadInput(Prefix(where), "unknown probe '" + e.probe_ref + "'",
                    "use a probe reference from 'twinprobe schedule' or the plan (e.g. P00001)");
  if (!scheme.has_code(e.code))
    return BadInput(Prefix(where), "'" + e.code + "' is not a response code of this study" + DidYouMean(e.code, scheme.codes),
                    "use one of: " + [&] {
                      std::string s;
                      for (const auto& c : scheme.codes) s += (s.empty() ? "" : ", ") + c;
                      return s;
                    }());
  if (!e.channel.empty() && std::find(kChannels.begin(), kChannels.end(), e.channel) == kChannels.end())
    return BadInput(Prefix(where), "unknown channel '" + e.channel + "'" + DidYouMean(e.channel, kChannels),
                    "use mail, phone, letter or other");
  std::string received = e.received_at.empty() ? at : e.received_at;
  auto t_received = ParseIsoTime(received);
  if (!t_received)
    return BadInput(Prefix(where), "'" + received + "' is not a time", "write it as YYYY-MM-DD or YYYY-MM-DDTHH:MM");
  received = FormatIsoTime(*t_received);

  RecordedResponse out;
  out.probe_ref = e.probe_ref;
  out.code = e.code;
  out.received_at = received;
  out.positive = scheme.is_positive(e.code);
  Stmt sent = store.Prepare("SELECT sent_at FROM sending WHERE probe_id = ?1 ORDER BY id DESC LIMIT 1");
  sent.Bind(1, probe_id);
  if (sent.Step()) {
    int64_t t_sent = ParseIsoTime(sent.Text(0)).value_or(0);
    if (*t_received < t_sent)
      return BadInput(Prefix(where),
                      "the response time " + received + " is before the probe was sent (" + sent.Text(0) + ")",
                      "check the date; a response cannot precede the application");
    out.late = *t_received > t_sent + static_cast<int64_t>(scheme.window_days) * 86400;
  }
  Stmt prev = store.Prepare("SELECT id FROM current_response WHERE probe_id = ?1 ORDER BY id DESC LIMIT 1");
  prev.Bind(1, probe_id);
  if (prev.Step()) out.superseded = prev.Int(0);

  Stmt ins = store.Prepare(
      "INSERT INTO response(probe_id, code, received_at, channel, note, note_sha256, origin, flags, entered_by, "
      "entered_at, supersedes, audit_seq) VALUES (?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8, ?9, ?10, ?11, ?12)");
  ins.Bind(1, probe_id).Bind(2, e.code).Bind(3, received);
  if (e.channel.empty()) ins.BindNull(4);
  else ins.Bind(4, e.channel);
  if (e.note.empty()) ins.BindNull(5).BindNull(6);
  else ins.Bind(5, e.note).Bind(6, Sha256Hex(e.note));
  ins.Bind(7, e.origin).Bind(8, out.late ? "late" : "").Bind(9, actor).Bind(10, at);
  if (out.superseded) ins.Bind(11, out.superseded);
  else ins.BindNull(11);
  ins.Bind(12, seq).Run();
  out.response_id = store.LastInsertId();
  return out;
}

Result<RecordedResponse> RecordResponse(Store& store, const OutcomeScheme& scheme, const ResponseEntry& entry) {
  AuditedWrite write(store, "record");
  auto r = AddResponse(store, scheme, entry, write.seq(), write.actor(), write.at(), "");
  if (!r.ok()) return r.error();
  write.Commit("record " + entry.probe_ref + " " + entry.code +
               (r.value().superseded ? " (supersedes response " + std::to_string(r.value().superseded) + ")" : ""));
  return r;
}

Result<std::string> MarkSent(Store& store, const std::string& probe_ref, const std::string& sent_at) {
  AuditedWrite write(store, "sent");
  int64_t probe_id = FindProbe(store, probe_ref);
  if (probe_id == 0)
    return BadInput("", "unknown probe '" + probe_ref + "'", "use a probe reference from 'twinprobe schedule'");
  std::string at = sent_at.empty() ? write.at() : sent_at;
  auto t = ParseIsoTime(at);
  if (!t) return BadInput("", "'" + at + "' is not a time", "write it as YYYY-MM-DD or YYYY-MM-DDTHH:MM");
  at = FormatIsoTime(*t);
  Stmt ins = store.Prepare(
      "INSERT INTO sending(probe_id, sent_at, entered_by, entered_at, audit_seq) VALUES (?1, ?2, ?3, ?4, ?5)");
  ins.Bind(1, probe_id).Bind(2, at).Bind(3, write.actor()).Bind(4, write.at()).Bind(5, write.seq()).Run();
  write.Commit("sent " + probe_ref + " at " + at);
  return at;
}

Result<ImportSummary> ImportOutcomes(Store& store, const OutcomeScheme& scheme, const std::string& path,
                                     const ImportOptions& options) {
  std::ifstream in(path, std::ios::binary);
  if (!in) return BadInput(path, "cannot read the file", "check the path");
  std::stringstream buf;
  buf << in.rdbuf();
  const std::string content = buf.str();
  auto table = ReadCsvText(content, path);
  if (!table.ok()) return table.error();
  const CsvTable& t = table.value();
  int c_probe = t.Column("probe"), c_code = t.Column("code"), c_at = t.Column("received_at"),
      c_channel = t.Column("channel"), c_note = t.Column("note");
  if (c_probe < 0 || c_code < 0)
    return BadInput(path + ":1", "an outcomes file needs the columns 'probe' and 'code'",
                    "name the columns probe,code[,received_at,channel,note]");

  AuditedWrite write(store, "import outcomes");
  ImportSummary summary;
  const std::string file_sha = Sha256Hex(content);
  Stmt seen = store.Prepare("SELECT count(*) FROM import_file WHERE kind = 'outcomes' AND sha256 = ?1");
  seen.Bind(1, file_sha);
  if (seen.Step() && seen.Int(0) > 0) {
    summary.already_imported = true;
    return summary;  // nothing written; the transaction rolls back
  }
  std::vector<std::pair<const CsvRecord*, std::string>> rejects;
  for (const auto& row : t.rows) {
    ResponseEntry e;
    e.probe_ref = row.fields[c_probe];
    e.code = row.fields[c_code];
    if (c_at >= 0) e.received_at = row.fields[c_at];
    if (c_channel >= 0) e.channel = row.fields[c_channel];
    if (c_note >= 0) e.note = row.fields[c_note];
    e.origin = "import";
    if (e.received_at.empty()) {
      auto where = path + ":" + std::to_string(row.line);
      Error err = BadInput(where, "received_at is empty", "give the time the response arrived");
      if (!options.skip_bad) return err;
      rejects.emplace_back(&row, err.what);
      continue;
    }
    auto r = AddResponse(store, scheme, e, write.seq(), write.actor(), write.at(), path + ":" + std::to_string(row.line));
    if (!r.ok()) {
      if (!options.skip_bad) return r.error();
      rejects.emplace_back(&row, r.error().what);
      continue;
    }
    ++summary.rows_landed;
  }
  summary.rows_rejected = static_cast<int64_t>(rejects.size());
  if (!rejects.empty()) {
    std::string reject_path = options.reject_path.empty() ? path + ".rejects.csv" : options.reject_path;
    std::ofstream out(reject_path, std::ios::binary);
    if (!out) return BadInput(reject_path, "cannot write the reject file", "check the folder is writable");
    out << "line,reason";
    for (const auto& h : t.header) out << "," << CsvQuote(h);
    out << "\n";
    for (const auto& [row, reason] : rejects) {
      out << row->line << "," << CsvQuote(reason);
      for (const auto& f : row->fields) out << "," << CsvQuote(f);
      out << "\n";
    }
  }
  Stmt ins = store.Prepare(
      "INSERT INTO import_file(kind, sha256, path, rows_landed, rows_rejected, audit_seq) VALUES ('outcomes', ?1, ?2, ?3, ?4, ?5)");
  ins.Bind(1, file_sha).Bind(2, path).Bind(3, summary.rows_landed).Bind(4, summary.rows_rejected).Bind(5, write.seq()).Run();
  summary.audit_hash = write.Commit("import outcomes " + path + ": " + std::to_string(summary.rows_landed) +
                                    " rows landed, " + std::to_string(summary.rows_rejected) + " rejected");
  return summary;
}

}  // namespace twinprobe
