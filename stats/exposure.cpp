#include "stats/exposure.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <limits>

namespace twinprobe::stats {

double PositionWeight(int64_t position, const DiscountSpec& discount) {
  const double p = static_cast<double>(position);
  switch (discount.kind) {
    case Discount::kLogarithmic:
      return 1.0 / std::log2(1.0 + p);
    case Discount::kReciprocal:
      return 1.0 / p;
    case Discount::kGeometric:
      return std::pow(discount.patience, p - 1.0);
  }
  return 0;
}

std::string DiscountName(const DiscountSpec& discount) {
  switch (discount.kind) {
    case Discount::kLogarithmic:
      return "log2";
    case Discount::kReciprocal:
      return "reciprocal";
    case Discount::kGeometric: {
      char buf[48];
      std::snprintf(buf, sizeof buf, "geometric:%g", discount.patience);
      return buf;
    }
  }
  return "";
}

bool ParseDiscount(const std::string& text, DiscountSpec& out) {
  if (text == "log2") {
    out = {Discount::kLogarithmic, 0.8};
    return true;
  }
  if (text == "reciprocal") {
    out = {Discount::kReciprocal, 0.8};
    return true;
  }
  if (text == "geometric") {
    out = {Discount::kGeometric, 0.8};
    return true;
  }
  const std::string prefix = "geometric:";
  if (text.rfind(prefix, 0) != 0) return false;
  const std::string number = text.substr(prefix.size());
  char* end = nullptr;
  double p = std::strtod(number.c_str(), &end);
  if (number.empty() || *end != '\0' || !(p > 0 && p < 1)) return false;
  out = {Discount::kGeometric, p};
  return true;
}

double Median(std::vector<double> values) {
  if (values.empty()) return std::numeric_limits<double>::quiet_NaN();
  const size_t n = values.size();
  const size_t mid = n / 2;
  std::nth_element(values.begin(), values.begin() + static_cast<std::ptrdiff_t>(mid), values.end());
  double upper = values[mid];
  if (n % 2 == 1) return upper;
  double lower = *std::max_element(values.begin(), values.begin() + static_cast<std::ptrdiff_t>(mid));
  return (lower + upper) / 2.0;
}

PositionSummary SummarisePositions(const std::vector<int64_t>& positions, const DiscountSpec& discount,
                                   int64_t top_k) {
  PositionSummary s;
  if (positions.empty()) return s;
  std::vector<double> as_double;
  as_double.reserve(positions.size());
  double sum_positions = 0;
  for (int64_t p : positions) {
    s.exposure_total += PositionWeight(p, discount);
    if (p <= top_k) ++s.in_top_k;
    sum_positions += static_cast<double>(p);
    as_double.push_back(static_cast<double>(p));
  }
  s.appearances = static_cast<int64_t>(positions.size());
  s.exposure_mean = s.exposure_total / static_cast<double>(s.appearances);
  s.mean_position = sum_positions / static_cast<double>(s.appearances);
  s.median_position = Median(std::move(as_double));
  return s;
}

}  // namespace twinprobe::stats
