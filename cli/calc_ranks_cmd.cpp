// Calculators for rank statistics on numbers typed at the command line:
//   twinprobe calc wilcoxon --x 1.5,2,... [--y 3,1,...] [--paired] [--exact|--normal]
//                           [--alternative two-sided|less|greater]
//   twinprobe calc emd --u 1,2,3 --v 2,3 [--u-weights ...] [--v-weights ...]
// The `calc` group is created by RegisterCalcCommands (cli/calc_cmd.cpp),
// which calls AddRankCalculators below.
#include <cmath>
#include <cstdlib>
#include <iostream>
#include <sstream>

#include <nlohmann/json.hpp>

#include "cli/command.h"
#include "report/json_number.h"
#include "report/text_report.h"
#include "stats/wasserstein.h"
#include "stats/wilcoxon.h"

namespace twinprobe {
namespace {

// "1.5,2,-3" -> numbers. `option` names the flag in the message.
Result<std::vector<double>> ParseNumbers(const std::string& text, const std::string& option) {
  std::vector<double> out;
  std::stringstream in(text);
  std::string part;
  while (std::getline(in, part, ',')) {
    char* end = nullptr;
    double v = std::strtod(part.c_str(), &end);
    if (part.empty() || *end != '\0' || !std::isfinite(v))
      return BadInput(option, "'" + part + "' is not a number",
                      "write numbers separated by commas, e.g. " + option + " 1.5,2,3");
  }
  in.clear();
  in.str(text);
  while (std::getline(in, part, ',')) out.push_back(std::strtod(part.c_str(), nullptr));
  if (out.empty() || text.back() == ',')
    return BadInput(option, "the list is empty or ends with a comma", "write numbers separated by commas, e.g. " + option + " 1.5,2,3");
  return out;
}

std::string Fmt(double v) {
  std::ostringstream o;
  o.precision(6);
  o << v;
  return o.str();
}

struct WilcoxonOptions {
  std::string x, y, alternative = "two-sided";
  bool paired = false, exact = false, normal = false;
};

int RunWilcoxon(Context& ctx, const WilcoxonOptions& o) {
  auto x = ParseNumbers(o.x, "--x");
  if (!x.ok()) return ReportError(x.error());
  std::vector<double> y;
  if (!o.y.empty()) {
    auto yy = ParseNumbers(o.y, "--y");
    if (!yy.ok()) return ReportError(yy.error());
    y = yy.value();
  }
  if (o.paired && y.empty())
    return ReportError(Error{ErrorKind::kUsage, "--paired", "needs --y", "give the second measurement of each pair with --y"});
  if (o.paired && y.size() != x.value().size())
    return ReportError(BadInput("--y", "--x has " + std::to_string(x.value().size()) + " values but --y has " +
                                           std::to_string(y.size()),
                                "paired data need one y for each x"));
  stats::Alternative alternative = stats::Alternative::kTwoSided;
  if (o.alternative == "less") alternative = stats::Alternative::kLess;
  else if (o.alternative == "greater") alternative = stats::Alternative::kGreater;
  else if (o.alternative != "two-sided")
    return ReportError(BadInput("--alternative", "unknown alternative '" + o.alternative + "'",
                                "use two-sided, less or greater"));
  stats::RankMethod method = o.exact ? stats::RankMethod::kExact : o.normal ? stats::RankMethod::kNormal : stats::RankMethod::kAuto;
  stats::RankTestResult r;
  std::string test;
  if (y.empty() || o.paired) {
    std::vector<double> d = x.value();
    for (size_t i = 0; i < y.size(); ++i) d[i] = x.value()[i] - y[i];
    r = stats::WilcoxonSignedRank(d, alternative, method);
    test = o.paired ? "Wilcoxon signed-rank test (paired)" : "Wilcoxon signed-rank test (one sample, location 0)";
  } else {
    r = stats::MannWhitney(x.value(), y, alternative, method);
    test = "Wilcoxon-Mann-Whitney rank-sum test";
  }
  if (r.exact_refused)
    Warn(std::string("an exact p-value needs ") + (r.ties ? "no ties" : r.zeros ? "no zero differences" : "smaller samples") +
         "; the normal approximation with continuity correction is used, as R's wilcox.test does");
  if (ctx.json) {
    nlohmann::json j{{"test", test},
                     {"statistic", r.statistic},
                     {"statistic_name", (y.empty() || o.paired) ? "V" : "W"},
                     {"alternative", o.alternative},
                     {"estimate_name", (y.empty() || o.paired) ? "Hodges-Lehmann (pseudo)median" : "Hodges-Lehmann location shift"},
                     {"p_value", JsonNumber(r.p_value)},
                     {"estimate", JsonNumber(r.estimate)},
                     {"exact", r.exact},
                     {"n", r.n},
                     {"zeros", r.zeros},
                     {"ties", r.ties}};
    std::cout << j.dump(2) << "\n";
  } else {
    std::cout << test << ", " << o.alternative << ", " << (r.exact ? "exact" : "normal approximation with continuity correction")
              << ":\n  " << ((y.empty() || o.paired) ? "V" : "W") << " = " << Fmt(r.statistic) << ", p = "
              << (std::isnan(r.p_value) ? std::string("not defined (every difference is zero)") : FormatP(r.p_value))
              << "\n  Hodges-Lehmann estimate of the " << ((y.empty() || o.paired) ? "(pseudo)median difference" : "location shift")
              << ": " << (std::isnan(r.estimate) ? std::string("not defined") : Fmt(r.estimate)) << "\n";
    if (r.zeros) std::cout << "  " << r.zeros << " zero differences were left out.\n";
  }
  return 0;
}

struct EmdOptions {
  std::string u, v, u_weights, v_weights;
};

int RunEmd(Context& ctx, const EmdOptions& o) {
  auto u = ParseNumbers(o.u, "--u");
  if (!u.ok()) return ReportError(u.error());
  auto v = ParseNumbers(o.v, "--v");
  if (!v.ok()) return ReportError(v.error());
  std::vector<double> uw, vw;
  if (!o.u_weights.empty()) {
    auto w = ParseNumbers(o.u_weights, "--u-weights");
    if (!w.ok()) return ReportError(w.error());
    uw = w.value();
  }
  if (!o.v_weights.empty()) {
    auto w = ParseNumbers(o.v_weights, "--v-weights");
    if (!w.ok()) return ReportError(w.error());
    vw = w.value();
  }
  std::string problem = stats::CheckWassersteinInput(u.value(), v.value(), uw, vw);
  if (!problem.empty())
    return ReportError(BadInput("", problem, "give as many non-negative weights as values, with a positive sum"));
  double d = stats::Wasserstein1(u.value(), v.value(), uw, vw);
  if (ctx.json) {
    std::cout << nlohmann::json{{"distance", d},
                                {"n_u", u.value().size()},
                                {"n_v", v.value().size()},
                                {"weighted", !uw.empty() || !vw.empty()}}
                     .dump(2)
              << "\n";
  } else {
    std::cout << "Earth mover's (1-Wasserstein) distance: " << Fmt(d) << "\n";
  }
  return 0;
}

}  // namespace

void AddRankCalculators(CLI::App& calc, Context& ctx) {
  auto wo = std::make_shared<WilcoxonOptions>();
  auto* w = calc.add_subcommand(
      "wilcoxon", "Wilcoxon signed-rank (one sample, or --paired) or rank-sum test, with R's exact/normal rules");
  w->add_option("--x", wo->x, "Values, comma-separated")->required();
  w->add_option("--y", wo->y, "Second sample (rank-sum) or second measurement of each pair (--paired)");
  w->add_flag("--paired", wo->paired, "Signed-rank test of the differences x - y");
  w->add_option("--alternative", wo->alternative, "two-sided (default), less or greater: x shifted below or above y");
  auto* exact = w->add_flag("--exact", wo->exact, "Exact null distribution; with ties or zeros (or samples too large) it warns and falls back to the normal approximation, as R");
  auto* normal = w->add_flag("--normal", wo->normal, "Normal approximation with continuity correction");
  exact->excludes(normal);
  w->callback([&ctx, wo] { ctx.exit_code = RunWilcoxon(ctx, *wo); });

  auto eo = std::make_shared<EmdOptions>();
  auto* e = calc.add_subcommand("emd", "Earth mover's (1-Wasserstein) distance between two samples, as scipy");
  e->add_option("--u", eo->u, "First sample, comma-separated")->required();
  e->add_option("--v", eo->v, "Second sample, comma-separated")->required();
  e->add_option("--u-weights", eo->u_weights, "Weights of the first sample");
  e->add_option("--v-weights", eo->v_weights, "Weights of the second sample");
  e->callback([&ctx, eo] { ctx.exit_code = RunEmd(ctx, *eo); });
}

}  // namespace twinprobe
