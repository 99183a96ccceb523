#pragma once
// Multiple-comparison adjustment of p-values, exactly as R's p.adjust.
#include <optional>
#include <string>
#include <vector>

namespace twinprobe::stats {

enum class Adjustment { kNone, kBonferroni, kHolm, kHochberg, kHommel, kBH, kBY };

// "none", "bonferroni", "holm", "hochberg", "hommel", "bh" (also "fdr"),
// "by"; case-insensitive. Nothing for an unknown name.
std::optional<Adjustment> ParseAdjustment(const std::string& name);
std::string AdjustmentName(Adjustment method);  // the lower-case name above

// Adjusted p-values in input order, as R's p.adjust(p, method) with n =
// length(p) (definitions: Bonferroni: min(1, n p); Holm 1979, Scand J Stat
// 6:65-70: step-down max over (n - i + 1) p_(i); Hochberg 1988, Biometrika
// 75:800-803: step-up min of the same; Hommel 1988, Biometrika 75:383-386:
// R's closed-testing algorithm; Benjamini & Hochberg 1995, JRSS B
// 57:289-300: step-up min of n p_(i) / i; Benjamini & Yekutieli 2001, Ann
// Stat 29:1165-1188: BH times sum_{j<=n} 1/j). Ties keep R's order (a
// stable sort). Requires every p in [0, 1] (no NaN).
std::vector<double> AdjustP(const std::vector<double>& p, Adjustment method);

}  // namespace twinprobe::stats
