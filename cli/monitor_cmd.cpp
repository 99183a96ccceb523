// `twinprobe monitor`: interim monitoring of a paired study with a
// group-sequential exact McNemar test and Lan–DeMets alpha spending
// (stats/sequential.h). Reads the store, writes nothing.
//
// How looks are defined: a set is complete when every probe of it was sent
// (or, for imported data, has an outcome), as in `analyze`. It completes at
// the time of its last sending (for a probe never marked sent, the time of its
// response). Sets are ordered by that time (ties by vacancy), and look k
// analyses the first s_k completed sets with their current outcomes, s_k being
// the [analysis] looks of study.toml plus the final analysis at all planned
// sets. Information at look k is s_k / (planned sets); the exact boundaries use
// the discordant counts actually observed among those sets. The completion
// order depends only on sending times, never on outcomes, so looking does not
// steer which sets a look sees.
#include <algorithm>
#include <cstdio>
#include <iostream>
#include <map>
#include <sstream>

#include <nlohmann/json.hpp>

#include "analysis/analyze.h"
#include "cli/command.h"
#include "core/clock.h"
#include "report/p_value.h"
#include "stats/mcnemar.h"
#include "stats/sequential.h"

namespace twinprobe {
namespace {

using nlohmann::json;

struct CompletedSet {
  int64_t vacancy_id = 0;
  int64_t completed_at = 0;  // epoch seconds
  bool reference_positive = false;
  bool other_positive = false;
};

// Every complete set of the current plan, in completion order. Fails (as an
// internal error) if its totals disagree with Analyze(), so the two readings
// of the store cannot drift apart.
Result<std::vector<CompletedSet>> ReadCompletedSets(Store& store, const OutcomeScheme& scheme,
                                                    const AnalysisResult& analysis) {
  Stmt ref = store.Prepare(
      "SELECT id FROM arm WHERE plan_id = (SELECT id FROM current_plan) ORDER BY is_reference DESC, id LIMIT 1");
  if (!ref.Step()) return Internal("the current plan has no arms");
  const int64_t reference_arm = ref.Int(0);
  Stmt q = store.Prepare(
      "SELECT p.vacancy_id, p.arm_id, "
      "  (SELECT min(s.sent_at) FROM sending s WHERE s.probe_id = p.id), "
      "  (SELECT code FROM current_response r WHERE r.probe_id = p.id ORDER BY r.id DESC LIMIT 1), "
      "  (SELECT coalesce(r.received_at, r.entered_at) FROM current_response r WHERE r.probe_id = p.id "
      "   ORDER BY r.id DESC LIMIT 1) "
      "FROM current_probe p ORDER BY p.vacancy_id, p.id");
  struct Acc {
    bool complete = true;
    int probes = 0;
    int64_t at = 0;
    CompletedSet set;
  };
  std::map<int64_t, Acc> sets;
  while (q.Step()) {
    Acc& a = sets[q.Int(0)];
    a.set.vacancy_id = q.Int(0);
    ++a.probes;
    const bool sent = !q.IsNull(2);
    const bool has_response = !q.IsNull(3);
    if (!sent && !has_response) {
      a.complete = false;
      continue;
    }
    const std::string when = sent ? q.Text(2) : (q.IsNull(4) ? std::string() : q.Text(4));
    a.at = std::max(a.at, ParseIsoTime(when).value_or(0));
    const bool positive = has_response && scheme.is_positive(q.Text(3));
    (q.Int(1) == reference_arm ? a.set.reference_positive : a.set.other_positive) |= positive;
  }
  std::vector<CompletedSet> out;
  stats::PairedCounts total;
  for (auto& [id, a] : sets) {
    if (!a.complete || a.probes != 2) continue;
    a.set.completed_at = a.at;
    out.push_back(a.set);
    const auto& s = a.set;
    (s.reference_positive ? (s.other_positive ? total.a : total.b) : (s.other_positive ? total.c : total.d)) += 1;
  }
  std::stable_sort(out.begin(), out.end(),
                   [](const CompletedSet& x, const CompletedSet& y) { return x.completed_at < y.completed_at; });
  const auto& p = analysis.paired;
  if (total.a != p.a || total.b != p.b || total.c != p.c || total.d != p.d)
    return Internal("monitor and analyze read different paired tables from the store");
  return out;
}

struct MonitorOptions {
  std::string spending = "obf";
  bool look_now = false;
  bool final_now = false;
};

struct Look {
  int64_t sets = 0;
  bool planned = true;
  bool final = false;
  int64_t b = 0, c = 0;
};

std::string Fmt(const char* format, double v) {
  char buf[64];
  std::snprintf(buf, sizeof buf, format, v);
  return buf;
}

int RunMonitor(Context& ctx, const MonitorOptions& o) {
  stats::Spending spending;
  if (!stats::ParseSpending(o.spending, spending))
    return ReportError(BadInput("--spending", "unknown spending function '" + o.spending + "'",
                                "use obf (O'Brien\u2013Fleming type) or pocock (Pocock type)"));
  auto store = OpenStudyStore(ctx, false);
  if (!store.ok()) return ReportError(store.error());
  auto settings = LoadStudySettings(ctx, *store.value());
  if (!settings.ok()) return ReportError(settings.error());
  const AnalysisPlan& plan = settings.value().analysis;
  auto analysis = Analyze(*store.value(), settings.value().outcomes, plan);
  if (!analysis.ok()) return ReportError(analysis.error());
  const AnalysisResult& r = analysis.value();
  if (!r.has_paired)
    return ReportError(BadInput(StorePath(ctx),
                                "monitor needs a paired design (two arms, a set of two probes per vacancy)",
                                "for other designs run 'twinprobe analyze' at the end of fieldwork"));
  auto sets = ReadCompletedSets(*store.value(), settings.value().outcomes, r);
  if (!sets.ok()) return ReportError(sets.error());
  const auto& completed = sets.value();
  const int64_t planned_sets = r.sets_analysed + r.sets_incomplete;
  const int64_t done = static_cast<int64_t>(completed.size());
  const double alpha = plan.alpha;

  // The schedule: planned interim looks below the planned total, then the
  // final analysis at all planned sets (or now, with --final).
  std::vector<Look> schedule;
  std::vector<int> planned_looks = plan.looks;
  std::sort(planned_looks.begin(), planned_looks.end());
  planned_looks.erase(std::unique(planned_looks.begin(), planned_looks.end()), planned_looks.end());
  for (int s : planned_looks)
    if (s > 0 && s < planned_sets) schedule.push_back({s, true, false, 0, 0});
  if (o.final_now) {
    std::erase_if(schedule, [&](const Look& l) { return l.sets >= done; });
    schedule.push_back({done, false, true, 0, 0});
  } else {
    if (o.look_now && done > 0 && done < planned_sets &&
        std::none_of(schedule.begin(), schedule.end(), [&](const Look& l) { return l.sets == done; })) {
      schedule.push_back({done, false, false, 0, 0});
      std::sort(schedule.begin(), schedule.end(), [](const Look& a, const Look& b) { return a.sets < b.sets; });
    }
    schedule.push_back({planned_sets, true, true, 0, 0});
  }
  if (done == 0 && o.final_now)
    return ReportError(BadInput(StorePath(ctx), "no set is complete yet", "record sendings before the final analysis"));

  // Counts at each reached look.
  std::vector<Look> reached;
  std::vector<stats::SequentialLook> seq;
  for (Look l : schedule) {
    if (l.sets > done) break;
    for (int64_t i = 0; i < l.sets; ++i) {
      const auto& s = completed[i];
      if (s.reference_positive && !s.other_positive) ++l.b;
      if (s.other_positive && !s.reference_positive) ++l.c;
    }
    reached.push_back(l);
    seq.push_back({l.final ? 1.0 : static_cast<double>(l.sets) / static_cast<double>(planned_sets), l.b + l.c});
  }
  const auto bounds = stats::ExactSequentialBoundaries(seq, alpha, spending);
  int stopped = -1;
  for (size_t k = 0; k < reached.size(); ++k)
    if (bounds[k].crossed_by(reached[k].b)) {
      stopped = static_cast<int>(k);
      break;
    }
  const bool final_reached = !reached.empty() && reached.back().final;
  std::string decision = stopped >= 0 ? "stop" : final_reached ? "final" : reached.empty() ? "waiting" : "continue";
  int64_t next_look = 0;
  if (stopped < 0 && !final_reached)
    for (const Look& l : schedule)
      if (l.sets > done) {
        next_look = l.sets;
        break;
      }
  // Shown looks: up to the stop, if any.
  const size_t shown = stopped >= 0 ? static_cast<size_t>(stopped) + 1 : reached.size();
  double adjusted_p = -1;
  if (stopped >= 0) adjusted_p = stats::StagewisePValue(bounds, static_cast<size_t>(stopped), reached[stopped].b);
  else if (final_reached) adjusted_p = stats::StagewisePValue(bounds, reached.size() - 1, reached.back().b);

  json looks = json::array();
  for (size_t k = 0; k < shown; ++k) {
    const Look& l = reached[k];
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
                     {"nominal_p", stats::McNemarExactP(stats::PairedCounts{0, l.b, l.c, 0})}});
  }
  std::vector<int64_t> schedule_sets;
  for (const Look& l : schedule) schedule_sets.push_back(l.sets);

