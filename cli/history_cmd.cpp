// `history PROBE`: every sending, response and decline of one probe, with
// who entered it and when (collector/history.h).
#include <iostream>

#include <nlohmann/json.hpp>

#include "cli/command.h"
#include "core/text.h"
#include "collector/history.h"
#include "core/terminal_text.h"

namespace twinprobe {
namespace {

nlohmann::json OrNull(const std::string& s) { return s.empty() ? nlohmann::json(nullptr) : nlohmann::json(s); }
nlohmann::json IdOrNull(int64_t id) { return id ? nlohmann::json(id) : nlohmann::json(nullptr); }

nlohmann::json EventJson(const HistoryEvent& e) {
  nlohmann::json j{{"kind", e.kind},         {"id", e.id},
                   {"at", OrNull(e.at)},     {"entered_by", e.entered_by},
                   {"entered_at", e.entered_at}, {"audit_seq", e.audit_seq}};
  if (e.kind == "response") {
    j["code"] = e.code;
    j["positive"] = e.positive;
    j["channel"] = OrNull(e.channel);
    j["origin"] = e.origin;
    j["flags"] = OrNull(e.flags);
    j["note"] = OrNull(e.note);
    j["note_purged"] = e.note_purged;
    j["supersedes"] = IdOrNull(e.supersedes);
    j["superseded_by"] = IdOrNull(e.superseded_by);
    j["current"] = e.current;
  } else if (e.kind == "decline") {
    j["channel"] = OrNull(e.channel);
  }
  return j;
}

std::string Describe(const HistoryEvent& e) {
  if (e.kind == "sending") return "sent at " + e.at;
  if (e.kind == "decline") return "declined at " + e.at + (e.channel.empty() ? "" : " by " + e.channel);
  std::string s = "response " + std::to_string(e.id) + ": " + e.code + (e.positive ? " (positive)" : "") + ", received " +
                  (e.at.empty() ? "at an unknown time" : e.at) + (e.channel.empty() ? "" : " by " + e.channel);
  if (e.origin != "record") s += ", from " + e.origin;
  if (!e.flags.empty()) s += ", flag " + e.flags;
  if (e.supersedes) s += "; supersedes " + std::to_string(e.supersedes);
  if (e.superseded_by) s += "; superseded by " + std::to_string(e.superseded_by);
  else if (e.current) s += "; current";
  return s;
}

int RunHistory(Context& ctx, const std::string& probe) {
  auto store = OpenStudyStore(ctx, false);
  if (!store.ok()) return ReportError(store.error());
  auto settings = LoadStudySettings(ctx, *store.value());
  if (!settings.ok()) return ReportError(settings.error());
  auto loaded = LoadHistory(*store.value(), settings.value().outcomes, probe);
  if (!loaded.ok()) return ReportError(loaded.error());
  const ProbeHistory& h = loaded.value();
  const HistoryEvent* current = h.current_response >= 0 ? &h.events[static_cast<size_t>(h.current_response)] : nullptr;
  if (ctx.json) {
    nlohmann::json strata = nlohmann::json::object();
    for (const auto& [name, value] : h.strata) strata[name] = value;
    nlohmann::json events = nlohmann::json::array();
    for (const auto& e : h.events) events.push_back(EventJson(e));
    std::cout << nlohmann::json{{"probe", h.probe},
                                {"vacancy", h.vacancy},
                                {"employer_key", OrNull(h.employer_key)},
                                {"arm", h.arm},
                                {"profile", OrNull(h.profile)},
                                {"planned_at", OrNull(h.planned_at)},
                                {"plan_origin", h.plan_origin},
                                {"strata", strata},
                                {"events", events},
                                {"current_response", current ? nlohmann::json(current->id) : nlohmann::json(nullptr)},
                                {"current_code", current ? nlohmann::json(current->code) : nlohmann::json(nullptr)}}
                     .dump(2)
              << "\n";
    return 0;
  }
  std::cout << "Probe " << ForTerminal(h.probe) << ": vacancy " << ForTerminal(h.vacancy);
  if (!h.employer_key.empty()) std::cout << " (employer " << ForTerminal(h.employer_key) << ")";
  std::cout << ", arm " << ForTerminal(h.arm);
  if (!h.profile.empty()) std::cout << ", profile " << ForTerminal(h.profile);
  std::cout << "\n";
  if (!h.planned_at.empty() || !h.strata.empty()) {
    std::cout << " ";
    if (!h.planned_at.empty()) std::cout << " planned for " << ForTerminal(h.planned_at) << (h.strata.empty() ? "" : ";");
    if (!h.strata.empty()) {
      std::cout << " strata";
      for (size_t i = 0; i < h.strata.size(); ++i)
        std::cout << (i ? ", " : " ") << ForTerminal(h.strata[i].first) << "=" << ForTerminal(h.strata[i].second);
    }
    std::cout << "\n";
  }
  if (h.events.empty()) {
    std::cout << "Nothing was recorded for it yet: no sending, no response.\n";
    return 0;
  }
  std::cout << "\n  entered               audit  by            what\n";
  for (const auto& e : h.events) {
    char head[96];
    std::snprintf(head, sizeof head, "  %-20s  %5lld  %s  ", e.entered_at.c_str(), static_cast<long long>(e.audit_seq),
                  PadRight(ForTerminal(e.entered_by), 12).c_str());
    std::cout << head << ForTerminal(Describe(e)) << "\n";
    if (!e.note.empty()) std::cout << "  " << std::string(43, ' ') << "note: " << ForTerminal(e.note) << "\n";
    else if (e.note_purged) std::cout << "  " << std::string(43, ' ') << "note: (removed by purge)\n";
  }
  if (current)
    std::cout << "\nCurrent outcome: " << ForTerminal(current->code) << (current->positive ? " (a positive callback)" : "")
              << ", response " << current->id << ".\n";
  else
    std::cout << "\nNo response recorded yet.\n";
  return 0;
}

}  // namespace

void RegisterHistory(CLI::App& app, Context& ctx) {
  auto probe = std::make_shared<std::string>();
  auto* cmd = app.add_subcommand(
      "history", "Show every sending, response (superseded ones too) and decline of a probe, with who and when");
  cmd->add_option("probe", *probe, "Probe reference, e.g. P00001")->required();
  cmd->callback([&ctx, probe] { ctx.exit_code = RunHistory(ctx, *probe); });
}

}  // namespace twinprobe
