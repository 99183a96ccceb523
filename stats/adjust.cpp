#include "stats/adjust.h"

#include <algorithm>
#include <cctype>
#include <limits>
#include <numeric>

namespace twinprobe::stats {

std::optional<Adjustment> ParseAdjustment(const std::string& name) {
  std::string s;
  for (char ch : name) s += static_cast<char>(std::tolower(static_cast<unsigned char>(ch)));
  if (s == "none") return Adjustment::kNone;
  if (s == "bonferroni") return Adjustment::kBonferroni;
  if (s == "holm") return Adjustment::kHolm;
  if (s == "hochberg") return Adjustment::kHochberg;
  if (s == "hommel") return Adjustment::kHommel;
  if (s == "bh" || s == "fdr") return Adjustment::kBH;
  if (s == "by") return Adjustment::kBY;
  return std::nullopt;
}

std::string AdjustmentName(Adjustment method) {
  switch (method) {
    case Adjustment::kNone: return "none";
    case Adjustment::kBonferroni: return "bonferroni";
    case Adjustment::kHolm: return "holm";
    case Adjustment::kHochberg: return "hochberg";
    case Adjustment::kHommel: return "hommel";
    case Adjustment::kBH: return "bh";
    case Adjustment::kBY: return "by";
  }
  return "none";
}

std::vector<double> AdjustP(const std::vector<double>& p, Adjustment method) {
  const size_t n = p.size();
  if (n <= 1 || method == Adjustment::kNone) return p;
  if (n == 2 && method == Adjustment::kHommel) method = Adjustment::kHochberg;
  const double dn = static_cast<double>(n);
  std::vector<double> out(n);
  // R's order(p) and order(p, decreasing = TRUE) are stable (radix sort).
  std::vector<size_t> up(n);
  std::iota(up.begin(), up.end(), 0);
  std::stable_sort(up.begin(), up.end(), [&](size_t i, size_t j) { return p[i] < p[j]; });
  std::vector<size_t> down(n);
  std::iota(down.begin(), down.end(), 0);
  std::stable_sort(down.begin(), down.end(), [&](size_t i, size_t j) { return p[i] > p[j]; });

  switch (method) {
    case Adjustment::kNone: break;
    case Adjustment::kBonferroni:
      for (size_t i = 0; i < n; ++i) out[i] = std::min(1.0, dn * p[i]);
      break;
    case Adjustment::kHolm: {
      double run = 0;
      for (size_t r = 0; r < n; ++r) {
        run = std::max(run, (dn - static_cast<double>(r)) * p[up[r]]);
        out[up[r]] = std::min(1.0, run);
      }
      break;
    }
    case Adjustment::kHochberg:
    case Adjustment::kBH:
    case Adjustment::kBY: {
      double q = 1;
      if (method == Adjustment::kBY) {
        q = 0;
        for (size_t j = 1; j <= n; ++j) q += 1.0 / static_cast<double>(j);
      }
      double run = std::numeric_limits<double>::infinity();
      for (size_t r = 0; r < n; ++r) {
        const double i = dn - static_cast<double>(r);  // rank from the top: n, n-1, ..., 1
        const double v = method == Adjustment::kHochberg ? (dn + 1 - i) * p[down[r]] : q * dn / i * p[down[r]];
        run = std::min(run, v);
        out[down[r]] = std::min(1.0, run);
      }
      break;
    }
    case Adjustment::kHommel: {
      // R's algorithm verbatim, on the sorted p (0-based indices).
      std::vector<double> ps(n);
      for (size_t r = 0; r < n; ++r) ps[r] = p[up[r]];
      double init = std::numeric_limits<double>::infinity();
      for (size_t i = 0; i < n; ++i) init = std::min(init, dn * ps[i] / static_cast<double>(i + 1));
      std::vector<double> q(n, init), pa(n, init);
      for (size_t j = n - 1; j >= 2; --j) {
        const size_t n_ij = n - j + 1;  // ij = 1..n-j+1, i2 = n-j+2..n
        double q1 = std::numeric_limits<double>::infinity();
        for (size_t k = 2; k <= j; ++k) q1 = std::min(q1, static_cast<double>(j) * ps[n - j + k - 1] / static_cast<double>(k));
        for (size_t i = 0; i < n_ij; ++i) q[i] = std::min(static_cast<double>(j) * ps[i], q1);
        for (size_t i = n_ij; i < n; ++i) q[i] = q[n_ij - 1];
        for (size_t i = 0; i < n; ++i) pa[i] = std::max(pa[i], q[i]);
      }
      for (size_t r = 0; r < n; ++r) out[up[r]] = std::max(pa[r], ps[r]);
      break;
    }
  }
  return out;
}

}  // namespace twinprobe::stats