  if (ctx.json) {
    json j{{"study_id", r.study_id},
           {"alpha", alpha},
           {"spending", stats::SpendingName(spending)},
           {"planned_sets", planned_sets},
           {"completed_sets", done},
           {"schedule", schedule_sets},
           {"looks", looks},
           {"decision", decision},
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
      const Look& l = reached[k];
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
  t << "\n";
  if (decision == "waiting") {
    t << "Decision: continue. No look has been reached yet; the first is at " << next_look << " completed sets ("
      << done << " so far).\n";
  } else if (decision == "continue") {
    t << "Decision: continue. No boundary has been crossed. The next look is at " << next_look << " completed sets ("
      << done << " so far).\n";
  } else if (decision == "stop") {
    const Look& l = reached[stopped];
    const bool ref = l.b > l.c;
    t << (l.final ? "Decision: the final analysis crosses the boundary. At look " : "Decision: stop. At look ")
      << stopped + 1 << " (" << l.sets << " completed sets) the "
      << (ref ? r.reference_label : r.other_label) << " arm alone was called back in " << std::max(l.b, l.c) << " of "
      << l.b + l.c << " discordant sets, crossing the boundary of " << bounds[stopped].upper() << ".\n"
      << "Adjusted p-value (stage-wise ordering): " << FormatP(adjusted_p)
      << (l.final ? ". The study shows a difference at the planned overall alpha "
                  : ". The evidence so far shows a difference at the planned overall alpha ")
      << Fmt("%g", alpha) << ".\n";
  } else {
    t << "Decision: final analysis reached without crossing a boundary: the study does not show a difference at\n"
      << "overall alpha " << Fmt("%g", alpha) << ". Adjusted p-value (stage-wise ordering): " << FormatP(adjusted_p)
      << ".\n";
  }
  std::cout << t.str();
  return 0;
}

}  // namespace

void RegisterMonitor(CLI::App& app, Context& ctx) {
  auto o = std::make_shared<MonitorOptions>();
  auto* cmd = app.add_subcommand(
      "monitor", "Interim looks: group-sequential exact McNemar test with Lan\u2013DeMets alpha spending");
  cmd->add_option("--spending", o->spending,
                  "Spending function fixed in the protocol: obf (O'Brien\u2013Fleming type, default) or pocock");
  cmd->add_flag("--look-now", o->look_now,
                "Add an unplanned look at the current number of completed sets (spends alpha for it)");
  cmd->add_flag("--final", o->final_now,
                "Treat the sets completed now as the final analysis (fieldwork ended early; spends all alpha left)");
  cmd->callback([&ctx, o] { ctx.exit_code = RunMonitor(ctx, *o); });
}

}  // namespace twinprobe
