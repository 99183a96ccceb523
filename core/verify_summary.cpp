#include "core/verify_summary.h"

#include <string>

#include "core/store.h"

namespace twinprobe {
namespace {

// A query per command that returns, for each of its entries: seq, at, actor,
// summary as stored, then the summary rebuilt from the sealed rows (NULL
// when the rows cannot be one such entry, e.g. two responses under a record).
struct SummaryRule {
  const char* command;
  const char* sql;
};

// Every rule keeps to the wording of the command that writes the entry:
//   record    collector/responses.cpp RecordResponse
//   sent      collector/responses.cpp RecordSending
//   decline   collector/declines.cpp RecordDecline
//   review    collector/mail_review.cpp Review
//   import outcomes  collector/import_outcomes.cpp ImportOutcomes
constexpr SummaryRule kRules[] = {
    {"record", R"SQL(
SELECT a.seq, a.at, a.actor, a.summary,
  (SELECT CASE WHEN count(*) = 1 THEN
     'record ' || max(p.ref) || ' ' || max(r.code) ||
     CASE WHEN max(r.flags) = 'late' THEN ' (late)' ELSE '' END ||
     CASE WHEN max(r.supersedes) IS NOT NULL THEN ' (supersedes response ' || max(r.supersedes) || ')' ELSE '' END
   END
   FROM response r LEFT JOIN probe p ON p.id = r.probe_id WHERE r.audit_seq = a.seq)
FROM audit a WHERE a.command = 'record' ORDER BY a.seq)SQL"},
    {"sent", R"SQL(
SELECT a.seq, a.at, a.actor, a.summary,
  CASE WHEN (SELECT count(*) FROM sending s WHERE s.audit_seq = a.seq) = 1 THEN
    (SELECT 'sent ' || p.ref || ' at ' || s.sent_at ||
            coalesce(' (replaces ' || (SELECT e.sent_at FROM sending e WHERE e.probe_id = s.probe_id AND e.id < s.id
                                       ORDER BY e.id DESC LIMIT 1) || ')', '')
     FROM sending s LEFT JOIN probe p ON p.id = s.probe_id WHERE s.audit_seq = a.seq)
  END
FROM audit a WHERE a.command = 'sent' ORDER BY a.seq)SQL"},
    {"decline", R"SQL(
SELECT a.seq, a.at, a.actor, a.summary,
  (SELECT CASE WHEN count(*) = 1 THEN 'decline ' || max(p.ref) || ' at ' || max(d.declined_at) END
   FROM decline d LEFT JOIN probe p ON p.id = d.probe_id WHERE d.audit_seq = a.seq)
FROM audit a WHERE a.command = 'decline' ORDER BY a.seq)SQL"},
    {"review", R"SQL(
SELECT a.seq, a.at, a.actor, a.summary,
  CASE WHEN (SELECT count(*) FROM review_decision d WHERE d.audit_seq = a.seq) = 1 THEN
    (SELECT CASE
       WHEN d.decision = 'dismissed' AND d.response_id IS NULL
            AND NOT EXISTS (SELECT 1 FROM response x WHERE x.audit_seq = a.seq)
         THEN 'review message ' || d.mail_message_id || ': dismissed (no response recorded)'
       WHEN (SELECT count(*) FROM response x WHERE x.audit_seq = a.seq) = 1
         THEN (SELECT 'review message ' || d.mail_message_id || ': ' || d.decision || ' ' || r.code || ' for ' ||
                      p.ref || coalesce(' (supersedes response ' || r.supersedes || ')', '')
               FROM response r LEFT JOIN probe p ON p.id = r.probe_id
               WHERE r.audit_seq = a.seq AND r.id = d.response_id)
     END
     FROM review_decision d WHERE d.audit_seq = a.seq)
  END
FROM audit a WHERE a.command = 'review' ORDER BY a.seq)SQL"},
    {"import outcomes", R"SQL(
SELECT a.seq, a.at, a.actor, a.summary,
  (SELECT CASE WHEN count(*) = 1 THEN
     'import outcomes ' || max(f.path) || ': ' ||
     (SELECT count(*) FROM response r WHERE r.audit_seq = a.seq) || ' rows landed, ' || max(f.rows_rejected) ||
     ' rejected'
   END
   FROM import_file f WHERE f.audit_seq = a.seq AND f.kind = 'outcomes')
FROM audit a WHERE a.command = 'import outcomes' ORDER BY a.seq)SQL"},
};

}  // namespace

std::vector<AuditProblem> CheckSummaries(Store& store) {
  std::vector<AuditProblem> out;
  for (const SummaryRule& rule : kRules) {
    Stmt q = store.Prepare(rule.sql);
    while (q.Step()) {
      const std::string stored = q.Text(3);
      if (!q.IsNull(4) && q.Text(4) == stored) continue;
      AuditProblem p(q.Int(0), q.IsNull(4) ? "its summary says '" + stored +
                                                 "' but the rows it sealed are not one such " + rule.command
                                           : "its summary says '" + stored + "' but the rows it sealed say '" +
                                                 q.Text(4) + "'");
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
