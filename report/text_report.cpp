#include "report/text_report.h"

#include <cmath>
#include <cstdio>
#include <sstream>

#include "report/design_report.h"
#include "report/effects_report.h"

namespace twinprobe {

std::string FormatP(double p) {
  char buf[32];
  if (p < 1e-16) return "< 1e-16";
  if (p < 0.001) std::snprintf(buf, sizeof buf, "%.2e", p);
  else std::snprintf(buf, sizeof buf, "%.3g", p);
  return buf;
}

std::string FormatPercent(double rate) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.1f%%", rate * 100.0);
  return buf;
}

std::string RenderTextReport(const AnalysisResult& r) {
  std::ostringstream o;
  o << r.title << "\n" << std::string(std::min<size_t>(r.title.size(), 78), '=') << "\n\n";
  o << "Study " << r.study_id << " (" << r.kind << " design, plan from " << r.plan_origin << ").\n";
  o << r.vacancies << " vacancies, " << r.probes_planned << " probes planned, " << r.probes_sent << " sent, "
    << r.responses << " with a recorded response";
  if (r.responses_superseded) o << " (" << r.responses_superseded << " earlier entries corrected)";
  o << ".\n" << r.sets_analysed << " complete sets analysed";
  if (r.sets_incomplete) o << "; " << r.sets_incomplete << " sets left out because a probe was not sent";
  o << ".\n\n";

  o << "Positive callback (";
  for (size_t i = 0; i < r.positive_codes.size(); ++i) o << (i ? ", " : "") << r.positive_codes[i];
  o << ") by arm, with exact Clopper-Pearson " << static_cast<int>(std::lround(r.confidence * 100))
    << "% intervals:\n";
  for (const auto& a : r.arms) {
    char line[256];
    std::snprintf(line, sizeof line, "  %-28s %6lld / %-6lld %7s   [%s, %s]%s\n", a.label.c_str(),
                  static_cast<long long>(a.positive), static_cast<long long>(a.probes), FormatPercent(a.rate).c_str(),
                  FormatPercent(a.ci.low).c_str(), FormatPercent(a.ci.high).c_str(),
                  a.is_reference ? "  (reference)" : "");
    o << line;
  }
  if (r.has_paired) {
    const auto& t = r.paired;
    o << "\nPaired table (one pair per vacancy; reference = " << r.reference_label << "):\n";
    o << "  both called back            a = " << t.a << "\n";
    o << "  only " << r.reference_label << std::string(r.reference_label.size() < 23 ? 23 - r.reference_label.size() : 1, ' ')
      << "b = " << t.b << "\n";
    o << "  only " << r.other_label << std::string(r.other_label.size() < 23 ? 23 - r.other_label.size() : 1, ' ')
      << "c = " << t.c << "\n";
    o << "  neither                     d = " << t.d << "\n";
    o << "Exact McNemar test (conditional binomial on the " << t.discordant()
      << " discordant pairs, two-sided): p = " << FormatP(r.mcnemar_exact_p) << ".\n";
    if (t.discordant() == 0)
      o << "No pair was discordant, so the data say nothing about a difference between the arms.\n";
    else if (r.mcnemar_exact_p < r.alpha)
      o << "At alpha = " << r.alpha << " the data are not compatible with equal callback chances: "
        << (t.b > t.c ? r.reference_label : r.other_label) << " was favoured in " << std::max(t.b, t.c) << " of "
        << t.discordant() << " pairs where the employer treated the two applicants differently.\n";
    else
      o << "At alpha = " << r.alpha << " the test does not show a difference; this is not evidence that there is none.\n";
  }
  o << RenderEffectsText(r);
  // Design integrity: balance of the plan and the pre-registration.
  if (std::string balance = RenderBalanceText(r.balance); !balance.empty()) o << "\n" << balance;
  o << "\n" << RenderPreregistrationText(r.preregistration);
  return o.str();
}

}  // namespace twinprobe
