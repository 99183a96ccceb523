// `twinprobe monitor`: interim monitoring of a paired study with a
// group-sequential exact McNemar test and Lan–DeMets alpha spending
// (stats/sequential.h). Each look it takes is stored and sealed
// (core/monitor_looks.h); a run that takes no new look writes nothing.
//
// The analysis itself (looks, boundaries, decision) is analysis/monitor.h;
// this file parses the options and prints.
#include <algorithm>
#include <cstdio>
#include <iostream>
#include <map>
#include <sstream>

#include <nlohmann/json.hpp>

#include "analysis/analyze.h"
#include "analysis/monitor.h"
#include "cli/command.h"
#include "core/clock.h"
#include "report/monitor_decision.h"
#include "report/p_value.h"
#include "report/plural.h"
#include "core/monitor_looks.h"
#include "core/read_study.h"
#include "stats/mcnemar.h"
#include "stats/sequential.h"

namespace twinprobe {
namespace {

using nlohmann::json;

struct MonitorOptions {
  std::string spending;  // "" = the design's [analysis].spending
  bool look_now = false;
  bool final_now = false;
};

std::string SpendingDeviation(const std::string& used, const std::string& planned) {
  return "Deviation: --spending " + used + " differs from the design's [analysis].spending = \"" + planned +
         "\"; the looks taken with it are stored with " + used + " and listed as deviations.";
}

// Which looks are records from earlier runs and which this run stored.
std::string LooksTakenText(const MonitorResult& m) {
  size_t before = 0;
  for (const MonitorLook& l : m.reached) before += l.stored ? 1 : 0;
  std::string s;
  if (before > 0) s += Count(static_cast<int64_t>(before), "look was", "looks were") + " taken before (stored). ";
  if (m.new_looks.empty()) return s + "No new look is due: nothing stored.\n";
  s += "Stored now: ";
  for (size_t i = 0; i < m.new_looks.size(); ++i)
    s += (i ? ", " : "") + std::string("look ") + std::to_string(m.new_looks[i].look) + " (" + m.new_looks[i].kind +
         ", " + std::to_string(m.new_looks[i].sets) + " sets)";
  return s + ".\n";
}

std::string Fmt(const char* format, double v) {
  char buf[64];
  std::snprintf(buf, sizeof buf, format, v);
  return buf;
}

int RunMonitor(Context& ctx, const MonitorOptions& o) {
  stats::Spending spending;
  if (!o.spending.empty() && !stats::ParseSpending(o.spending, spending))
    return ReportError(BadInput("--spending", "unknown spending function '" + o.spending + "'",
                                "use obf (O'Brien\u2013Fleming type) or pocock (Pocock type)"));
  auto store = OpenStudyStore(ctx, false);
  if (!store.ok()) return ReportError(store.error());
  auto settings = LoadStudySettings(ctx, *store.value());
  if (!settings.ok()) return ReportError(settings.error());
  const AnalysisPlan& plan = settings.value().analysis;
  // The spending function is part of the frozen monitoring plan; a different
  // one on the command line is used, stored with the looks and said to be a
  // deviation (analyze lists it too).
  const std::string spending_name = o.spending.empty() ? plan.spending : o.spending;
  stats::ParseSpending(spending_name, spending);
  const bool spending_deviates = spending_name != plan.spending;
  const OutcomeScheme& scheme = settings.value().outcomes;
  const StudyReading reading = ReadStudy(*store.value(), scheme, FieldworkOptions{.completion_order = true, .now = std::nullopt});
  auto analysis = Analyze(reading, store.value()->path(), scheme, plan);
  if (!analysis.ok()) return ReportError(analysis.error());
  const AnalysisResult& r = analysis.value();
  if (!r.has_paired)
    return ReportError(BadInput(StorePath(ctx),
                                "monitor needs a paired design (two arms, a set of two probes per vacancy)",
                                "for other designs run 'twinprobe analyze' at the end of fieldwork"));
  MonitorInput in;
  in.completed = reading.fieldwork.completed;
  in.planned_sets = r.sets_analysed + r.sets_open + r.sets_incomplete;  // every set of the plan, open ones too
  in.looks = plan.looks;
  in.alpha = plan.alpha;
  in.spending = spending;
  in.look_now = o.look_now;
  in.final_now = o.final_now;
  in.stored = reading.monitor_looks;
  const MonitorResult m = RunMonitor(in);
  if (m.decision == "nothing_complete")
    return ReportError(BadInput(StorePath(ctx), "no set is complete yet", "record sendings before the final analysis"));
  // Every look taken now becomes a record, one audited write each.
  std::vector<StoredLook> taken = reading.monitor_looks;
  for (const StoredLook& l : m.new_looks) taken.push_back(RecordMonitorLook(*store.value(), l, nullptr));
  const int64_t planned_sets = in.planned_sets;
  const int64_t done = m.completed_sets;
  const double alpha = plan.alpha;
  const auto& schedule = m.schedule;
  const auto& reached = m.reached;
  const auto& bounds = m.bounds;
  const int stopped = m.stopped;
  const std::string& decision = m.decision;
  const int64_t next_look = m.next_look;
  const size_t shown = m.shown;
  const double adjusted_p = m.adjusted_p;

  json looks = json::array();
  for (size_t k = 0; k < shown; ++k) {
    const MonitorLook& l = reached[k];
    const auto& bd = bounds[k];
    looks.push_back({{"look", k + 1},
                     {"sets", l.sets},
                     {"planned", l.planned},
                     {"final", l.final},
                     {"information", bd.information},
                     {"discordant", bd.n_discordant},
                     {"reference_only", l.b},
                     {"other_only", l.c},
                     {"stop_at", bd.lower >= 0 ? json(bd.upper()) : json(nullptr)},
                     {"alpha_allowed", bd.alpha_allowed},
                     {"alpha_spent", bd.alpha_spent},
                     {"crossed", bd.crossed_by(l.b)},
                     {"kind", l.Kind()},
                     {"taken_at", k < taken.size() ? json(taken[k].taken_at) : json(nullptr)},
                     {"taken_before", l.stored},
                     {"nominal_p", stats::McNemarExactP(stats::PairedCounts{0, l.b, l.c, 0})}});
  }
  std::vector<int64_t> schedule_sets;
  for (const MonitorLook& l : schedule) schedule_sets.push_back(l.sets);

  if (ctx.json) {
    json j{{"study_id", r.study_id},
           {"alpha", alpha},
           {"spending", stats::SpendingName(spending)},
           {"design_spending", plan.spending},
           {"deviation", spending_deviates ? json(SpendingDeviation(spending_name, plan.spending)) : json(nullptr)},
           {"new_looks", m.new_looks.size()},
           {"planned_sets", planned_sets},
           {"completed_sets", done},
           {"schedule", schedule_sets},
           {"looks", looks},
           {"decision", decision},
           {"decision_text", MonitorDecisionText(m, alpha, r.reference_label, r.other_label)},
           {"stopped_at_look", stopped >= 0 ? json(stopped + 1) : json(nullptr)},
           {"adjusted_p", adjusted_p >= 0 ? json(adjusted_p) : json(nullptr)},
           {"next_look_sets", next_look > 0 ? json(next_look) : json(nullptr)},
           {"exact_type_i_error_so_far", shown ? json(bounds[shown - 1].alpha_spent) : json(0.0)}};
    if (stopped >= 0)
      j["favoured"] = reached[stopped].b > reached[stopped].c ? r.reference_label : r.other_label;
    std::cout << j.dump(2) << "\n";
    return 0;
  }

  std::ostringstream t;
  t << "Interim monitoring: " << r.title << "\n"
    << "Group-sequential exact McNemar test on the discordant sets, two-sided alpha " << Fmt("%g", alpha) << ",\n"
    << "Lan\u2013DeMets " << stats::SpendingLabel(spending) << " alpha spending. Reference arm " << r.reference_label
    << ", other arm " << r.other_label << ".\n"
    << "Looks count completed sets in the order they completed; schedule:";
  // (the looks taken come first, as stored)
  for (size_t i = 0; i < schedule.size(); ++i)
    t << (i ? "," : "") << " " << schedule[i].sets
      << (schedule[i].final     ? " (final)"
          : schedule[i].planned ? ""
                                : " (unplanned)");
  t << ". Completed so far: " << done << " of " << planned_sets << " planned sets.\n";
  if (!looks.empty()) {
    t << "\n  look    sets  information  discordant  ref only / other only  stop at  alpha spent / allowed  crossed\n";
    for (size_t k = 0; k < shown; ++k) {
      const auto& bd = bounds[k];
      const MonitorLook& l = reached[k];
      char line[200];
      std::snprintf(line, sizeof line, "  %4zu  %6lld  %11.3f  %10lld  %8lld / %-10lld  %7s  %9s / %-9s  %s\n", k + 1,
                    static_cast<long long>(l.sets), bd.information, static_cast<long long>(bd.n_discordant),
                    static_cast<long long>(l.b), static_cast<long long>(l.c),
                    bd.lower >= 0 ? std::to_string(bd.upper()).c_str() : "-", FormatP(bd.alpha_spent).c_str(),
                    FormatP(bd.alpha_allowed).c_str(), bd.crossed_by(l.b) ? "yes" : "no");
      t << line;
    }
    t << "  (stop at: the boundary is crossed when either arm alone is called back in at least that many of the\n"
         "   discordant sets; '-': too few discordant sets to stop at this look.)\n";
  }
  t << "\n" << LooksTakenText(m);
  if (spending_deviates) t << SpendingDeviation(spending_name, plan.spending) << "\n";
  t << "\n" << MonitorDecisionText(m, alpha, r.reference_label, r.other_label);
  std::cout << t.str();
  return 0;
}

}  // namespace

void RegisterMonitor(CLI::App& app, Context& ctx) {
  auto o = std::make_shared<MonitorOptions>();
  auto* cmd = app.add_subcommand(
      "monitor", "Interim looks: group-sequential exact McNemar test with Lan\u2013DeMets alpha spending");
  cmd->add_option("--spending", o->spending,
                  "Spending function, if not the design's [analysis].spending (obf or pocock); a different one is a "
                  "deviation");
  cmd->add_flag("--look-now", o->look_now,
                "Take and store an unplanned look at the current number of completed sets (spends alpha for it)");
  cmd->add_flag("--final", o->final_now,
                "Treat the sets completed now as the final analysis (fieldwork ended early; spends all alpha left)");
  cmd->callback([&ctx, o] { ctx.exit_code = RunMonitor(ctx, *o); });
}

}  // namespace twinprobe
