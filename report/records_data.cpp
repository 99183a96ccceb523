#include "report/records_data.h"

#include "report/effects_report.h"
#include "report/html_parts.h"
#include "report/html_table.h"
#include "report/plain_summary.h"
#include "report/plural.h"

namespace twinprobe {
namespace {

std::string ListInWords(const std::vector<std::string>& items) {
  std::string s;
  for (size_t i = 0; i < items.size(); ++i)
    s += (i == 0 ? "" : i + 1 == items.size() ? " and " : ", ") + items[i];
  return s;
}

std::string LevelText(const DesignFactorSummary& f, size_t i) {
  return i < f.level_labels.size() && !f.level_labels[i].empty() ? f.level_labels[i] : f.levels[i];
}

std::string FactorName(const DesignFactorSummary& f) { return f.label.empty() ? f.name : f.label; }

std::string PositiveText(const AnalysisResult& r) {
  return r.positive_codes.size() == 1 ? "a positive outcome is " + r.positive_codes.front()
                                      : "a positive outcome is any of " + ListInWords(r.positive_codes);
}

}  // namespace

std::string RecordsGroupsText(const AnalysisResult& r) {
  if (r.design.factors.empty()) return "";
  const DesignFactorSummary& f = r.design.factors.front();
  std::vector<std::string> groups;
  for (size_t i = 0; i < f.levels.size(); ++i)
    groups.push_back(LevelText(f, i) + (f.levels[i] == f.reference ? " (reference)" : ""));
  return "groups " + ListInWords(groups) + " of " + FactorName(f);
}

std::vector<std::string> RecordsFileLines(const AnalysisResult& r) {
  std::vector<std::string> lines;
  for (const ImportedFile& file : r.design.imported_files)
    lines.push_back(file.path + ": " + Count(file.rows_landed, "row", "rows") +
                    (file.rows_rejected ? " (" + Count(file.rows_rejected, "row", "rows") + " rejected)" : "") +
                    ", SHA-256 " + file.sha256);
  return lines;
}

std::string RecordsDataText(const AnalysisResult& r) {
  const auto& d = r.design;
  std::string o = "\nData: applicant records";
  if (const std::string groups = RecordsGroupsText(r); !groups.empty()) o += "; " + groups;
  o += "; " + PositiveText(r) + "; strata " + (d.strata_columns.empty() ? "none" : ListInWords(d.strata_columns)) + ".\n";
  for (const std::string& line : RecordsFileLines(r)) o += "Imported from " + line + ".\n";
  return o;
}

std::string RecordsGroupsPart(const AnalysisResult& r) {
  std::string o = html::Para(
      "The data are records of real applications imported from a file, each with its recorded outcome. The "
      "applicants were not matched: the groups compared may differ in qualifications and other respects that the "
      "data do not hold.");
  if (r.arms.empty()) return o;
  HtmlTable t;
  t.caption = r.design.factors.empty() ? "Groups" : "Groups by " + FactorName(r.design.factors.front());
  t.headers = {"Group", "Stored label", "Applications"};
  for (const ArmResult& a : r.arms)
    t.rows.push_back({HeadCell(ArmName(r, a.label) + (a.is_reference ? " (reference)" : "")), Cell(a.label),
                      NumCell(std::to_string(a.probes))});
  return o + "<div class=\"tables\">" + RenderTable(t) + "</div>";
}

std::string RecordsFactsPart(const AnalysisResult& r) {
  const auto& d = r.design;
  std::vector<std::pair<std::string, std::string>> rows = {
      {"Data", RecordsExtent(r.probes_planned, r.vacancies) + " (applicant records imported from a file)"},
      {"Positive outcome", ListInWords(r.positive_codes)},
      {"Strata", d.strata_columns.empty() ? "none" : ListInWords(d.strata_columns)},
  };
  for (const std::string& line : RecordsFileLines(r)) rows.push_back({"Imported file", line});
  rows.push_back({"Significance level (alpha)", FormatEstimate(r.alpha)});
  rows.push_back({"Multiple-comparison correction", r.correction.empty() ? "none" : r.correction});
  return html::Heading("Counts") + html::Facts(rows);
}

}  // namespace twinprobe
