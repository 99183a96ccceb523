#include "stats/pairwise.h"

#include "stats/fisher.h"
#include "stats/mcnemar.h"

namespace twinprobe::stats {
namespace {

void Adjust(std::vector<PairwiseComparison>& out, Adjustment method) {
  std::vector<double> p;
  for (const auto& c : out) p.push_back(c.p);
  const std::vector<double> adjusted = AdjustP(p, method);
  for (size_t i = 0; i < out.size(); ++i) out[i].p_adjusted = adjusted[i];
}

}  // namespace

std::vector<PairwiseComparison> PairwiseWithin(const std::vector<std::vector<int>>& sets, Adjustment method) {
  std::vector<PairwiseComparison> out;
  if (sets.empty()) return out;
  const size_t k = sets[0].size();
  const double n = static_cast<double>(sets.size());
  for (size_t i = 0; i < k; ++i)
    for (size_t j = i + 1; j < k; ++j) {
      PairedCounts t;
      for (const auto& row : sets) {
        if (row[i] && row[j]) ++t.a;
        else if (row[i]) ++t.b;
        else if (row[j]) ++t.c;
        else ++t.d;
      }
      PairwiseComparison c;
      c.first = static_cast<int>(i);
      c.second = static_cast<int>(j);
      c.rate_first = static_cast<double>(t.a + t.b) / n;
      c.rate_second = static_cast<double>(t.a + t.c) / n;
      c.difference = c.rate_first - c.rate_second;
      c.only_first = t.b;
      c.only_second = t.c;
      c.p = McNemarExactP(t);
      out.push_back(c);
    }
  Adjust(out, method);
  return out;
}

std::vector<PairwiseComparison> PairwiseBetween(const std::vector<int64_t>& positives,
                                                const std::vector<int64_t>& probes, Adjustment method) {
  std::vector<PairwiseComparison> out;
  for (size_t i = 0; i < probes.size(); ++i)
    for (size_t j = i + 1; j < probes.size(); ++j) {
      PairwiseComparison c;
      c.first = static_cast<int>(i);
      c.second = static_cast<int>(j);
      c.rate_first = static_cast<double>(positives[i]) / static_cast<double>(probes[i]);
      c.rate_second = static_cast<double>(positives[j]) / static_cast<double>(probes[j]);
      c.difference = c.rate_first - c.rate_second;
      const Table2x2 t{positives[i], probes[i] - positives[i], positives[j], probes[j] - positives[j]};
      c.p = FisherTest(t, Alternative::kTwoSided, 0.95).p.p;
      out.push_back(c);
    }
  Adjust(out, method);
  return out;
}

}  // namespace twinprobe::stats
