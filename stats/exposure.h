#pragma once
// Position-discounted attention ("exposure") in a ranked list, and the plain
// position summaries a listing audit reports per group.
//
// A reader looks at the top of a list more than at its foot; a discount
// function v(position) models how much attention a position gets. Exposure of
// an item = v(its position); exposure of a group = mean over its appearances
// (Singh & Joachims 2018, "Fairness of exposure in rankings", KDD '18,
// pp. 2219-2228: group exposure is the mean of its members' exposure).
//
// Discounts (position is 1-based):
//   kLogarithmic  v = 1 / log2(1 + position)   the DCG discount of Järvelin &
//                 Kekäläinen (2002), ACM TOIS 20(4):422-446; the default.
//   kReciprocal   v = 1 / position             the reciprocal-rank weight
//                 (Voorhees 1999, TREC-8 question answering track report).
//   kGeometric    v = patience^(position - 1)  the user model of rank-biased
//                 precision (Moffat & Zobel 2008, ACM TOIS 27(1), article 2):
//                 the reader moves on to the next item with probability
//                 `patience`, 0 < patience < 1.
// The sources above are cited from memory.
#include <cstdint>
#include <string>
#include <vector>

namespace twinprobe::stats {

enum class Discount { kLogarithmic, kReciprocal, kGeometric };

struct DiscountSpec {
  Discount kind = Discount::kLogarithmic;
  double patience = 0.8;  // kGeometric only; 0 < patience < 1
};

// v(position). Requires position >= 1.
double PositionWeight(int64_t position, const DiscountSpec& discount);

// "log2", "reciprocal" or "geometric(0.8)".
std::string DiscountName(const DiscountSpec& discount);
// Parses "log2" | "reciprocal" | "geometric" | "geometric:P"; false if unknown
// or P is not in (0, 1).
bool ParseDiscount(const std::string& text, DiscountSpec& out);

// Summary of the positions at which one group's items appeared (pooled over
// lists). `top_k` counts appearances at positions 1..k.
struct PositionSummary {
  int64_t appearances = 0;
  double exposure_total = 0;  // sum of v(position)
  double exposure_mean = 0;   // exposure_total / appearances (0 when none)
  int64_t in_top_k = 0;       // appearances at position <= k
  double mean_position = 0;
  double median_position = 0;  // as R's median(): mean of the two middle values for an even count
};

// Requires every position >= 1 and top_k >= 1. An empty input gives zeros.
PositionSummary SummarisePositions(const std::vector<int64_t>& positions, const DiscountSpec& discount,
                                   int64_t top_k);

// Median as R's median(): the middle value, or the mean of the two middle
// values. Returns NaN for an empty input. Takes a copy it may reorder.
double Median(std::vector<double> values);

}  // namespace twinprobe::stats
