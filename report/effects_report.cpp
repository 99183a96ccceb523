#include "report/effects_report.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <sstream>

#include "core/text.h"
#include "report/fieldwork_state.h"
#include "report/json_number.h"
#include "report/plain_summary.h"
#include "report/plural.h"
#include "report/text_report.h"

namespace twinprobe {

std::string FormatEstimate(double v) {
  if (std::isnan(v)) return "undefined";
  if (std::isinf(v)) return v > 0 ? "infinite" : "-infinite";
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.3g", v);
  return buf;
}

std::string FormatInterval(const stats::Interval& ci) {
  return "[" + FormatEstimate(ci.low) + ", " + FormatEstimate(ci.high) + "]";
}

std::string ConfidencePercent(double confidence) {
  return std::to_string(static_cast<int>(std::lround(confidence * 100))) + "%";
}

namespace {

nlohmann::json Ci(const stats::Interval& ci) { return nlohmann::json::array({JsonNumber(ci.low), JsonNumber(ci.high)}); }

nlohmann::json P(const stats::PValue& p) { return {{"p", JsonNumber(p.p)}, {"log10_p", JsonNumber(p.log10_p)}}; }

nlohmann::json Est(const stats::Estimate& e) { return {{"estimate", JsonNumber(e.estimate)}, {"conf_int", Ci(e.ci)}}; }

nlohmann::json ComparisonJson(const ArmComparison& c) {
  nlohmann::json j{{"other_arm", c.other_label}, {"design", c.paired ? "paired" : "unpaired"}, {"p_value", JsonNumber(c.p.p)},
                   {"log10_p_value", JsonNumber(c.p.log10_p)}, {"p_adjusted", JsonNumber(c.p_adjusted)}};
  if (c.paired) {
    j["table"] = {{"a", c.pairs.a}, {"b", c.pairs.b}, {"c", c.pairs.c}, {"d", c.pairs.d}, {"n", c.pairs.n()}};
    j["mcnemar_exact"] = P(c.mcnemar.exact);
    j["mcnemar_mid_p"] = P(c.mcnemar.mid_p);
    j["mcnemar_chi2"] = {{"statistic", JsonNumber(c.mcnemar.chi2)}, {"df", 1}, {"p", JsonNumber(c.mcnemar.chi2_p.p)}};
    j["mcnemar_chi2_corrected"] = {{"statistic", JsonNumber(c.mcnemar.chi2_corrected)}, {"df", 1}, {"p", JsonNumber(c.mcnemar.chi2_corrected_p.p)}};
    j["conditional_odds_ratio"] = Est(c.conditional_or);
    j["conditional_odds_ratio"]["method"] = "exact (Clopper-Pearson), two-sided";
    j["conditional_odds_ratio"]["conf_int_mid_p"] = Ci(c.conditional_or_mid_p.ci);
    j["callback_rate_ratio"] = Est(c.callback_ratio);
    j["callback_rate_ratio"]["method"] = "Bonett-Price, two-sided";
    j["net_discrimination_among_positive"] = Est(c.net.among_positive);
    j["paired_difference"] = Est(c.net.over_all);
    if (const auto& q = c.equivalence)
      j["equivalence"] = {{"test", "two one-sided Tango score tests"},
                          {"margin", JsonNumber(q->upper_margin)},
                          {"estimate", JsonNumber(q->estimate)},
                          {"z_lower", JsonNumber(q->z_lower)},
                          {"z_upper", JsonNumber(q->z_upper)},
                          {"p_lower", JsonNumber(q->p_lower.p)},
                          {"p_upper", JsonNumber(q->p_upper.p)},
                          {"p", JsonNumber(q->p.p)},
                          {"conf_int", Ci(q->ci)},
                          {"conf_level", JsonNumber(1 - 2 * q->alpha)},
                          {"alpha", JsonNumber(q->alpha)},
                          {"equivalent", q->equivalent}};
  } else {
    j["table"] = {{"a", c.table.a}, {"b", c.table.b}, {"c", c.table.c}, {"d", c.table.d}, {"n", c.table.n()}};
    j["fisher"] = {{"p", JsonNumber(c.fisher.p.p)}, {"log10_p", JsonNumber(c.fisher.p.log10_p)}, {"conditional_mle_odds_ratio", JsonNumber(c.fisher.estimate)},
                   {"conf_int", Ci(c.fisher.ci)}};
    j["sample_odds_ratio"] = {{"estimate", JsonNumber(c.woolf.estimate)}, {"conf_int", Ci(c.woolf.ci)}, {"method", "Woolf"}};
    j["reference_rate_wilson"] = Ci(c.reference_wilson);
    j["other_rate_wilson"] = Ci(c.other_wilson);
    if (c.has_rate_contrast) {
      j["impact_ratio"] = {{"estimate", JsonNumber(c.impact.ratio)},
                           {"conf_int", Ci(c.impact.koopman_score)},
                           {"method", "Koopman score, two-sided"},
                           {"conf_int_katz_log", Ci(c.impact.katz_log)}};
      j["rate_difference"] = {{"estimate", JsonNumber(c.difference.difference)},
                              {"conf_int", Ci(c.difference.ci)},
                              {"method", "Newcombe hybrid score (1998, method 10), two-sided"}};
    }
  }
  return j;
}

std::string Fmt(double v) { return FormatEstimate(v); }
std::string FmtCi(const stats::Interval& ci) { return FormatInterval(ci); }
std::string Percent(double confidence) { return ConfidencePercent(confidence); }

void ComparisonText(std::ostringstream& o, const ArmComparison& c, const AnalysisResult& r, const std::string& ref) {
  const std::string cl = Percent(r.confidence);
  if (c.paired) {
    const auto& t = c.pairs;
    o << "  " << ArmShown(r, c.other_label) << " vs " << ref << ": " << t.n() << " sets with both (a " << t.a << ", b " << t.b << ", c "
      << t.c << ", d " << t.d << ").\n"
      << "    the exact McNemar test, two-sided, " << (c.mcnemar.exact.p < r.alpha ? "rejects" : "does not reject")
      << " equal treatment at alpha " << Fmt(r.alpha) << ": " << PEquals(c.mcnemar.exact) << " (mid-p, two-sided, "
      << FormatP(c.mcnemar.mid_p) << "); asymptotic McNemar X^2 = " << Fmt(c.mcnemar.chi2) << " ("
      << PEquals(c.mcnemar.chi2_p) << "), with continuity correction " << Fmt(c.mcnemar.chi2_corrected) << " ("
      << PEquals(c.mcnemar.chi2_corrected_p) << ").\n"
      << "    callback-rate ratio (a+b)/(a+c) (reference over other) = " << Fmt(c.callback_ratio.estimate) << ", " << cl
      << " two-sided CI (Bonett-Price) " << FmtCi(c.callback_ratio.ci) << ".\n"
      << "    conditional odds ratio b/c = " << Fmt(c.conditional_or.estimate) << ", " << cl
      << " two-sided CI exact (Clopper-Pearson) " << FmtCi(c.conditional_or.ci) << ", mid-p "
      << FmtCi(c.conditional_or_mid_p.ci) << ".\n"
      << "    net discrimination (b-c)/(a+b+c) = " << Fmt(c.net.among_positive.estimate) << " " << FmtCi(c.net.among_positive.ci)
      << "; paired difference of rates (b-c)/n = " << Fmt(c.net.over_all.estimate) << " " << FmtCi(c.net.over_all.ci)
      << " (" << cl << " two-sided, Newcombe).\n";
    if (c.equivalence) o << "    " << EquivalenceSentence(*c.equivalence) << "\n";
  } else {
    const auto& t = c.table;
    o << "  " << ArmShown(r, c.other_label) << " vs " << ref << ": " << t.c << "/" << t.c + t.d << " positive " << FmtCi(c.other_wilson)
      << " vs " << t.a << "/" << t.a + t.b << " " << FmtCi(c.reference_wilson) << " (Wilson " << cl << ").\n"
      << "    Fisher's exact test, two-sided, " << (c.fisher.p.p < r.alpha ? "rejects" : "does not reject")
      << (r.records ? " equal selection rates at alpha " : " equal callback rates at alpha ") << Fmt(r.alpha) << ": " << PEquals(c.fisher.p) << "; conditional MLE odds ratio (reference vs other) "
      << Fmt(c.fisher.estimate) << ", " << cl << " two-sided exact CI " << FmtCi(c.fisher.ci) << "; sample odds ratio "
      << Fmt(c.woolf.estimate) << " " << FmtCi(c.woolf.ci) << " (Woolf, two-sided).\n";
    if (c.has_rate_contrast)
      o << "    rate ratio (impact ratio) " << Fmt(c.impact.ratio) << ", " << cl << " two-sided CI (Koopman score) "
        << FmtCi(c.impact.koopman_score) << "; rate difference " << Fmt(c.difference.difference) << ", " << cl
        << " two-sided CI (Newcombe 1998, method 10) " << FmtCi(c.difference.ci) << ".\n";
  }
}

// The pair-keeping analysis across one stratum column (analysis/effects.h).
void AcrossPairedText(std::ostringstream& o, const AcrossStrata& a, const AnalysisResult& r, const std::string& ref) {
  const auto& h = a.homogeneity;
  o << "\nAcross " << a.column << " (" << a.values << " values, " << ArmShown(r, a.other_label) << " vs " << ref
    << "; discordant sets per value, pairs kept):\n"
    << "  pooled conditional odds ratio sum(b)/sum(c) = " << h.total_b << "/" << h.total_c << " = "
    << Fmt(h.pooled_odds_ratio.estimate) << ", " << Percent(r.confidence) << " two-sided CI exact (Clopper-Pearson) "
    << FmtCi(h.pooled_odds_ratio.ci) << ".\n";
  if (h.strata_used < 2) {
    o << "  homogeneity of the discordant split b/(b+c): not testable (" << Count(h.strata_used, "value has", "values have")
      << " discordant sets).\n";
    return;
  }
  o << "  homogeneity of the discordant split b/(b+c) across the " << h.strata_used
    << " values with discordant sets: Pearson's chi-square test X^2 = " << Fmt(h.chi2) << " on " << h.df << " df ("
    << PEquals(h.chi2_p) << ")";
  if (h.exact_p) o << "; the exact Freeman-Halton test " << PEquals(*h.exact_p);
  o << ".\n";
  const double p = h.exact_p && h.small_expected ? *h.exact_p : h.chi2_p.p;
  o << "  " << (h.exact_p && h.small_expected ? "the exact test (expected counts are small)" : "the chi-square test")
    << (p < r.alpha ? " rejects" : " does not reject") << " a common conditional odds ratio across " << a.column
    << " at alpha " << Fmt(r.alpha) << ".\n";
}

}  // namespace

std::string EquivalenceSentence(const stats::EquivalenceResult& q) {
  std::ostringstream o;
  o << "equivalence within +/-" << Fmt(q.upper_margin) << " (two one-sided Tango score tests, each one-sided at alpha "
    << Fmt(q.alpha) << "): paired difference (b-c)/n = " << Fmt(q.estimate) << ", "
    << std::lround((1 - 2 * q.alpha) * 100) << "% two-sided CI (Tango) " << FmtCi(q.ci) << "; p = max("
    << FormatP(q.p_lower) << ", " << FormatP(q.p_upper) << ") = " << FormatP(q.p) << ": "
    << (q.equivalent ? "shows" : "does not show") << " equivalence.";
  return o.str();
}

nlohmann::json EffectsJson(const AnalysisResult& r) {
  const Effects& e = r.effects;
  nlohmann::json j;
  j["correction"] = e.correction;
  j["comparisons"] = nlohmann::json::array();
  // The arm's display text beside its code (ArmName: levels by their labels).
  for (const auto& c : e.comparisons) {
    nlohmann::json x = ComparisonJson(c);
    x["other_arm_label"] = ArmName(r, c.other_label);
    j["comparisons"].push_back(x);
  }
  j["not_with_reference"] = e.not_with_reference;
  j["strata"] = nlohmann::json::array();
  for (const auto& s : e.strata) {
    nlohmann::json x = ComparisonJson(s.result);
    x["other_arm_label"] = ArmName(r, s.result.other_label);
    x["column"] = s.column;
    x["value"] = s.value;
    j["strata"].push_back(x);
  }
  j["single_strata"] = nlohmann::json::array();
  const std::vector<std::string> single = SingleStratumSentences(r);
  for (size_t i = 0; i < e.single_strata.size(); ++i)
    j["single_strata"].push_back(
        {{"column", e.single_strata[i].column}, {"value", e.single_strata[i].value}, {"sentence", single[i]}});
  j["across_strata"] = nlohmann::json::array();
  for (const auto& a : e.across) {
    if (a.paired) {
      const auto& h = a.homogeneity;
      nlohmann::json counts = nlohmann::json::array();
      for (const auto& d : a.discordant) counts.push_back({d.b, d.c});
      j["across_strata"].push_back(
          {{"column", a.column},
           {"other_arm", a.other_label},
           {"design", "paired"},
           {"values", a.values},
           {"discordant", counts},
           {"pooled_conditional_odds_ratio",
            {{"b", h.total_b}, {"c", h.total_c}, {"estimate", JsonNumber(h.pooled_odds_ratio.estimate)},
             {"conf_int", Ci(h.pooled_odds_ratio.ci)}, {"method", "exact (Clopper-Pearson), two-sided"}}},
           {"homogeneity",
            {{"test", "Pearson chi-square on the k x 2 table of (b, c)"},
             {"statistic", JsonNumber(h.chi2)},
             {"df", h.df},
             {"p", JsonNumber(h.chi2_p.p)},
             {"exact_p", h.exact_p ? JsonNumber(*h.exact_p) : nlohmann::json(nullptr)},
             {"small_expected", h.small_expected},
             {"strata_used", h.strata_used}}}});
      continue;
    }
    nlohmann::json tables = nlohmann::json::array();
    for (const auto& t : a.tables) tables.push_back({t.a, t.b, t.c, t.d});
    j["across_strata"].push_back(
        {{"column", a.column},
         {"other_arm", a.other_label},
         {"design", "unpaired"},
         {"values", a.values},
         {"tables", tables},
         {"mantel_haenszel", {{"estimate", JsonNumber(a.mh.estimate)}, {"conf_int", Ci(a.mh.ci)}, {"log_sd", JsonNumber(a.mh.log_sd)},
                              {"strata_used", a.mh.strata_used}}},
         {"cmh", {{"statistic", JsonNumber(a.mh.chi2)}, {"p", JsonNumber(a.mh.chi2_p.p)}, {"statistic_corrected", JsonNumber(a.mh.chi2_corrected)},
                  {"p_corrected", JsonNumber(a.mh.chi2_corrected_p.p)}}},
         {"breslow_day", {{"statistic", JsonNumber(a.breslow_day.statistic)}, {"df", JsonNumber(a.breslow_day.df)},
                          {"p", JsonNumber(a.breslow_day.p.p)}, {"tarone_statistic", JsonNumber(a.breslow_day.tarone)},
                          {"tarone_p", JsonNumber(a.breslow_day.tarone_p.p)}, {"strata_used", a.breslow_day.strata_used}}},
         {"sparse", a.sparse},
         {"exact_conditional",
          a.exact ? nlohmann::json{{"statistic", a.exact->statistic},
                                   {"p", JsonNumber(a.exact->p.p)},
                                   {"conditional_mle_odds_ratio", JsonNumber(a.exact->estimate)},
                                   {"conf_int", Ci(a.exact->ci)}}
                  : nlohmann::json(nullptr)}});
  }
  return j;
}

std::string RenderEffectsText(const AnalysisResult& r) {
  const Effects& e = r.effects;
  if (e.comparisons.empty()) return "";
  std::ostringstream o;
  const std::string ref = r.arms.empty() ? "reference" : ArmShown(r, r.arms.front().label);
  const bool paired = e.comparisons.front().paired;
  o << (r.records ? "\nComparisons with the reference group (" : "\nComparisons with the reference arm (") << ref << ")\n";
  if (paired)
    o << "within sets: exact conditional McNemar test (two-sided), mid-p and the asymptotic McNemar test; the\n"
         "callback-rate ratio (a+b)/(a+c) with Bonett and Price's (2006) paired interval; the conditional odds\n"
         "ratio b/c with the exact (Clopper-Pearson) and mid-p intervals of b/(b+c); net discrimination rates\n"
         "with Newcombe's (1998, method 10) score interval. Every interval is two-sided.\n";
  else
    o << (r.records ? "applications counted independently" : "probes counted independently")
      << ": Fisher's exact test (two-sided), the conditional\n"
         "maximum-likelihood odds ratio with its exact interval, the sample odds ratio with Woolf's interval,\n"
         "the rate ratio with Koopman's score interval and the rate difference with Newcombe's (1998, method\n"
         "10) interval.\n";
  for (const auto& c : e.comparisons) ComparisonText(o, c, r, ref);
  if (!e.not_with_reference.empty()) {
    std::string shown;
    for (const auto& label : e.not_with_reference) shown += (shown.empty() ? "" : "; ") + ArmShown(r, label);
    o << "  Not compared with the reference, whose sets they never share (a factor varies between vacancies;\n"
         "  the factor sections below compare its levels): "
      << shown << ".\n";
  }
  if (e.comparisons.size() > 1) {
    o << "  p-values adjusted across the " << e.comparisons.size() << " comparisons (" << e.correction << "):";
    for (const auto& c : e.comparisons) o << " " << c.other_label << " " << Fmt(c.p_adjusted) << ";";
    o << "\n";
  }
  const auto shown = [&r](const StratumComparison& s) { return !(s.column == "vacancy" && r.records); };
  if (std::any_of(e.strata.begin(), e.strata.end(), shown)) {
    o << "\nBy stratum (" << (paired ? "exact McNemar p, conditional odds ratio" : "Fisher's exact p, conditional MLE odds ratio")
      << "; p adjusted with " << e.correction << " within each stratum column):\n";
    for (const auto& s : e.strata) {
      // One line per vacancy would bury the report: those tables are in the
      // JSON only.
      if (!shown(s)) continue;
      const auto& c = s.result;
      char line[400];
      if (paired)
        std::snprintf(line, sizeof line, "  %s %s %s b %4lld  c %4lld  p %-10s adj %-8s OR %s %s\n",
                      PadRight(s.column, 12).c_str(), PadRight(s.value, 18).c_str(), PadRight(c.other_label, 14).c_str(), static_cast<long long>(c.pairs.b),
                      static_cast<long long>(c.pairs.c), FormatP(c.p).c_str(), Fmt(c.p_adjusted).c_str(),
                      Fmt(c.conditional_or.estimate).c_str(), FmtCi(c.conditional_or.ci).c_str());
      else
        std::snprintf(line, sizeof line, "  %s %s %s %lld/%lld vs %lld/%lld  p %-10s adj %-8s OR %s %s\n",
                      PadRight(s.column, 12).c_str(), PadRight(s.value, 18).c_str(), PadRight(c.other_label, 14).c_str(), static_cast<long long>(c.table.c),
                      static_cast<long long>(c.table.c + c.table.d), static_cast<long long>(c.table.a),
                      static_cast<long long>(c.table.a + c.table.b), FormatP(c.p).c_str(), Fmt(c.p_adjusted).c_str(),
                      Fmt(c.fisher.estimate).c_str(), FmtCi(c.fisher.ci).c_str());
      o << line;
    }
  }
  for (const std::string& sentence : SingleStratumSentences(r)) o << "\n" << sentence << "\n";
  for (const auto& a : e.across) {
    if (a.paired) {
      AcrossPairedText(o, a, r, ref);
      continue;
    }
    o << "\nAcross " << a.column << " (" << a.values << " values, " << ArmShown(r, a.other_label) << " vs " << ref
      << (r.records ? "; group x outcome tables):\n" : "; arm x outcome tables):\n")
      << "  Mantel-Haenszel odds ratio (reference vs other) " << Fmt(a.mh.estimate) << ", " << Percent(r.confidence)
      << " two-sided CI (Robins-Breslow-Greenland) " << FmtCi(a.mh.ci) << "; the CMH test, two-sided: X^2 = "
      << Fmt(a.mh.chi2_corrected) << " with continuity correction (" << PEquals(a.mh.chi2_corrected_p) << "), "
      << Fmt(a.mh.chi2) << " without (" << PEquals(a.mh.chi2_p) << ").\n"
      << "  Breslow-Day test of equal odds ratios: X^2 = " << Fmt(a.breslow_day.statistic) << " on "
      << Fmt(a.breslow_day.df) << " df (" << PEquals(a.breslow_day.p) << "); with Tarone's correction "
      << Fmt(a.breslow_day.tarone) << " (" << PEquals(a.breslow_day.tarone_p) << ").\n";
    if (a.sparse) {
      o << "  Some tables are sparse (an expected count below 5, the rule of Cochran 1954, Biometrics 10:417-451), so\n"
           "  the Breslow-Day test and the CMH X^2 are unreliable here; ";
      if (a.exact)
        o << "the exact conditional test of a common odds ratio\n  (as R's mantelhaen.test(exact = TRUE)), two-sided: "
          << PEquals(a.exact->p) << "; conditional MLE odds ratio " << Fmt(a.exact->estimate) << ", "
          << Percent(r.confidence) << " two-sided exact CI " << FmtCi(a.exact->ci) << ".\n";
      else
        o << "the exact conditional test was too large to compute.\n";
    }
    if (a.column == "vacancy" && r.records)
      o << "  The table of each vacancy is in the JSON output (analyze --json).\n";
  }
  return o.str();
}

}  // namespace twinprobe
