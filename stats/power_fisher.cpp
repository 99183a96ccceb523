#include "stats/power_fisher.h"

#include <algorithm>
#include <unordered_map>

#include "stats/fisher.h"
#include "stats/power_internal.h"

namespace twinprobe::stats {
namespace {

constexpr double kTailMass = 1e-17;

// The rejection region of the two-sided Fisher test for n per arm, by total.
class FisherRegion {
 public:
  FisherRegion(int64_t n, double alpha) : n_(n), alpha_(alpha) {}

  bool Rejects(int64_t x1, int64_t total) {
    auto it = cut_.find(total);
    if (it == cut_.end()) {
      // Neighbouring totals have cutoffs within a count or two: start there.
      auto near = cut_.find(total - 1);
      if (near == cut_.end()) near = cut_.find(total + 1);
      it = cut_.emplace(total, near == cut_.end() ? Cutoffs(total) : Cutoffs(total, near->second)).first;
    }
    return x1 <= it->second.first || x1 >= it->second.second;
  }

 private:
  bool TestRejects(int64_t x1, int64_t total) const {
    const Table2x2 t{x1, n_ - x1, total - x1, n_ - (total - x1)};
    return FisherTest(t, Alternative::kTwoSided, 0.95).p.p <= alpha_;
  }

  int64_t Lo(int64_t total) const { return std::max<int64_t>(0, total - n_); }
  int64_t Hi(int64_t total) const { return std::min(total, n_); }
  // Mode of the central hypergeometric with column total `total`, row total n of 2n.
  int64_t Mode(int64_t total) const {
    return std::clamp<int64_t>((total + 1) * (n_ + 1) / (2 * n_ + 2), Lo(total), Hi(total));
  }

  // (L, U): reject when x1 <= L or x1 >= U.
  std::pair<int64_t, int64_t> Cutoffs(int64_t total) const {
    const int64_t mode = Mode(total);
    // Largest x in [lo, mode] that rejects (p rises towards the mode).
    int64_t a = Lo(total) - 1, b = mode;
    while (a < b) {
      const int64_t mid = a + (b - a + 1) / 2;
      if (TestRejects(mid, total)) a = mid;
      else b = mid - 1;
    }
    // Smallest x in [mode, hi] that rejects (p falls away from the mode).
    int64_t c = mode, d = Hi(total) + 1;
    while (c < d) {
      const int64_t mid = c + (d - c) / 2;
      if (TestRejects(mid, total)) d = mid;
      else c = mid + 1;
    }
    return {a, c};
  }

  // The same from a guess: L is certified by "L rejects (or is below the
  // support) and L + 1 does not", U by "U rejects (or is above the support)
  // and U - 1 does not", since p is monotone on each side of the mode. A
  // guess that fails either check falls back to the binary searches.
  std::pair<int64_t, int64_t> Cutoffs(int64_t total, std::pair<int64_t, int64_t> guess) const {
    const int64_t lo = Lo(total), hi = Hi(total), mode = Mode(total);
    auto lower_ok = [&](int64_t l) {
      return l >= lo - 1 && l < mode && (l < lo || TestRejects(l, total)) && !TestRejects(l + 1, total);
    };
    auto upper_ok = [&](int64_t u) {
      return u <= hi + 1 && u > mode && (u > hi || TestRejects(u, total)) && !TestRejects(u - 1, total);
    };
    int64_t l = -2, u = -2;
    for (int64_t cand : {guess.first, guess.first + 1, guess.first - 1})
      if (lower_ok(cand)) {
        l = cand;
        break;
      }
    for (int64_t cand : {guess.second, guess.second + 1, guess.second - 1})
      if (upper_ok(cand)) {
        u = cand;
        break;
      }
    if (l == -2 || u == -2) {
      auto full = Cutoffs(total);
      if (l == -2) l = full.first;
      if (u == -2) u = full.second;
    }
    return {l, u};
  }

  int64_t n_;
  double alpha_;
  std::unordered_map<int64_t, std::pair<int64_t, int64_t>> cut_;
};

}  // namespace

double FisherExactPower(int64_t n_per_arm, double p1, double p2, double alpha) {
  internal::BinomialWeights w1, w2;
  internal::FillBinomialWeights(n_per_arm, p1, kTailMass, w1);
  internal::FillBinomialWeights(n_per_arm, p2, kTailMass, w2);
  FisherRegion region(n_per_arm, alpha);
  double power = 0.0;
  for (size_t i = 0; i < w1.weights.size(); ++i) {
    const int64_t x1 = w1.lo + static_cast<int64_t>(i);
    double inner = 0.0;
    for (size_t j = 0; j < w2.weights.size(); ++j) {
      const int64_t x2 = w2.lo + static_cast<int64_t>(j);
      if (region.Rejects(x1, x1 + x2)) inner += w2.weights[j];
    }
    power += w1.weights[i] * inner;
  }
  return std::min(power, 1.0);
}

FisherSampleSize FisherExactSampleSize(double p1, double p2, double alpha, double target, int64_t max_n) {
  FisherSampleSize out;
  auto reaches = [&](int64_t n) { return FisherExactPower(n, p1, p2, alpha) >= target; };
  int64_t below = 1, above = 2;  // power(below) < target <= power(above), assuming monotonicity
  if (reaches(1)) above = 1, below = 0;
  while (below > 0 && !reaches(above)) {
    below = above;
    if (above >= max_n) return out;
    above = std::min(max_n, above * 2);
  }
  while (above - below > 1) {
    const int64_t mid = below + (above - below) / 2;
    (reaches(mid) ? above : below) = mid;
  }
  out.found = true;
  out.n = above;
  out.power_at_n = FisherExactPower(above, p1, p2, alpha);
  const int64_t window = std::max<int64_t>(5, above / 100);
  out.checked_from = std::max<int64_t>(1, above - window);
  out.checked_to = above + window;
  out.n_first = above;
  for (int64_t n = out.checked_from; n < above; ++n)
    if (reaches(n)) {
      out.n_first = n;
      break;
    }
  for (int64_t n = above + 1; n <= out.checked_to; ++n)
    if (!reaches(n)) {
      out.dips_above = true;
      break;
    }
  return out;
}

}  // namespace twinprobe::stats
