#include "core/verify_summary.h"

#include <optional>
#include <string>

#include "core/audit_summaries.h"
#include "core/store.h"

namespace twinprobe {
namespace {

// A query per command that returns, for each of its entries: seq, at, actor,
// summary as stored, whether the entry sealed exactly one row of its kind
// (else it cannot be one such entry, e.g. two responses under a record),
// then the facts its summary states. `rebuild` words them with the same
// function the command calls (core/audit_summaries.h); nullopt when the
// rows cannot make the summary (e.g. a response of no probe).
struct SummaryRule {
  const char* command;
  const char* needs_table;  // a table the query reads that older schema versions lack; nullptr: none
  const char* sql;
  std::optional<std::string> (*rebuild)(const Stmt& q);
};

int64_t IntOr0(const Stmt& q, int col) { return q.IsNull(col) ? 0 : q.Int(col); }

constexpr SummaryRule kRules[] = {
    {"record", nullptr, R"SQL(
SELECT a.seq, a.at, a.actor, a.summary,
  (SELECT count(*) FROM response x WHERE x.audit_seq = a.seq) = 1, p.ref, r.code, r.flags, r.supersedes
FROM audit a
LEFT JOIN response r ON r.id = (SELECT max(x.id) FROM response x WHERE x.audit_seq = a.seq)
LEFT JOIN probe p ON p.id = r.probe_id
WHERE a.command = 'record' ORDER BY a.seq)SQL",
     [](const Stmt& q) -> std::optional<std::string> {
       if (q.IsNull(5)) return std::nullopt;
       return RecordSummary(q.Text(5), q.Text(6), !q.IsNull(7) && q.Text(7) == "late", IntOr0(q, 8));
     }},
    {"sent", nullptr, R"SQL(
SELECT a.seq, a.at, a.actor, a.summary,
  (SELECT count(*) FROM sending x WHERE x.audit_seq = a.seq) = 1, p.ref, s.sent_at,
  (SELECT e.sent_at FROM sending e WHERE e.probe_id = s.probe_id AND e.id < s.id ORDER BY e.id DESC LIMIT 1)
FROM audit a
LEFT JOIN sending s ON s.id = (SELECT max(x.id) FROM sending x WHERE x.audit_seq = a.seq)
LEFT JOIN probe p ON p.id = s.probe_id
WHERE a.command = 'sent' ORDER BY a.seq)SQL",
     [](const Stmt& q) -> std::optional<std::string> {
       if (q.IsNull(5)) return std::nullopt;
       return SentSummary(q.Text(5), q.Text(6), q.IsNull(7) ? "" : q.Text(7));
     }},
    {"decline", nullptr, R"SQL(
SELECT a.seq, a.at, a.actor, a.summary,
  (SELECT count(*) FROM decline x WHERE x.audit_seq = a.seq) = 1, p.ref, d.declined_at
FROM audit a
LEFT JOIN decline d ON d.id = (SELECT max(x.id) FROM decline x WHERE x.audit_seq = a.seq)
LEFT JOIN probe p ON p.id = d.probe_id
WHERE a.command = 'decline' ORDER BY a.seq)SQL",
     [](const Stmt& q) -> std::optional<std::string> {
       if (q.IsNull(5)) return std::nullopt;
       return DeclineSummary(q.Text(5), q.Text(6));
     }},
    // A review either dismissed its message and recorded no response, or
    // recorded exactly the one response its decision names.
    {"review", nullptr, R"SQL(
SELECT a.seq, a.at, a.actor, a.summary,
  (SELECT count(*) FROM review_decision x WHERE x.audit_seq = a.seq) = 1, d.mail_message_id, d.decision,
  d.response_id IS NULL, (SELECT count(*) FROM response x WHERE x.audit_seq = a.seq),
  r.id IS NOT NULL, r.code, p.ref, r.supersedes
FROM audit a
LEFT JOIN review_decision d ON d.id = (SELECT max(x.id) FROM review_decision x WHERE x.audit_seq = a.seq)
LEFT JOIN response r ON r.id = d.response_id AND r.audit_seq = a.seq
LEFT JOIN probe p ON p.id = r.probe_id
WHERE a.command = 'review' ORDER BY a.seq)SQL",
     [](const Stmt& q) -> std::optional<std::string> {
       const int64_t responses = q.Int(8);
       if (q.Text(6) == "dismissed" && q.Int(7) && responses == 0) return ReviewDismissedSummary(q.Int(5));
       if (responses != 1 || !q.Int(9) || q.IsNull(11)) return std::nullopt;
       return ReviewRecordedSummary(q.Int(5), q.Text(6), q.Text(10), q.Text(11), IntOr0(q, 12));
     }},
    {"import outcomes", nullptr, R"SQL(
SELECT a.seq, a.at, a.actor, a.summary,
  (SELECT count(*) FROM import_file x WHERE x.audit_seq = a.seq AND x.kind = 'outcomes') = 1, f.path,
  (SELECT count(*) FROM response r WHERE r.audit_seq = a.seq), f.rows_rejected
FROM audit a
LEFT JOIN import_file f ON f.id = (SELECT max(x.id) FROM import_file x WHERE x.audit_seq = a.seq AND x.kind = 'outcomes')
WHERE a.command = 'import outcomes' ORDER BY a.seq)SQL",
     [](const Stmt& q) -> std::optional<std::string> {
       return ImportOutcomesSummary(q.Text(5), q.Int(6), q.Int(7));
     }},
    {"withdraw", "withdrawal", R"SQL(
SELECT a.seq, a.at, a.actor, a.summary,
  (SELECT count(*) FROM withdrawal x WHERE x.audit_seq = a.seq) = 1, v.ref, w.withdrawn_at, w.reason
FROM audit a
LEFT JOIN withdrawal w ON w.id = (SELECT max(x.id) FROM withdrawal x WHERE x.audit_seq = a.seq)
LEFT JOIN vacancy v ON v.id = w.vacancy_id
WHERE a.command = 'withdraw' ORDER BY a.seq)SQL",
     [](const Stmt& q) -> std::optional<std::string> {
       if (q.IsNull(5)) return std::nullopt;
       return WithdrawSummary(q.Text(5), q.Text(6), q.Text(7));
     }},
    {"monitor", "monitor_look", R"SQL(
SELECT a.seq, a.at, a.actor, a.summary,
  (SELECT count(*) FROM monitor_look x WHERE x.audit_seq = a.seq) = 1, m.look, m.kind, m.sets, m.planned_sets,
  m.reference_only, m.other_only, m.lower, m.alpha_spent, m.decision
FROM audit a
LEFT JOIN monitor_look m ON m.id = (SELECT max(x.id) FROM monitor_look x WHERE x.audit_seq = a.seq)
WHERE a.command = 'monitor' ORDER BY a.seq)SQL",
     [](const Stmt& q) -> std::optional<std::string> {
       if (q.IsNull(5)) return std::nullopt;
       return MonitorLookSummary(q.Int(5), q.Text(6), q.Int(7), q.Int(8), q.Int(9), q.Int(10), q.Int(11),
                                 q.Double(12), q.Text(13));
     }},
    {"import sendings", "sending_detail", R"SQL(
SELECT a.seq, a.at, a.actor, a.summary,
  (SELECT count(*) FROM import_file x WHERE x.audit_seq = a.seq AND x.kind = 'sendings') = 1, f.path,
  (SELECT count(*) FROM sending s WHERE s.audit_seq = a.seq), f.rows_rejected
FROM audit a
LEFT JOIN import_file f ON f.id = (SELECT max(x.id) FROM import_file x WHERE x.audit_seq = a.seq AND x.kind = 'sendings')
WHERE a.command = 'import sendings' ORDER BY a.seq)SQL",
     [](const Stmt& q) -> std::optional<std::string> {
       return ImportSendingsSummary(q.Text(5), q.Int(6), q.Int(7));
     }},
    // A handout writes one entry in each store: the main store's seals a
    // handout row with its vacancies, the office's first entry an
    // office_origin row with the plan's rows.
    {"handout", "handout", R"SQL(
SELECT a.seq, a.at, a.actor, a.summary,
  (SELECT count(*) FROM handout x WHERE x.audit_seq = a.seq) +
    (SELECT count(*) FROM office_origin x WHERE x.audit_seq = a.seq) = 1,
  h.id IS NOT NULL, h.office, (SELECT count(*) FROM handout_vacancy x WHERE x.handout_id = h.id AND x.audit_seq = a.seq),
  (SELECT count(*) FROM probe p JOIN handout_vacancy v ON v.vacancy_id = p.vacancy_id
     WHERE v.handout_id = h.id AND p.plan_id = h.plan_id), h.office_head,
  o.office, o.plan_hash, (SELECT count(*) FROM vacancy x WHERE x.audit_seq = a.seq),
  (SELECT count(*) FROM probe x WHERE x.audit_seq = a.seq)
FROM audit a
LEFT JOIN handout h ON h.id = (SELECT max(x.id) FROM handout x WHERE x.audit_seq = a.seq)
LEFT JOIN office_origin o ON o.id = (SELECT max(x.id) FROM office_origin x WHERE x.audit_seq = a.seq)
WHERE a.command = 'handout' ORDER BY a.seq)SQL",
     [](const Stmt& q) -> std::optional<std::string> {
       if (q.Int(5)) return HandoutSummary(q.Text(6), q.Int(7), q.Int(8), q.Text(9));
       if (q.IsNull(10)) return std::nullopt;
       return OfficeHandoutSummary(q.Text(10), q.Text(11), q.Int(12), q.Int(13));
     }},
    // A merge's counts come from merged_row, and the rows it sealed must be
    // exactly those: every sending and decline one merged row, every response
    // one merged row or one restatement of a choice for the main store.
    {"merge", "office_merge", R"SQL(
SELECT a.seq, a.at, a.actor, a.summary,
  (SELECT count(*) FROM office_merge x WHERE x.audit_seq = a.seq) = 1, m.office, m.office_head_seq, m.office_head,
  (SELECT count(*) FROM merged_row x WHERE x.audit_seq = a.seq AND x.tbl = 'sending'),
  (SELECT count(*) FROM merged_row x WHERE x.audit_seq = a.seq AND x.tbl = 'response'),
  (SELECT count(*) FROM merged_row x WHERE x.audit_seq = a.seq AND x.tbl = 'decline'),
  (SELECT count(*) FROM merged_row x WHERE x.audit_seq = a.seq AND x.tbl = 'mail_message'),
  (SELECT count(*) FROM merged_row x WHERE x.audit_seq = a.seq AND x.tbl = 'review_decision'),
  (SELECT count(*) FROM merge_choice x WHERE x.audit_seq = a.seq),
  (SELECT count(*) FROM sending x WHERE x.audit_seq = a.seq),
  (SELECT count(*) FROM decline x WHERE x.audit_seq = a.seq),
  (SELECT count(*) FROM response x WHERE x.audit_seq = a.seq),
  (SELECT count(*) FROM merge_choice x WHERE x.audit_seq = a.seq AND x.prefer = 'main')
FROM audit a
LEFT JOIN office_merge m ON m.id = (SELECT max(x.id) FROM office_merge x WHERE x.audit_seq = a.seq)
WHERE a.command = 'merge' ORDER BY a.seq)SQL",
     [](const Stmt& q) -> std::optional<std::string> {
       MergedRowCounts c;
       c.sendings = q.Int(8);
       c.responses = q.Int(9);
       c.declines = q.Int(10);
       c.mail_messages = q.Int(11);
       c.review_decisions = q.Int(12);
       c.choices = q.Int(13);
       if (q.Int(14) != c.sendings || q.Int(15) != c.declines || q.Int(16) != c.responses + q.Int(17))
         return std::nullopt;
       return MergeSummary(q.Text(5), q.Int(6), q.Text(7), c);
     }},
};

}  // namespace

std::vector<AuditProblem> CheckSummaries(Store& store) {
  std::vector<AuditProblem> out;
  for (const SummaryRule& rule : kRules) {
    if (rule.needs_table) {
      Stmt has = store.Prepare("SELECT count(*) FROM sqlite_master WHERE type = 'table' AND name = ?1");
      has.Bind(1, rule.needs_table);
      if (!has.Step() || has.Int(0) == 0) continue;  // a store of an older version: no such entries
    }
    Stmt q = store.Prepare(rule.sql);
    while (q.Step()) {
      const std::string stored = q.Text(3);
      std::optional<std::string> rebuilt = q.Int(4) ? rule.rebuild(q) : std::nullopt;
      if (rebuilt && *rebuilt == stored) continue;
      AuditProblem p(q.Int(0), !rebuilt ? "its summary says '" + stored +
                                              "' but the rows it sealed are not one such " + rule.command
                                        : "its summary says '" + stored + "' but the rows it sealed say '" +
                                              *rebuilt + "'");
      p.command = rule.command;
      p.at = q.Text(1);
      p.actor = q.Text(2);
      p.summary = stored;
      out.push_back(std::move(p));
    }
  }
  return out;
}

}  // namespace twinprobe
