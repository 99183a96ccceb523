#include "stats/homogeneity.h"

#include <cmath>
#include <limits>

#include "stats/contingency.h"

namespace twinprobe::stats {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

double LogChoose(int64_t n, int64_t k) {
  return std::lgamma(static_cast<double>(n) + 1) - std::lgamma(static_cast<double>(k) + 1) -
         std::lgamma(static_cast<double>(n - k) + 1);
}

// Freeman–Halton enumeration of the k x 2 tables with row totals n_k and
// first-column total B. A table's probability is prod C(n_k, b_k) / C(N, B),
// so only the numerator's log is compared with the observed one's.
class KByTwoExact {
 public:
  explicit KByTwoExact(const std::vector<DiscordantCounts>& strata) {
    for (const auto& s : strata) {
      rows_.push_back(s.discordant()), total_b_ += s.b;
      std::vector<double> lc(static_cast<size_t>(s.discordant()) + 1);
      for (int64_t b = 0; b <= s.discordant(); ++b) lc[static_cast<size_t>(b)] = LogChoose(s.discordant(), b);
      log_choose_.push_back(std::move(lc));
    }
    suffix_.assign(rows_.size() + 1, 0);
    for (size_t i = rows_.size(); i-- > 0;) suffix_[i] = suffix_[i + 1] + rows_[i];
    for (size_t i = 0; i < rows_.size(); ++i) observed_log_ += LogChoose(rows_[i], strata[i].b);
    int64_t n = suffix_[0];
    log_denominator_ = LogChoose(n, total_b_);
  }

  std::optional<double> P() {
    // Tables with the same probability as the observed one must count even
    // when rounding puts them a hair above it: R's fuzz, 1 + 1e-7.
    threshold_ = observed_log_ + std::log1p(1e-7);
    Walk(0, total_b_, 0.0);
    if (visited_ > kMaxExactTables) return std::nullopt;
    return std::min(1.0, sum_);
  }

 private:
  void Walk(size_t row, int64_t remaining, double log_numerator) {
    if (visited_ > kMaxExactTables) return;
    if (row + 1 == rows_.size()) {  // the last row's b is forced
      ++visited_;
      const double lp = log_numerator + log_choose_[row][static_cast<size_t>(remaining)];
      if (lp <= threshold_) sum_ += std::exp(lp - log_denominator_);
      return;
    }
    const int64_t lo = std::max<int64_t>(0, remaining - suffix_[row + 1]);
    const int64_t hi = std::min(rows_[row], remaining);
    for (int64_t b = lo; b <= hi; ++b) Walk(row + 1, remaining - b, log_numerator + log_choose_[row][static_cast<size_t>(b)]);
  }

  std::vector<int64_t> rows_, suffix_;
  std::vector<std::vector<double>> log_choose_;  // per row, log C(n_k, b) for b = 0..n_k
  int64_t total_b_ = 0;
  double observed_log_ = 0, log_denominator_ = 0, threshold_ = 0, sum_ = 0;
  int64_t visited_ = 0;
};

}  // namespace

DiscordantHomogeneity TestDiscordantHomogeneity(const std::vector<DiscordantCounts>& strata, double conf) {
  DiscordantHomogeneity r;
  std::vector<DiscordantCounts> used;
  for (const auto& s : strata) {
    r.total_b += s.b, r.total_c += s.c;
    if (s.discordant() > 0) used.push_back(s);
  }
  r.strata_used = static_cast<int>(used.size());
  r.pooled_odds_ratio = ConditionalOddsRatio(PairedCounts{0, r.total_b, r.total_c, 0}, conf);
  r.chi2 = kNaN;
  r.chi2_p = PValue{kNaN, kNaN};
  r.df = r.strata_used - 1;
  if (r.strata_used < 2) return r;
  if (r.total_b == 0 || r.total_c == 0) {
    // Every table with these margins is the observed one: nothing varies.
    r.exact_p = 1.0;
    return r;
  }
  CountTable table;
  for (const auto& s : used) table.push_back({s.b, s.c});
  // The Monte Carlo option of PearsonIndependence is not used here: the
  // exact test below replaces it.
  IndependenceTest t = PearsonIndependence(table, 1, 0);
  r.chi2 = t.statistic;
  r.chi2_p = ChiSquareUpper(t.statistic, r.df);
  r.small_expected = t.small_expected;
  r.exact_p = KByTwoExact(used).P();
  return r;
}

}  // namespace twinprobe::stats
