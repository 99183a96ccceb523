#pragma once
// The listing audit: how groups are placed in ranked lists (docs/architecture.md:
// listing), computed for `analyze` and `report` from the lists
// core/read_listings.h reads.
//
// Uses every listing whose extraction is 'ok' with its items, and the
// newest label of each item per factor (item_label). A group is a level of
// one factor ("origin=coastal") or, with several factors, a cell
// ("gender=f,origin=coastal"). A stratum is a query x location. Permutation
// tests exchange labels between the items of one stratum (an item keeps one
// label in every list of its stratum, so repeated fetches of the same query
// are not counted as independent evidence). The reference level of a factor is the plan's reference level when
// the store holds a plan with that factor, else the level with the most
// appearances (ties: alphabetical). See docs/ranks.md and docs/methods.md,
// "Listing audits".
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "core/design.h"
#include "core/status.h"
#include "core/read_listings.h"
#include "stats/exposure.h"
#include "stats/permutation.h"
#include "stats/wilcoxon.h"

namespace twinprobe {

struct ListingOptions {
  stats::DiscountSpec discount;  // log2 by default
  int64_t top_k = 10;
  int64_t resamples = 9999;      // per permutation test
  uint64_t seed = 20270301;      // the plan's seed when there is a plan
  size_t top_n = 3;              // most and least disparate entries listed
  size_t max_splits = 4096;      // widest-split candidates before the search is bounded
  std::string correction = "holm";
  double alpha = 0.05;
  stats::ProgressFn progress;    // permutation progress over the whole audit
};

struct ListingGroup {
  std::string factor;            // "origin", or "gender,origin" for a cell
  std::string label;             // "origin=coastal"
  int64_t appearances = 0;
  double exposure = 0;           // mean v(position)
  double exposure_share = 0;     // share of all exposure in the lists
  double top_k_share = 0;        // share of the places 1..k
  double mean_position = 0;
  double median_position = 0;
};

struct ListingComparison {
  std::string factor;
  std::string reference, other;  // levels
  std::string query, location;   // empty: all listings
  int64_t n_reference = 0, n_other = 0;
  double exposure_gap = 0;       // reference - other
  double emd = 0;                // places
  double mann_whitney_p = 1;
  double gap_p = 1, emd_p = 1;   // permutation, within listings
  std::optional<double> gap_p_adjusted, emd_p_adjusted;  // across strata, with the study's method
};

struct ListingPaired {
  std::string factor, reference, other;
  int64_t strata = 0;            // strata where both levels appear
  stats::RankTestResult wilcoxon;  // on per-stratum exposure gaps (reference - other)
  stats::SignTestResult sign;
};

struct DisparityEntry {
  std::string value;             // a group label, a query or a location
  double disparity = 0;          // mean EMD to neighbouring groups, in places
};

struct DisparityRanking {
  std::string dimension;         // group | query | location
  std::vector<DisparityEntry> most, least;
};

struct ListingSplit {
  std::string description;       // "origin: inland | coastal"
  int32_t parts = 0;
  double distance = 0;           // mean EMD between parts, in places
  double p_value = 1;
  int64_t resamples = 0;
  size_t candidates = 0;
  bool exhaustive = true;
};

struct ProfileOverlap {
  std::string profile_a, profile_b;  // seen_by values (equal: same profile, repeated lists = noise floor)
  int64_t comparisons = 0;
  double mean_jaccard_distance = 0;
};

struct ListingAudit {
  bool present = false;          // the store holds at least one usable listing
  bool listing_only = false;     // ... and no plan
  int64_t listings = 0, appearances = 0, labelled_appearances = 0, items = 0, strata = 0;
  std::vector<std::string> factors;
  std::vector<std::vector<std::string>> levels;  // per factor, reference first
  std::string discount;          // DiscountName
  int64_t top_k = 10, resamples = 0;
  uint64_t seed = 0;
  std::string correction;
  std::vector<ListingGroup> groups;
  std::vector<ListingComparison> overall;
  std::vector<ListingComparison> by_stratum;
  std::vector<ListingPaired> paired;
  std::vector<DisparityRanking> disparity;
  std::optional<ListingSplit> widest;
  std::vector<ProfileOverlap> overlap;
};

// Computes the audit (present = false when there is no listing).
Result<ListingAudit> AnalyzeListings(const ListingData& data, const ListingOptions& options);

// The audit as `analyze` runs it: the study's correction and alpha, the
// plan's seed (a fixed default without one), and a progress bar on a
// terminal.
Result<ListingAudit> AnalyzeStudyListings(const ListingData& data, const AnalysisPlan& plan,
                                          std::optional<int64_t> plan_seed);

// A progress callback that feeds the one progress bar (core/progress.h) on a
// terminal, and is an empty function otherwise.
stats::ProgressFn TerminalProgress(const std::string& label);

}  // namespace twinprobe
