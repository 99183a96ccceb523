// `withdraw VACANCY --reason TEXT [--at TIME]`: take a vacancy out of the
// study (collector/withdrawals.h).
#include <iostream>

#include <nlohmann/json.hpp>

#include "cli/command.h"
#include "collector/withdrawals.h"
#include "core/terminal_text.h"
#include "report/plural.h"

namespace twinprobe {
namespace {

struct WithdrawOptions {
  std::string vacancy, reason, at;
};

// What happened, then what it changes: the schedule, the analysis, and
// what is kept.
std::string WithdrawalText(const WithdrawalRecord& w) {
  const std::string reason = ForTerminal(w.reason);
  if (w.already)
    return "Vacancy " + ForTerminal(w.vacancy_ref) + " was already withdrawn at " + w.withdrawn_at + " (" + reason +
           "); nothing recorded.\n";
  std::string o = "Withdrew vacancy " + ForTerminal(w.vacancy_ref) + " at " + w.withdrawn_at + " (" + reason + ").\n";
  if (w.unsent > 0)
    o += Count(w.unsent, "unsent application leaves", "unsent applications leave") +
         " the schedule; 'twinprobe sent' refuses " + (w.unsent == 1 ? "it" : "them") + ".\n";
  o += "Its set leaves the primary analysis and is counted as withdrawn in the flow of the study.\n";
  if (w.responses > 0)
    o += Count(w.responses, "response", "responses") + " already recorded " + (w.responses == 1 ? "stays" : "stay") +
         " in the store and in 'twinprobe history'.\n";
  return o;
}

int RunWithdraw(Context& ctx, const WithdrawOptions& o) {
  auto store = OpenStudyStore(ctx, false);
  if (!store.ok()) return ReportError(store.error());
  auto r = WithdrawVacancy(*store.value(), o.vacancy, o.reason, o.at);
  if (!r.ok()) return ReportError(r.error());
  const WithdrawalRecord& w = r.value();
  if (ctx.json)
    std::cout << nlohmann::json{{"vacancy", w.vacancy_ref},   {"reason", w.reason},
                                {"withdrawn_at", w.withdrawn_at}, {"already_withdrawn", w.already},
                                {"probes", w.probes},          {"unsent_probes", w.unsent},
                                {"responses_kept", w.responses}}
                     .dump(2)
              << "\n";
  else
    std::cout << WithdrawalText(w);
  return 0;
}

}  // namespace

void RegisterWithdraw(CLI::App& app, Context& ctx) {
  auto o = std::make_shared<WithdrawOptions>();
  auto* withdraw = app.add_subcommand(
      "withdraw",
      "Take a vacancy out of the study (posting closed, test seen through, listing error): its unsent applications "
      "leave the schedule and its set leaves the analysis");
  withdraw->add_option("vacancy", o->vacancy, "Vacancy reference, as in 'twinprobe schedule'")->required();
  withdraw->add_option("--reason", o->reason, "Why, in one line, e.g. \"the posting closed\"")->required();
  withdraw->add_option("--at", o->at, "When it was withdrawn (YYYY-MM-DD[THH:MM], UTC); default now");
  withdraw->callback([&ctx, o] { ctx.exit_code = RunWithdraw(ctx, *o); });
}

}  // namespace twinprobe
