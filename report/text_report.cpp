#include "report/text_report.h"

#include <cmath>
#include <cstdio>
#include <sstream>

#include "report/effects_report.h"
#include "report/plain_summary.h"

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

namespace {

// Wraps plain text at 78 columns (words never split).
std::string Wrap(const std::string& text, const std::string& indent) {
  std::string out, line;
  std::istringstream words(text);
  std::string w;
  while (words >> w) {
    if (!line.empty() && line.size() + 1 + w.size() > 78 - indent.size()) {
      out += indent + line + "\n";
      line.clear();
    }
    line += (line.empty() ? "" : " ") + w;
  }
  if (!line.empty()) out += indent + line + "\n";
  return out;
}

void PlainWords(std::ostringstream& o, const AnalysisResult& r) {
  for (const auto& p : PlainSummary(r)) o << p.heading << ".\n" << Wrap(p.text, "  ") << "\n";
}

void DesignBlock(std::ostringstream& o, const AnalysisResult& r) {
  const auto& d = r.design;
  o << "\nDesign: ";
  for (size_t i = 0; i < d.factors.size(); ++i) {
    o << (i ? "; " : "") << "factor " << d.factors[i].name << " (";
    for (size_t k = 0; k < d.factors[i].levels.size(); ++k) o << (k ? ", " : "") << d.factors[i].levels[k];
    o << "; reference " << d.factors[i].reference << ")";
  }
  o << "; " << d.employers << " employers (by pseudonym); observation window " << d.window_days << " days.\n";
  if (!d.first_sent_at.empty()) o << "Fieldwork: " << d.first_sent_at << " to " << d.last_sent_at << ".\n";
  o << "Design hash (SHA-256): " << (d.design_sha256.empty() ? "none" : d.design_sha256);
  if (d.has_seed) o << "; seed " << d.seed;
  o << ".\n";
}

void ResponseTimesBlock(std::ostringstream& o, const AnalysisResult& r) {
  const auto& rt = r.response_times;
  if (!rt.available || rt.arms.empty()) {
    o << "\nTime to first response: no send times recorded.\n";
    return;
  }
  o << "\nTime to first response (share of sent applications answered by day; window " << rt.window_days
    << " days):\n";
  char line[256];
  auto row = [&o](std::string text) {  // columns padded, trailing blanks trimmed
    while (!text.empty() && text.back() == ' ') text.pop_back();
    o << text << "\n";
  };
  std::snprintf(line, sizeof line, "  %-8s", "day");
  std::string head = line;
  for (const auto& a : rt.arms) {
    std::snprintf(line, sizeof line, " %-34s", (ArmName(a.label) + " any / positive").c_str());
    head += line;
  }
  row(head);
  for (size_t m = 0; m < rt.arms.front().milestones.size(); ++m) {
    std::snprintf(line, sizeof line, "  %-8d", rt.arms.front().milestones[m].day);
    std::string text = line;
    for (const auto& a : rt.arms) {
      const auto& ms = a.milestones[m];
      std::string cell = std::to_string(ms.any) + " (" + FormatPercent(ms.any_share) + ") / " +
                         std::to_string(ms.positive) + " (" + FormatPercent(ms.positive_share) + ")";
      std::snprintf(line, sizeof line, " %-34s", cell.c_str());
      text += line;
    }
    row(text);
  }
  for (const auto& a : rt.arms) {
    o << "  " << ArmName(a.label) << ": " << a.responded << " of " << a.probes_sent << " answered within the window";
    if (a.median_days >= 0) {
      std::snprintf(line, sizeof line, ", median %.1f days", a.median_days);
      o << line;
    }
    if (a.late) o << ", " << a.late << " only after it";
    o << "; outcomes:";
    for (const auto& c : a.codes) o << " " << c.code << " " << c.probes;
    o << ".\n";
  }
}

void EmployersBlock(std::ostringstream& o, const AnalysisResult& r) {
  const auto& e = r.employers;
  if (!e.available) return;
  o << "\nEmployers: " << e.employers << " with analysed pairs, " << e.employers_discordant
    << " with at least one unequal pair.";
  bool any = false;
  for (const auto& x : e.discordant) {
    if (x.discordant < 2) break;  // sorted, most unequal first
    if (!any) o << " With more than one, by pseudonym:\n";
    any = true;
    o << "  " << x.pseudonym << ": " << x.vacancies << " pairs, only " << ArmName(r.reference_label) << " "
      << x.table.b << ", only " << ArmName(r.other_label) << " " << x.table.c << "\n";
  }
  if (!any) o << " None had more than one.\n";
}

}  // namespace

std::string RenderTextReport(const AnalysisResult& r, const ReportContext& ctx) {
  std::ostringstream o;
  o << RenderTextReport(r);
  if (ctx.reveal_employers && r.employers.available) {
    o << "\nEmployer names (shown because of --reveal-employers, recorded in the audit chain):\n";
    for (const auto& x : r.employers.discordant) {
      if (x.discordant < 2) break;
      const std::string& key = x.pseudonym;
      auto it = ctx.employer_names.find(key);
      o << "  " << key << " = " << (it == ctx.employer_names.end() ? "(name purged)" : it->second) << "\n";
    }
  }
  o << "\nMade with twinprobe " << ctx.tool_version << " at " << ctx.generated_at << "; audit chain "
    << ctx.audit_entries << " entries, " << (ctx.audit_intact ? "intact" : "BROKEN") << ", head " << ctx.audit_head
    << ".\n";
  return o.str();
}

std::string RenderTextReport(const AnalysisResult& r) {
  std::ostringstream o;
  o << r.title << "\n" << std::string(std::min<size_t>(r.title.size(), 78), '=') << "\n\n";
  PlainWords(o, r);
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
  DesignBlock(o, r);
  ResponseTimesBlock(o, r);
  EmployersBlock(o, r);
  return o.str();
}

}  // namespace twinprobe
