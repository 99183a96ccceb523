// `twinprobe power paired|unpaired`: power, sample size and minimum
// detectable effect before fieldwork. Pure calculation: reads no study and
// writes nothing except the optional --plot SVG. The numbers come from
// stats/power_paired.h, stats/power_unpaired.h and stats/power_fisher.h; this file only checks the
// inputs, picks what to solve for and words the answer.
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
  CLI::Option *p1_opt, *p2_opt, *n_opt;
};

json UnpairedTable(const std::vector<int64_t>& sizes, double p1, double p2, double alpha, bool exact) {
  json rows = json::array();
  for (int64_t n : sizes) {
    json row{{"n_per_arm", n}, {"normal", stats::NormalTwoProportionPower(static_cast<double>(n), p1, p2, alpha)}};
    row["power"] = exact ? stats::FisherExactPower(n, p1, p2, alpha) : row["normal"].get<double>();
    rows.push_back(row);
  }
  return rows;
}

std::string RenderUnpairedTable(const json& rows, bool exact) {
  std::ostringstream o;
  o << "\n  vacancies per arm   " << (exact ? "Fisher exact   normal approx." : "power") << "\n";
  for (const auto& r : rows) {
    char line[96];
    if (exact)
      std::snprintf(line, sizeof line, "  %17s   %12.3f   %13.3f\n", Count(r["n_per_arm"].get<int64_t>()).c_str(),
                    r["power"].get<double>(), r["normal"].get<double>());
    else
      std::snprintf(line, sizeof line, "  %17s   %5.3f\n", Count(r["n_per_arm"].get<int64_t>()).c_str(),
                    r["power"].get<double>());
    o << line;
  }
  if (exact) o << "Fisher exact: the power of the two-sided Fisher test the analysis runs, by enumeration.\n";
  o << "Normal approximation without continuity correction, as R's power.prop.test.\n";
  return o.str();
}

Status PlotUnpaired(const std::string& path, double p1, double p2, double alpha, int64_t x_max,
                    std::optional<double> target, int64_t marker, bool exact) {
  PowerCurveChart chart;
  chart.title = "Power for callback rates " + Pct(p1) + " vs " + Pct(p2) + " (alpha " + Short(alpha) + ")";
  chart.x_label = "Vacancies per arm (one probe each)";
  PowerCurveSeries normal{"normal approx.", {}, exact}, fisher{"Fisher exact", {}, false};
  for (int64_t n : CurveSizes(x_max))
    normal.xy.emplace_back(static_cast<double>(n),
                           stats::NormalTwoProportionPower(static_cast<double>(n), p1, p2, alpha));
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
  const bool has_n = o.n_opt->count() > 0, has_power = o.common.power_opt->count() > 0;
  const double alpha = o.common.alpha_each();
  json j{{"design", "unpaired"},
         {"test", o.exact ? "Fisher's exact test, two-sided (exact power by enumeration)"
                          : "two proportions, normal approximation (as R's power.prop.test), two-sided"},
         {"alpha", o.common.alpha},
         {"comparisons", o.common.comparisons},
         {"alpha_per_comparison", alpha},
         {"p1", o.p1}};
  std::ostringstream text;
  text << "Unpaired design: one probe per vacancy, two independent arms; "
       << (o.exact ? "Fisher's exact test" : "normal approximation") << ", two-sided alpha " << Short(alpha) << ".\n"
       << CorrectionSentence(o.common);
  if (!o.p2_opt->count()) {
    if (!(has_n && has_power))
      return ReportError(Usage("--p2 missing", "give --p2, or give --n and --power for the smallest detectable p2"));
    if (o.exact)
      return ReportError(Usage("--exact is not available for the smallest detectable p2",
                               "leave out --exact (normal approximation), or try candidate values with --p2 and --n"));
    const double n = static_cast<double>(o.n);
    auto below = stats::NormalTwoProportionDetectable(n, o.p1, alpha, o.common.power, false);
    auto above = stats::NormalTwoProportionDetectable(n, o.p1, alpha, o.common.power, true);
    j["n_per_arm"] = o.n;
    j["target_power"] = o.common.power;
    j["detectable_p2_below"] = below ? json(*below) : json(nullptr);
    j["detectable_p2_above"] = above ? json(*above) : json(nullptr);
    text << "\nWith " << Count(o.n) << " vacancies per arm and " << Level(o.common.power)
         << " power, the other arm's callback rate must be ";
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
      const double normal = stats::NormalTwoProportionPower(static_cast<double>(o.n), o.p1, o.p2, alpha);
      const double power = o.exact ? stats::FisherExactPower(o.n, o.p1, o.p2, alpha) : normal;
      j["n_per_arm"] = o.n;
      j["power"] = power;
      j["normal"] = {{"power", normal}};
      text << "\nWith " << Count(o.n) << " vacancies per arm (" << Count(2 * o.n) << " applications), the study has a "
           << Pct(power) << " chance of showing this gap at the " << Level(alpha) << " level, if it is real";
      if (o.exact) text << " (normal approximation: " << Pct(normal) << ")";
      text << ".\n";
    } else {
      const double n_normal = stats::NormalTwoProportionSampleSize(o.p1, o.p2, alpha, o.common.power);
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
        j["applications"] = 2 * base;
        text << "\nTo show this gap with " << Level(o.common.power) << " power at the " << Level(alpha)
             << " level, test " << Count(base) << " vacancies per arm (" << Count(2 * base)
             << " applications in all; unrounded " << Fmt("%.2f", n_normal) << ").\n";
      }
    }
    j["table"] = UnpairedTable(TableSizes(base), o.p1, o.p2, alpha, o.exact);
    text << RenderUnpairedTable(j["table"], o.exact);
    if (!o.common.plot.empty())
      if (Status s = PlotUnpaired(o.common.plot, o.p1, o.p2, alpha, 2 * base,
                                  has_power ? std::optional<double>(o.common.power) : std::nullopt, base, o.exact);
          !s.ok())
        return ReportError(s.error());
  }
  std::cout << (ctx.json ? j.dump(2) + "\n" : text.str());
  return 0;
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
  AddCommonOptions(unpaired, uo->common);
  unpaired->callback([&ctx, uo] { ctx.exit_code = RunUnpaired(ctx, *uo); });
}

}  // namespace twinprobe
