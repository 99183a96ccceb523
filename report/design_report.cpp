#include "report/design_report.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <sstream>

#include "core/text.h"
#include "report/text_report.h"

namespace twinprobe {
namespace {

std::string TestLine(const stats::IndependenceTest& t) {
  if (t.df == 0) return "no test: the table has a single row or column";
  char buf[160];
  std::snprintf(buf, sizeof buf, "X2 = %.2f, df = %d, %s", t.statistic, t.df, PEquals(t.p()).c_str());
  std::string line = buf;
  if (t.p_monte_carlo)
    line += " (Monte Carlo over " + std::to_string(t.replicates) + " tables with these margins: " +
            std::to_string(t.cells_below_5) + " of " + std::to_string(t.cells) +
            " expected counts are below 5; the chi-square approximation would give " + FormatP(t.p_asymptotic) + ")";
  return line;
}

}  // namespace

std::string RenderBalanceText(const BalanceReport& b) {
  if (!b.present || b.tables.empty()) return "";
  std::ostringstream o;
  o << "Balance of the plan (probes per arm; Pearson chi-square test of independence, where a balanced\n"
       "plan gives X2 near 0 and p near 1):\n";
  for (const auto& t : b.tables) {
    o << "  " << t.title << ": " << TestLine(t.test) << "; largest difference between arms in a column: "
      << t.max_spread << "\n";
    size_t label_width = 0;
    for (const auto& a : t.arms) label_width = std::max(label_width, CodePoints(a));
    std::vector<size_t> widths;
    for (size_t j = 0; j < t.columns.size(); ++j) {
      size_t w = CodePoints(t.columns[j]);
      for (const auto& row : t.counts) w = std::max(w, std::to_string(row[j]).size());
      widths.push_back(w);
    }
    o << "    " << std::string(label_width, ' ');
    for (size_t j = 0; j < t.columns.size(); ++j)
      o << "  " << PadLeft(t.columns[j], widths[j]);
    o << "\n";
    for (size_t i = 0; i < t.arms.size(); ++i) {
      o << "    " << PadRight(t.arms[i], label_width);
      for (size_t j = 0; j < t.columns.size(); ++j) {
        std::string n = std::to_string(t.counts[i][j]);
        o << "  " << PadLeft(n, widths[j]);
      }
      o << "\n";
    }
  }
  return o.str();
}

nlohmann::json BalanceJson(const BalanceReport& b) {
  nlohmann::json tables = nlohmann::json::array();
  for (const auto& t : b.tables) {
    const auto& x = t.test;
    nlohmann::json test = {{"method", x.p_monte_carlo ? "pearson_chi_square_monte_carlo" : "pearson_chi_square"},
                           {"statistic", x.statistic},
                           {"df", x.df},
                           {"p", x.p()},
                           {"p_asymptotic", x.p_asymptotic},
                           {"p_monte_carlo", x.p_monte_carlo ? nlohmann::json(*x.p_monte_carlo) : nlohmann::json()},
                           {"replicates", x.replicates},
                           {"n", x.n},
                           {"min_expected", std::isfinite(x.min_expected) ? nlohmann::json(x.min_expected) : nlohmann::json()},
                           {"cells_below_5", x.cells_below_5},
                           {"small_expected", x.small_expected}};
    tables.push_back({{"variable", t.variable},
                      {"title", t.title},
                      {"arms", t.arms},
                      {"columns", t.columns},
                      {"counts", t.counts},
                      {"max_spread", t.max_spread},
                      {"test", test}});
  }
  return {{"present", b.present}, {"tables", tables}};
}

std::string RenderPreregistrationText(const PreregistrationStatus& s) {
  std::ostringstream o;
  o << "Pre-registration:\n";
  if (!s.frozen) {
    o << "  Not frozen: the analysis plan was not registered with 'twinprobe freeze', so this report cannot show\n"
         "  that the analysis was fixed before the data came in.\n";
    return o.str();
  }
  o << "  Frozen at " << s.frozen_at << ".\n"
    << "  Design sha256        " << s.design_sha256 << "\n"
    << "  Analysis plan sha256 " << s.analysis_sha256 << "\n";
  if (s.deviations.empty()) {
    o << "  The analysis follows the frozen plan: no deviation.\n";
    return o.str();
  }
  o << "  " << s.deviations.size() << (s.deviations.size() == 1 ? " deviation" : " deviations")
    << " from the frozen plan:\n";
  for (const auto& d : s.deviations) o << "    - " << d.what << " [" << d.kind << "]\n";
  if (!s.exploratory.empty()) {
    o << "  Exploratory, not confirmatory (outside the frozen plan):\n";
    for (const auto& e : s.exploratory) o << "    - " << e.what << ": " << e.why << "\n";
  }
  return o.str();
}

nlohmann::json PreregistrationJson(const PreregistrationStatus& s) {
  nlohmann::json deviations = nlohmann::json::array(), exploratory = nlohmann::json::array();
  for (const auto& d : s.deviations)
    deviations.push_back({{"kind", d.kind},
                          {"what", d.what},
                          {"file", d.file.empty() ? nlohmann::json() : nlohmann::json(d.file)},
                          {"keys", d.keys}});
  for (const auto& e : s.exploratory) exploratory.push_back({{"what", e.what}, {"why", e.why}});
  auto opt = [](const std::string& v) { return v.empty() ? nlohmann::json() : nlohmann::json(v); };
  return {{"frozen", s.frozen},
          {"frozen_at", opt(s.frozen_at)},
          {"design_sha256", opt(s.design_sha256)},
          {"analysis_sha256", opt(s.analysis_sha256)},
          {"current_design_sha256", opt(s.current_design_sha256)},
          {"current_analysis_sha256", opt(s.current_analysis_sha256)},
          {"frozen_strata", s.frozen_strata},
          {"deviations", deviations},
          {"exploratory", exploratory}};
}

}  // namespace twinprobe
