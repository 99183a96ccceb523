// Several field offices, one study: handout, merge, status
// (collector/handout.h, collector/merge.h).
#include <cstdio>
#include <iostream>
#include <memory>

#include <nlohmann/json.hpp>

#include "cli/command.h"
#include "core/text.h"
#include "collector/handout.h"
#include "collector/merge.h"
#include "core/clock.h"
#include "core/office_records.h"
#include "core/terminal_text.h"
#include "planner/design_file.h"
#include "report/plural.h"

namespace twinprobe {
namespace {

int RunHandout(Context& ctx, const HandoutRequest& options) {
  auto store = OpenStudyStore(ctx, false);
  if (!store.ok()) return ReportError(store.error());
  auto design = LoadDesign(ctx.study_dir);
  if (!design.ok()) return ReportError(design.error());
  HandoutRequest request = options;
  request.study_dir = ctx.study_dir;
  auto r = HandOut(*store.value(), design.value(), request);
  if (!r.ok()) return ReportError(r.error());
  const HandoutResult& h = r.value();
  if (ctx.json) {
    std::cout << nlohmann::json{{"office", h.office},
                                {"folder", h.folder},
                                {"vacancies", h.vacancies},
                                {"probes", h.probes},
                                {"material_files", h.material_files},
                                {"plan_hash", h.plan_hash},
                                {"office_head", h.office_head}}
                     .dump(2)
              << "\n";
    return 0;
  }
  std::cout << "Handed out to office " << ForTerminal(h.office) << " (" << ForTerminal(h.folder) << "): "
            << Count(h.vacancies, "vacancy", "vacancies") << ", " << Count(h.probes, "probe", "probes") << ", "
            << Count(h.material_files, "material file", "material files") << ".\n"
            << "  plan        " << h.plan_hash << "\n"
            << "  office head " << h.office_head << "\n"
            << "The office works in its folder with every fieldwork command; bring its work back with\n"
            << "'twinprobe merge " << ForTerminal(h.folder) << "'.\n";
  return 0;
}

nlohmann::json HistoryJson(const std::vector<PlacedResponse>& history) {
  nlohmann::json out = nlohmann::json::array();
  for (const PlacedResponse& e : history)
    out.push_back({{"response", e.id},
                   {"code", e.code},
                   {"received_at", e.received_at},
                   {"entered_by", e.entered_by},
                   {"entered_at", e.entered_at},
                   {"place", e.place},
                   {"current", e.current}});
  return out;
}

void PrintHistory(const std::string& indent, const std::string& label, const std::vector<PlacedResponse>& history) {
  std::cout << indent << "    " << ForTerminal(label) << ":\n";
  for (const PlacedResponse& e : history) {
    char line[64];
    std::snprintf(line, sizeof line, "      response %-5lld ", static_cast<long long>(e.id));
    std::cout << indent << line << ForTerminal(e.code) << ", received " << (e.received_at.empty() ? "(time unknown)" : e.received_at)
              << ", entered by " << ForTerminal(e.entered_by) << " at " << e.entered_at;
    if (e.place != label) std::cout << " (from " << ForTerminal(e.place) << ")";
    if (e.current) std::cout << " — current";
    std::cout << "\n";
  }
}

nlohmann::json ConflictsJson(const std::vector<MergeConflict>& conflicts) {
  nlohmann::json out = nlohmann::json::array();
  for (const MergeConflict& c : conflicts)
    out.push_back({{"office", c.office},
                   {"probe", c.histories.probe_ref},
                   {"main", HistoryJson(c.histories.main)},
                   {"office_history", HistoryJson(c.histories.office)}});
  return out;
}

// `indent` sets the list in when it belongs to an office's merge.
void PrintConflicts(const std::string& indent, const std::string& title, const std::vector<MergeConflict>& conflicts) {
  std::cout << indent << title << "\n";
  for (const MergeConflict& c : conflicts) {
    std::cout << indent << "  " << ForTerminal(c.histories.probe_ref) << ": main has "
              << ForTerminal(c.histories.main_current->code) << ", office " << ForTerminal(c.office) << " has "
              << ForTerminal(c.histories.office_current->code) << "\n";
    PrintHistory(indent, "main", c.histories.main);
    PrintHistory(indent, c.office, c.histories.office);
  }
}

int RunMerge(Context& ctx, const std::vector<std::string>& folders, const std::string& prefer) {
  auto store = OpenStudyStore(ctx, false);
  if (!store.ok()) return ReportError(store.error());
  auto r = MergeOffices(*store.value(), folders, prefer.empty() ? std::nullopt : std::optional<std::string>(prefer));
  if (!r.ok()) return ReportError(r.error());
  const MergeOutcome& m = r.value();
  if (!m.conflicts.empty()) {
    if (ctx.json) std::cout << nlohmann::json{{"merged", false}, {"conflicts", ConflictsJson(m.conflicts)}}.dump(2) << "\n";
    else PrintConflicts("", "Conflicts (different current responses in two places):", m.conflicts);
    return ReportError(BadInput(
        "merge",
        Count(static_cast<int64_t>(m.conflicts.size()), "probe has", "probes have") +
            " different current responses in the main store and an office (listed above); nothing was merged",
        "decide which to keep: merge again with --prefer main or --prefer " + m.conflicts.front().office +
            " (the choice is sealed in the chain)"));
  }
  if (ctx.json) {
    nlohmann::json offices = nlohmann::json::array();
    for (const OfficeMergeOutcome& o : m.offices)
      offices.push_back({{"office", o.office},
                         {"folder", o.folder},
                         {"head_seq", o.head.seq},
                         {"head", o.head.hash},
                         {"nothing_new", o.nothing_new},
                         {"sendings", o.counts.sendings},
                         {"responses", o.counts.responses},
                         {"declines", o.counts.declines},
                         {"mail_messages", o.counts.mail_messages},
                         {"review_decisions", o.counts.review_decisions},
                         {"choices", o.counts.choices},
                         {"resolved", ConflictsJson(o.resolved)}});
    std::cout << nlohmann::json{{"merged", true}, {"offices", offices}}.dump(2) << "\n";
    return 0;
  }
  for (const OfficeMergeOutcome& o : m.offices) {
    if (o.nothing_new) {
      std::cout << "Office " << ForTerminal(o.office) << ": nothing new (its head, entry " << o.head.seq
                << ", was merged before).\n";
      continue;
    }
    std::cout << "Office " << ForTerminal(o.office) << ": merged up to its entry " << o.head.seq << " (head "
              << o.head.hash << "):\n  " << Count(o.counts.sendings, "sending", "sendings") << ", "
              << Count(o.counts.responses, "response", "responses") << ", "
              << Count(o.counts.declines, "decline", "declines") << ", "
              << Count(o.counts.mail_messages, "mail message", "mail messages") << ", "
              << Count(o.counts.review_decisions, "review decision", "review decisions") << ".\n";
    if (!o.resolved.empty())
      PrintConflicts("  ", "Conflicts decided by --prefer " + ForTerminal(prefer) + " (sealed):", o.resolved);
  }
  return 0;
}

int RunStatus(Context& ctx) {
  auto store = OpenStudyStore(ctx, false);
  if (!store.ok()) return ReportError(store.error());
  auto settings = LoadStudySettings(ctx, *store.value());
  if (!settings.ok()) return ReportError(settings.error());
  const std::vector<OfficeStatus> offices = ReadOfficeStatuses(*store.value(), settings.value().outcomes, NowEpoch());
  int64_t kept = 0;
  for (const PlanVacancy& v : ReadPlanVacancies(*store.value())) kept += v.office.empty() ? 1 : 0;
  if (ctx.json) {
    nlohmann::json list = nlohmann::json::array();
    for (const OfficeStatus& o : offices) {
      nlohmann::json merges = nlohmann::json::array();
      for (const ChainPoint& p : o.merges) merges.push_back({{"head_seq", p.seq}, {"head", p.hash}, {"at", p.at}});
      list.push_back({{"office", o.office},
                      {"folder", o.folder},
                      {"handed_at", o.handed_at},
                      {"vacancies", o.vacancies},
                      {"probes", o.probes},
                      {"sent", o.sent},
                      {"closed", o.closed},
                      {"merges", merges}});
    }
    std::cout << nlohmann::json{{"offices", list}, {"vacancies_not_handed_out", kept}}.dump(2) << "\n";
    return 0;
  }
  if (offices.empty()) {
    std::cout << "No vacancy was handed out to an office; the main store holds all "
              << Count(kept, "vacancy", "vacancies") << ".\n";
    return 0;
  }
  std::cout << "Offices (sent and closed as merged into this store):\n";
  char line[160];
  std::snprintf(line, sizeof line, "  %-20s %9s %7s %6s %7s  %s\n", "office", "vacancies", "probes", "sent", "closed",
                "merged");
  std::cout << line;
  for (const OfficeStatus& o : offices) {
    std::string merged = "never";
    if (!o.merges.empty())
      merged = Count(static_cast<int64_t>(o.merges.size()), "time", "times") + ", last up to its entry " +
               std::to_string(o.merges.back().seq) + " at " + o.merges.back().at;
    std::snprintf(line, sizeof line, "  %s %9lld %7lld %6lld %7lld  ", PadRight(ForTerminal(o.office), 20).c_str(),
                  static_cast<long long>(o.vacancies), static_cast<long long>(o.probes),
                  static_cast<long long>(o.sent), static_cast<long long>(o.closed));
    std::cout << line << merged << "\n";
  }
  std::cout << Count(kept, "vacancy is", "vacancies are") << " not handed out (the main store's own).\n";
  return 0;
}

}  // namespace

void RegisterOfficeCommands(CLI::App& app, Context& ctx) {
  auto handout_options = std::make_shared<HandoutRequest>();
  auto* handout = app.add_subcommand(
      "handout", "Write a study folder for one field office holding only its vacancies (sealed in both chains)");
  handout->add_option("--to", handout_options->to, "The office's new study folder; its name names the office")
      ->required();
  handout->add_option("--vacancies", handout_options->vacancies_file,
                      "File of the office's vacancy references, one a line");
  handout->add_option("--stratum", handout_options->stratum, "The office's vacancies by stratum, e.g. region=North");
  handout->callback([&ctx, handout_options] { ctx.exit_code = RunHandout(ctx, *handout_options); });

  auto folders = std::make_shared<std::vector<std::string>>();
  auto prefer = std::make_shared<std::string>();
  auto* merge = app.add_subcommand(
      "merge", "Bring offices' fieldwork back into this study, after verifying each office's chain");
  merge->add_option("offices", *folders, "Office folders written by 'twinprobe handout'")->required();
  merge->add_option("--prefer", *prefer,
                    "On a conflict (different current responses in two places) keep main's or OFFICE's");
  merge->callback([&ctx, folders, prefer] { ctx.exit_code = RunMerge(ctx, *folders, *prefer); });

  auto* status = app.add_subcommand("status", "Per office: vacancies handed out, probes sent, closed and merged");
  status->callback([&ctx] { ctx.exit_code = RunStatus(ctx); });
}

}  // namespace twinprobe
