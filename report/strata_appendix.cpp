#include "report/strata_appendix.h"

#include <map>
#include <utility>

#include "report/html_parts.h"
#include "report/html_table.h"
#include "report/p_value.h"
#include "report/plural.h"

namespace twinprobe {

bool HasStrataAppendix(const AnalysisResult& r) {
  return r.records && r.kind == "unpaired" && !r.effects.strata.empty() && !r.arms.empty();
}

std::string StrataAppendix(const AnalysisResult& r, const ReportContext&) {
  // The comparisons of one stratum value, in the order the effects hold them.
  std::vector<std::pair<std::string, std::string>> order;
  std::map<std::pair<std::string, std::string>, std::vector<const ArmComparison*>> by_value;
  for (const StratumComparison& s : r.effects.strata) {
    auto key = std::make_pair(s.column, s.value);
    auto& list = by_value[key];
    if (list.empty()) order.push_back(key);
    list.push_back(&s.result);
  }
  const std::string ref = r.arms.front().label;
  std::string o = html::Para(
      "One table per " + std::string(order.size() == 1 ? "stratum value" : "stratum value, " + std::to_string(order.size()) +
                                                                               " in all") +
      ": applications by group and outcome, and Fisher's exact test (two-sided) of each group against " + ref +
      " within it, not adjusted for the number of tables. Read them for where a difference lies, not as tests of "
      "their own: the tests across strata are in the body of the report.");
  for (const auto& key : order) {
    const auto& list = by_value[key];
    HtmlTable t;
    t.caption = key.first + ": " + key.second;
    t.headers = {"group", "positive", "not positive", "Fisher p"};
    t.css_class = "stratum-table";
    // Rows of each comparison's table: reference (a, b), then the other (c, d).
    const stats::Table2x2& first = list.front()->table;
    t.rows.push_back({HeadCell(ref + " (reference)"), NumCell(std::to_string(first.a)), NumCell(std::to_string(first.b)),
                      NumCell("")});
    for (const ArmComparison* c : list)
      t.rows.push_back({HeadCell(c->other_label), NumCell(std::to_string(c->table.c)), NumCell(std::to_string(c->table.d)),
                        NumCell(FormatP(c->fisher.p.p))});
    o += RenderTable(t);
  }
  return o;
}

}  // namespace twinprobe
