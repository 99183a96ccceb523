#include "report/text_report.h"
#include "report/fieldwork_state.h"
#include "report/plural.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <sstream>

#include "analysis/strongest_evidence.h"
#include "core/text.h"
#include "report/design_report.h"
#include "report/early_stop_report.h"
#include "report/effects_report.h"
#include "report/declines_report.h"
#include "report/stages_report.h"
#include "report/employer_flip_text.h"
#include "report/adjusted_model_report.h"
#include "report/covariate_model_report.h"
#include "report/k_level_report.h"
#include "report/plain_summary.h"
#include "report/records_data.h"

namespace twinprobe {

std::string FormatPercent(double rate) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.1f%%", rate * 100.0);
  return buf;
}

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

namespace {

// The cautions the plain summary points to ("see the cautions at the end of
// this report"); the HTML report lists the same points (CautionsText in
// report/html_sections_about.cpp).
void CautionsBlock(std::ostringstream& o) {
  o << "\nCautions.\n"
    << Wrap("Ethics review. A correspondence test deceives employers and takes their time. It should run only with "
            "the approval of an ethics review board, with few applications per employer and every invitation "
            "declined promptly and politely.", "  ")
    << Wrap("The law differs by country. In some countries situation testing is accepted as evidence of "
            "discrimination; elsewhere it is unregulated or restricted. Take legal advice before any finding is "
            "used against a named employer.", "  ")
    << Wrap("Personal data. Employer names and contacts and recruiters' messages are personal data. This report "
            "shows employers by pseudonym unless --reveal-employers was given; keep the study store under your "
            "data-protection plan.", "  ")
    << Wrap("What a correspondence test shows. It measures the first stage of hiring (who is answered or invited) "
            "for the vacancies tested, under the fictitious profiles used. It does not measure later stages "
            "(interviews, offers, pay), employers outside the sample, or the reasons for a decision. A test that "
            "does not reject equal treatment is not proof that there is none.", "  ")
    << Wrap("What each p-value tests. Every p-value above names its test and whether it is one- or two-sided; "
            "p-values of tests that assume independent observations where there are none (the Mann-Whitney test on "
            "listing positions) are descriptive only.", "  ");
}

// The cautions of a study of applicant records (import applications):
// there was no deception and no fieldwork; what the numbers can and cannot
// carry is the point. The HTML report lists the same (RecordsCautionsText in
// report/html_sections_about.cpp).
void RecordsCautionsBlock(std::ostringstream& o) {
  o << "\nCautions.\n"
    << Wrap("Records, not an experiment. The applications were real and not matched; a difference between groups "
            "may reflect qualifications, experience or other differences that the data do not hold, as well as "
            "unequal treatment.", "  ")
    << Wrap("The four-fifths rule. The Uniform Guidelines on Employee Selection Procedures (1978, 29 CFR "
            "1607.4(D)) read a selection rate below four-fifths of the highest group's as generally evidence of "
            "adverse impact. It is a rule of thumb, not a test: read it with the interval of the ratio.", "  ")
    << Wrap("Personal data. Applicant records are personal data; keep the study store under your "
            "data-protection plan.", "  ")
    << Wrap("What each p-value tests. Every p-value above names its test and whether it is one- or two-sided. A "
            "test that does not reject equal selection rates is not proof that they are equal.", "  ");
}

void PlainWords(std::ostringstream& o, const AnalysisResult& r) {
  for (const auto& p : PlainSummary(r)) o << p.heading << ".\n" << Wrap(p.text, "  ") << "\n";
}

void DesignBlock(std::ostringstream& o, const AnalysisResult& r) {
  if (r.records) {  // no design, employers, hash or seed: what the data are
    o << RecordsDataText(r);
    return;
  }
  const auto& d = r.design;
  o << "\nDesign: ";
  for (size_t i = 0; i < d.factors.size(); ++i) {
    // Codes as stored, each with its display label when the design gives one.
    const auto& f = d.factors[i];
    o << (i ? "; " : "") << "factor " << f.name << (f.label.empty() ? "" : " = " + f.label) << " (";
    for (size_t k = 0; k < f.levels.size(); ++k)
      o << (k ? ", " : "") << f.levels[k]
        << (k < f.level_labels.size() && !f.level_labels[k].empty() ? " = " + f.level_labels[k] : "");
    o << "; reference " << d.factors[i].reference << ")";
  }
  if (r.records) o << "; " << d.employers << " employers (by pseudonym).\n";
  else o << "; " << d.employers << " employers (by pseudonym); observation window " << d.window_days << " days.\n";
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
    std::snprintf(line, sizeof line, " %s", PadRight(ArmName(r, a.label) + " any / positive", 34).c_str());
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
    o << "  " << ArmName(r, a.label) << ": " << a.responded << " of " << a.probes_sent << " answered within the window";
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
    o << "  " << x.pseudonym << ": " << Count(x.vacancies, "pair", "pairs") << ", only " << ArmName(r, r.reference_label) << " "
      << x.table.b << ", only " << ArmName(r, r.other_label) << " " << x.table.c << "\n";
  }
  if (!any) o << " None had more than one.\n";
  if (std::string flip = EmployerFlipSentence(r); !flip.empty()) o << Wrap(flip, "  ");
}

