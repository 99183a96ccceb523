#include "report/effects_report.h"

#include <cmath>
#include <cstdio>
#include <sstream>

#include "report/json_number.h"
#include "report/text_report.h"

namespace twinprobe {
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
    j["net_discrimination_among_positive"] = Est(c.net.among_positive);
    j["paired_difference"] = Est(c.net.over_all);
  } else {
    j["table"] = {{"a", c.table.a}, {"b", c.table.b}, {"c", c.table.c}, {"d", c.table.d}, {"n", c.table.n()}};
    j["fisher"] = {{"p", JsonNumber(c.fisher.p.p)}, {"log10_p", JsonNumber(c.fisher.p.log10_p)}, {"conditional_mle_odds_ratio", JsonNumber(c.fisher.estimate)},
                   {"conf_int", Ci(c.fisher.ci)}};
    j["sample_odds_ratio"] = {{"estimate", JsonNumber(c.woolf.estimate)}, {"conf_int", Ci(c.woolf.ci)}, {"method", "Woolf"}};
    j["reference_rate_wilson"] = Ci(c.reference_wilson);
    j["other_rate_wilson"] = Ci(c.other_wilson);
  }
  return j;
}

std::string Fmt(double v) {
  if (std::isnan(v)) return "undefined";
  if (std::isinf(v)) return v > 0 ? "infinite" : "-infinite";
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.3g", v);
  return buf;
}

std::string FmtCi(const stats::Interval& ci) { return "[" + Fmt(ci.low) + ", " + Fmt(ci.high) + "]"; }

std::string Percent(double confidence) { return std::to_string(static_cast<int>(std::lround(confidence * 100))) + "%"; }

void ComparisonText(std::ostringstream& o, const ArmComparison& c, const AnalysisResult& r, const std::string& ref) {
  const std::string cl = Percent(r.confidence);
  if (c.paired) {
    const auto& t = c.pairs;
    o << "  " << c.other_label << " vs " << ref << ": " << t.n() << " sets with both (a " << t.a << ", b " << t.b << ", c "
      << t.c << ", d " << t.d << ").\n"
      << "    exact McNemar " << PEquals(c.mcnemar.exact) << " (mid-p " << FormatP(c.mcnemar.mid_p) << "); asymptotic X^2 = "
      << Fmt(c.mcnemar.chi2) << " (" << PEquals(c.mcnemar.chi2_p) << "), with continuity correction "
      << Fmt(c.mcnemar.chi2_corrected) << " (" << PEquals(c.mcnemar.chi2_corrected_p) << ").\n"
      << "    conditional odds ratio b/c = " << Fmt(c.conditional_or.estimate) << ", " << cl << " exact CI "
      << FmtCi(c.conditional_or.ci) << ".\n"
      << "    net discrimination (b-c)/(a+b+c) = " << Fmt(c.net.among_positive.estimate) << " " << FmtCi(c.net.among_positive.ci)
      << "; paired difference of rates (b-c)/n = " << Fmt(c.net.over_all.estimate) << " " << FmtCi(c.net.over_all.ci)
      << " (Newcombe " << cl << ").\n";
  } else {
    const auto& t = c.table;
    o << "  " << c.other_label << " vs " << ref << ": " << t.c << "/" << t.c + t.d << " positive " << FmtCi(c.other_wilson)
      << " vs " << t.a << "/" << t.a + t.b << " " << FmtCi(c.reference_wilson) << " (Wilson " << cl << ").\n"
      << "    Fisher's exact " << PEquals(c.fisher.p) << "; conditional MLE odds ratio (reference vs other) "
      << Fmt(c.fisher.estimate) << ", " << cl << " exact CI " << FmtCi(c.fisher.ci) << "; sample odds ratio "
      << Fmt(c.woolf.estimate) << " " << FmtCi(c.woolf.ci) << " (Woolf).\n";
  }
}

}  // namespace

nlohmann::json EffectsJson(const AnalysisResult& r) {
  const Effects& e = r.effects;
  nlohmann::json j;
  j["correction"] = e.correction;
  j["comparisons"] = nlohmann::json::array();
  for (const auto& c : e.comparisons) j["comparisons"].push_back(ComparisonJson(c));
  j["strata"] = nlohmann::json::array();
  for (const auto& s : e.strata) {
    nlohmann::json x = ComparisonJson(s.result);
    x["column"] = s.column;
    x["value"] = s.value;
    j["strata"].push_back(x);
  }
  j["across_strata"] = nlohmann::json::array();
  for (const auto& a : e.across) {
    nlohmann::json tables = nlohmann::json::array();
    for (const auto& t : a.tables) tables.push_back({t.a, t.b, t.c, t.d});
    j["across_strata"].push_back(
        {{"column", a.column},
         {"other_arm", a.other_label},
         {"values", a.values},
         {"tables", tables},
         {"mantel_haenszel", {{"estimate", JsonNumber(a.mh.estimate)}, {"conf_int", Ci(a.mh.ci)}, {"log_sd", JsonNumber(a.mh.log_sd)},
                              {"strata_used", a.mh.strata_used}}},
         {"cmh", {{"statistic", JsonNumber(a.mh.chi2)}, {"p", JsonNumber(a.mh.chi2_p.p)}, {"statistic_corrected", JsonNumber(a.mh.chi2_corrected)},
                  {"p_corrected", JsonNumber(a.mh.chi2_corrected_p.p)}}},
         {"breslow_day", {{"statistic", JsonNumber(a.breslow_day.statistic)}, {"df", JsonNumber(a.breslow_day.df)},
                          {"p", JsonNumber(a.breslow_day.p.p)}, {"tarone_statistic", JsonNumber(a.breslow_day.tarone)},
                          {"tarone_p", JsonNumber(a.breslow_day.tarone_p.p)}, {"strata_used", a.breslow_day.strata_used}}}});
  }
  return j;
}

