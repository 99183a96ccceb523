// `twinprobe schedule [--due DATE] [--all]`: what to send and when. Overdue
// declines come first (ethics/README.md): an invitation not yet declined holds
// an employer's vacancy, which matters more than the next sending.
#include <cstdio>
#include <iostream>
#include <vector>

#include <nlohmann/json.hpp>

#include "cli/command.h"
#include "core/text.h"
#include "collector/declines.h"
#include "core/clock.h"
#include "core/ethics_gate.h"
#include "report/plural.h"
#include "planner/materials_check.h"
#include "planner/schedule.h"

namespace twinprobe {
namespace {

struct ScheduleOptions {
  std::string due;
  bool all = false;
};

nlohmann::json DeclinesJson(const std::vector<PendingDecline>& declines) {
  nlohmann::json rows = nlohmann::json::array();
  for (const auto& d : declines)
    rows.push_back({{"probe", d.probe_ref},
                    {"vacancy", d.vacancy_ref},
                    {"employer", d.employer_key},
                    {"profile", d.profile},
                    {"code", d.code},
                    {"received_at", d.received_at},
                    {"decline_by", FormatIsoTime(d.deadline)},
                    {"overdue", d.overdue}});
  return rows;
}

// Overdue declines first, then those still within their deadline.
void PrintDeclines(const Context& ctx, const std::vector<PendingDecline>& declines, int hours) {
  if (declines.empty()) return;
  size_t overdue = 0;
  for (const auto& d : declines) overdue += d.overdue;
  const std::string letter = StudyPath(ctx, kDeclineLetterPath);
  const std::string next = CommandFor(ctx, "decline PROBE");
  if (overdue > 0)
    std::cout << "OVERDUE: " << Count(static_cast<int64_t>(overdue), "positive response", "positive responses")
              << " not declined " << DeclineWithinWords(hours) << ". Decline now with " << letter << ", then run '"
              << next << "':\n";
  else
    std::cout << Count(static_cast<int64_t>(declines.size()), "positive response", "positive responses") << " to decline ("
              << letter << ", then '" << next << "'):\n";
  for (const auto& d : declines) {
    if (overdue > 0 && !d.overdue && &d == &declines[overdue])
      std::cout << "Still within the deadline:\n";
    std::cout << "  " << (d.overdue ? "overdue: " : "due: ") << DeclineDeadlineWords(d.code, d.probe_ref, d.deadline, hours)
              << "; vacancy " << d.vacancy_ref << " (" << d.employer_key << "), received " << d.received_at << "\n";
  }
  std::cout << "\n";
}

int RunSchedule(Context& ctx, const ScheduleOptions& o) {
  ScheduleQuery query;
  query.include_sent = o.all;
  if (!o.due.empty()) {
    auto t = ParseIsoTime(o.due);
    if (!t)
      return ReportError(BadInput("--due", "'" + o.due + "' " + WhyNotATime(o.due, "is not a date"), "write it as YYYY-MM-DD or YYYY-MM-DDTHH:MM"));
    // A date means "by the end of that day"; a time means "before that time".
    query.due_until = o.due.size() == 10 ? *t + 86400 : *t;
  }
  auto store = OpenStudyStore(ctx, false);
  if (!store.ok()) return ReportError(store.error());
  auto list = ListSchedule(*store.value(), query);
  if (!list.ok()) return ReportError(list.error());
  const auto& probes = list.value();
  // A listed probe whose file is not the one rendered for this plan would
  // send another plan's applicant: refuse the list, naming the first.
  for (const auto& p : probes)
    if (p.sent_at.empty())
      if (Status m = CheckProbeMaterial(*store.value(), ctx.study_dir, p.probe); !m.ok()) return ReportError(m.error());
  auto settings = LoadStudySettings(ctx, *store.value());
  if (!settings.ok()) return ReportError(settings.error());
  const int hours = settings.value().ethics.decline_within_hours;
  std::vector<PendingDecline> declines;
  if (hours > 0) declines = PendingDeclines(*store.value(), settings.value().outcomes, hours, NowEpoch());
  if (ctx.json) {
    nlohmann::json rows = nlohmann::json::array();
    for (const auto& p : probes)
      rows.push_back({{"probe", p.probe},
                      {"vacancy", p.vacancy},
                      {"employer", p.employer},
                      {"arm", p.arm},
                      {"profile", p.profile},
                      {"mailbox", p.mailbox},
                      {"phone", p.phone},
                      {"template", p.template_path},
                      {"send_order", p.send_order},
                      {"planned_at", p.planned_at},
                      {"sent_at", p.sent_at.empty() ? nlohmann::json() : nlohmann::json(p.sent_at)}});
    std::cout << nlohmann::json{{"due", o.due.empty() ? nlohmann::json() : nlohmann::json(o.due)},
                                {"include_sent", o.all},
                                {"declines", DeclinesJson(declines)},
                                {"count", probes.size()},
                                {"probes", rows}}
                     .dump(2)
              << "\n";
    return 0;
  }
  PrintDeclines(ctx, declines, hours);
  std::cout << Count(static_cast<int64_t>(probes.size()), "probe", "probes")
            << (o.all ? " in the plan" : " to send") << (o.due.empty() ? "" : " by " + o.due)
            << " (times UTC; mark each with 'twinprobe sent PROBE --at TIME'):\n";
  if (probes.empty()) return 0;
  size_t w_arm = 3, w_profile = 7, w_vac = 7;
  for (const auto& p : probes) {
    w_arm = std::max(w_arm, CodePoints(p.arm));
    w_profile = std::max(w_profile, CodePoints(p.profile));
    w_vac = std::max(w_vac, CodePoints(p.vacancy));
  }
  const auto pad = [](const std::string& s, size_t w) { return PadRight(s, w); };
  std::cout << "  " << pad("planned", 17) << "  " << pad("probe", 7) << "  " << pad("vacancy", w_vac) << "  "
            << pad("employer", 12) << "  #  " << pad("arm", w_arm) << "  " << pad("profile", w_profile)
            << "  template" << (o.all ? "  sent" : "") << "\n";
  for (const auto& p : probes) {
    std::string planned = p.planned_at.size() >= 16 ? p.planned_at.substr(0, 10) + " " + p.planned_at.substr(11, 5) : p.planned_at;
    std::cout << "  " << pad(planned, 17) << "  " << pad(p.probe, 7) << "  " << pad(p.vacancy, w_vac) << "  "
              << pad(p.employer, 12) << "  " << p.send_order << "  " << pad(p.arm, w_arm) << "  "
              << pad(p.profile, w_profile) << "  " << p.template_path;
    if (o.all) std::cout << "  " << (p.sent_at.empty() ? "-" : p.sent_at);
    std::cout << "\n";
  }
  std::cout << "Contact identities (mailbox, phone) are in 'schedule --json' and in the rendered materials.\n";
  return 0;
}

}  // namespace

void RegisterSchedule(CLI::App& app, Context& ctx) {
  auto o = std::make_shared<ScheduleOptions>();
  auto* schedule = app.add_subcommand("schedule", "List the probes to send and when (probe, vacancy, profile, template, time)");
  schedule->add_option("--due", o->due, "Only probes planned by the end of this day (YYYY-MM-DD) or before this time");
  schedule->add_flag("--all", o->all, "Include probes already marked as sent");
  schedule->callback([&ctx, o] { ctx.exit_code = RunSchedule(ctx, *o); });
}

}  // namespace twinprobe
