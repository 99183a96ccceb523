#pragma once
// Accurate log densities of the binomial and hypergeometric distributions.
//
// Loader, C. (2000), "Fast and accurate computation of binomial
// probabilities": the density is written through the Stirling error
// stirlerr(n) = log(n!) - log(sqrt(2 pi n) (n/e)^n) and the deviance term
// bd0(x, np) = x log(x/np) + np - x, both evaluated without cancellation, so
// the relative error stays near machine precision even for n = 10^7 (a plain
// lgamma difference loses about 8 digits there). The same algorithm underlies
// R's dbinom and dhyper, which is why exact p-values agree with R to ~1e-14.
#include <cstdint>

namespace twinprobe::stats {

// log P(X = x) for X ~ Binomial(n, p). Requires 0 <= x <= n, 0 <= p <= 1.
// Returns -inf for impossible outcomes (e.g. x > 0 when p = 0).
double LogDbinom(int64_t x, int64_t n, double p);

// log P(X = x) for the hypergeometric distribution of the [1,1] cell of a
// 2x2 table with column totals m (first) and n (second) and first-row total
// k: P(X = x) = C(m, x) C(n, k - x) / C(m + n, k), as R's dhyper(x, m, n, k,
// log = TRUE). Requires counts >= 0, k <= m + n. -inf outside the support.
double LogDhyper(int64_t x, int64_t m, int64_t n, int64_t k);

}  // namespace twinprobe::stats
