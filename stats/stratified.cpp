#include "stats/stratified.h"

#include <cmath>
#include <limits>

namespace twinprobe::stats {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
constexpr double kInf = std::numeric_limits<double>::infinity();

}  // namespace

MantelHaenszelResult MantelHaenszel(const std::vector<Table2x2>& strata, double conf) {
  MantelHaenszelResult r;
  // Sums of R's mantelhaen.test, term by term (RBG variance in its notation:
  // R = sum ad/n, S = sum bc/n).
  double sum_r = 0, sum_s = 0, pr = 0, ps_qr = 0, qs = 0, delta = 0, var = 0;
  for (const auto& t : strata) {
    if (t.n() < 2) continue;
    ++r.strata_used;
    const double a = static_cast<double>(t.a), b = static_cast<double>(t.b), c = static_cast<double>(t.c),
                 d = static_cast<double>(t.d), n = static_cast<double>(t.n());
    const double ad = a * d / n, bc = b * c / n;
    sum_r += ad;
    sum_s += bc;
    pr += (a + d) * a * d / (n * n);
    ps_qr += ((a + d) * b * c + (b + c) * a * d) / (n * n);
    qs += (b + c) * b * c / (n * n);
    const double r1 = a + b, r2 = c + d, c1 = a + c, c2 = b + d;
    delta += a - r1 * c1 / n;
    var += r1 * r2 * c1 * c2 / (n * n * (n - 1));
  }
  r.estimate = sum_s == 0 ? (sum_r == 0 ? kNaN : kInf) : sum_r / sum_s;
  if (std::isfinite(r.estimate) && r.estimate > 0) {
    r.log_sd = std::sqrt(pr / (2 * sum_r * sum_r) + ps_qr / (2 * sum_r * sum_s) + qs / (2 * sum_s * sum_s));
    const double z = NormalQuantile((1 + conf) / 2);
    r.ci = {r.estimate * std::exp(-z * r.log_sd), r.estimate * std::exp(z * r.log_sd)};
  } else {
    r.log_sd = kNaN;
    r.ci = {kNaN, kNaN};
  }
  r.delta = delta;
  if (var > 0) {
    r.chi2 = delta * delta / var;
    const double yates = std::abs(delta) >= 0.5 ? 0.5 : 0.0;
    r.chi2_corrected = (std::abs(delta) - yates) * (std::abs(delta) - yates) / var;
  } else {
    r.chi2 = r.chi2_corrected = kNaN;
  }
  r.chi2_p = ChiSquareUpper(r.chi2, 1);
  r.chi2_corrected_p = ChiSquareUpper(r.chi2_corrected, 1);
  return r;
}

BreslowDayResult BreslowDay(const std::vector<Table2x2>& strata) {
  BreslowDayResult r;
  const double psi = MantelHaenszel(strata, 0.95).estimate;
  if (!(std::isfinite(psi) && psi > 0)) {
    r.statistic = r.tarone = r.df = kNaN;
    r.p = r.tarone_p = PValue::FromLog(kNaN);
    return r;
  }
  double bd = 0, sum_a = 0, sum_fit = 0, sum_v = 0;
  for (const auto& t : strata) {
    const double a = static_cast<double>(t.a), r1 = static_cast<double>(t.a + t.b),
                 r2 = static_cast<double>(t.c + t.d), c1 = static_cast<double>(t.a + t.c);
    if (r1 == 0 || r2 == 0 || c1 == 0 || r1 + r2 - c1 == 0) continue;  // a zero margin: no information
    const double lo = std::max(0.0, c1 - r2), hi = std::min(r1, c1);
    // (1 - psi) A^2 + (r2 - c1 + psi (r1 + c1)) A - psi r1 c1 = 0; the root
    // inside [lo, hi] is the one with the + sign of the square root when
    // written as 2C / (-B -+ sqrt(...)) (no cancellation for any psi).
    double fit;
    const double qa = 1 - psi, qb = r2 - c1 + psi * (r1 + c1), qc = -psi * r1 * c1;
    if (std::abs(qa) < 1e-15) {
      fit = -qc / qb;
    } else {
      const double disc = std::sqrt(qb * qb - 4 * qa * qc);
      const double q = -0.5 * (qb + std::copysign(disc, qb));
      const double x1 = q / qa, x2 = qc / q;
      fit = (x1 >= lo - 1e-9 && x1 <= hi + 1e-9) ? x1 : x2;
    }
    const double v = 1 / (1 / fit + 1 / (r1 - fit) + 1 / (c1 - fit) + 1 / (r2 - c1 + fit));
    if (!(v > 0) || !std::isfinite(v)) continue;
    ++r.strata_used;
    bd += (a - fit) * (a - fit) / v;
    sum_a += a;
    sum_fit += fit;
    sum_v += v;
  }
  if (r.strata_used < 2) {
    r.statistic = r.tarone = r.df = kNaN;
    r.p = r.tarone_p = PValue::FromLog(kNaN);
    return r;
  }
  r.df = r.strata_used - 1;
  r.statistic = bd;
  r.p = ChiSquareUpper(bd, r.df);
  r.tarone = bd - (sum_a - sum_fit) * (sum_a - sum_fit) / sum_v;
  r.tarone_p = ChiSquareUpper(r.tarone, r.df);
  return r;
}

}  // namespace twinprobe::stats
