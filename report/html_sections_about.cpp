// Methods (with sources), cautions and the reproducibility stamp of the HTML
// report.
#include <cmath>

#include "report/html_escape.h"
#include "report/plural.h"
#include "report/html_parts.h"
#include "report/html_sections.h"
#include "report/html_table.h"
#include "report/plain_summary.h"
#include "report/records_data.h"

namespace twinprobe {
namespace {

std::string Item(const std::string& name, const std::string& text, const std::string& source) {
  return "<li><strong>" + EscapeHtml(name) + ".</strong> " + EscapeHtml(text) +
         (source.empty() ? "" : " <span class=\"source\">Source: " + EscapeHtml(source) + ".</span>") + "</li>";
}

// The published source of each p.adjust method (docs/methods.md).
std::string CorrectionSource(const std::string& method) {
  if (method == "holm") return "Holm, S. (1979), Scandinavian Journal of Statistics 6:65\u201370; ";
  if (method == "hochberg") return "Hochberg, Y. (1988), Biometrika 75:800\u2013803; ";
  if (method == "hommel") return "Hommel, G. (1988), Biometrika 75:383\u2013386; ";
  if (method == "bh") return "Benjamini, Y. & Hochberg, Y. (1995), JRSS B 57:289\u2013300; ";
  if (method == "by") return "Benjamini, Y. & Yekutieli, D. (2001), Annals of Statistics 29:1165\u20131188; ";
  if (method == "bonferroni") return "Bonferroni correction as R's p.adjust; ";
  return "";
}

}  // namespace

std::string MethodsText(const AnalysisResult& r, const ReportContext&) {
  const std::string conf = std::to_string(static_cast<int>(std::lround(r.confidence * 100))) + "%";
  std::string o = "<ul class=\"methods\">";
  if (r.records)
    o += Item("Data",
              "Each application counts with the outcome recorded in the imported file. Every change to the study "
              "store is sealed in a SHA-256 audit chain.",
              "");
  else
    o += Item("Data",
              "Each application (probe) counts with its current outcome: the newest recorded response, or none. A "
              "corrected response supersedes the earlier one and both are kept. A set enters the analysis only when "
              "every application in it was sent. Every change to the study store is sealed in a SHA-256 audit chain.",
              "");
  if (!r.listings.listing_only)
    o += Item(r.records ? "Positive outcome rate" : "Positive callback rate",
            std::string(r.records ? "The share of a group's applications with a positive outcome" :
                                    "The share of a group's applications that received a positive answer") +
                ", with the exact " + conf +
                " confidence interval of Clopper and Pearson (the same as R's binom.test).",
            "Clopper, C. J. & Pearson, E. S. (1934), Biometrika 26:404–413");
  if (r.has_paired)
    o += Item("Exact McNemar test",
              "For paired applications, only the unequal pairs carry information. Under equal treatment the number b "
              "of pairs favouring the reference group is binomial with b + c trials and probability ½; the two-sided "
              "p-value is min(1, 2·P(X ≤ min(b, c))).",
              "McNemar, Q. (1947), Psychometrika 12:153–157; exact form as in Fagerland, M. W., Lydersen, S. & Laake, "
              "P. (2013), BMC Medical Research Methodology 13:91");
  if (!r.effects.comparisons.empty() && r.effects.comparisons.front().paired)
    o += Item("Effect measures for pairs",
              "Net discrimination (b \u2212 c)/(a + b + c), the ILO measure, and the difference of rates (b \u2212 c)/n, "
              "each with Newcombe's score interval for paired proportions (method 10); the conditional odds ratio "
              "b/c with the exact interval from the Clopper\u2013Pearson interval of b/(b + c); the mid-p and the "
              "asymptotic McNemar test beside the exact one.",
              "Bovenkerk, F. (1992), Testing discrimination in natural experiments, ILO; Riach, P. A. & Rich, J. "
              "(2002), Economic Journal 112:F480\u2013F518; Newcombe, R. G. (1998), Statistics in Medicine "
              "17:2635\u20132650; Breslow, N. E. & Day, N. E. (1980), Statistical Methods in Cancer Research I, eq. 5.2; "
              "Fagerland, Lydersen & Laake (2013)");
  if (!r.effects.comparisons.empty() && !r.effects.comparisons.front().paired)
    o += Item("Unpaired comparisons",
              "Each application counts on its own: Fisher's exact test (two-sided, as R's fisher.test) with the "
              "conditional maximum-likelihood odds ratio and its exact interval.",
              "Fisher, R. A. (1935), Journal of the Royal Statistical Society 98:39\u201382");
  if (!r.effects.strata.empty())
    o += Item("Strata and multiple comparisons",
              "Within each value of each stratum column the same test is run; the p-values of one column form a "
              "family and are adjusted with the design's method (" + r.effects.correction +
                  ", as R's p.adjust). Across the values of a column the Mantel\u2013Haenszel odds ratio (with the "
                  "Robins\u2013Breslow\u2013Greenland interval), the Cochran\u2013Mantel\u2013Haenszel test and "
                  "the Breslow\u2013Day test of equal odds ratios (with Tarone's correction) are reported.",
              CorrectionSource(r.effects.correction) + "Mantel, N. & Haenszel, W. (1959), "
              "Journal of the National Cancer Institute 22:719\u2013748; Robins, Breslow & Greenland (1986), "
              "Biometrics 42:311\u2013323; Breslow & Day (1980), section 4.4; Tarone, R. E. (1985), Biometrika "
              "72:91\u201395");
  if (!r.strata.empty())
    o += Item("Strata",
              "The paired table is repeated within each value of each stratum column; these tables describe where the "
              "unequal pairs occurred.",
              "");
  if (!r.listings.listing_only && (!r.records || r.response_times.available))
    o += Item("Time to first response",
            "Days from sending to the earliest answer other than none, per application; the curves are the cumulative "
            "share of sent applications answered by each day. Answers after the " +
                std::to_string(r.response_times.window_days) +
                "-day observation window count as no answer. Applications still within their window are left out until it ends.",
            "");
  if (r.balance.present)
    o += Item("Balance of the plan",
              "Applications are counted by group against template, position in the sending order, stratum and "
              "weekday; each table is tested with Pearson's chi-square test of independence without continuity "
              "correction (as R's chisq.test with correct = FALSE), with a seeded Monte Carlo p-value from 9,999 "
              "tables with the observed margins when expected counts are small. For what the plan balances by "
              "construction, X\u00b2 = 0 and p = 1 are a proof of balance, not a test of chance.",
              "Pearson, K. (1900), Philosophical Magazine 50:157\u2013175; Agresti, A. (2002), Categorical Data "
              "Analysis, 2nd ed., section 3.2.1");
  if (r.preregistration.frozen)
    o += Item("Pre-registration",
              "'twinprobe freeze' stored the SHA-256 of the design and of the analysis plan before the data came in. "
              "The report compares both with the current ones; each change is listed as a deviation, and results it "
              "touches are marked exploratory.",
              "");
  if (r.employers.available)
    o += Item("Employer pseudonyms",
              "Employers are identified by a keyed hash (HMAC-SHA-256) of the normalised name under a secret kept in "
              "the study store; deleting the secret and the employer table (purge) leaves pseudonyms that reveal "
              "nothing.",
              "");
  if (r.listings.present)
    o += Item("Listing audit",
              "A group's exposure is the mean attention of its places (" + r.listings.discount +
                  " discount); the exposure gap and the earth mover's (1-Wasserstein) distance between the groups' "
                  "positions are tested by permutation within each query \u00D7 location, p-values across strata "
                  "adjusted with " + r.listings.correction + "; the Mann\u2013Whitney, Wilcoxon signed-rank and sign "
                  "tests as R computes them; personalised lists by the Jaccard distance against a same-profile noise "
                  "floor.",
              "Singh, A. & Joachims, T. (2018), Fairness of exposure in rankings, KDD '18, pp. 2219\u20132228; "
              "J\u00E4rvelin, K. & Kek\u00E4l\u00E4inen, J. (2002), ACM TOIS 20(4):422\u2013446; Rubner, Tomasi & "
              "Guibas (2000), IJCV 40(2); Hann\u00E1k et al. (2013), WWW '13");
  o += Item("Charts",
            "Colours follow the Okabe–Ito palette, chosen to be distinguishable with every common form of colour "
            "blindness; groups also differ by marker shape and line pattern. Every chart has a data table beside it.",
            "Okabe, M. & Ito, K. (2008), Color Universal Design (CUD): how to make figures and presentations that are "
            "friendly to colorblind people");
  o += "</ul>";
  o += html::Para("docs/methods.md in twinprobe's source tree gives every formula with its source and the reference "
                  "values the implementation is tested against.",
                  "note");
  return o;
}

// A study of applicant records (import applications): the same points as
// RecordsCautionsBlock in report/text_report.cpp.
std::string RecordsCautionsText() {
  std::string o = "<ul class=\"cautions\">";
  o += "<li><strong>Records, not an experiment.</strong> The applications were real and not matched; a difference "
       "between groups may reflect qualifications, experience or other differences that the data do not hold, as "
       "well as unequal treatment.</li>";
  o += "<li><strong>The four-fifths rule.</strong> The Uniform Guidelines on Employee Selection Procedures (1978, 29 "
       "CFR 1607.4(D)) read a selection rate below four-fifths of the highest group's as generally evidence of "
       "adverse impact. It is a rule of thumb, not a test: read it with the interval of the ratio.</li>";
  o += "<li><strong>Personal data.</strong> Applicant records are personal data; keep the study store under your "
       "data-protection plan.</li>";
  o += "<li><strong>What each p-value tests.</strong> Every p-value names its test and whether it is one- or "
       "two-sided. A test that does not reject equal selection rates is not proof that they are equal.</li>";
  return o + "</ul>";
}

std::string CautionsText(const AnalysisResult& r, const ReportContext& ctx) {
  if (r.records) return RecordsCautionsText();
  std::string o = "<ul class=\"cautions\">";
  o += "<li><strong>Ethics review.</strong> A correspondence test deceives employers and takes their time. It should "
       "run only with the approval of an ethics review board, with few applications per employer and every "
       "invitation declined promptly and politely.";
  if (!ctx.ethics_approval.empty()) o += " This study's approval: " + UserText(ctx.ethics_approval) + ".";
  o += "</li>";
  o += "<li><strong>The law differs by country.</strong> In some countries situation testing is accepted as evidence "
       "of discrimination; elsewhere it is unregulated or restricted. Take legal advice before any finding is used "
       "against a named employer.</li>";
  o += "<li><strong>Personal data.</strong> Employer names and contacts and recruiters' messages are personal data. "
       "This report shows employers by pseudonym";
  o += ctx.reveal_employers ? "; this copy names them, so share it only with people entitled to see the names."
                            : " only; keep the study store under your data-protection plan.";
  o += "</li>";
  o += "<li><strong>What a correspondence test shows.</strong> It measures the first stage of hiring (who is answered "
       "or invited) for the vacancies tested, under the fictitious profiles used. It does not measure later stages "
       "(interviews, offers, pay), employers outside the sample, or the reasons for a decision. A test that finds no "
       "difference is not proof that there is none.</li>";
  o += "<li><strong>Safeguards.</strong> The ethics/ folder of the twinprobe source tree holds a protocol template, a "
       "review checklist, data-protection notes and letter templates for declining invitations.</li>";
  return o + "</ul>";
}

std::string StampTable(const AnalysisResult& r, const ReportContext& ctx) {
  std::vector<std::pair<std::string, std::string>> rows = {
      {"Made by", "twinprobe " + (ctx.tool_version.empty() ? std::string("(version unknown)") : ctx.tool_version)},
      {"Made at (UTC)", ctx.generated_at.empty() ? "unknown" : ctx.generated_at},
      {"Study", r.study_id},
      {"Design hash (SHA-256)", r.design.design_sha256.empty() ? "none" : r.design.design_sha256},
      {"Random seed", r.design.has_seed ? std::to_string(r.design.seed) : "none"},
      {"Data", r.records ? RecordsExtent(r.probes_planned, r.vacancies) + " (records imported from a file)"
                         : std::to_string(r.vacancies) + " vacancies, " + std::to_string(r.probes_planned) +
                               " applications planned, " + std::to_string(r.probes_sent) + " sent, " +
                               std::to_string(r.responses) + " with a response, " + std::to_string(r.sets_analysed) +
                               " sets analysed"},
  };
  if (r.records) {  // no design file, no randomisation: the files the records came from instead
    std::erase_if(rows, [](const auto& row) { return row.first == "Design hash (SHA-256)" || row.first == "Random seed"; });
    for (const std::string& line : RecordsFileLines(r)) rows.push_back({"Imported file", line});
  }
  if (!ctx.audit_head.empty())
    rows.push_back({"Audit chain", Count(ctx.audit_entries, "entry", "entries") + ", " +
                                       (ctx.audit_intact ? "intact" : "BROKEN (run twinprobe verify)") + ", head " +
                                       ctx.audit_head});
  rows.push_back({"Employer names", ctx.reveal_employers ? "shown (--reveal-employers, recorded in the audit chain)"
                                                         : "not shown (pseudonyms only)"});
  return html::Para("With the study folder and this version of twinprobe, 'twinprobe report' recomputes every number "
                    "in this report; 'twinprobe verify' checks that the stored data are unchanged since the audit "
                    "head below.") +
         html::Facts(rows);
}

}  // namespace twinprobe