std::string Fixed(double v, int digits) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*f", digits, v);
  return buf;
}

std::string Signed(double v, int digits) { return (v >= 0 ? "+" : "") + Fixed(v, digits); }

std::string Stratum(const ListingComparison& c) {
  if (c.query.empty()) return c.location;
  return c.location.empty() ? c.query : c.query + " / " + c.location;
}

// The listing audit as text (docs/ranks.md explains every figure).
std::string RenderListingText(const ListingAudit& a, double alpha, bool heading) {
  std::ostringstream o;
  if (heading) o << "Listing audit\n-------------\n";
  std::string factors;
  for (const auto& f : a.factors) factors += (factors.empty() ? "" : ", ") + f;
  o << a.listings << " ranked lists in " << a.strata << " query x location strata; " << a.appearances << " places, "
    << a.labelled_appearances << " held by items labelled with every factor (" << factors << ").\n";
  if (a.factors.empty()) {
    o << "No item carries a group label, so nothing can be compared; import labels with the lists.\n";
    return o.str();
  }
  o << "Exposure is the attention a place gets, " << (a.discount == "log2" ? "1/log2(1 + position)" : a.discount)
    << " (" << a.discount << " discount); \"top " << a.top_k << "\" is the group's share of places 1-" << a.top_k
    << ".\n\n";
  char line[320];
  std::snprintf(line, sizeof line, "  %-34s %7s %9s %7s %7s %9s %7s\n", "group", "places", "exposure", "share",
                ("top " + std::to_string(a.top_k)).c_str(), "mean pos", "median");
  o << line;
  for (const auto& g : a.groups) {
    std::snprintf(line, sizeof line, "  %s %7lld %9.4f %7s %7s %9.2f %7.1f\n", PadRight(g.label, 34).c_str(),
                  static_cast<long long>(g.appearances), g.exposure, FormatPercent(g.exposure_share).c_str(),
                  FormatPercent(g.top_k_share).c_str(), g.mean_position, g.median_position);
    o << line;
  }
  o << "\nReference level against each other level over all lists (permutation tests exchange the groups of\n"
    << "items within each query x location; " << a.resamples << " resamples, seed " << a.seed << "):\n";
  for (const auto& c : a.overall) {
    o << "  " << c.factor << ": " << c.reference << " vs " << c.other << " (" << c.n_reference << " and " << c.n_other
      << " places)\n";
    o << "    exposure gap " << Signed(c.exposure_gap, 4) << " (" << c.reference << " - " << c.other
      << "), permutation test, two-sided, " << PEquals(c.gap_p) << "\n";
    o << "    earth mover's distance " << Fixed(c.emd, 2) << " places, permutation test (a larger distance is more "
      << "extreme), " << PEquals(c.emd_p) << "\n";
    // A line of its own, the caution after the p-value: wrapped inside its
    // parenthesis, the sentence read as two broken halves.
    o << "    Mann-Whitney test on positions, two-sided, " << PEquals(c.mann_whitney_p)
      << " (descriptive only: places are not independent and items recur)\n";
    for (const auto& p : a.paired)
      if (p.factor == c.factor && p.other == c.other) {
        o << "    across " << p.strata << " strata the gap favours " << c.reference << " in " << p.sign.positive
          << ", " << c.other << " in " << p.sign.negative << " (sign test " << PEquals(p.sign.p_value)
          << "); Wilcoxon signed-rank V = " << p.wilcoxon.statistic << ", "
          << PEquals(p.wilcoxon.p_value) << "\n";
      }
  }
  if (!a.by_stratum.empty()) {
    const bool adjusted = a.by_stratum.front().gap_p_adjusted.has_value();
    const std::vector<const ListingComparison*> rows = StrongestEvidence(a);  // ties in adjusted p by raw p
    auto key = [&](const ListingComparison* c) { return adjusted ? *c->gap_p_adjusted : c->gap_p; };
    int64_t significant = 0;
    for (auto* c : rows) significant += key(c) < alpha;
    o << "\nQuery x location strata with the strongest evidence of an exposure gap ("
      << (adjusted ? "p adjusted by " + a.correction + " across the strata of each comparison"
                   : "p NOT adjusted for multiple comparisons: unknown correction '" + a.correction + "'")
      << "):\n";
    std::snprintf(line, sizeof line, "  %-36s %-24s %9s %9s %9s %7s\n", "stratum", "comparison", "gap", "p",
                  adjusted ? "p adj" : "", "EMD");
    o << line;
    for (size_t i = 0; i < rows.size() && i < 8; ++i) {
      const auto& c = *rows[i];
      std::snprintf(line, sizeof line, "  %s %s %9s %9s %9s %7.2f\n", PadRight(Stratum(c), 36).c_str(),
                    PadRight(c.reference + " vs " + c.other, 24).c_str(), Signed(c.exposure_gap, 4).c_str(),
                    FormatP(c.gap_p).c_str(), adjusted ? FormatP(*c.gap_p_adjusted).c_str() : "", c.emd);
      o << line;
    }
    o << "  " << significant << " of " << rows.size() << " stratum comparisons have " << (adjusted ? "an adjusted " : "a ")
      << "p below alpha = " << alpha << ".\n";
  }
  if (!a.disparity.empty()) {
    o << "\nNeighbour groups: the disparity of a group is its mean earth mover's distance (in places) to the\n"
      << "groups that differ from it in exactly one level, within a stratum, then averaged:\n";
    for (const auto& d : a.disparity) {
      auto list = [](const std::vector<DisparityEntry>& v) {
        std::string s;
        for (const auto& e : v) s += (s.empty() ? "" : "; ") + e.value + " " + Fixed(e.disparity, 2);
        return s;
      };
      char head[64];
      std::snprintf(head, sizeof head, "  %s most:  ", PadRight(d.dimension, 9).c_str());
      o << head << list(d.most) << "\n";
      std::snprintf(head, sizeof head, "  %-9s least: ", "");
      o << head << list(d.least) << "\n";
    }
  }
  if (a.widest) {
    const auto& w = *a.widest;
    o << "\nWidest split of the listed population: " << w.description << " (" << w.parts
      << " parts), mean distance between parts " << Fixed(w.distance, 2) << " places; permutation p = "
      << FormatP(w.p_value) << " for the largest of " << w.candidates << " candidate splits ("
      << (w.exhaustive ? "exhaustive search" : "bounded search") << ").\n";
  }
  if (!a.overlap.empty()) {
    o << "\nPersonalised lists (mean Jaccard distance between the items shown to two profiles; same-profile pairs\n"
      << "are the noise floor):\n";
    for (const auto& p : a.overlap)
      o << "  " << p.profile_a << " vs " << p.profile_b << ": " << Fixed(p.mean_jaccard_distance, 3) << " over "
        << Count(p.comparisons, "pair", "pairs") << " of lists\n";
  }
  return o.str();
}