std::string RenderEffectsText(const AnalysisResult& r) {
  const Effects& e = r.effects;
  if (e.comparisons.empty()) return "";
  std::ostringstream o;
  const std::string ref = r.arms.empty() ? "reference" : r.arms.front().label;
  const bool paired = e.comparisons.front().paired;
  o << "\nComparisons with the reference arm (" << ref << ")\n";
  if (paired)
    o << "within sets: exact conditional McNemar test (two-sided), mid-p and the asymptotic McNemar test; the\n"
         "conditional odds ratio b/c with the exact interval from the Clopper-Pearson interval of b/(b+c); net\n"
         "discrimination rates with Newcombe's (1998, method 10) score interval.\n";
  else
    o << "probes counted independently: Fisher's exact test (two-sided), the conditional\n"
         "maximum-likelihood odds ratio with its exact interval, the sample odds ratio with Woolf's interval.\n";
  for (const auto& c : e.comparisons) ComparisonText(o, c, r, ref);
  if (e.comparisons.size() > 1) {
    o << "  p-values adjusted across the " << e.comparisons.size() << " comparisons (" << e.correction << "):";
    for (const auto& c : e.comparisons) o << " " << c.other_label << " " << Fmt(c.p_adjusted) << ";";
    o << "\n";
  }
  if (!e.strata.empty()) {
    o << "\nBy stratum (" << (paired ? "exact McNemar p, conditional odds ratio" : "Fisher's exact p, conditional MLE odds ratio")
      << "; p adjusted with " << e.correction << " within each stratum column):\n";
    for (const auto& s : e.strata) {
      const auto& c = s.result;
      char line[400];
      if (paired)
        std::snprintf(line, sizeof line, "  %-12s %-18s %-14s b %4lld  c %4lld  p %-10s adj %-8s OR %s %s\n", s.column.c_str(),
                      s.value.c_str(), c.other_label.c_str(), static_cast<long long>(c.pairs.b),
                      static_cast<long long>(c.pairs.c), FormatP(c.p).c_str(), Fmt(c.p_adjusted).c_str(),
                      Fmt(c.conditional_or.estimate).c_str(), FmtCi(c.conditional_or.ci).c_str());
      else
        std::snprintf(line, sizeof line, "  %-12s %-18s %-14s %lld/%lld vs %lld/%lld  p %-10s adj %-8s OR %s %s\n",
                      s.column.c_str(), s.value.c_str(), c.other_label.c_str(), static_cast<long long>(c.table.c),
                      static_cast<long long>(c.table.c + c.table.d), static_cast<long long>(c.table.a),
                      static_cast<long long>(c.table.a + c.table.b), FormatP(c.p).c_str(), Fmt(c.p_adjusted).c_str(),
                      Fmt(c.fisher.estimate).c_str(), FmtCi(c.fisher.ci).c_str());
      o << line;
    }
  }
  for (const auto& a : e.across) {
    o << "\nAcross " << a.column << " (" << a.values << " values, " << a.other_label << " vs " << ref
      << "; arm x outcome tables" << (paired ? ", pairing ignored" : "") << "):\n"
      << "  Mantel-Haenszel odds ratio " << Fmt(a.mh.estimate) << ", " << Percent(r.confidence)
      << " CI (Robins-Breslow-Greenland) " << FmtCi(a.mh.ci) << "; CMH X^2 = " << Fmt(a.mh.chi2_corrected)
      << " with continuity correction (" << PEquals(a.mh.chi2_corrected_p) << "), " << Fmt(a.mh.chi2)
      << " without (" << PEquals(a.mh.chi2_p) << ").\n"
      << "  Breslow-Day test of equal odds ratios: X^2 = " << Fmt(a.breslow_day.statistic) << " on "
      << Fmt(a.breslow_day.df) << " df (" << PEquals(a.breslow_day.p) << "); with Tarone's correction "
      << Fmt(a.breslow_day.tarone) << " (" << PEquals(a.breslow_day.tarone_p) << ").\n";
  }
  if (paired && !e.across.empty())
    o << "  (Respecting the pairs, Mantel-Haenszel over vacancies reduces to sum(b)/sum(c), the conditional odds\n"
         "  ratio above.)\n";
  return o.str();
}

}  // namespace twinprobe
