#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <vector>

#include "stats/permutation.h"

using namespace twinprobe::stats;

namespace {

// Difference in means between label 0 and label 1.
double MeanGap(const std::vector<double>& v, const std::vector<int32_t>& l) {
  double s[2] = {0, 0}, n[2] = {0, 0};
  for (size_t i = 0; i < v.size(); ++i) s[l[i]] += v[i], n[l[i]] += 1;
  return s[0] / n[0] - s[1] / n[1];
}

}  // namespace

TEST_CASE("permutation: the Monte Carlo p-value agrees with full enumeration of one block") {
  // 8 values, 4 per group, one block: all C(8,4) = 70 labellings enumerated
  // by hand below are the exact permutation distribution (the slow oracle).
  const std::vector<double> v = {1, 2, 3, 5, 4, 7, 9, 12};
  const std::vector<int32_t> labels = {0, 0, 0, 0, 1, 1, 1, 1};
  const double observed = MeanGap(v, labels);
  int extreme = 0, total = 0;
  for (int mask = 0; mask < 256; ++mask) {
    if (__builtin_popcount(static_cast<unsigned>(mask)) != 4) continue;
    std::vector<int32_t> l(8);
    for (int k = 0; k < 8; ++k) l[static_cast<size_t>(k)] = (mask >> k) & 1 ? 0 : 1;
    ++total;
    if (std::fabs(MeanGap(v, l)) >= std::fabs(observed) - 1e-12) ++extreme;
  }
  REQUIRE(total == 70);
  const double exact = static_cast<double>(extreme) / 70.0;
  PermutationOptions o;
  o.resamples = 40000;
  o.seed = 7;
  auto r = PermutationTest(labels, {{0, 1, 2, 3, 4, 5, 6, 7}},
                           [&](const std::vector<int32_t>& l) { return MeanGap(v, l); }, Tail::kAbsolute, o);
  CHECK(r.observed == observed);
  // Within 4 standard errors of the exact value.
  CHECK(std::fabs(r.p_value - exact) < 4 * std::sqrt(exact * (1 - exact) / 40000.0));
}

TEST_CASE("permutation: labels move only within their block") {
  const std::vector<int32_t> labels = {0, 1, 1, 0, 0, 0, 1, 1, 1};
  const std::vector<std::vector<int32_t>> blocks = {{0, 1, 2}, {3, 4, 5, 6}, {7}};
  PermutationOptions o;
  o.resamples = 500;
  bool intact = true;
  auto count_block = [&](const std::vector<int32_t>& l) {
    int ones0 = l[0] + l[1] + l[2], ones1 = l[3] + l[4] + l[5] + l[6];
    intact = intact && ones0 == 2 && ones1 == 1 && l[7] == 1 && l[8] == 1;  // item 8 is in no block
    return 0.0;
  };
  PermutationTest(labels, blocks, count_block, Tail::kGreater, o);
  CHECK(intact);
}

TEST_CASE("permutation: a seed reproduces the p-value, p is never zero, progress reaches the end") {
  std::vector<double> v;
  std::vector<int32_t> labels;
  std::vector<int32_t> block;
  for (int i = 0; i < 40; ++i) {
    v.push_back(i < 20 ? i : 100 + i);  // fully separated groups
    labels.push_back(i < 20 ? 0 : 1);
    block.push_back(i);
  }
  PermutationOptions o;
  o.resamples = 999;
  o.seed = 11;
  int64_t last_done = 0, calls = 0;
  o.progress = [&](int64_t done, int64_t total) {
    CHECK(total == 999);
    CHECK(done > last_done);
    last_done = done;
    ++calls;
  };
  auto stat = [&](const std::vector<int32_t>& l) { return MeanGap(v, l); };
  auto a = PermutationTest(labels, {block}, stat, Tail::kAbsolute, o);
  o.progress = {};
  auto b = PermutationTest(labels, {block}, stat, Tail::kAbsolute, o);
  CHECK(a.p_value == b.p_value);
  CHECK(a.as_extreme == 0);
  CHECK(a.p_value == 1.0 / 1000.0);  // Phipson & Smyth: (0 + 1) / (999 + 1)
  CHECK(last_done == 999);
  CHECK(calls >= 99);
}

TEST_CASE("permutation: ties with the observed value count as extreme") {
  CHECK(AtLeastAsExtreme(0.30000000000000004, 0.3, Tail::kGreater));
  CHECK(AtLeastAsExtreme(0.3 - 1e-16, 0.3, Tail::kGreater));
  CHECK_FALSE(AtLeastAsExtreme(0.29, 0.3, Tail::kGreater));
  CHECK(AtLeastAsExtreme(-0.5, 0.5, Tail::kAbsolute));
  CHECK_FALSE(AtLeastAsExtreme(-0.5, 0.5, Tail::kGreater));
}