void FindingsBlock(std::ostringstream& o, const AnalysisResult& r);

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
    << Count(ctx.audit_entries, "entry", "entries") << ", " << (ctx.audit_intact ? "intact" : "BROKEN") << ", head " << ctx.audit_head
    << ".\n";
  return o.str();
}

std::string RenderTextReport(const AnalysisResult& r) {
  if (r.listings.listing_only)  // a store with lists only: no callbacks to report
    return r.title + "\n" + std::string(std::min<size_t>(r.title.size(), 78), '=') + "\n\n" +
           RenderListingText(r.listings, r.alpha, false);
  std::ostringstream o;
  o << r.title << "\n" << std::string(std::min<size_t>(r.title.size(), 78), '=') << "\n\n";
  PlainWords(o, r);
  if (r.records) {
    // Records have no fieldwork: no sending, no window, no flow of sets.
    o << "Study " << r.study_id << " (" << r.kind << " design, applicant records imported from a file).\n"
      << RecordsExtent(r.probes_planned, r.vacancies) << ", each with its recorded outcome.\n\n";
    FindingsBlock(o, r);
    DesignBlock(o, r);
    o << "\n" << RenderPreregistrationText(r.preregistration);
    RecordsCautionsBlock(o);
    return o.str();
  }
  o << "Study " << r.study_id << " (" << r.kind << " design, plan from " << r.plan_origin << ").\n";
  o << r.vacancies << " vacancies, " << r.probes_planned << " probes planned, " << r.probes_sent << " sent, "
    << r.responses << " with a recorded response";
  if (r.responses_superseded) o << " (" << r.responses_superseded << " earlier entries corrected)";
  o << ".\n" << r.sets_analysed << " complete sets analysed";
  if (r.sets_incomplete) o << "; " << r.sets_incomplete << " sets left out because a probe was not sent";
  o << ".\n";
  if (const std::string open = OpenSetsSentence(r); !open.empty()) o << open << "\n";
  o << "\nFlow of the study:\n";
  for (const std::string& line : FlowTextLines(r.flow)) o << "  " << line << "\n";
  o << "\n";
  // An early state has no findings: no rate, no table, no sentence about
  // employers; the design, its balance and the pre-registration still show.
  const bool findings = EarlyStateSentence(r).empty();
  if (findings) FindingsBlock(o, r);
  if (std::string stop = RenderEarlyStopText(r.early_stop, r.reference_label, r.other_label); !stop.empty())
    o << "\n" << stop;
  DesignBlock(o, r);
  if (findings) {
    ResponseTimesBlock(o, r);
    EmployersBlock(o, r);
  }
  o << RenderDeclinesText(r);
  if (r.listings.present) o << "\n" << RenderListingText(r.listings, r.alpha, true);
  // Design integrity: balance of the plan and the pre-registration.
  if (std::string balance = RenderBalanceText(r.balance); !balance.empty()) o << "\n" << balance;
  o << "\n" << RenderPreregistrationText(r.preregistration);
  CautionsBlock(o);
  return o.str();
}

