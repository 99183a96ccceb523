// Not a test by itself: the checker shared by reference_test.cpp and
// r_live_test.cpp (named *_test.cpp so the test binary's glob picks it up).
#include "stats/reference_check.h"

#include <cmath>
#include <cstdlib>
#include <map>
#include <sstream>

#include "stats/adjust.h"
#include "stats/binomial.h"
#include "stats/conditional_or.h"
#include "stats/exact_stratified.h"
#include "stats/fisher.h"
#include "stats/mcnemar.h"
#include "stats/paired.h"
#include "stats/stratified.h"

namespace twinprobe::testing {
namespace {

using namespace twinprobe::stats;

std::vector<std::string> Split(const std::string& s, char sep) {
  std::vector<std::string> out;
  std::string cur;
  std::istringstream in(s);
  while (std::getline(in, cur, sep)) out.push_back(cur);
  if (!s.empty() && s.back() == sep) out.push_back("");
  return out;
}

double Parse(const std::string& s) {
  if (s == "NaN") return std::nan("");
  if (s == "Inf") return INFINITY;
  if (s == "-Inf") return -INFINITY;
  return std::strtod(s.c_str(), nullptr);
}

std::vector<double> Numbers(const std::string& s) {
  std::vector<double> v;
  for (const auto& f : Split(s, ',')) v.push_back(Parse(f));
  return v;
}

int64_t I(double v) { return static_cast<int64_t>(std::llround(v)); }

Alternative Alt(double code) {
  return code == 1 ? Alternative::kLess : code == 2 ? Alternative::kGreater : Alternative::kTwoSided;
}

std::vector<Table2x2> Strata(const std::string& s) {
  std::vector<Table2x2> out;
  for (const auto& t : Split(s, ';')) {
    auto v = Numbers(t);
    out.push_back({I(v[0]), I(v[1]), I(v[2]), I(v[3])});
  }
  return out;
}

constexpr double kLn10 = 2.302585092994045684;

// Our values for one line, by key.
std::map<std::string, std::vector<double>> Compute(const std::string& kind, const std::string& args) {
  std::map<std::string, std::vector<double>> v;
  if (kind == "binom") {
    auto a = Numbers(args);
    auto r = BinomTest(I(a[0]), I(a[1]), a[2], Alt(a[3]), a[4]);
    v["p"] = {r.p.p};
    v["ci"] = {r.ci.low, r.ci.high};
  } else if (kind == "binom_log10") {
    auto a = Numbers(args);
    v["less"] = {LogBinomTail(I(a[0]), I(a[1]), a[2], false) / kLn10};
    v["greater"] = {LogBinomTail(I(a[0]), I(a[1]), a[2], true) / kLn10};
  } else if (kind == "wilson") {
    auto a = Numbers(args);
    auto ci = Wilson(I(a[0]), I(a[1]), a[2]);
    v["ci"] = {ci.low, ci.high};
  } else if (kind == "mcnemar") {
    auto a = Numbers(args);
    PairedCounts t{I(a[0]), I(a[1]), I(a[2]), I(a[3])};
    auto r = McNemar(t);
    auto cor = ConditionalOddsRatio(t, a[4]);
    v["exact"] = {r.exact.p};
    v["mid"] = {r.mid_p.p};
    v["chi2"] = {r.chi2};
    v["chi2_p"] = {r.chi2_p.p};
    v["chi2_cc"] = {r.chi2_corrected};
    v["chi2_cc_p"] = {r.chi2_corrected_p.p};
    v["or_ci"] = {cor.ci.low, cor.ci.high};
    v["log10_exact"] = {r.exact.log10_p};
  } else if (kind == "newcombe") {
    auto a = Numbers(args);
    auto e = NewcombePairedDifference({I(a[0]), I(a[1]), I(a[2]), I(a[3])}, a[4]);
    v["d"] = {e.estimate};
    v["ci"] = {e.ci.low, e.ci.high};
  } else if (kind == "fisher" || kind == "fisher_scipy") {
    auto a = Numbers(args);
    auto r = FisherTest({I(a[0]), I(a[1]), I(a[2]), I(a[3])}, Alt(a[4]), a[5]);
    v["p"] = {r.p.p};
    v["estimate_r"] = v["estimate_tight"] = v["estimate"] = {r.estimate};
    v["ci_r"] = v["ci_tight"] = v["ci"] = {r.ci.low, r.ci.high};
  } else if (kind == "fisher_log10") {
    auto a = Numbers(args);
    Table2x2 t{I(a[0]), I(a[1]), I(a[2]), I(a[3])};
    v["less"] = {FisherTest(t, Alternative::kLess, 0.95).p.log10_p};
    v["greater"] = {FisherTest(t, Alternative::kGreater, 0.95).p.log10_p};
  } else if (kind == "mh") {
    auto parts = Split(args, '|');
    auto opts = Numbers(parts[1]);
    auto r = MantelHaenszel(Strata(parts[0]), opts[1]);
    v["estimate"] = {r.estimate};
    v["ci"] = {r.ci.low, r.ci.high};
    v["chi2"] = {r.chi2};
    v["p"] = {r.chi2_p.p};
    v["chi2_cc"] = {r.chi2_corrected};
    v["p_cc"] = {r.chi2_corrected_p.p};
  } else if (kind == "mh_exact") {
    auto parts = Split(args, '|');
    auto opts = Numbers(parts[1]);
    auto r = ExactCommonOddsRatio(Strata(parts[0]), Alt(opts[0]), opts[1]);
    if (r) {
      v["p"] = {r->p.p};
      v["estimate_r"] = v["estimate_tight"] = {r->estimate};
      v["ci_r"] = v["ci_tight"] = {r->ci.low, r->ci.high};
    }
  } else if (kind == "adjust") {
    auto parts = Split(args, '|');
    v["adjusted"] = AdjustP(Numbers(parts[1]), *ParseAdjustment(parts[0]));
  } else if (kind == "bd") {
    auto strata = Strata(args);
    auto bd = BreslowDay(strata);
    auto mh = MantelHaenszel(strata, 0.95);
    v["statistic"] = {bd.statistic};
    v["p"] = {bd.p.p};
    v["tarone"] = {bd.tarone};
    v["tarone_p"] = {bd.tarone_p.p};
    v["mh_estimate"] = {mh.estimate};
    v["mh_ci"] = {mh.ci.low, mh.ci.high};
  } else if (kind == "woolf") {
    auto a = Numbers(args);
    auto r = WoolfOddsRatio({I(a[0]), I(a[1]), I(a[2]), I(a[3])}, a[4]);
    v["estimate"] = {r.estimate};
    v["ci"] = {r.ci.low, r.ci.high};
  }
  return v;
}

bool IsLog10(const std::string& kind, const std::string& key) {
  return key == "log10_exact" || kind == "binom_log10" || kind == "fisher_log10";
}

bool IsStatistic(const std::string& key) {
  // Statistics that can be 0 by cancellation get an absolute floor of 1e-14;
  // p-values and intervals never do.
  return key == "d" || key == "chi2" || key == "chi2_cc" || key == "statistic" || key == "tarone";
}

// R solved on psi in (0, 1) or on 1/psi in (0, 1) with uniroot's default
// tolerance .Machine$double.eps^0.25 = 1.22e-4; allow five times that.
bool WithinUnirootTolerance(double ours, double r) {
  if (ours == r) return true;
  if (!std::isfinite(ours) || !std::isfinite(r)) return false;
  constexpr double kTol = 5 * 1.220703125e-4;
  if (ours <= 1 && r <= 1) return std::abs(ours - r) <= kTol;
  return std::abs(1 / ours - 1 / r) <= kTol;
}

}  // namespace

ReferenceSummary CheckReferenceText(const std::string& text) {
  ReferenceSummary s;
  std::istringstream in(text);
  std::string line;
  while (std::getline(in, line)) {
    if (line.empty() || line[0] == '#') continue;
    auto fields = Split(line, '\t');
    if (fields.size() < 3) {
      s.failures.push_back("malformed line: " + line);
      continue;
    }
    ++s.lines;
    const std::string& kind = fields[0];
    const std::string& args = fields[1];
    auto ours = Compute(kind, args);
    bool degenerate_support = false;
    if (kind == "fisher") {
      auto a = Numbers(args);
      HypergeometricFamily f(I(a[0] + a[2]), I(a[1] + a[3]), I(a[0] + a[1]));
      degenerate_support = f.lo() == f.hi();
    }
    for (size_t i = 2; i < fields.size(); ++i) {
      auto eq = fields[i].find('=');
      std::string key = fields[i].substr(0, eq);
      auto expected = Numbers(fields[i].substr(eq + 1));
      auto it = ours.find(key);
      if (it == ours.end() || it->second.size() != expected.size()) {
        s.failures.push_back(kind + " " + args + ": no value for " + key);
        continue;
      }
      const bool loose = key.size() > 2 && key.compare(key.size() - 2, 2, "_r") == 0;
      for (size_t j = 0; j < expected.size(); ++j) {
        const double e = expected[j], o = it->second[j];
        if (loose && degenerate_support && key == "estimate_r") continue;  // R's 0 vs our NaN: documented
        bool ok;
        double rel = 0;
        if (loose) {
          ++s.loose_checks;
          ok = WithinUnirootTolerance(o, e);
        } else {
          ++s.checks;
          if (std::isnan(e) || std::isnan(o)) ok = std::isnan(e) && std::isnan(o);
          else if (std::isinf(e) || std::isinf(o)) ok = e == o;
          else {
            const double diff = std::abs(o - e);
            double scale = std::max(std::abs(e), std::abs(o));
            // A log10 near 0 (a probability near 1) is compared on the scale 1.
            if (IsLog10(kind, key)) scale = std::max(scale, 1.0);
            // Below 1e-300 R's arithmetic runs into denormals (it reports e.g.
            // 2.96e-323 for a p whose log10 is -4260); there both sides must
            // simply be that small, and the log10 fixtures check the value.
            if (e >= 0 && o >= 0 && e < 1e-300 && o < 1e-300 && !IsLog10(kind, key)) {
              ++s.underflow_checks;
              continue;
            }
            rel = scale == 0 ? 0 : diff / scale;
            ok = rel <= 1e-9 || (IsStatistic(key) && diff <= 1e-14);
            if (!(IsStatistic(key) && diff <= 1e-14)) s.max_rel_error = std::max(s.max_rel_error, rel);
          }
        }
        if (!ok) {
          std::ostringstream msg;
          msg.precision(17);
          msg << kind << " " << args << ": " << key << "[" << j << "] expected " << e << " got " << o
              << (loose ? " (R tolerance)" : "") << " rel " << rel;
          s.failures.push_back(msg.str());
        }
      }
    }
  }
  return s;
}

}  // namespace twinprobe::testing
