// `twinprobe calc`: calculators on counts from a published test or a
// spreadsheet, with the same exact statistics `analyze` uses (stats/).
//   calc binom   --x X --n N [--p 0.5] [--alternative ...] [--conf 0.95]
//   calc mcnemar --table a,b,c,d [--conf 0.95]
//   calc fisher  --table a,b,c,d [--alternative ...] [--conf 0.95]
//   calc mh      --tables "a,b,c,d;..." [--conf 0.95] [--exact]
//   calc adjust  --method M (--p p1,p2,... | --file FILE)
//   calc ratio        --table a,b,c,d [--alternative ...] [--conf 0.95]
//   calc homogeneity  --strata "b,c;b,c;..." [--conf 0.95]
//   calc equivalence  --table a,b,c,d --margin M|LOW,HIGH [--alpha 0.05]
//   calc employers    --employers "b,c;b,c;..." [--alternative ...] [--seed 1]
// Every p-value sentence names its test and sidedness, and every interval
// its level, sidedness and method.
// RegisterCalcCommands (end of this file) creates the group and adds these
// and the rank calculators of cli/calc_ranks_cmd.cpp.
#include <cmath>
#include <cstdio>
#include <fstream>
#include <iostream>
#include <memory>
#include <sstream>

#include <nlohmann/json.hpp>

#include "cli/command.h"
#include "core/text.h"
#include "report/json_number.h"
#include "report/p_value.h"
#include "stats/adjust.h"
#include "stats/binomial.h"
#include "stats/exact_stratified.h"
#include "stats/fisher.h"
#include "stats/mcnemar.h"
#include "stats/cluster_permutation.h"
#include "stats/equivalence.h"
#include "stats/homogeneity.h"
#include "stats/paired.h"
#include "stats/paired_midp.h"
#include "stats/paired_ratio.h"
#include "stats/stratified.h"