namespace {

// The rates, the paired table and test, and the effects.
void FindingsBlock(std::ostringstream& o, const AnalysisResult& r) {
  o << (r.records ? "Positive outcome (" : "Positive callback (");
  for (size_t i = 0; i < r.positive_codes.size(); ++i) o << (i ? ", " : "") << r.positive_codes[i];
  o << (r.records ? ") by group, with" : ") by arm, with") << " exact Clopper-Pearson " << static_cast<int>(std::lround(r.confidence * 100))
    << "% intervals:\n";
  for (const auto& a : r.arms) {
    char line[256];
    std::snprintf(line, sizeof line, "  %s %6lld / %-6lld %7s   [%s, %s]%s\n", PadRight(a.label, 28).c_str(),
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
    o << "Exact McNemar test (conditional binomial on the " << Count(t.discordant(), "discordant pair", "discordant pairs")
      << ", two-sided): " << PEquals(r.mcnemar_exact_p) << ".\n";
    if (t.discordant() == 0)
      o << "No pair was discordant, so the data say nothing about a difference between the arms.\n";
    else if (r.mcnemar_exact_p < r.alpha)
      o << "At alpha = " << r.alpha << " the exact McNemar test, two-sided, rejects equal treatment: "
        << (t.b > t.c ? r.reference_label : r.other_label) << " was favoured in " << std::max(t.b, t.c) << " of the "
        << Count(t.discordant(), "pair", "pairs") << " where the employer treated the two applicants differently.\n";
    else
      o << "At alpha = " << r.alpha << " the exact McNemar test, two-sided, does not reject equal treatment; this is "
           "not evidence that there is none.\n";
  }
  o << RenderEffectsText(r);
  o << RenderStagesText(r);
  o << RenderAdjustedText(r);
  o << RenderCovariateModelText(r);
  o << RenderKLevelText(r);
}

}  // namespace

}  // namespace twinprobe
