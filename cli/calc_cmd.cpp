// `twinprobe calc`: calculators on counts from a published test or a
// spreadsheet, with the same exact statistics `analyze` uses (stats/).
//   calc binom   --x X --n N [--p 0.5] [--alternative ...] [--conf 0.95]
//   calc mcnemar --table a,b,c,d [--conf 0.95]
//   calc fisher  --table a,b,c,d [--alternative ...] [--conf 0.95]
//   calc mh      --tables "a,b,c,d;..." [--conf 0.95] [--exact]
//   calc adjust  --method M (--p p1,p2,... | --file FILE)
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
#include "stats/paired.h"
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
  char buf[256];
  std::snprintf(buf, sizeof buf, "  %-40s %s\n", label.c_str(), value.c_str());
  return buf;
}

// The plain sentence: what the test shows at the level 1 - conf.
std::string Verdict(const PValue& p, double conf, const std::string& shown, const std::string& not_shown) {
  const double alpha = 1 - conf;
  char level[32];
  std::snprintf(level, sizeof level, "%g", alpha);
  if (std::isnan(p.p)) return "The data hold no information on this question.\n";
  if (p.p < alpha || p.underflowed()) return "At the " + std::string(level) + " level, " + shown + " (" + PEquals(p) + ").\n";
  return "At the " + std::string(level) + " level the test does not show " + not_shown + " (" + PEquals(p) +
         "); this is not evidence that there is none.\n";
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
  auto r = stats::BinomTest(x.value(), n.value(), p0.value(), alt.value(), conf.value());
  auto wilson = stats::Wilson(x.value(), n.value(), conf.value());
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
                     {"wilson_conf_int", Ci(wilson)}};
    PutP(j, "p_value", r.p);
    std::cout << j.dump(2) << "\n";
    return 0;
  }
  std::cout << "Exact binomial test of " << x.value() << " successes in " << n.value() << " trials against p = " << Fmt(p0.value())
            << " (" << AlternativeName(alt.value()) << ").\n"
            << Verdict(r.p, conf.value(), "the success rate differs from " + Fmt(p0.value()),
                       "a success rate different from " + Fmt(p0.value()))
            << "\n"
            << Line("estimate x/n", Fmt(r.estimate)) << Line("exact p (" + AlternativeName(alt.value()) + ")", FormatP(r.p))
            << Line(Percent(conf.value()) + " CI, Clopper-Pearson (exact)", FmtCi(r.ci))
            << Line(Percent(conf.value()) + " CI, Wilson score", FmtCi(wilson));
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
  if (ctx.json) {
    nlohmann::json j{{"test", "exact McNemar test"},
                     {"table", {{"a", pc.a}, {"b", pc.b}, {"c", pc.c}, {"d", pc.d}, {"n", pc.n()}}},
                     {"conf_level", conf.value()},
                     {"statistic", pc.b},
                     {"discordant", pc.discordant()},
                     {"estimate", JsonNumber(cor.estimate)},
                     {"conf_int", Ci(cor.ci)},
                     {"estimate_name", "conditional odds ratio b/c"},
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
    std::cout << Verdict(m.exact, conf.value(),
                         std::string("the arms were not treated alike: the ") + (pc.b > pc.c ? "reference" : "other") +
                             " arm was favoured in " + std::to_string(std::max(pc.b, pc.c)) + " of " +
                             std::to_string(pc.discordant()) + " discordant pairs",
                         "a difference between the arms");
  std::cout << "\n"
            << Line("exact McNemar p (two-sided)", FormatP(m.exact)) << Line("mid-p", FormatP(m.mid_p))
            << Line("McNemar X^2 uncorrected", Fmt(m.chi2) + "   " + PEquals(m.chi2_p))
            << Line("McNemar X^2 continuity-corrected", Fmt(m.chi2_corrected) + "   " + PEquals(m.chi2_corrected_p))
            << Line("conditional odds ratio b/c", Fmt(cor.estimate) + "   " + Percent(conf.value()) + " CI " + FmtCi(cor.ci) + " (exact)")
            << Line("net discrimination (b-c)/(a+b+c)", Fmt(net.among_positive.estimate) + "   " + Percent(conf.value()) +
                                                           " CI " + FmtCi(net.among_positive.ci) + " (Newcombe)")
            << Line("paired difference (b-c)/n", Fmt(net.over_all.estimate) + "   " + Percent(conf.value()) + " CI " +
                                                    FmtCi(net.over_all.ci) + " (Newcombe)");
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
  auto r = stats::FisherTest(tab, alt.value(), conf.value());
  auto woolf = stats::WoolfOddsRatio(tab, conf.value());
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
                     {"rate_reference", JsonNumber(rate(tab.a, tab.a + tab.b))},
                     {"rate_other", JsonNumber(rate(tab.c, tab.c + tab.d))}};
    PutP(j, "p_value", r.p);
    std::cout << j.dump(2) << "\n";
    return 0;
  }
  std::cout << "Fisher's exact test: reference arm " << tab.a << " of " << tab.a + tab.b << " positive, other arm " << tab.c
            << " of " << tab.c + tab.d << " (" << AlternativeName(alt.value()) << ").\n"
            << Verdict(r.p, conf.value(), "the positive rates of the two arms differ", "a difference between the arms") << "\n"
            << Line("exact p (" + AlternativeName(alt.value()) + ")", FormatP(r.p))
            << Line("conditional MLE odds ratio", Fmt(r.estimate) + "   " + Percent(conf.value()) + " CI " + FmtCi(r.ci) + " (exact)")
            << Line("sample odds ratio ad/bc", Fmt(woolf.estimate) + "   " + Percent(conf.value()) + " CI " + FmtCi(woolf.ci) + " (Woolf)");
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
            << Verdict(headline, conf.value(), "the arms differ after stratification",
                       "a difference between the arms after stratification")
            << "\n"
            << Line("Mantel-Haenszel odds ratio", Fmt(mh.estimate) + "   " + Percent(conf.value()) + " CI " + FmtCi(mh.ci) +
                                                     " (Robins-Breslow-Greenland)")
            << Line("CMH X^2 with continuity correction", Fmt(mh.chi2_corrected) + "   " + PEquals(mh.chi2_corrected_p))
            << Line("CMH X^2 without correction", Fmt(mh.chi2) + "   " + PEquals(mh.chi2_p));
  if (exact)
    std::cout << Line("exact conditional p (two-sided)", FormatP(exact->p))
              << Line("conditional MLE common odds ratio", Fmt(exact->estimate) + "   " + Percent(conf.value()) + " CI " +
                                                               FmtCi(exact->ci) + " (exact)");
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

void RegisterCalcCommands(CLI::App& app, Context& ctx) {
  auto* calc = app.add_subcommand("calc", "Exact statistics on numbers you type in (no study needed)");
  calc->require_subcommand(1);
  AddCountCalculators(*calc, ctx);
  AddRankCalculators(*calc, ctx);
}

}  // namespace twinprobe
