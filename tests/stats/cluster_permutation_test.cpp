// The employer sign-flip test: exact against brute force over all 2^E sign
// vectors, the sign-flip null with one pair per employer (the exact McNemar
// test), and Monte Carlo against exact.
#include <catch2/catch.hpp>

#include <cmath>
#include <cstdlib>

#include "stats/cluster_permutation.h"
#include "stats/mcnemar.h"
#include "stats/random.h"

using namespace twinprobe::stats;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

namespace {

// Every one of the 2^E ways to swap whole employers, counted directly.
ClusterFlipResult BruteForce(const std::vector<DiscordantCounts>& employers) {
  ClusterFlipResult r;
  for (const auto& e : employers) r.statistic += e.b - e.c;
  const size_t n = employers.size();
  double greater = 0, less = 0, two = 0;
  const double each = std::ldexp(1.0, -static_cast<int>(n));
  for (uint64_t mask = 0; mask < (uint64_t{1} << n); ++mask) {
    int64_t s = 0;
    for (size_t j = 0; j < n; ++j) {
      const auto& e = employers[j];
      s += (mask >> j & 1) ? e.c - e.b : e.b - e.c;
    }
    greater += s >= r.statistic ? each : 0;
    less += s <= r.statistic ? each : 0;
    two += std::llabs(s) >= std::llabs(r.statistic) ? each : 0;
  }
  r.p_greater = greater, r.p_less = less, r.p_two_sided = two;
  return r;
}

}  // namespace

TEST_CASE("cluster flip: exact distribution equals brute force over every employer swap") {
  Rng rng(1935);
  for (int trial = 0; trial < 40; ++trial) {
    std::vector<DiscordantCounts> employers;
    const int n = static_cast<int>(rng.Between(1, 14));
    for (int j = 0; j < n; ++j) employers.push_back({rng.Between(0, 6), rng.Between(0, 6)});
    auto exact = ClusterFlipTest(employers, 1);
    auto brute = BruteForce(employers);
    INFO("trial " << trial);
    REQUIRE(exact.exact);
    CHECK(exact.statistic == brute.statistic);
    CHECK_THAT(exact.p_greater, WithinRel(brute.p_greater, 1e-12));
    CHECK_THAT(exact.p_less, WithinRel(brute.p_less, 1e-12));
    CHECK_THAT(exact.p_two_sided, WithinRel(brute.p_two_sided, 1e-12));
  }
}

TEST_CASE("cluster flip: one discordant pair per employer is the exact McNemar test") {
  for (int64_t b = 0; b <= 12; ++b)
    for (int64_t c = 0; c <= 12; ++c) {
      std::vector<DiscordantCounts> employers;
      for (int64_t i = 0; i < b; ++i) employers.push_back({1, 0});
      for (int64_t i = 0; i < c; ++i) employers.push_back({0, 1});
      employers.push_back({0, 0});  // an employer with only concordant pairs changes nothing
      auto r = ClusterFlipTest(employers, 1);
      INFO("b = " << b << ", c = " << c);
      CHECK_THAT(r.p_two_sided, WithinRel(McNemarExactP(PairedCounts{0, b, c, 0}), 1e-12));
    }
}

TEST_CASE("cluster flip: an employer that favours one arm in all its pairs counts once") {
  // 12 discordant pairs for the reference arm, 10 of them at one employer, 2
  // for the other arm at a fourth: pair by pair the exact McNemar p is
  // 212/16384 = 0.0129, but flipping whole employers leaves four units: the
  // sums +-10 +-1 +-1 +-2 reach |10| in 10 of the 16 sign vectors, and 10 or
  // more in 5 of them.
  std::vector<DiscordantCounts> employers{{10, 0}, {1, 0}, {1, 0}, {0, 2}};
  auto r = ClusterFlipTest(employers, 1);
  CHECK(r.statistic == 10);
  CHECK(r.employers == 4);
  CHECK_THAT(r.p_two_sided, WithinRel(10.0 / 16.0, 1e-15));
  CHECK_THAT(r.p_greater, WithinRel(5.0 / 16.0, 1e-15));
  CHECK_THAT(McNemarExactP(PairedCounts{0, 12, 2, 0}), WithinRel(212.0 / 16384.0, 1e-12));
}

TEST_CASE("cluster flip: Monte Carlo beyond the exact limit is close to exact and reproducible") {
  // 3000 employers with up to 5000 pairs each exceed kMaxExactClusterSteps.
  Rng rng(7);
  std::vector<DiscordantCounts> employers;
  for (int j = 0; j < 3000; ++j) employers.push_back({rng.Between(0, 5000), rng.Between(0, 5000)});
  auto mc = ClusterFlipTest(employers, 42, 2000);
  auto again = ClusterFlipTest(employers, 42, 2000);
  REQUIRE_FALSE(mc.exact);
  CHECK(mc.resamples == 2000);
  CHECK(mc.p_two_sided == again.p_two_sided);
  CHECK(mc.p_two_sided > 0);
  CHECK(mc.p_two_sided <= 1);
}
