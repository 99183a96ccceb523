#include "collector/withdrawals.h"

#include <algorithm>

#include "collector/event_time.h"
#include "core/audit.h"
#include "core/audit_summaries.h"
#include "core/plan_rows.h"
#include "core/suggest.h"
#include "core/text.h"
#include "core/withdrawal_records.h"

namespace twinprobe {

Result<WithdrawalRecord> WithdrawVacancy(Store& store, const std::string& vacancy_ref, const std::string& reason,
                                         const std::string& withdrawn_at) {
  if (!HasCurrentPlan(store))
    return BadInput(store.path(), "the store holds no plan yet, so there is no vacancy to withdraw",
                    "run 'twinprobe plan' first");
  AuditedWrite write(store, "withdraw");
  const int64_t vacancy_id = FindVacancy(store, vacancy_ref);
  if (vacancy_id == 0)
    return BadInput("", "unknown vacancy '" + vacancy_ref + "'" + DidYouMean(vacancy_ref, VacancyRefs(store)),
                    "use a vacancy reference from 'twinprobe schedule' (its VACANCY column)");
  // The reason is stored and shown in the audit log, one entry per line.
  const std::string why(Trim(reason));
  if (why.empty())
    return BadInput("", "a withdrawal needs a reason",
                    "say why with --reason, e.g. --reason \"the posting closed before the second application\"");
  if (std::any_of(why.begin(), why.end(), [](unsigned char c) { return c < 0x20 || c == 0x7f; }))
    return BadInput("", "the reason holds a line break or control character",
                    "write the reason on one line of plain text");
  const std::string at_text = withdrawn_at.empty() ? write.at() : withdrawn_at;
  auto at = ParseEventTime(at_text);
  if (!at)
    return BadInput("", "'" + at_text + "' is not a date or time", "write it as YYYY-MM-DD or YYYY-MM-DDTHH:MM (UTC)");

  const VacancyProbeCounts counts = CountVacancyProbes(store, vacancy_id);
  WithdrawalRecord out{vacancy_ref, why, at->text(), false, counts.probes, counts.unsent, counts.responses};
  if (auto first = WithdrawalOfVacancy(store, vacancy_id)) {
    out.reason = first->reason;
    out.withdrawn_at = first->withdrawn_at;
    out.already = true;
    return out;  // nothing written; the transaction rolls back
  }
  InsertWithdrawal(store, {vacancy_id, out.reason, out.withdrawn_at, write.actor(), write.at(), write.seq()});
  write.Commit(WithdrawSummary(vacancy_ref, out.withdrawn_at, out.reason));
  return out;
}

}  // namespace twinprobe