namespace twinprobe {
namespace {

using stats::Alternative;
using stats::PValue;

// ---- parsing: every bad value is one clear line, exit 1 ----

std::vector<std::string> SplitOn(const std::string& s, char sep) {
  std::vector<std::string> out;
  std::string cur;
  for (char ch : s) {
    if (ch == sep) out.emplace_back(Trim(cur)), cur.clear();
    else cur += ch;
  }
  out.emplace_back(Trim(cur));
  return out;
}

Result<int64_t> ParseCount(const std::string& where, const std::string& text, const std::string& fix) {
  std::string t(Trim(text));
  if (!t.empty() && t[0] == '-' && t.find_first_not_of("0123456789", 1) == std::string::npos && t.size() > 1)
    return BadInput(where, "counts cannot be negative, got " + t, fix);
  if (t.empty() || t.size() > 15 || t.find_first_not_of("0123456789") != std::string::npos)
    return BadInput(where, "expected a whole number, got '" + t + "'", fix);
  return static_cast<int64_t>(std::stoll(t));
}

Result<double> ParseNumber(const std::string& where, const std::string& text, const std::string& fix) {
  std::string t(Trim(text));
  char* end = nullptr;
  double v = t.empty() ? NAN : std::strtod(t.c_str(), &end);
  if (t.empty() || end != t.c_str() + t.size() || !std::isfinite(v))
    return BadInput(where, "expected a number, got '" + t + "'", fix);
  return v;
}

Result<double> ParseProbability(const std::string& where, const std::string& text, const std::string& fix) {
  auto v = ParseNumber(where, text, fix);
  if (!v.ok()) return v;
  if (v.value() < 0 || v.value() > 1) return BadInput(where, "a probability must lie in [0, 1], got " + std::string(Trim(text)), fix);
  return v;
}

Result<double> ParseConf(const std::string& text) {
  auto v = ParseNumber("--conf", text, "give the confidence level as a fraction, e.g. --conf 0.95");
  if (!v.ok()) return v;
  if (!(v.value() > 0 && v.value() < 1))
    return BadInput("--conf", "the confidence level must lie strictly between 0 and 1, got " + std::string(Trim(text)),
                    "e.g. --conf 0.95");
  return v;
}

Result<Alternative> ParseAlternative(const std::string& text) {
  if (text == "two-sided") return Alternative::kTwoSided;
  if (text == "less") return Alternative::kLess;
  if (text == "greater") return Alternative::kGreater;
  return BadInput("--alternative", "unknown alternative '" + text + "'", "use two-sided, less or greater");
}

std::string AlternativeName(Alternative a) {
  return a == Alternative::kLess ? "less" : a == Alternative::kGreater ? "greater" : "two-sided";
}

Result<std::array<int64_t, 4>> ParseTable(const std::string& where, const std::string& text, const std::string& fix) {
  auto parts = SplitOn(text, ',');
  if (parts.size() != 4)
    return BadInput(where, "expected four counts a,b,c,d separated by commas, got '" + std::string(Trim(text)) + "'", fix);
  std::array<int64_t, 4> t{};
  for (size_t i = 0; i < 4; ++i) {
    auto v = ParseCount(where, parts[i], fix);
    if (!v.ok()) return v.error();
    t[i] = v.value();
  }
  return t;
}

// ---- output ----

nlohmann::json Ci(const stats::Interval& ci) { return nlohmann::json::array({JsonNumber(ci.low), JsonNumber(ci.high)}); }

std::string Fmt(double v) {
  if (std::isnan(v)) return "undefined";
  if (std::isinf(v)) return v > 0 ? "infinite" : "-infinite";
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.4g", v);
  return buf;
}

std::string FmtCi(const stats::Interval& ci) { return "[" + Fmt(ci.low) + ", " + Fmt(ci.high) + "]"; }

std::string Percent(double conf) {
  char buf[16];
  std::snprintf(buf, sizeof buf, "%g%%", conf * 100);
  return buf;
}

void PutP(nlohmann::json& j, const std::string& key, const PValue& p) {
  j[key] = JsonNumber(p.p);
  j["log10_" + key] = JsonNumber(p.log10_p);
}

std::string Line(const std::string& label, const std::string& value) {
  char buf[320];
  std::snprintf(buf, sizeof buf, "  %s %s\n", PadRight(label, 48).c_str(), value.c_str());
  return buf;
}

// "two-sided" or "one-sided (less)": every p-value and interval says which.
std::string Sided(Alternative a) { return a == Alternative::kTwoSided ? "two-sided" : "one-sided (" + AlternativeName(a) + ")"; }

// "95% CI two-sided [l, h], METHOD": an interval never appears without its
// level, its sidedness and its method.
std::string CiText(double conf, Alternative a, const stats::Interval& ci, const std::string& method) {
  return Percent(conf) + " CI " + Sided(a) + " " + FmtCi(ci) + ", " + method;
}

// The one-sided bound of an interval method that only has a two-sided form:
// the two-sided interval at level 2 conf - 1 has each tail at 1 - conf, so
// its upper limit is the one-sided (less) bound and its lower limit the
// one-sided (greater) bound; the other end opens to the parameter's edge.
stats::Interval OneSided(const stats::Interval& at_2conf_minus_1, Alternative a, double edge_low, double edge_high) {
  if (a == Alternative::kLess) return {edge_low, at_2conf_minus_1.high};
  if (a == Alternative::kGreater) return {at_2conf_minus_1.low, edge_high};
  return at_2conf_minus_1;
}

// The plain sentence: which test (with its sidedness), what it rejects or
// does not reject at the level 1 - conf, and never more than that.
//   test:     "the exact binomial test, one-sided (less),"
//   null:     "a success rate of 0.2 or more"
//   favoured: "a lower rate" (what a rejection points to)
std::string Verdict(const PValue& p, double conf, const std::string& test, const std::string& null,
                    const std::string& favoured) {
  const double alpha = 1 - conf;
  char level[32];
  std::snprintf(level, sizeof level, "%g", alpha);
  if (std::isnan(p.p)) return "The data hold no information on this question: " + test.substr(0, test.size() - 1) + " is undefined.\n";
  if (p.p < alpha || p.underflowed())
    return "At the " + std::string(level) + " level, " + test + " rejects " + null + " in favour of " + favoured +
           " (" + PEquals(p) + ").\n";
  return "At the " + std::string(level) + " level, " + test + " does not reject " + null + " (" + PEquals(p) +
         "); this is not evidence for it.\n";
}

// Wilson's and Woolf's one-sided bounds come from their two-sided form at
// 2 conf - 1, which needs conf > 0.5 (a one-sided bound below 50% would sit
// on the wrong side of the estimate anyway).
Status CheckOneSidedConf(Alternative a, double conf, const std::string& text) {
  if (a != Alternative::kTwoSided && conf <= 0.5)
    return BadInput("--conf", "a one-sided interval needs a confidence level above 0.5, got " + std::string(Trim(text)), "e.g. --conf 0.95");
  return Status();
}

// ---- the calculators ----

struct Options {
  std::string x, n, p = "0.5", alternative = "two-sided", conf = "0.95", table, tables, method, p_list, file;
  bool exact = false;
};

int Fail(const Error& e) { return ReportError(e); }

int RunBinom(const Context& ctx, const Options& o) {
  const std::string fix = "give whole numbers with 0 <= x <= n, e.g. --x 682 --n 925";
  auto x = ParseCount("--x", o.x, fix);
  if (!x.ok()) return Fail(x.error());
  auto n = ParseCount("--n", o.n, fix);
  if (!n.ok()) return Fail(n.error());
  if (n.value() == 0) return Fail(BadInput("--n", "the number of trials must be at least 1", fix));
  if (x.value() > n.value())
    return Fail(BadInput("--x", "successes (" + std::to_string(x.value()) + ") exceed trials (" + std::to_string(n.value()) + ")", fix));
  auto p0 = ParseProbability("--p", o.p, "give the null probability as a fraction, e.g. --p 0.5");
  if (!p0.ok()) return Fail(p0.error());
  auto alt = ParseAlternative(o.alternative);
  if (!alt.ok()) return Fail(alt.error());
  auto conf = ParseConf(o.conf);
  if (!conf.ok()) return Fail(conf.error());
  if (auto st = CheckOneSidedConf(alt.value(), conf.value(), o.conf); !st.ok()) return Fail(st.error());
  auto r = stats::BinomTest(x.value(), n.value(), p0.value(), alt.value(), conf.value());
  // Wilson's interval is two-sided by construction; a one-sided test gets
  // the matching one-sided bound.
  const bool one_sided = alt.value() != Alternative::kTwoSided;
  auto wilson = OneSided(stats::Wilson(x.value(), n.value(), one_sided ? 2 * conf.value() - 1 : conf.value()), alt.value(), 0, 1);
  if (ctx.json) {
    nlohmann::json j{{"test", "exact binomial test"},
                     {"x", x.value()},
                     {"n", n.value()},
                     {"null_value", p0.value()},
                     {"alternative", AlternativeName(alt.value())},
                     {"conf_level", conf.value()},
                     {"statistic", x.value()},
                     {"estimate", JsonNumber(r.estimate)},
                     {"conf_int", Ci(r.ci)},
                     {"conf_int_method", "Clopper-Pearson"},
                     {"wilson_conf_int", Ci(wilson)},
                     {"conf_int_sidedness", Sided(alt.value())}};
    PutP(j, "p_value", r.p);
    std::cout << j.dump(2) << "\n";
    return 0;
  }
  const std::string rate = Fmt(p0.value());
  const std::string null = alt.value() == Alternative::kLess      ? "a success rate of " + rate + " or more"
                           : alt.value() == Alternative::kGreater ? "a success rate of " + rate + " or less"
                                                                  : "a success rate of " + rate;
  const std::string favoured = alt.value() == Alternative::kLess      ? "a lower rate"
                               : alt.value() == Alternative::kGreater ? "a higher rate"
                                                                      : "a different rate";
  std::cout << "Exact binomial test of " << x.value() << " successes in " << n.value() << " trials against p = " << rate
            << ", " << Sided(alt.value()) << ".\n"
            << Verdict(r.p, conf.value(), "the exact binomial test, " + Sided(alt.value()) + ",", null, favoured) << "\n"
            << Line("estimate x/n", Fmt(r.estimate)) << Line("exact binomial p, " + Sided(alt.value()), FormatP(r.p))
            << Line("Clopper-Pearson interval (exact)", Percent(conf.value()) + " CI " + Sided(alt.value()) + " " + FmtCi(r.ci))
            << Line("Wilson score interval", Percent(conf.value()) + " CI " + Sided(alt.value()) + " " + FmtCi(wilson));
  return 0;
}

int RunMcNemar(const Context& ctx, const Options& o) {
  const std::string fix = "give the paired table as a,b,c,d (a both positive, b reference only, c other only, d neither), e.g. --table 794,150,86,570";
  auto t = ParseTable("--table", o.table, fix);
  if (!t.ok()) return Fail(t.error());
  auto conf = ParseConf(o.conf);
  if (!conf.ok()) return Fail(conf.error());
  stats::PairedCounts pc{t.value()[0], t.value()[1], t.value()[2], t.value()[3]};
  if (pc.n() == 0) return Fail(BadInput("--table", "the table is empty", fix));
  auto m = stats::McNemar(pc);
  auto cor = stats::ConditionalOddsRatio(pc, conf.value());
  auto net = stats::NetDiscriminationRates(pc, conf.value());
  auto cor_mid = stats::ConditionalOddsRatioMidP({pc.b, pc.c}, conf.value());
  auto ratio = stats::CallbackRatio(pc, conf.value());
  if (ctx.json) {
    nlohmann::json j{{"test", "exact McNemar test"},
                     {"alternative", "two-sided"},
                     {"table", {{"a", pc.a}, {"b", pc.b}, {"c", pc.c}, {"d", pc.d}, {"n", pc.n()}}},
                     {"conf_level", conf.value()},
                     {"statistic", pc.b},
                     {"discordant", pc.discordant()},
                     {"estimate", JsonNumber(cor.estimate)},
                     {"conf_int", Ci(cor.ci)},
                     {"estimate_name", "conditional odds ratio b/c"},
                     {"conf_int_method", "Clopper-Pearson on b of b+c, mapped to b/c"},
                     {"mid_p_conf_int", Ci(cor_mid.ci)},
                     {"callback_ratio", {{"estimate", JsonNumber(ratio.estimate)}, {"conf_int", Ci(ratio.ci)},
                                         {"conf_int_method", "Bonett-Price hybrid Wilson score"}}},
                     {"chi2", JsonNumber(m.chi2)},
                     {"chi2_corrected", JsonNumber(m.chi2_corrected)},
                     {"net_discrimination_among_positive", {{"estimate", JsonNumber(net.among_positive.estimate)}, {"conf_int", Ci(net.among_positive.ci)}}},
                     {"net_discrimination_over_all", {{"estimate", JsonNumber(net.over_all.estimate)}, {"conf_int", Ci(net.over_all.ci)}}}};
    PutP(j, "p_value", m.exact);
    PutP(j, "mid_p_value", m.mid_p);
    PutP(j, "chi2_p_value", m.chi2_p);
    PutP(j, "chi2_corrected_p_value", m.chi2_corrected_p);
    std::cout << j.dump(2) << "\n";
    return 0;
  }
  std::cout << "Paired table: a = " << pc.a << " both positive, b = " << pc.b << " reference arm only, c = " << pc.c
            << " other arm only, d = " << pc.d << " neither (n = " << pc.n() << ").\n";
  if (pc.discordant() == 0)
    std::cout << "No pair was discordant, so the data say nothing about a difference between the arms.\n";
  else
    std::cout << Verdict(m.exact, conf.value(), "the exact McNemar test, two-sided,", "equal treatment of the arms",
                         std::string("unequal treatment: the ") + (pc.b > pc.c ? "reference" : "other") +
                             " arm was favoured in " + std::to_string(std::max(pc.b, pc.c)) + " of " +
                             std::to_string(pc.discordant()) + " discordant pairs");
  const Alternative two = Alternative::kTwoSided;
  const double cl = conf.value();
  std::cout << "\n"
            << Line("exact McNemar p, two-sided", FormatP(m.exact)) << Line("mid-p McNemar p, two-sided", FormatP(m.mid_p))
            << Line("McNemar X^2 uncorrected", Fmt(m.chi2) + "   " + PEquals(m.chi2_p) + ", two-sided")
            << Line("McNemar X^2 continuity-corrected", Fmt(m.chi2_corrected) + "   " + PEquals(m.chi2_corrected_p) + ", two-sided")
            << Line("conditional odds ratio b/c", Fmt(cor.estimate) + "   " + CiText(cl, two, cor.ci, "exact (Clopper-Pearson)"))
            << Line("  the same with the mid-p interval", Fmt(cor.estimate) + "   " + CiText(cl, two, cor_mid.ci, "mid-p"))
            << Line("callback-rate ratio (a+b)/(a+c)", Fmt(ratio.estimate) + "   " + CiText(cl, two, ratio.ci, "Bonett-Price"))
            << Line("net discrimination (b-c)/(a+b+c)", Fmt(net.among_positive.estimate) + "   " + CiText(cl, two, net.among_positive.ci, "Newcombe"))
            << Line("paired difference (b-c)/n", Fmt(net.over_all.estimate) + "   " + CiText(cl, two, net.over_all.ci, "Newcombe"));
  return 0;
}

int RunFisher(const Context& ctx, const Options& o) {
  const std::string fix = "give the table as a,b,c,d: reference arm positive, negative, other arm positive, negative; e.g. --table 3,1,1,3";
  auto t = ParseTable("--table", o.table, fix);
  if (!t.ok()) return Fail(t.error());
  auto alt = ParseAlternative(o.alternative);
  if (!alt.ok()) return Fail(alt.error());
  auto conf = ParseConf(o.conf);
  if (!conf.ok()) return Fail(conf.error());
  stats::Table2x2 tab{t.value()[0], t.value()[1], t.value()[2], t.value()[3]};
  if (tab.n() == 0) return Fail(BadInput("--table", "the table is empty", fix));
  if (auto st = CheckOneSidedConf(alt.value(), conf.value(), o.conf); !st.ok()) return Fail(st.error());
  auto r = stats::FisherTest(tab, alt.value(), conf.value());
  const bool one_sided = alt.value() != Alternative::kTwoSided;
  auto woolf = stats::WoolfOddsRatio(tab, one_sided ? 2 * conf.value() - 1 : conf.value());
  woolf.ci = OneSided(woolf.ci, alt.value(), 0, INFINITY);  // Woolf's is two-sided by construction
  auto rate = [](int64_t pos, int64_t total) { return total ? double(pos) / double(total) : NAN; };
  if (ctx.json) {
    nlohmann::json j{{"test", "Fisher's exact test"},
                     {"table", {{"a", tab.a}, {"b", tab.b}, {"c", tab.c}, {"d", tab.d}, {"n", tab.n()}}},
                     {"alternative", AlternativeName(alt.value())},
                     {"conf_level", conf.value()},
                     {"statistic", tab.a},
                     {"estimate", JsonNumber(r.estimate)},
                     {"estimate_name", "conditional maximum-likelihood odds ratio"},
                     {"conf_int", Ci(r.ci)},
                     {"sample_odds_ratio", JsonNumber(woolf.estimate)},
                     {"woolf_conf_int", Ci(woolf.ci)},
                     {"conf_int_sidedness", Sided(alt.value())},
                     {"rate_reference", JsonNumber(rate(tab.a, tab.a + tab.b))},
                     {"rate_other", JsonNumber(rate(tab.c, tab.c + tab.d))}};
    PutP(j, "p_value", r.p);
    std::cout << j.dump(2) << "\n";
    return 0;
  }
  const std::string null = alt.value() == Alternative::kLess ? "a positive rate in the reference arm at least the other arm's"
                           : alt.value() == Alternative::kGreater
                               ? "a positive rate in the reference arm no higher than the other arm's"
                               : "equal positive rates in the two arms";
  const std::string favoured = alt.value() == Alternative::kLess      ? "a lower rate in the reference arm"
                               : alt.value() == Alternative::kGreater ? "a higher rate in the reference arm"
                                                                      : "unequal rates";
  std::cout << "Fisher's exact test: reference arm " << tab.a << " of " << tab.a + tab.b << " positive, other arm " << tab.c
            << " of " << tab.c + tab.d << ", " << Sided(alt.value()) << ".\n"
            << Verdict(r.p, conf.value(), "Fisher's exact test, " + Sided(alt.value()) + ",", null, favoured) << "\n"
            << Line("Fisher's exact p, " + Sided(alt.value()), FormatP(r.p))
            << Line("conditional MLE odds ratio", Fmt(r.estimate) + "   " + CiText(conf.value(), alt.value(), r.ci, "exact (conditional)"))
            << Line("sample odds ratio ad/bc", Fmt(woolf.estimate) + "   " + CiText(conf.value(), alt.value(), woolf.ci, "Woolf"));
  return 0;
}

int RunMh(const Context& ctx, const Options& o) {
  const std::string fix = "give one a,b,c,d per stratum separated by ';', e.g. --tables \"0,6,0,5;3,3,0,6;6,0,2,4\"";
  std::vector<stats::Table2x2> strata;
  for (const auto& part : SplitOn(o.tables, ';')) {
    auto t = ParseTable("--tables", part, fix);
    if (!t.ok()) return Fail(t.error());
    strata.push_back({t.value()[0], t.value()[1], t.value()[2], t.value()[3]});
  }
  auto conf = ParseConf(o.conf);
  if (!conf.ok()) return Fail(conf.error());
  auto mh = stats::MantelHaenszel(strata, conf.value());
  if (mh.strata_used == 0) return Fail(BadInput("--tables", "no stratum has two or more observations", fix));
  auto bd = stats::BreslowDay(strata);
  std::optional<stats::ExactStratifiedResult> exact;
  if (o.exact) {
    exact = stats::ExactCommonOddsRatio(strata, Alternative::kTwoSided, conf.value());
    if (!exact)
      return Fail(BadInput("--tables", "the strata are too large for the exact conditional test",
                           "drop --exact and use the Mantel-Haenszel test"));
  }
  if (ctx.json) {
    nlohmann::json j{{"test", o.exact ? "exact conditional test of a common odds ratio" : "Cochran-Mantel-Haenszel test"},
                     {"strata", strata.size()},
                     {"strata_used", mh.strata_used},
                     {"conf_level", conf.value()},
                     {"mantel_haenszel_estimate", JsonNumber(mh.estimate)},
                     {"mantel_haenszel_conf_int", Ci(mh.ci)},
                     {"chi2_corrected", JsonNumber(mh.chi2_corrected)},
                     {"chi2", JsonNumber(mh.chi2)},
                     {"breslow_day", {{"statistic", JsonNumber(bd.statistic)}, {"df", JsonNumber(bd.df)}, {"p_value", JsonNumber(bd.p.p)},
                                      {"tarone_statistic", JsonNumber(bd.tarone)}, {"tarone_p_value", JsonNumber(bd.tarone_p.p)}}}};
    PutP(j, "chi2_p_value", mh.chi2_p);
    PutP(j, "chi2_corrected_p_value", mh.chi2_corrected_p);
    if (exact) {
      j["statistic"] = exact->statistic;
      j["p_value_method"] = "exact conditional (product hypergeometric)";
      PutP(j, "p_value", exact->p);
      j["estimate"] = JsonNumber(exact->estimate);
      j["estimate_name"] = "conditional maximum-likelihood common odds ratio";
      j["conf_int"] = Ci(exact->ci);
    } else {
      j["statistic"] = JsonNumber(mh.chi2_corrected);
      j["p_value_method"] = "Cochran-Mantel-Haenszel chi-squared with continuity correction";
      PutP(j, "p_value", mh.chi2_corrected_p);
      j["estimate"] = JsonNumber(mh.estimate);
      j["estimate_name"] = "Mantel-Haenszel common odds ratio";
      j["conf_int"] = Ci(mh.ci);
    }
    std::cout << j.dump(2) << "\n";
    return 0;
  }
  const PValue& headline = exact ? exact->p : mh.chi2_corrected_p;
  std::cout << "Stratified analysis of " << strata.size() << " 2x2 tables (" << mh.strata_used << " with two or more observations).\n"
            << Verdict(headline, conf.value(),
                       exact ? "the exact conditional test of a common odds ratio, two-sided,"
                             : "the Cochran-Mantel-Haenszel test with continuity correction, two-sided,",
                       "a common odds ratio of 1 across the strata", "a common odds ratio different from 1")
            << "These tables count every application as independent: for matched pairs use calc homogeneity.\n"
            << "\n"
            << Line("Mantel-Haenszel odds ratio", Fmt(mh.estimate) + "   " +
                                                     CiText(conf.value(), Alternative::kTwoSided, mh.ci, "Robins-Breslow-Greenland"))
            << Line("CMH X^2 with continuity correction", Fmt(mh.chi2_corrected) + "   " + PEquals(mh.chi2_corrected_p) + ", two-sided")
            << Line("CMH X^2 without correction", Fmt(mh.chi2) + "   " + PEquals(mh.chi2_p) + ", two-sided");
  if (exact)
    std::cout << Line("exact conditional p, two-sided", FormatP(exact->p))
              << Line("conditional MLE common odds ratio",
                      Fmt(exact->estimate) + "   " + CiText(conf.value(), Alternative::kTwoSided, exact->ci, "exact (conditional)"));
  std::cout << Line("Breslow-Day homogeneity X^2", Fmt(bd.statistic) + " on " + Fmt(bd.df) + " df   " + PEquals(bd.p))
            << Line("  with Tarone's correction", Fmt(bd.tarone) + "   " + PEquals(bd.tarone_p));
  return 0;
}

int RunAdjust(const Context& ctx, const Options& o) {
  auto method = stats::ParseAdjustment(o.method);
  if (!method || *method == stats::Adjustment::kNone)
    return Fail(BadInput("--method", "unknown method '" + o.method + "'", "use holm, hochberg, hommel, bonferroni, bh or by"));
  if (o.p_list.empty() == o.file.empty())
    return Fail(BadInput("calc adjust", "give the p-values either with --p or with --file, not both or neither",
                         "e.g. --p 0.01,0.04,0.2"));
  std::vector<double> p;
  if (!o.file.empty()) {
    std::ifstream in(o.file);
    if (!in) return Fail(BadInput(o.file, "cannot read the file", "check the path"));
    std::string line;
    for (int lineno = 1; std::getline(in, line); ++lineno) {
      for (char& ch : line)
        if (ch == ',' || ch == ';' || ch == '\t') ch = ' ';
      std::istringstream words(line);
      std::string w;
      while (words >> w) {
        auto v = ParseProbability(o.file + ":" + std::to_string(lineno), w, "the file holds p-values in [0, 1], one or more per line");
        if (!v.ok()) return Fail(v.error());
        p.push_back(v.value());
      }
    }
  } else {
    for (const auto& w : SplitOn(o.p_list, ',')) {
      auto v = ParseProbability("--p", w, "give p-values in [0, 1] separated by commas, e.g. --p 0.01,0.04,0.2");
      if (!v.ok()) return Fail(v.error());
      p.push_back(v.value());
    }
  }
  if (p.empty()) return Fail(BadInput(o.file.empty() ? "--p" : o.file, "no p-values given", "give at least one p-value"));
  auto adjusted = stats::AdjustP(p, *method);
  if (ctx.json) {
    nlohmann::json j{{"method", stats::AdjustmentName(*method)}, {"p_values", p}, {"adjusted", adjusted}};
    std::cout << j.dump(2) << "\n";
    return 0;
  }
  int below = 0;
  for (double v : adjusted) below += v <= 0.05;
  std::cout << stats::AdjustmentName(*method) << " adjustment of " << p.size() << " p-values (as R's p.adjust): " << below
            << " stay at or below 0.05 after adjustment.\n\n";
  char buf[96];
  std::snprintf(buf, sizeof buf, "  %5s  %-14s %s\n", "#", "p", "adjusted");
  std::cout << buf;
  for (size_t i = 0; i < p.size(); ++i) {
    std::snprintf(buf, sizeof buf, "  %5zu  %-14.6g %.6g\n", i + 1, p[i], adjusted[i]);
    std::cout << buf;
  }
  return 0;
}

}  // namespace

// The calculators on counts; cli/calc_ranks_cmd.cpp adds those on ranks.
void AddCountCalculators(CLI::App& calc, Context& ctx) {
  auto o = std::make_shared<Options>();
  auto conf = [o](CLI::App* sub) { sub->add_option("--conf", o->conf, "Confidence level (default 0.95)"); };
  auto alternative = [o](CLI::App* sub) {
    sub->add_option("--alternative", o->alternative, "two-sided (default), less or greater");
  };

  auto* binom = calc.add_subcommand("binom", "Exact binomial test with Clopper-Pearson and Wilson intervals");
  binom->add_option("--x", o->x, "Successes")->required();
  binom->add_option("--n", o->n, "Trials")->required();
  binom->add_option("--p", o->p, "Success probability under the null (default 0.5)");
  alternative(binom);
  conf(binom);
  binom->callback([&ctx, o] { ctx.exit_code = RunBinom(ctx, *o); });

  auto* mcnemar = calc.add_subcommand("mcnemar", "Paired table: exact McNemar, mid-p, conditional odds ratio, net discrimination");
  mcnemar->add_option("--table", o->table, "a,b,c,d: both positive, reference only, other only, neither")->required();
  conf(mcnemar);
  mcnemar->callback([&ctx, o] { ctx.exit_code = RunMcNemar(ctx, *o); });

  auto* fisher = calc.add_subcommand("fisher", "Unpaired 2x2 table: Fisher's exact test and odds ratios");
  fisher->add_option("--table", o->table, "a,b,c,d: reference positive, negative; other positive, negative")->required();
  alternative(fisher);
  conf(fisher);
  fisher->callback([&ctx, o] { ctx.exit_code = RunFisher(ctx, *o); });

  auto* mh = calc.add_subcommand("mh", "Stratified 2x2 tables: Mantel-Haenszel, CMH test, Breslow-Day, exact test");
  mh->add_option("--tables", o->tables, "a,b,c,d;a,b,c,d;... one table per stratum")->required();
  conf(mh);
  mh->add_flag("--exact", o->exact, "Exact conditional test, MLE and interval of the common odds ratio");
  mh->callback([&ctx, o] { ctx.exit_code = RunMh(ctx, *o); });

  auto* adjust = calc.add_subcommand("adjust", "Adjust p-values for multiple comparisons (as R's p.adjust)");
  adjust->add_option("--method", o->method, "holm, hochberg, hommel, bonferroni, bh or by")->required();
  adjust->add_option("--p", o->p_list, "p-values separated by commas");
  adjust->add_option("--file", o->file, "A file of p-values (separated by commas, spaces or new lines)");
  adjust->callback([&ctx, o] { ctx.exit_code = RunAdjust(ctx, *o); });
}

namespace {

// ---- paired-design calculators: ratio, homogeneity, equivalence, employers ----

struct PairedOptions {
  std::string table, strata, employers, margin, alternative = "two-sided", conf = "0.95", alpha = "0.05", seed = "1",
                                                resamples = "99999";
};

const char kPairedTableFix[] =
    "give the paired table as a,b,c,d (a both positive, b reference only, c other only, d neither), e.g. --table 45,66,32,257";

Result<stats::PairedCounts> ParsePairedTable(const std::string& text) {
  auto t = ParseTable("--table", text, kPairedTableFix);
  if (!t.ok()) return t.error();
  stats::PairedCounts pc{t.value()[0], t.value()[1], t.value()[2], t.value()[3]};
  if (pc.n() == 0) return BadInput("--table", "the table is empty", kPairedTableFix);
  return pc;
}

// "b,c;b,c;...": the discordant counts of each stratum or employer.
Result<std::vector<stats::DiscordantCounts>> ParseDiscordantList(const std::string& where, const std::string& text,
                                                                  const std::string& fix) {
  std::vector<stats::DiscordantCounts> out;
  for (const auto& part : SplitOn(text, ';')) {
    auto pair = SplitOn(part, ',');
    if (pair.size() != 2) return BadInput(where, "expected two counts b,c per group, got '" + part + "'", fix);
    auto b = ParseCount(where, pair[0], fix);
    if (!b.ok()) return b.error();
    auto c = ParseCount(where, pair[1], fix);
    if (!c.ok()) return c.error();
    out.push_back({b.value(), c.value()});
  }
  return out;
}

int RunRatio(const Context& ctx, const PairedOptions& o) {
  auto t = ParsePairedTable(o.table);
  if (!t.ok()) return Fail(t.error());
  auto alt = ParseAlternative(o.alternative);
  if (!alt.ok()) return Fail(alt.error());
  auto conf = ParseConf(o.conf);
  if (!conf.ok()) return Fail(conf.error());
  const stats::PairedCounts& pc = t.value();
  auto ratio = stats::CallbackRatio(pc, conf.value(), alt.value());
  const double n = static_cast<double>(pc.n());
  const double rate_ref = static_cast<double>(pc.a + pc.b) / n, rate_other = static_cast<double>(pc.a + pc.c) / n;
  if (ctx.json) {
    nlohmann::json j{{"estimate_name", "callback-rate ratio (a+b)/(a+c)"},
                     {"table", {{"a", pc.a}, {"b", pc.b}, {"c", pc.c}, {"d", pc.d}, {"n", pc.n()}}},
                     {"rate_reference", JsonNumber(rate_ref)},
                     {"rate_other", JsonNumber(rate_other)},
                     {"estimate", JsonNumber(ratio.estimate)},
                     {"conf_level", conf.value()},
                     {"alternative", AlternativeName(alt.value())},
                     {"conf_int", Ci(ratio.ci)},
                     {"conf_int_method", "Bonett-Price hybrid Wilson score"},
                     {"conf_int_sidedness", Sided(alt.value())}};
    std::cout << j.dump(2) << "\n";
    return 0;
  }
  std::cout << "Callback rates of paired applications: reference arm (a+b)/n = " << Fmt(rate_ref)
            << ", other arm (a+c)/n = " << Fmt(rate_other) << " (n = " << pc.n() << " pairs).\n"
            << "The interval is for the ratio of the two rates; pairs where neither was called back do not enter it.\n\n"
            << Line("callback-rate ratio (a+b)/(a+c)",
                    Fmt(ratio.estimate) + "   " + CiText(conf.value(), alt.value(), ratio.ci, "Bonett-Price"));
  return 0;
}

int RunHomogeneity(const Context& ctx, const PairedOptions& o) {
  const std::string fix = "give each stratum's discordant counts as b,c separated by ';', e.g. --strata \"12,4;9,8;15,3\"";
  auto strata = ParseDiscordantList("--strata", o.strata, fix);
  if (!strata.ok()) return Fail(strata.error());
  auto conf = ParseConf(o.conf);
  if (!conf.ok()) return Fail(conf.error());
  auto h = stats::TestDiscordantHomogeneity(strata.value(), conf.value());
  if (h.strata_used < 2)
    return Fail(BadInput("--strata", "fewer than two strata have discordant pairs, so there is nothing to compare", fix));
  auto pooled_p = stats::BinomTest(h.total_b, h.total_b + h.total_c, 0.5, Alternative::kTwoSided, conf.value()).p;
  // The exact test is the headline when Cochran's rule doubts the chi-square
  // approximation (and the enumeration was affordable).
  const bool use_exact = h.small_expected && h.exact_p.has_value();
  const PValue headline = use_exact ? PValue::FromValue(*h.exact_p) : h.chi2_p;
  if (ctx.json) {
    nlohmann::json per = nlohmann::json::array();
    for (const auto& s : strata.value()) per.push_back({{"b", s.b}, {"c", s.c}});
    nlohmann::json j{{"test", use_exact ? "Fisher's exact test of the strata x (b, c) table"
                                        : "Pearson chi-square test of homogeneity of b/(b+c) across strata"},
                     {"alternative", "two-sided"},
                     {"strata", per},
                     {"strata_used", h.strata_used},
                     {"chi2", JsonNumber(h.chi2)},
                     {"df", h.df},
                     {"exact_p_value", h.exact_p ? JsonNumber(*h.exact_p) : nlohmann::json(nullptr)},
                     {"small_expected", h.small_expected},
                     {"conf_level", conf.value()},
                     {"pooled_odds_ratio", {{"estimate", JsonNumber(h.pooled_odds_ratio.estimate)},
                                            {"conf_int", Ci(h.pooled_odds_ratio.ci)},
                                            {"conf_int_method", "Clopper-Pearson on sum(b) of sum(b)+sum(c)"}}}};
    PutP(j, "chi2_p_value", h.chi2_p);
    PutP(j, "p_value", headline);
    PutP(j, "pooled_mcnemar_p_value", pooled_p);
    std::cout << j.dump(2) << "\n";
    return 0;
  }
  const std::string test = use_exact ? "Fisher's exact test of the strata x (b, c) table, two-sided,"
                                     : "Pearson's chi-square test of homogeneity (" + std::to_string(h.df) + " df),";
  std::cout << "Discordant pairs in " << strata.value().size() << " strata (" << h.strata_used
            << " with discordant pairs): does the share b/(b+c) favouring the reference arm differ between strata?\n"
            << Verdict(headline, conf.value(), test, "the same conditional odds ratio b/c in every stratum",
                       "odds ratios that differ between strata");
  if (h.small_expected)
    std::cout << "Some expected counts are small, so the chi-square approximation is doubtful"
              << (h.exact_p ? "; the exact test is the one to read.\n" : " and the exact test was too large to enumerate.\n");
  std::cout << "\n"
            << Line("Pearson X^2 (no continuity correction)", Fmt(h.chi2) + " on " + std::to_string(h.df) + " df   " + PEquals(h.chi2_p))
            << Line("Fisher's exact p (Freeman-Halton)", h.exact_p ? FormatP(PValue::FromValue(*h.exact_p)) : "not computed (too many tables)")
            << Line("pooled conditional odds ratio sum(b)/sum(c)",
                    Fmt(h.pooled_odds_ratio.estimate) + "   " +
                        CiText(conf.value(), Alternative::kTwoSided, h.pooled_odds_ratio.ci, "exact (Clopper-Pearson)"))
            << Line("exact McNemar p on the pooled pairs, two-sided", FormatP(pooled_p));
  for (size_t i = 0; i < strata.value().size(); ++i) {
    const auto& s = strata.value()[i];
    std::cout << Line("stratum " + std::to_string(i + 1), "b = " + std::to_string(s.b) + ", c = " + std::to_string(s.c) +
                                                              ", b/c = " + (s.discordant() ? Fmt(s.c ? double(s.b) / double(s.c) : INFINITY) : "undefined"));
  }
  return 0;
}

Result<std::pair<double, double>> ParseMargin(const std::string& text) {
  const std::string fix = "give the margin as one positive difference, e.g. --margin 0.05, or as lower,upper, e.g. --margin -0.05,0.1";
  auto parts = SplitOn(text, ',');
  if (parts.size() > 2) return BadInput("--margin", "expected one or two numbers, got '" + std::string(Trim(text)) + "'", fix);
  std::vector<double> v;
  for (const auto& part : parts) {
    auto x = ParseNumber("--margin", part, fix);
    if (!x.ok()) return x.error();
    v.push_back(x.value());
  }
  const double low = v.size() == 1 ? -std::fabs(v[0]) : v[0], high = v.size() == 1 ? std::fabs(v[0]) : v[1];
  if (!(low < 0 && high > 0 && low > -1 && high < 1))
    return BadInput("--margin", "the margin must lie strictly between -1 and 1 with the lower end below 0 and the upper above 0, got '" +
                                    std::string(Trim(text)) + "'",
                    fix);
  return std::make_pair(low, high);
}

int RunEquivalence(const Context& ctx, const PairedOptions& o) {
  auto t = ParsePairedTable(o.table);
  if (!t.ok()) return Fail(t.error());
  auto margin = ParseMargin(o.margin);
  if (!margin.ok()) return Fail(margin.error());
  auto alpha = ParseNumber("--alpha", o.alpha, "give the level of each one-sided test, e.g. --alpha 0.05");
  if (!alpha.ok()) return Fail(alpha.error());
  if (!(alpha.value() > 0 && alpha.value() < 0.5))
    return Fail(BadInput("--alpha", "the level must lie strictly between 0 and 0.5, got " + std::string(Trim(o.alpha)), "e.g. --alpha 0.05"));
  const auto [low, high] = margin.value();
  auto r = stats::PairedEquivalence(t.value(), low, high, alpha.value());
  const double conf = 1 - 2 * alpha.value();
  if (ctx.json) {
    nlohmann::json j{{"test", "two one-sided score tests (Tango) for equivalence of paired rates"},
                     {"estimate_name", "paired difference (b-c)/n"},
                     {"estimate", JsonNumber(r.estimate)},
                     {"margin", {JsonNumber(low), JsonNumber(high)}},
                     {"alpha", alpha.value()},
                     {"z_lower", JsonNumber(r.z_lower)},
                     {"z_upper", JsonNumber(r.z_upper)},
                     {"equivalent", r.equivalent},
                     {"conf_level", conf},
                     {"conf_int", Ci(r.ci)},
                     {"conf_int_method", "Tango score"}};
    PutP(j, "p_value", r.p);
    PutP(j, "p_value_lower", r.p_lower);
    PutP(j, "p_value_upper", r.p_upper);
    std::cout << j.dump(2) << "\n";
    return 0;
  }
  const std::string range = "[" + Fmt(low) + ", " + Fmt(high) + "]";
  char level[32];
  std::snprintf(level, sizeof level, "%g", alpha.value());
  std::cout << "Equivalence of the paired callback rates within the margin " << range
            << " for the difference (b-c)/n, by two one-sided score tests (Tango; Liu et al. 2002).\n";
  if (r.equivalent)
    std::cout << "At the " << level << " level, both one-sided tests reject a difference outside " << range
              << ": the two arms' callback rates are equivalent within the margin (" << PEquals(r.p) << ").\n";
  else
    std::cout << "At the " << level << " level, the two one-sided tests do not both reject a difference outside " << range
              << " (" << PEquals(r.p) << "): equivalence is not shown, which is not evidence of a difference.\n";
  std::cout << "\n"
            << Line("paired difference (b-c)/n", Fmt(r.estimate) + "   " + CiText(conf, Alternative::kTwoSided, r.ci, "Tango score"))
            << Line("lower test, one-sided (greater)", "H0: difference <= " + Fmt(low) + "   z = " + Fmt(r.z_lower) + "   " + PEquals(r.p_lower))
            << Line("upper test, one-sided (less)", "H0: difference >= " + Fmt(high) + "   z = " + Fmt(r.z_upper) + "   " + PEquals(r.p_upper));
  return 0;
}

int RunEmployers(const Context& ctx, const PairedOptions& o) {
  const std::string fix = "give each employer's discordant counts as b,c separated by ';', e.g. --employers \"3,0;1,1;0,2;4,1\"";
  auto employers = ParseDiscordantList("--employers", o.employers, fix);
  if (!employers.ok()) return Fail(employers.error());
  auto alt = ParseAlternative(o.alternative);
  if (!alt.ok()) return Fail(alt.error());
  auto conf = ParseConf(o.conf);
  if (!conf.ok()) return Fail(conf.error());
  const std::string seed_fix = "give a whole number, e.g. --seed 1";
  auto seed = ParseCount("--seed", o.seed, seed_fix);
  if (!seed.ok()) return Fail(seed.error());
  auto resamples = ParseCount("--resamples", o.resamples, "give a whole number of at least 1, e.g. --resamples 99999");
  if (!resamples.ok()) return Fail(resamples.error());
  if (resamples.value() < 1)
    return Fail(BadInput("--resamples", "at least one resample is needed", "e.g. --resamples 99999"));
  auto r = stats::ClusterFlipTest(employers.value(), static_cast<uint64_t>(seed.value()), resamples.value());
  int64_t b = 0, c = 0;
  for (const auto& e : employers.value()) b += e.b, c += e.c;
  if (b + c == 0) return Fail(BadInput("--employers", "no employer has a discordant pair", fix));
  auto pair_level = stats::BinomTest(b, b + c, 0.5, alt.value(), conf.value()).p;
  const PValue cluster = PValue::FromValue(r.p(alt.value()));
  const double alpha = 1 - conf.value();
  const bool disagree = (cluster.p < alpha) != (pair_level.p < alpha);
  const std::string method = r.exact ? "exact" : "Monte Carlo, " + std::to_string(r.resamples) + " resamples";
  if (ctx.json) {
    nlohmann::json j{{"test", "employer sign-flip randomisation test"},
                     {"method", r.exact ? "exact" : "monte carlo"},
                     {"resamples", r.resamples},
                     {"seed", seed.value()},
                     {"alternative", AlternativeName(alt.value())},
                     {"statistic", r.statistic},
                     {"statistic_name", "sum(b) - sum(c)"},
                     {"employers", employers.value().size()},
                     {"employers_informative", r.employers},
                     {"decisions_differ", disagree}};
    PutP(j, "p_value", cluster);
    PutP(j, "pair_level_p_value", pair_level);
    std::cout << j.dump(2) << "\n";
    return 0;
  }
  const std::string sided = Sided(alt.value());
  const std::string null = alt.value() == Alternative::kLess      ? "equal treatment (or an advantage for the reference arm)"
                           : alt.value() == Alternative::kGreater ? "equal treatment (or an advantage for the other arm)"
                                                                  : "equal treatment of the arms";
  const std::string favoured = alt.value() == Alternative::kLess      ? "the other arm being favoured"
                               : alt.value() == Alternative::kGreater ? "the reference arm being favoured"
                                                                      : "unequal treatment";
  std::cout << employers.value().size() << " employers with " << b << " pairs favouring the reference arm and " << c
            << " favouring the other; each employer's pairs are swapped together (" << method << ").\n"
            << Verdict(cluster, conf.value(), "the employer sign-flip test, " + sided + ",", null, favoured);
  if (disagree)
    std::cout << "The pair-level exact McNemar test, which counts every pair as independent, reaches the opposite "
                 "decision ("
              << PEquals(pair_level) << "): employers with several vacancies carry less information than their pairs suggest.\n";
  std::cout << "\n"
            << Line("statistic sum(b) - sum(c)", std::to_string(r.statistic))
            << Line("employer sign-flip p, " + sided, FormatP(cluster) + " (" + method + ")")
            << Line("pair-level exact McNemar p, " + sided, FormatP(pair_level));
  return 0;
}

void AddPairedCalculators(CLI::App& calc_app, Context& ctx) {
  CLI::App* calc = &calc_app;
  auto o = std::make_shared<PairedOptions>();

  auto* ratio = calc->add_subcommand("ratio", "Paired table: callback-rate ratio (a+b)/(a+c) with the Bonett-Price interval");
  ratio->add_option("--table", o->table, "a,b,c,d: both positive, reference only, other only, neither")->required();
  ratio->add_option("--alternative", o->alternative, "two-sided (default), less or greater: which bound to give");
  ratio->add_option("--conf", o->conf, "Confidence level (default 0.95)");
  ratio->callback([&ctx, o] { ctx.exit_code = RunRatio(ctx, *o); });

  auto* homogeneity = calc->add_subcommand(
      "homogeneity", "Matched pairs in strata: does b/(b+c) differ across strata? Chi-square, exact test, pooled b/c");
  homogeneity->add_option("--strata", o->strata, "b,c;b,c;... each stratum's discordant pairs")->required();
  homogeneity->add_option("--conf", o->conf, "Confidence level (default 0.95)");
  homogeneity->callback([&ctx, o] { ctx.exit_code = RunHomogeneity(ctx, *o); });

  auto* equivalence = calc->add_subcommand(
      "equivalence", "Paired table: two one-sided score tests that the difference of callback rates lies within a margin");
  equivalence->add_option("--table", o->table, "a,b,c,d: both positive, reference only, other only, neither")->required();
  equivalence->add_option("--margin", o->margin, "Equivalence margin for (b-c)/n: 0.05 or lower,upper")->required();
  equivalence->add_option("--alpha", o->alpha, "Level of each one-sided test (default 0.05)");
  equivalence->callback([&ctx, o] { ctx.exit_code = RunEquivalence(ctx, *o); });

  auto* employers = calc->add_subcommand(
      "employers", "Pairs clustered by employer: sign-flip test that swaps each employer's pairs together");
  employers->add_option("--employers", o->employers, "b,c;b,c;... each employer's discordant pairs")->required();
  employers->add_option("--alternative", o->alternative, "two-sided (default), less or greater (reference arm favoured)");
  employers->add_option("--conf", o->conf, "Confidence level (default 0.95)");
  employers->add_option("--seed", o->seed, "Seed of the Monte Carlo resamples when the exact distribution is too large (default 1)");
  employers->add_option("--resamples", o->resamples, "Monte Carlo resamples (default 99999)");
  employers->callback([&ctx, o] { ctx.exit_code = RunEmployers(ctx, *o); });
}

}  // namespace

void RegisterCalcCommands(CLI::App& app, Context& ctx) {
  auto* calc = app.add_subcommand("calc", "Exact statistics on numbers you type in (no study needed)");
  calc->require_subcommand(1);
  AddCountCalculators(*calc, ctx);
  AddPairedCalculators(*calc, ctx);
  AddRankCalculators(*calc, ctx);
}

}  // namespace twinprobe
