#include "report/declines_report.h"

#include <algorithm>
#include <sstream>
#include <utility>
#include <vector>

#include "core/clock.h"
#include "report/html_parts.h"
#include "report/html_table.h"
#include "report/text_report.h"

namespace twinprobe {
namespace {

// One sentence in every rendering, as the report's other cautions are.
constexpr const char* kEthicsSentence =
    "Declining promptly limits what the test costs employers, who would otherwise hold a place for an applicant who "
    "does not exist; how and when to decline is for the study's ethics review to decide, and these counts do not "
    "replace it.";

std::string RuleSentence(const DeclineCounts& d) {
  if (d.decline_within_hours <= 0)
    return "The plan stores no decline deadline ([ethics] decline_within_hours), so no decline is counted as due.";
  return "Each positive response is to be declined " + d.rule + "; \"passed\" is judged at " +
         FormatIsoTime(d.study_clock) + ".";
}

// The rows every rendering shows, in order: label, count.
std::vector<std::pair<std::string, int64_t>> Rows(const DeclineCounts& d) {
  std::vector<std::pair<std::string, int64_t>> rows = {
      {"positive responses", d.positive},
      {"due (with a decline deadline)", d.due},
      {"declined on time", d.on_time},
      {"declined late", d.late},
      {"missing (deadline passed, not declined)", d.missing},
      {"still within the deadline", d.within}};
  if (d.decline_within_hours > 0 && d.positive > d.due)
    rows.push_back({"stored without a received time (no deadline)", d.positive - d.due});
  return rows;
}

}  // namespace

bool HasDeclines(const AnalysisResult& r) { return r.declines.present; }

std::string RenderDeclinesText(const AnalysisResult& r) {
  const DeclineCounts& d = r.declines;
  if (!d.present) return "";
  std::ostringstream o;
  o << "\nDeclines of positive responses:\n";
  for (const auto& [label, n] : Rows(d)) {
    std::string cell = "  " + label;
    cell.resize(std::max<size_t>(cell.size() + 1, 44), ' ');
    o << cell << n << "\n";
  }
  o << Wrap(RuleSentence(d), "  ") << Wrap(kEthicsSentence, "  ");
  return o.str();
}

nlohmann::json DeclinesJson(const DeclineCounts& d) {
  if (!d.present) return nullptr;
  return {{"decline_within_hours", d.decline_within_hours},
          {"rule", d.rule.empty() ? nlohmann::json(nullptr) : nlohmann::json(d.rule)},
          {"positive", d.positive},
          {"due", d.due},
          {"on_time", d.on_time},
          {"late", d.late},
          {"missing", d.missing},
          {"within_deadline", d.within}};
}

std::string DeclinesSection(const AnalysisResult& r, const ReportContext&) {
  const DeclineCounts& d = r.declines;
  if (!d.present) return "";
  HtmlTable t;
  t.caption = "Declines of positive responses";
  t.headers = {"", "responses"};
  for (const auto& [label, n] : Rows(d)) t.rows.push_back({HeadCell(label), NumCell(std::to_string(n))});
  return html::Para(RuleSentence(d)) + RenderTable(t) + html::Para(kEthicsSentence);
}

}  // namespace twinprobe
