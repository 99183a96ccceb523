#include "report/fieldwork_state.h"

#include "report/plain_summary.h"
#include "report/plural.h"

namespace twinprobe {

std::string OpenSetsSentence(const AnalysisResult& r) {
  if (r.sets_open == 0) return "";
  return Count(r.sets_open, "set is", "sets are") + " still within " + (r.sets_open == 1 ? "its " : "their ") +
         std::to_string(r.flow.window_days) + "-day window and " + (r.sets_open == 1 ? "is" : "are") +
         " not analysed yet.";
}

std::string EarlyStateSentence(const AnalysisResult& r) {
  if (r.listings.listing_only) return "";
  if (r.sets_analysed == 0 && r.probes_sent == 0 && r.responses == 0)
    return "No application has been sent yet, so there is nothing to analyse: send the sets on the schedule "
           "('twinprobe schedule'), record each sending with 'twinprobe sent', and analyse again.";
  if (r.sets_analysed == 0)
    return "No set of applications is closed yet, so there is nothing to analyse: a set is analysed once every "
           "application in it has been answered or its " +
           std::to_string(r.flow.window_days) + "-day window has ended; analyse again then.";
  int arms_with_probes = 0;
  std::string only;
  for (const auto& a : r.arms)
    if (a.probes > 0) ++arms_with_probes, only = ArmName(r, a.label);
  if (r.arms.size() > 1 && arms_with_probes == 1)
    return "Only " + only + " applications are in closed sets, so no groups can be compared yet: send and close "
           "applications of the other groups, then analyse again.";
  return "";
}

std::vector<std::string> SingleStratumSentences(const AnalysisResult& r) {
  std::vector<std::string> out;
  for (const SingleStratum& one : r.effects.single_strata)
    out.push_back("Every analysed set has " + one.column + " '" + one.value + "', so there is no analysis by " +
                  one.column + ": a stratified analysis needs at least two values. Analyse again once sets with "
                  "another " + one.column + " are closed; if the study has only one, leave '" + one.column +
                  "' out of [strata] columns in study.toml.");
  return out;
}

std::vector<std::string> FlowTextLines(const StudyFlow& flow) {
  std::vector<std::string> lines;
  auto exclusion = [&](const char* reason) {
    for (const auto& x : flow.exclusions)
      if (x.reason == reason && x.sets > 0) lines.push_back("  " + Count(x.sets, "set", "sets") + " left out: " + x.label);
  };
  lines.push_back(Count(flow.vacancies_planned, "vacancy", "vacancies") + " planned");
  exclusion("not_sent");
  exclusion("incomplete");
  exclusion("withdrawn");
  lines.push_back(Count(flow.sets_sent, "set", "sets") + " with every application sent");
  exclusion("still_open");
  lines.push_back(Count(flow.sets_closed, "set", "sets") + " closed (answered or window over)");
  lines.push_back(Count(flow.sets_analysed, "set", "sets") + " analysed");
  if (flow.responses_late > 0)
    lines.push_back("  " + Count(flow.responses_late, "answer", "answers") + " after the window kept as late, counted as no answer");
  return lines;
}

}  // namespace twinprobe
