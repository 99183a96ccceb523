// `twinprobe power paired|unpaired|sets`: power, sample size and minimum
// detectable effect before fieldwork. Pure calculation: reads no study and
// writes nothing except the optional --plot SVG. The numbers come from
// stats/power_paired.h, stats/power_unpaired.h, stats/power_fisher.h and stats/power_sets.h; this file only checks the
// inputs, picks what to solve for and words the answer.
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <fstream>
#include <iostream>
#include <set>
#include <sstream>

#include <nlohmann/json.hpp>

#include "cli/command.h"
#include "report/svg_power.h"
#include "stats/power_fisher.h"
#include "stats/power_paired.h"
#include "stats/power_sets.h"
#include "stats/power_unpaired.h"

namespace twinprobe {
namespace {

using nlohmann::json;

Error Usage(std::string what, std::string fix) { return Error{ErrorKind::kUsage, "", std::move(what), std::move(fix)}; }

std::string Fmt(const char* format, double v) {
  char buf[64];
  std::snprintf(buf, sizeof buf, format, v);
  return buf;
}
std::string Pct(double v) { return Fmt("%.1f%%", 100.0 * v); }
// Targets and levels as typed: 0.8 -> "80%", 0.125 -> "12.5%".
std::string Level(double v) { return Fmt("%g%%", 100.0 * v); }
std::string Short(double v) { return Fmt("%g", v); }
// 1290 -> "1,290"
std::string Count(int64_t n) {
  std::string s = std::to_string(n);
  for (int i = static_cast<int>(s.size()) - 3; i > 0; i -= 3) s.insert(static_cast<size_t>(i), ",");
  return s;
}

// Checks shared by both designs. `name` is the option as typed.
Status CheckOpenUnit(const std::string& name, double v, const std::string& what, const std::string& example) {
  if (!(v > 0.0 && v < 1.0))
    return BadInput(name, what + " must be between 0 and 1 (exclusive), got " + Short(v), "use e.g. " + name + " " +
                                                                                               example);
  return {};
}

struct Common {
  double alpha = 0.05;
  double power = 0.8;
  int comparisons = 1;
  std::string plot;
  CLI::Option* power_opt = nullptr;
  double alpha_each() const { return alpha / comparisons; }
};

Status CheckCommon(const Common& c) {
  if (Status s = CheckOpenUnit("--alpha", c.alpha, "alpha", "0.05"); !s.ok()) return s;
  if (c.power_opt->count())
    if (Status s = CheckOpenUnit("--power", c.power, "the target power", "0.8"); !s.ok()) return s;
  if (c.comparisons < 1)
    return BadInput("--comparisons",
                    "the number of comparisons must be at least 1, got " + std::to_string(c.comparisons),
                    "give how many strata or comparisons the analysis plan corrects across");
  return {};
}

void AddCommonOptions(CLI::App* cmd, Common& c) {
  cmd->add_option("--alpha", c.alpha, "Two-sided significance level of the whole plan (default 0.05)");
  c.power_opt = cmd->add_option("--power", c.power, "Target power: solve for the number of vacancies (e.g. 0.8)");
  cmd->add_option("--comparisons", c.comparisons,
                  "Comparisons (strata) the plan corrects across: each is tested at alpha / K (Bonferroni; the first "
                  "step of Holm)");
  cmd->add_option("--plot", c.plot, "Also write the power curve as an SVG file");
}

std::string CorrectionSentence(const Common& c) {
  if (c.comparisons == 1) return "";
  return "The plan corrects across " + std::to_string(c.comparisons) + " comparisons: each is tested at alpha " +
         Short(c.alpha_each()) + " (" + Short(c.alpha) + " / " + std::to_string(c.comparisons) +
         ", Bonferroni and the first, most stringent step of Holm), and every number below is per comparison "
         "(per stratum).\n";
}

Status WriteSvg(const std::string& path, const PowerCurveChart& chart) {
  std::ofstream out(path, std::ios::binary);
  out << RenderPowerCurveSvg(chart);
  if (!out) return BadInput(path, "cannot write the plot", "check that the folder exists and is writable");
  std::cerr << "Power curve written to " << path << "\n";
  return {};
}

// N values for the table around a base N.
std::vector<int64_t> TableSizes(int64_t base) {
  std::set<int64_t> s;
  for (double m : {0.5, 0.75, 0.9, 1.0, 1.1, 1.25, 1.5, 2.0}) s.insert(std::max<int64_t>(1, std::llround(m * base)));
  return {s.begin(), s.end()};
}

// Points of a curve from 1 to x_max (at most about 400).
std::vector<int64_t> CurveSizes(int64_t x_max) {
  std::vector<int64_t> xs;
  const int64_t step = std::max<int64_t>(1, (x_max + 399) / 400);
  for (int64_t n = 1; n <= x_max; n += step) xs.push_back(n);
  if (xs.back() != x_max) xs.push_back(x_max);
  return xs;
}

// ---------------------------------------------------------------- paired --

struct PairedOptions {
  Common common;
  double p10 = 0, p01 = 0, rate = 0, ratio = 0, difference = 0, both = 0, discordant = 0, lost = 0;
  int64_t pairs = 0;
  CLI::Option *p10_opt, *p01_opt, *rate_opt, *ratio_opt, *difference_opt, *both_opt, *discordant_opt, *pairs_opt;
};

// What the user described, in both forms.
struct PairedInputs {
  bool from_rates = false;        // --rate/--ratio|--difference/--both
  bool detect = false;            // solve for the smallest detectable gap
  bool detect_ratio = false;      // …as a ratio (from --rate --both) or a difference (from --discordant)
  double rate_reference = 0, rate_other = 0, both = 0;
  stats::PairedAlternative alt;
};

Result<PairedInputs> ReadPairedInputs(const PairedOptions& o) {
  PairedInputs in;
  const bool discordant_form = o.p10_opt->count() || o.p01_opt->count();
  const bool rates_form =
      o.rate_opt->count() || o.ratio_opt->count() || o.difference_opt->count() || o.both_opt->count();
  if (discordant_form + rates_form + (o.discordant_opt->count() > 0) > 1)
    return Usage("give the gap one way: --p10 and --p01, or --rate with --ratio (or --difference) and --both, or "
                 "--discordant",
                 "see 'twinprobe power paired --help'");
  if (discordant_form) {
    if (!o.p10_opt->count() || !o.p01_opt->count())
      return Usage("--p10 and --p01 go together", "give both discordant shares, e.g. --p10 0.05 --p01 0.02");
    for (auto [name, v] : {std::pair{"--p10", o.p10}, std::pair{"--p01", o.p01}})
      if (!(v >= 0.0 && v < 1.0))
        return BadInput(name, std::string("a share of vacancies must be in [0, 1), got ") + Short(v),
                        "give the share of vacancies where only that arm is called back, e.g. 0.05");
    if (o.p10 + o.p01 > 1.0)
      return BadInput("--p01", "p10 + p01 = " + Short(o.p10 + o.p01) + " is above 1",
                      "the two discordant shares together cannot exceed 1");
    if (o.p10 + o.p01 == 0.0)
      return BadInput("--p10", "p10 and p01 are both 0, so no vacancy would ever separate the arms",
                      "give the expected shares of vacancies where only one arm is called back");
    in.alt = {o.p10, o.p01};
    return in;
  }
  if (o.discordant_opt->count()) {
    if (Status s = CheckOpenUnit("--discordant", o.discordant, "the discordant share", "0.07"); !s.ok())
      return s.error();
    if (!(o.pairs_opt->count() && o.common.power_opt->count()))
      return Usage("--discordant alone describes no gap: it asks for the smallest detectable difference",
                   "give --pairs N and --power P with it, or give --p10 and --p01");
    in.detect = true;
    in.alt = {o.discordant / 2, o.discordant / 2};
    return in;
  }
  if (!rates_form)
    return Usage("no gap given",
                 "give --p10 and --p01, or --rate R --ratio Q --both B (see 'twinprobe power paired --help')");
  in.from_rates = true;
  if (!o.rate_opt->count() || !o.both_opt->count())
    return Usage("--rate and --both are needed with --ratio or --difference",
                 "give the reference arm's callback rate (--rate) and the share of vacancies calling back both "
                 "(--both)");
  if (o.ratio_opt->count() && o.difference_opt->count())
    return Usage("give --ratio or --difference, not both", "the gap is one or the other");
  if (Status s = CheckOpenUnit("--rate", o.rate, "a callback rate", "0.12"); !s.ok()) return s.error();
  in.rate_reference = o.rate;
  in.both = o.both;
  if (!(o.both >= 0.0 && o.both < 1.0))
    return BadInput("--both", "the share of vacancies calling back both probes must be in [0, 1), got " + Short(o.both),
                    "e.g. --both 0.05");
  if (o.ratio_opt->count()) {
    if (!(o.ratio > 0.0))
      return BadInput("--ratio", "the ratio of callback rates must be positive, got " + Short(o.ratio),
                      "give the reference rate divided by the other arm's rate, e.g. 1.25");
    in.rate_other = o.rate / o.ratio;
    if (in.rate_other >= 1.0)
      return BadInput("--ratio",
                      "a ratio of " + Short(o.ratio) + " makes the other arm's callback rate " + Short(in.rate_other) +
                          ", not below 1",
                      "use a ratio above " + Short(o.rate) + " (the reference rate)");
  } else if (o.difference_opt->count()) {
    in.rate_other = o.rate - o.difference;
    if (!(in.rate_other > 0.0 && in.rate_other < 1.0))
      return BadInput("--difference",
                      "a difference of " + Short(o.difference) + " makes the other arm's callback rate " +
                          Short(in.rate_other) + ", outside (0, 1)",
                      "give the reference rate minus the other arm's rate, e.g. 0.03");
  } else {
    if (!(o.pairs_opt->count() && o.common.power_opt->count()))
      return Usage("no gap given: --rate and --both alone ask for the smallest detectable ratio",
                   "give --ratio Q (or --difference D), or give both --pairs N and --power P");
    if (o.both >= o.rate)
      return BadInput("--both",
                      Short(o.both) + " of vacancies calling back both probes is not below the reference rate " +
                          Short(o.rate),
                      "--both must be below the reference arm's callback rate");
    in.detect = true;
    in.detect_ratio = true;
    in.alt = stats::AlternativeFromRates(o.rate, o.rate, o.both);
    return in;
  }
  const double lower_rate = std::min(in.rate_reference, in.rate_other);
  if (o.both > lower_rate)
    return BadInput("--both",
                    Short(o.both) + " of vacancies calling back both probes is more than the lower callback rate " +
                        Short(lower_rate),
                    "--both can be at most the lower of the two callback rates");
  const double at_least = in.rate_reference + in.rate_other - 1.0;
  if (o.both < at_least - 1e-15)
    return BadInput("--both",
                    "with callback rates " + Short(in.rate_reference) + " and " + Short(in.rate_other) + ", at least " +
                        Short(at_least) + " of vacancies must call back both probes",
                    "raise --both to at least " + Short(at_least));
  in.alt = stats::AlternativeFromRates(in.rate_reference, in.rate_other, o.both);
  if (in.alt.discordant() == 0.0)
    return BadInput("--both", "every vacancy would treat both probes alike, so no set is discordant",
                    "--both must be below the callback rates");
  return in;
}

std::string DescribeGap(const PairedInputs& in) {
  std::ostringstream o;
  if (in.from_rates)
    o << "Callback rates " << Pct(in.rate_reference) << " (reference arm) and " << Pct(in.rate_other)
      << " (other arm), both probes called back at " << Pct(in.both) << " of vacancies:\n";
  o << Pct(in.alt.p10) << " of vacancies call back only the reference arm's probe (p10) and " << Pct(in.alt.p01)
    << " only the other's (p01).\n";
  return o.str();
}

json GapJson(const PairedInputs& in, const PairedOptions& o) {
  json j{{"design", "paired"},
         {"test", "exact conditional McNemar, two-sided"},
         {"alpha", o.common.alpha},
         {"comparisons", o.common.comparisons},
         {"alpha_per_comparison", o.common.alpha_each()},
         {"lost", o.lost}};
  if (!in.detect) j["p10"] = in.alt.p10, j["p01"] = in.alt.p01;
  if (in.from_rates) {
    j["rate_reference"] = in.rate_reference;
    j["both"] = in.both;
    if (!in.detect) j["rate_other"] = in.rate_other;
  }
  return j;
}

// Rows of N against exact, Connor and Miettinen power (N = planned sets;
// the asymptotic formulas see the expected completed sets N (1 - lost)).
json PairedTable(const std::vector<int64_t>& sizes, const stats::PairedAlternative& alt, double alpha, double lost) {
  json rows = json::array();
  stats::McNemarPowerCalculator calc(stats::WithLosses(alt, lost), alpha);
  for (int64_t n : sizes) {
    const double completed = static_cast<double>(n) * (1.0 - lost);
    rows.push_back({{"sets", n},
                    {"power", calc.Power(n)},
                    {"connor", stats::ConnorPower(completed, alt, alpha)},
                    {"miettinen", stats::MiettinenPower(completed, alt, alpha)}});
  }
  return rows;
}

std::string RenderPairedTable(const json& rows, double lost) {
  std::ostringstream o;
  char head[128];
  std::snprintf(head, sizeof head, "\n  %17s   %5s   %6s  %9s\n", lost > 0 ? "planned vacancies" : "vacancies", "exact",
                "Connor", "Miettinen");
  o << head;
  for (const auto& r : rows) {
    char line[128];
    std::snprintf(line, sizeof line, "  %17s   %5.3f   %6.3f  %9.3f\n", Count(r["sets"].get<int64_t>()).c_str(),
                  r["power"].get<double>(), r["connor"].get<double>(), r["miettinen"].get<double>());
    o << line;
  }
  o << "Exact: the power of the exact McNemar test the analysis runs. Connor (1987) and Miettinen (1968) are\n"
       "large-sample formulas, shown for comparison with other planning tools.\n";
  return o.str();
}

Status PlotPaired(const std::string& path, const stats::PairedAlternative& alt, double alpha, double lost,
                  int64_t x_max, std::optional<double> target, int64_t marker, const std::string& marker_label) {
  PowerCurveChart chart;
  chart.title = "Power of the exact McNemar test (alpha " + Short(alpha) + ")";
  chart.x_label = lost > 0 ? "Planned vacancies (sets of two probes)" : "Vacancies (sets of two probes)";
  PowerCurveSeries exact{"exact McNemar", {}, false}, connor{"Connor (1987)", {}, true};
  stats::McNemarPowerCalculator calc(stats::WithLosses(alt, lost), alpha);
  for (int64_t n : CurveSizes(x_max)) {
    const double x = static_cast<double>(n);
    exact.xy.emplace_back(x, calc.Power(n));
    connor.xy.emplace_back(x, stats::ConnorPower(x * (1.0 - lost), alt, alpha));
  }
  chart.series = {exact, connor};
  chart.target_power = target;
  chart.marker_x = static_cast<double>(marker);
  chart.marker_label = marker_label;
  return WriteSvg(path, chart);
}

int RunPaired(Context& ctx, const PairedOptions& o) {
  if (Status s = CheckCommon(o.common); !s.ok()) return ReportError(s.error());
  if (!(o.lost >= 0.0 && o.lost < 1.0))
    return ReportError(BadInput("--lost", "the share of vacancies lost must be in [0, 1), got " + Short(o.lost),
                                "e.g. --lost 0.1 when one vacancy in ten closes before both probes are sent"));
  if (o.pairs_opt->count() && o.pairs < 1)
    return ReportError(BadInput("--pairs", "the number of vacancies must be at least 1, got " + std::to_string(o.pairs),
                                "give the number of vacancies (sets of two probes) the budget allows"));
  auto read = ReadPairedInputs(o);
  if (!read.ok()) return ReportError(read.error());
  const PairedInputs& in = read.value();
  const bool has_n = o.pairs_opt->count() > 0, has_power = o.common.power_opt->count() > 0;
  if (!in.detect && has_n == has_power)
    return ReportError(Usage(has_n ? "--pairs and --power together ask for a detectable gap, but the gap is given"
                                   : "nothing to solve for",
                             "give --pairs N to get the power, or --power P to get the number of vacancies"));
  const double alpha = o.common.alpha_each();
  const double lost = o.lost;
  json j = GapJson(in, o);
  std::ostringstream text;
  text << "Paired design: exact McNemar test, two-sided, alpha " << Short(alpha) << ".\n"
       << CorrectionSentence(o.common);
  if (lost > 0)
    text << "Expected share of vacancies lost before both probes are sent: " << Pct(lost)
         << "; vacancy counts are planned vacancies.\n";

  if (in.detect) {
    const double target = o.common.power;
    if (in.detect_ratio) {
      const double q = stats::McNemarDetectableRatio(o.pairs, in.rate_reference, in.both, alpha, target, lost);
      j["pairs"] = o.pairs;
      j["target_power"] = target;
      if (q == 0.0) {
        j["detectable_ratio"] = nullptr;
        text << "\nWith " << Count(o.pairs) << " vacancies no gap compatible with --both " << Short(in.both)
             << " reaches " << Level(target) << " power: even the other arm at " << Pct(in.both)
             << " (every callback it gets shared with the reference arm) is not enough.\n";
      } else {
        const double other = in.rate_reference / q;
        const stats::PairedAlternative alt = stats::AlternativeFromRates(in.rate_reference, other, in.both);
        j["detectable_ratio"] = q;
        j["detectable_rate_other"] = other;
        j["power"] = stats::McNemarExactPower(o.pairs, stats::WithLosses(alt, lost), alpha);
        j["connor"] = {{"power", stats::ConnorPower(static_cast<double>(o.pairs) * (1 - lost), alt, alpha)}};
        j["miettinen"] = {{"power", stats::MiettinenPower(static_cast<double>(o.pairs) * (1 - lost), alt, alpha)}};
        text << "\nWith " << Count(o.pairs) << " vacancies the smallest gap found with " << Level(target)
             << " power is a callback ratio of " << Fmt("%.3f", q) << ": " << Pct(in.rate_reference)
             << " for the reference arm against " << Pct(other) << " for the other (both probes called back at "
             << Pct(in.both) << " of vacancies).\n";
        j["table"] = PairedTable(TableSizes(o.pairs), alt, alpha, lost);
        text << RenderPairedTable(j["table"], lost);
      }
    } else {
      const double d = stats::McNemarDetectableDifference(o.pairs, o.discordant, alpha, target, lost);
      j["pairs"] = o.pairs;
      j["target_power"] = target;
      j["discordant"] = o.discordant;
      if (d == 0.0) {
        j["detectable_difference"] = nullptr;
        text << "\nWith " << Count(o.pairs) << " vacancies and " << Pct(o.discordant)
             << " of them discordant, no difference reaches " << Level(target) << " power.\n";
      } else {
        const stats::PairedAlternative alt{(o.discordant + d) / 2, (o.discordant - d) / 2};
        j["detectable_difference"] = d;
        j["p10"] = alt.p10;
        j["p01"] = alt.p01;
        j["power"] = stats::McNemarExactPower(o.pairs, stats::WithLosses(alt, lost), alpha);
        j["connor"] = {{"power", stats::ConnorPower(static_cast<double>(o.pairs) * (1 - lost), alt, alpha)}};
        j["miettinen"] = {{"power", stats::MiettinenPower(static_cast<double>(o.pairs) * (1 - lost), alt, alpha)}};
        text << "\nWith " << Count(o.pairs) << " vacancies, " << Pct(o.discordant)
             << " of them discordant, the smallest difference in callback rates found with " << Level(target)
             << " power is " << Fmt("%.2f", 100 * d) << " percentage points (p10 = " << Fmt("%.4f", alt.p10)
             << ", p01 = " << Fmt("%.4f", alt.p01) << ").\n";
        j["table"] = PairedTable(TableSizes(o.pairs), alt, alpha, lost);
        text << RenderPairedTable(j["table"], lost);
      }
    }
  } else if (has_n) {
    const stats::PairedAlternative lost_alt = stats::WithLosses(in.alt, lost);
    const double power = stats::McNemarExactPower(o.pairs, lost_alt, alpha);
    const double completed = static_cast<double>(o.pairs) * (1.0 - lost);
    j["pairs"] = o.pairs;
    j["power"] = power;
    j["connor"] = {{"power", stats::ConnorPower(completed, in.alt, alpha)}};
    j["miettinen"] = {{"power", stats::MiettinenPower(completed, in.alt, alpha)}};
    j["table"] = PairedTable(TableSizes(o.pairs), in.alt, alpha, lost);
    text << DescribeGap(in) << "\nWith " << Count(o.pairs) << " vacancies (" << Count(2 * o.pairs)
         << " applications), the study has a " << Pct(power) << " chance of showing this gap at the "
         << Level(alpha) << " level, if the gap is real.\n"
         << RenderPairedTable(j["table"], lost);
    if (!o.common.plot.empty())
      if (Status s = PlotPaired(o.common.plot, in.alt, alpha, lost, 2 * o.pairs, std::nullopt, o.pairs,
                                "N = " + Count(o.pairs));
          !s.ok())
        return ReportError(s.error());
  } else {
    const double target = o.common.power;
    if (in.alt.p10 == in.alt.p01)
      return ReportError(BadInput(in.from_rates ? (o.ratio_opt->count() ? "--ratio" : "--difference") : "--p01",
                                  "the two arms are called back equally often, so no number of vacancies can show a "
                                  "gap",
                                  "give the smallest gap worth detecting"));
    const stats::PairedAlternative lost_alt = stats::WithLosses(in.alt, lost);
    auto size = stats::McNemarExactSampleSize(lost_alt, alpha, target);
    if (!size.found)
      return ReportError(BadInput("--power",
                                  "no study of up to 10,000,000 vacancies reaches " + Level(target) + " power",
                                  "look for a larger gap or accept lower power"));
    const double connor = stats::ConnorSampleSize(in.alt, alpha, target) / (1.0 - lost);
    const double miettinen = stats::MiettinenSampleSize(in.alt, alpha, target) / (1.0 - lost);
    j["target_power"] = target;
    j["n"] = size.n_stable;
    j["n_rule"] = "smallest N from which exact power stays at or above the target for every N up to the horizon";
    j["n_first"] = size.n_first;
    j["horizon"] = size.horizon;
    j["power_at_n"] = size.power_stable;
    j["applications"] = 2 * size.n_stable;
    j["completed_expected"] = static_cast<double>(size.n_stable) * (1.0 - lost);
    j["connor"] = {{"n", connor}, {"n_rounded", static_cast<int64_t>(std::ceil(connor))}};
    j["miettinen"] = {{"n", miettinen}, {"n_rounded", static_cast<int64_t>(std::ceil(miettinen))}};
    j["table"] = PairedTable(TableSizes(size.n_stable), in.alt, alpha, lost);
    text << DescribeGap(in) << "\nTo show this gap with " << Level(target) << " power at the " << Level(alpha)
         << " level, " << (lost > 0 ? "plan " : "test ") << Count(size.n_stable)
         << " vacancies with a pair of probes each (" << Count(2 * size.n_stable) << " applications)";
    if (lost > 0)
      text << "; about " << Count(std::llround(static_cast<double>(size.n_stable) * (1 - lost))) << " will be complete";
    text << ".\n";
    if (size.n_first == size.n_stable)
      text << "Exact power first reaches " << Level(target) << " at " << Count(size.n_first)
           << " vacancies and stays at or above it for every number up to " << Count(size.horizon) << ".\n";
    else
      text << "Exact power first reaches " << Level(target) << " at " << Count(size.n_first)
           << " vacancies but dips below it again before " << Count(size.n_stable) << " (the exact test moves in whole "
           << "counts); from " << Count(size.n_stable) << " it stays at or above the target up to "
           << Count(size.horizon) << ".\n";
    text << "Large-sample formulas: Connor (1987) " << Count(static_cast<int64_t>(std::ceil(connor))) << " ("
         << Fmt("%.1f", connor) << "), Miettinen (1968) " << Count(static_cast<int64_t>(std::ceil(miettinen))) << " ("
         << Fmt("%.1f", miettinen) << ").\n"
         << RenderPairedTable(j["table"], lost);
    if (!o.common.plot.empty())
      if (Status s = PlotPaired(o.common.plot, in.alt, alpha, lost, 2 * size.n_stable, target, size.n_stable,
                                "N = " + Count(size.n_stable));
          !s.ok())
        return ReportError(s.error());
  }
  std::cout << (ctx.json ? j.dump(2) + "\n" : text.str());
  return 0;
}

// -------------------------------------------------------------- unpaired --

struct UnpairedOptions {
  Common common;
  double p1 = 0, p2 = 0;
  int64_t n = 0;
  bool exact = false;
  // The plan's shape: other arm's vacancies over the reference arm's, the
  // sidedness of the test and whether both tails count (R's strict = TRUE).
  double ratio = 1;
  std::string alternative = "two-sided";
  bool strict = false;
  CLI::Option *p1_opt, *p2_opt, *n_opt;
  int sides() const { return alternative == "one-sided" ? 1 : 2; }
};

// The normal-approximation power of the plan's test for n reference-arm
// vacancies.
double UnpairedNormal(const UnpairedOptions& o, double n, double p2, double alpha) {
  return stats::NormalTwoProportionPower(n, o.p1, p2, alpha, o.sides(), o.strict, o.ratio);
}

// The other arm's vacancies for n in the reference arm (rounded up).
int64_t OtherArm(const UnpairedOptions& o, double n) {
  return static_cast<int64_t>(std::ceil(o.ratio * n - 1e-9));
}

json UnpairedTable(const std::vector<int64_t>& sizes, const UnpairedOptions& o, double alpha) {
  json rows = json::array();
  for (int64_t n : sizes) {
    json row{{"n_per_arm", n}, {"normal", UnpairedNormal(o, static_cast<double>(n), o.p2, alpha)}};
    if (o.ratio != 1) row["n_other"] = OtherArm(o, static_cast<double>(n));
    row["power"] = o.exact ? stats::FisherExactPower(n, o.p1, o.p2, alpha) : row["normal"].get<double>();
    rows.push_back(row);
  }
  return rows;
}

std::string RenderUnpairedTable(const json& rows, bool exact, bool unequal) {
  std::ostringstream o;
  o << "\n  " << (unequal ? "reference-arm vacancies" : "vacancies per arm") << "   "
    << (exact ? "Fisher exact   normal approx." : "power") << "\n";
  for (const auto& r : rows) {
    char line[96];
    if (exact)
      std::snprintf(line, sizeof line, "  %17s   %12.3f   %13.3f\n", Count(r["n_per_arm"].get<int64_t>()).c_str(),
                    r["power"].get<double>(), r["normal"].get<double>());
    else
      std::snprintf(line, sizeof line, unequal ? "  %23s   %5.3f\n" : "  %17s   %5.3f\n",
                    Count(r["n_per_arm"].get<int64_t>()).c_str(), r["power"].get<double>());
    o << line;
  }
  if (exact) o << "Fisher exact: the power of the two-sided Fisher test the analysis runs, by enumeration.\n";
  o << "Normal approximation without continuity correction, as R's power.prop.test.\n";
  return o.str();
}

Status PlotUnpaired(const std::string& path, const UnpairedOptions& o, double alpha, int64_t x_max,
                    std::optional<double> target, int64_t marker) {
  const double p1 = o.p1, p2 = o.p2;
  const bool exact = o.exact;
  PowerCurveChart chart;
  chart.title = "Power for callback rates " + Pct(p1) + " vs " + Pct(p2) + " (alpha " + Short(alpha) + ")";
  chart.x_label = o.ratio != 1 ? "Reference-arm vacancies (one probe each)" : "Vacancies per arm (one probe each)";
  PowerCurveSeries normal{"normal approx.", {}, exact}, fisher{"Fisher exact", {}, false};
  for (int64_t n : CurveSizes(x_max))
    normal.xy.emplace_back(static_cast<double>(n), UnpairedNormal(o, static_cast<double>(n), p2, alpha));
  if (exact) {
    // Each exact point enumerates the outcomes: 60 points are enough for a curve.
    const int64_t step = std::max<int64_t>(1, x_max / 60);
    for (int64_t n = 1; n <= x_max; n += step)
      fisher.xy.emplace_back(static_cast<double>(n), stats::FisherExactPower(n, p1, p2, alpha));
    chart.series = {fisher, normal};
  } else {
    chart.series = {normal};
  }
  chart.target_power = target;
  chart.marker_x = static_cast<double>(marker);
  chart.marker_label = "n = " + Count(marker);
  return WriteSvg(path, chart);
}

int RunUnpaired(Context& ctx, const UnpairedOptions& o) {
  if (Status s = CheckCommon(o.common); !s.ok()) return ReportError(s.error());
  if (!o.p1_opt->count()) return ReportError(Usage("--p1 is required", "give the reference arm's callback rate"));
  if (Status s = CheckOpenUnit("--p1", o.p1, "a callback rate", "0.10"); !s.ok()) return ReportError(s.error());
  if (o.p2_opt->count())
    if (Status s = CheckOpenUnit("--p2", o.p2, "a callback rate", "0.07"); !s.ok()) return ReportError(s.error());
  if (o.n_opt->count() && o.n < 2)
    return ReportError(BadInput("--n", "the number of vacancies per arm must be at least 2, got " + std::to_string(o.n),
                                "give the vacancies per arm the budget allows"));
  if (o.alternative != "one-sided" && o.alternative != "two-sided")
    return ReportError(Usage("--alternative must be one-sided or two-sided, got '" + o.alternative + "'",
                             "use --alternative one-sided for a plan that tests one direction only"));
  if (o.strict && o.sides() == 1)
    return ReportError(Usage("--strict counts the far tail of a two-sided test, and a one-sided test has none",
                             "leave out --strict, or use --alternative two-sided"));
  if (!(o.ratio > 0.0 && std::isfinite(o.ratio)))
    return ReportError(BadInput("--ratio",
                                "the ratio of the other arm's vacancies to the reference arm's must be positive, got " +
                                    Short(o.ratio),
                                "e.g. --ratio 2 when the other arm gets twice as many vacancies"));
  if (o.exact && (o.ratio != 1 || o.sides() == 1 || o.strict))
    return ReportError(Usage("--exact covers equal arms and the two-sided Fisher test only",
                             "leave out --exact (normal approximation), or --ratio, --alternative and --strict"));
  const bool has_n = o.n_opt->count() > 0, has_power = o.common.power_opt->count() > 0;
  const double alpha = o.common.alpha_each();
  const bool unequal = o.ratio != 1;
  const std::string sided = o.sides() == 1 ? "one-sided" : o.strict ? "two-sided, both tails counted" : "two-sided";
  json j{{"design", "unpaired"},
         {"test", o.exact ? "Fisher's exact test, two-sided (exact power by enumeration)"
                          : "two proportions, normal approximation (as R's power.prop.test), " + sided},
         {"alpha", o.common.alpha},
         {"comparisons", o.common.comparisons},
         {"alpha_per_comparison", alpha},
         {"alternative", o.alternative},
         {"strict", o.strict},
         {"ratio", o.ratio},
         {"p1", o.p1}};
  std::ostringstream text;
  text << "Unpaired design: one probe per vacancy, two independent arms; "
       << (o.exact ? "Fisher's exact test" : "normal approximation") << ", " << (o.sides() == 1 ? "one" : "two")
       << "-sided alpha " << Short(alpha) << ".\n";
  if (o.strict)
    text << "Both tails count as finding the gap (R's strict = TRUE): a result in the wrong direction counts too.\n";
  if (unequal)
    text << "The other arm gets " << Short(o.ratio) << " times the reference arm's vacancies (--ratio " << Short(o.ratio)
         << ").\n";
  text << CorrectionSentence(o.common);
  if (!o.p2_opt->count()) {
    if (!(has_n && has_power))
      return ReportError(Usage("--p2 missing", "give --p2, or give --n and --power for the smallest detectable p2"));
    if (o.exact)
      return ReportError(Usage("--exact is not available for the smallest detectable p2",
                               "leave out --exact (normal approximation), or try candidate values with --p2 and --n"));
    const double n = static_cast<double>(o.n);
    auto below = stats::NormalTwoProportionDetectable(n, o.p1, alpha, o.common.power, false, o.sides(), o.strict, o.ratio);
    auto above = stats::NormalTwoProportionDetectable(n, o.p1, alpha, o.common.power, true, o.sides(), o.strict, o.ratio);
    j["n_per_arm"] = o.n;
    j["target_power"] = o.common.power;
    j["detectable_p2_below"] = below ? json(*below) : json(nullptr);
    j["detectable_p2_above"] = above ? json(*above) : json(nullptr);
    text << "\nWith " << Count(o.n) << (unequal ? " reference-arm vacancies (" + Count(OtherArm(o, n)) + " in the other)"
                                                 : std::string(" vacancies per arm"))
         << " and " << Level(o.common.power) << " power, the other arm's callback rate must be ";
    if (below) text << "at most " << Pct(*below);
    if (below && above) text << " or ";
    if (above) text << "at least " << Pct(*above);
    if (!below && !above) text << "impossible to separate from " << Pct(o.p1);
    text << " for the gap to be found (reference arm " << Pct(o.p1) << ").\n";
  } else {
    if (o.p1 == o.p2 && !has_n)
      return ReportError(BadInput("--p2", "p1 and p2 are equal, so no number of vacancies can show a gap",
                                  "give the smallest gap worth detecting"));
    j["p2"] = o.p2;
    if (has_n == has_power)
      return ReportError(Usage(has_n ? "--n and --power together ask for a detectable p2, but --p2 is given"
                                     : "nothing to solve for",
                               "give --n N to get the power, or --power P to get the vacancies per arm"));
    text << "Callback rates " << Pct(o.p1) << " (reference arm) and " << Pct(o.p2) << " (other arm).\n";
    int64_t base = o.n;
    if (has_n) {
      const double normal = UnpairedNormal(o, static_cast<double>(o.n), o.p2, alpha);
      const double power = o.exact ? stats::FisherExactPower(o.n, o.p1, o.p2, alpha) : normal;
      const int64_t other = OtherArm(o, static_cast<double>(o.n));
      j["n_per_arm"] = o.n;
      if (unequal) j["n_other"] = other, j["applications"] = o.n + other;
      j["power"] = power;
      j["normal"] = {{"power", normal}};
      if (unequal)
        text << "\nWith " << Count(o.n) << " vacancies for the reference arm and " << Count(other) << " for the other ("
             << Count(o.n + other) << " applications), the study has a " << Pct(power)
             << " chance of showing this gap at the " << Level(alpha) << " level, if it is real";
      else
        text << "\nWith " << Count(o.n) << " vacancies per arm (" << Count(2 * o.n)
             << " applications), the study has a " << Pct(power) << " chance of showing this gap at the "
             << Level(alpha) << " level, if it is real";
      if (o.exact) text << " (normal approximation: " << Pct(normal) << ")";
      text << ".\n";
    } else {
      const double n_normal =
          stats::NormalTwoProportionSampleSize(o.p1, o.p2, alpha, o.common.power, o.sides(), o.strict, o.ratio);
      j["target_power"] = o.common.power;
      j["normal"] = {{"n", static_cast<int64_t>(std::ceil(n_normal))}, {"n_unrounded", n_normal}};
      if (o.exact) {
        auto size = stats::FisherExactSampleSize(o.p1, o.p2, alpha, o.common.power);
        if (!size.found)
          return ReportError(BadInput("--power", "no study of up to 1,000,000 vacancies per arm reaches " +
                                                     Level(o.common.power) + " power with Fisher's test",
                                      "look for a larger gap or accept lower power"));
        base = size.n;
        j["n"] = size.n;
        j["n_first"] = size.n_first;
        j["n_rule"] = "bisection on the exact power, then every n within 1% (at least 5) either side checked";
        j["checked_from"] = size.checked_from;
        j["checked_to"] = size.checked_to;
        j["dips_above"] = size.dips_above;
        j["power_at_n"] = size.power_at_n;
        j["applications"] = 2 * size.n;
        text << "\nTo show this gap with " << Level(o.common.power) << " power at the " << Level(alpha)
             << " level with Fisher's exact test, test " << Count(size.n) << " vacancies per arm ("
             << Count(2 * size.n) << " applications in all; the normal approximation says "
             << Count(static_cast<int64_t>(std::ceil(n_normal))) << ").\n"
             << "Found by bisection on the exact power; every n from " << Count(size.checked_from) << " to "
             << Count(size.checked_to) << " was checked one by one";
        if (size.n_first < size.n) text << ": power already reaches the target at " << Count(size.n_first);
        if (size.dips_above) text << "; power dips below the target again above " << Count(size.n);
        text << ".\n";
      } else {
        base = static_cast<int64_t>(std::ceil(n_normal));
        j["n"] = base;
        j["n_unrounded"] = n_normal;
        if (unequal) {
          const int64_t other = OtherArm(o, n_normal);
          j["n_other"] = other;
          j["n_other_unrounded"] = o.ratio * n_normal;
          j["applications"] = base + other;
          text << "\nTo show this gap with " << Level(o.common.power) << " power at the " << Level(alpha)
               << " level, test " << Count(base) << " vacancies for the reference arm and " << Count(other)
               << " for the other (" << Count(base + other) << " applications in all; unrounded "
               << Fmt("%.2f", n_normal) << " and " << Fmt("%.2f", o.ratio * n_normal) << ").\n";
        } else {
          j["applications"] = 2 * base;
          text << "\nTo show this gap with " << Level(o.common.power) << " power at the " << Level(alpha)
               << " level, test " << Count(base) << " vacancies per arm (" << Count(2 * base)
               << " applications in all; unrounded " << Fmt("%.2f", n_normal) << ").\n";
        }
      }
    }
    j["table"] = UnpairedTable(TableSizes(base), o, alpha);
    text << RenderUnpairedTable(j["table"], o.exact, unequal);
    if (!o.common.plot.empty())
      if (Status s = PlotUnpaired(o.common.plot, o, alpha, 2 * base,
                                  has_power ? std::optional<double>(o.common.power) : std::nullopt, base);
          !s.ok())
        return ReportError(s.error());
  }
  std::cout << (ctx.json ? j.dump(2) + "\n" : text.str());
  return 0;
}

// ------------------------------------------------------------------ sets --

struct SetsOptions {
  std::vector<double> rates;
  int64_t vacancies = 0;
  double power = 0.8, alpha = 0.05;
  uint64_t seed = 1;
  int replicates = 10000;
  CLI::Option *rates_opt, *vacancies_opt, *power_opt;
};

// At most this many arms: 2^k outcome patterns per vacancy are simulated.
constexpr int kMaxSetsArms = 8;

std::string ArmName(size_t i, double rate) { return "arm " + std::to_string(i + 1) + " (" + Pct(rate) + ")"; }

Status CheckSets(const SetsOptions& o) {
  if (!o.rates_opt->count())
    return Usage("--rates is required", "give each arm's expected callback rate, e.g. --rates 0.12,0.09,0.07");
  if (o.rates.size() < 2 || o.rates.size() > static_cast<size_t>(kMaxSetsArms))
    return BadInput("--rates",
                    "a sets design needs 2 to " + std::to_string(kMaxSetsArms) + " arms, got " +
                        std::to_string(o.rates.size()),
                    "give one callback rate per arm, separated by commas, e.g. --rates 0.12,0.09,0.07");
  for (size_t i = 0; i < o.rates.size(); ++i)
    if (!(o.rates[i] > 0.0 && o.rates[i] < 1.0))
      return BadInput("--rates",
                      "rate " + std::to_string(i + 1) + " must be between 0 and 1 (exclusive), got " + Short(o.rates[i]),
                      "give callback rates as shares, e.g. 0.12 for 12%");
  if (std::all_of(o.rates.begin(), o.rates.end(), [&](double r) { return r == o.rates[0]; }))
    return BadInput("--rates", "every arm has the same callback rate, so no number of vacancies can show a difference",
                    "give the smallest differences worth detecting");
  if (Status s = CheckOpenUnit("--alpha", o.alpha, "alpha", "0.05"); !s.ok()) return s;
  if (o.power_opt->count())
    if (Status s = CheckOpenUnit("--power", o.power, "the target power", "0.8"); !s.ok()) return s;
  if (o.vacancies_opt->count() == o.power_opt->count())
    return Usage(o.vacancies_opt->count() ? "give --vacancies or --power, not both" : "nothing to solve for",
                 "give --vacancies N to get the power, or --power P to get the number of vacancies");
  if (o.vacancies_opt->count() && (o.vacancies < 1 || o.vacancies > 1'000'000))
    return BadInput("--vacancies", "the number of vacancies must be between 1 and 1,000,000, got " +
                                       std::to_string(o.vacancies),
                    "give the number of vacancies (sets of one probe per arm) the budget allows");
  if (o.replicates < 100 || o.replicates > 1'000'000)
    return BadInput("--replicates", "simulated studies must be between 100 and 1,000,000, got " +
                                        std::to_string(o.replicates),
                    "the default, 10000, gives a Monte Carlo standard error below half a point");
  return {};
}

int RunSets(Context& ctx, const SetsOptions& o) {
  if (Status s = CheckSets(o); !s.ok()) return ReportError(s.error());
  const int64_t k = static_cast<int64_t>(o.rates.size());
  const int64_t pairs = k * (k - 1) / 2;
  const stats::SmallestGap gap = stats::SmallestPairwiseGap(o.rates);
  const double alpha_pair = o.alpha / static_cast<double>(pairs);
  const auto first = static_cast<size_t>(gap.first), second = static_cast<size_t>(gap.second);
  json j{{"design", "sets"},
         {"arms", k},
         {"rates", o.rates},
         {"alpha", o.alpha},
         {"model", "outcomes independent within a vacancy"},
         {"overall", {{"test", "Cochran's Q, chi-square on " + std::to_string(k - 1) + " df"}}},
         {"pairwise",
          {{"test", "exact McNemar, two-sided"},
           {"arms", {gap.first + 1, gap.second + 1}},
           {"alpha", alpha_pair},
           {"correction", "Bonferroni over " + std::to_string(pairs) + " pairs (the first step of Holm)"}}}};
  std::ostringstream text;
  text << "Sets design: each vacancy receives one probe of each of " << k << " arms, callback rates ";
  for (size_t i = 0; i < o.rates.size(); ++i) text << (i ? ", " : "") << Pct(o.rates[i]);
  text << ", outcomes independent within a vacancy.\n"
       << "Overall test: Cochran's Q, chi-square on " << k - 1 << " df, alpha " << Short(o.alpha) << ".\n"
       << "Smallest pairwise gap: " << ArmName(first, o.rates[first]) << " against " << ArmName(second, o.rates[second])
       << ", exact McNemar at alpha " << Fmt("%.4g", alpha_pair) << " (" << Short(o.alpha) << " / " << pairs
       << " pairs: Bonferroni, the first step of Holm).\n";
  if (o.vacancies_opt->count()) {
    const stats::SetsPower p = stats::PowerForSets(o.vacancies, o.rates, o.alpha, o.seed, o.replicates);
    j["vacancies"] = o.vacancies;
    j["applications"] = o.vacancies * k;
    j["overall"]["power"] = p.overall;
    j["overall"]["method"] = p.overall_exact ? "exact" : "simulation";
    if (!p.overall_exact) {
      j["overall"]["replicates"] = p.replicates;
      j["overall"]["standard_error"] = p.overall_se;
      j["overall"]["seed"] = o.seed;
    }
    j["pairwise"]["power"] = p.pairwise;
    // As the analysis adjusts: Holm over every pair (the Bonferroni power
    // above is its lower bound).
    j["pairwise"]["holm"] = {{"power", p.pairwise_holm}, {"method", p.overall_exact ? "exact" : "simulation"}};
    if (!p.overall_exact) j["pairwise"]["holm"]["standard_error"] = p.pairwise_holm_se;
    text << "\nWith " << Count(o.vacancies) << " vacancies (" << Count(o.vacancies * k) << " applications):\n"
         << "  overall test: " << Pct(p.overall) << " power";
    if (p.overall_exact)
      text << " (exact, summed over every outcome)\n";
    else
      text << " (simulated: " << Count(p.replicates) << " studies, seed " << o.seed << ", Monte Carlo standard error "
           << Fmt("%.2f", 100 * p.overall_se) << " points)\n";
    text << "  smallest pairwise gap: " << Pct(p.pairwise) << " power (exact)\n"
         << "  smallest pairwise gap after Holm over the " << pairs << " pairs, as analyze adjusts: " << Pct(p.pairwise_holm)
         << " power";
    if (p.overall_exact)
      text << " (exact)\n";
    else
      text << " (the same simulated studies, Monte Carlo standard error " << Fmt("%.2f", 100 * p.pairwise_holm_se)
           << " points)\n";
  } else {
    const int search_replicates = std::min(o.replicates, 4000);
    const stats::SetsSampleSize size =
        stats::SampleSizeForSets(o.rates, o.alpha, o.power, o.seed, search_replicates);
    j["target_power"] = o.power;
    text << "\nTo reach " << Level(o.power) << " power:\n";
    if (size.overall_found) {
      const stats::SetsPower at = stats::PowerForSets(size.overall, o.rates, o.alpha, o.seed, o.replicates, false);
      j["overall"]["vacancies"] = size.overall;
      j["overall"]["applications"] = size.overall * k;
      j["overall"]["method"] = "simulation";
      j["overall"]["search_replicates"] = search_replicates;
      j["overall"]["power_at_vacancies"] = at.overall;
      j["overall"]["standard_error"] = at.overall_se;
      j["overall"]["replicates"] = at.replicates;
      j["overall"]["seed"] = o.seed;
      text << "  overall test: " << Count(size.overall) << " vacancies (" << Count(size.overall * k)
           << " applications), found by bisection on simulated power (" << Count(search_replicates)
           << " studies per step, seed " << o.seed << "); there " << Pct(at.overall) << " power ("
           << Count(at.replicates) << " studies, Monte Carlo standard error " << Fmt("%.2f", 100 * at.overall_se)
           << " points)\n";
    } else {
      j["overall"]["vacancies"] = nullptr;
      text << "  overall test: not reached with up to 200,000 vacancies\n";
    }
    if (size.pairwise_found) {
      j["pairwise"]["vacancies"] = size.pairwise;
      j["pairwise"]["applications"] = size.pairwise * k;
      text << "  smallest pairwise gap: " << Count(size.pairwise) << " vacancies (" << Count(size.pairwise * k)
           << " applications), exact\n";
    } else {
      j["pairwise"]["vacancies"] = nullptr;
      text << "  smallest pairwise gap: not reached with up to 200,000 vacancies\n";
    }
    if (size.overall_found && size.pairwise_found) {
      const int64_t both = std::max(size.overall, size.pairwise);
      j["vacancies"] = both;
      j["applications"] = both * k;
      text << "A plan for both needs " << Count(both) << " vacancies (" << Count(both * k) << " applications).\n";
    }
  }
  text << "Vacancies that call everyone back more readily make a set's outcomes alike; with the same rates that raises "
          "the power of these within-set tests, so the numbers above are conservative.\n";
  std::cout << (ctx.json ? j.dump(2) + "\n" : text.str());
  return 0;
}

void RegisterPowerSets(CLI::App* power, Context& ctx) {
  auto so = std::make_shared<SetsOptions>();
  auto* sets = power->add_subcommand(
      "sets", "Sets design (one probe of each of k arms per vacancy): Cochran's Q and the smallest pairwise gap");
  so->rates_opt = sets->add_option("--rates", so->rates, "Each arm's expected callback rate, e.g. 0.12,0.09,0.07")
                      ->delimiter(',');
  so->vacancies_opt = sets->add_option("--vacancies", so->vacancies, "Number of vacancies: solve for power");
  so->power_opt = sets->add_option("--power", so->power, "Target power: solve for the number of vacancies");
  sets->add_option("--alpha", so->alpha, "Two-sided significance level (default 0.05)");
  sets->add_option("--seed", so->seed, "Seed of the simulation (default 1)");
  sets->add_option("--replicates", so->replicates, "Simulated studies when the power is not summed exactly (default 10000)");
  sets->callback([&ctx, so] { ctx.exit_code = RunSets(ctx, *so); });
}

void AddUnpairedPlanOptions(CLI::App* unpaired, UnpairedOptions& o) {
  unpaired->add_option("--ratio", o.ratio,
                       "Other arm's vacancies over the reference arm's, N2/N1 (default 1; --n and the answer count "
                       "the reference arm)");
  unpaired->add_option("--alternative", o.alternative, "one-sided or two-sided (default two-sided)");
  unpaired->add_flag("--strict", o.strict,
                     "Count both tails of the two-sided test as power (R's power.prop.test strict = TRUE)");
}

}  // namespace

void RegisterPower(CLI::App& app, Context& ctx) {
  auto* power = app.add_subcommand("power", "Power, sample size and smallest detectable gap before fieldwork");
  power->require_subcommand(1);

  auto po = std::make_shared<PairedOptions>();
  auto* paired = power->add_subcommand(
      "paired", "Paired design (a set of two probes per vacancy), exact McNemar test; Connor and Miettinen beside it");
  po->p10_opt = paired->add_option("--p10", po->p10, "Share of vacancies calling back only the reference arm's probe");
  po->p01_opt = paired->add_option("--p01", po->p01, "Share of vacancies calling back only the other arm's probe");
  po->rate_opt = paired->add_option("--rate", po->rate, "Reference arm's expected callback rate (e.g. 0.10)");
  po->ratio_opt = paired->add_option("--ratio", po->ratio,
                                     "Gap worth detecting: reference rate / other arm's rate (e.g. 1.43)");
  po->difference_opt = paired->add_option("--difference", po->difference,
                                          "Gap worth detecting: reference rate - other arm's rate (e.g. 0.03)");
  po->both_opt = paired->add_option("--both", po->both, "Share of vacancies expected to call back both probes");
  po->discordant_opt =
      paired->add_option("--discordant", po->discordant,
                         "Share of discordant vacancies (p10 + p01), for the smallest detectable difference");
  po->pairs_opt = paired->add_option("--pairs", po->pairs, "Number of vacancies (sets of two probes): solve for power");
  paired->add_option("--lost", po->lost, "Expected share of vacancies lost before both probes are sent (default 0)");
  AddCommonOptions(paired, po->common);
  paired->callback([&ctx, po] { ctx.exit_code = RunPaired(ctx, *po); });

  auto uo = std::make_shared<UnpairedOptions>();
  auto* unpaired =
      power->add_subcommand("unpaired", "Unpaired design (one probe per vacancy, two arms): normal approximation, or "
                                        "Fisher's exact test with --exact");
  uo->p1_opt = unpaired->add_option("--p1", uo->p1, "Reference arm's expected callback rate");
  uo->p2_opt = unpaired->add_option("--p2", uo->p2, "Other arm's callback rate worth detecting");
  uo->n_opt = unpaired->add_option("--n", uo->n, "Vacancies per arm: solve for power");
  unpaired->add_flag("--exact", uo->exact,
                     "Exact power of Fisher's test (by enumeration) beside the normal approximation");
  AddUnpairedPlanOptions(unpaired, *uo);
  AddCommonOptions(unpaired, uo->common);
  unpaired->callback([&ctx, uo] { ctx.exit_code = RunUnpaired(ctx, *uo); });
  RegisterPowerSets(power, ctx);
}

}  // namespace twinprobe
