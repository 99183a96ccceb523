#pragma once
// Paired outcomes grouped by employer pseudonym, for the report's
// "employers" section. Employers appear here only by their keyed pseudonym
// (core/pseudonym.h); names stay in the store's employer table and reach a
// report only when the user asks for them (`report --reveal-employers`).
//
// Counts are over the analysed pairs (the sets Analyze puts in the paired
// table): per employer, how many of its vacancies were tested and how their
// pairs fell (a = both positive, b = reference arm only, c = other arm only,
// d = neither; the same cells as the paired table).
#include <cstdint>
#include <map>
#include <string>
#include <vector>

#include "stats/cluster_permutation.h"
#include "stats/mcnemar.h"

#include "core/fieldwork.h"

namespace twinprobe {

struct EmployerOutcome {
  std::string pseudonym;         // e.g. "E-3fa94c01d2"
  int64_t vacancies = 0;         // analysed pairs at this employer
  stats::PairedCounts table;     // the employer's pairs
  int64_t discordant = 0;        // b + c
};

struct EmployerOutcomes {
  bool available = false;             // paired design with employer keys
  int64_t employers = 0;              // employers with at least one analysed pair
  int64_t employers_discordant = 0;   // … of which with at least one discordant pair
  // Employers with at least one discordant pair, most discordant first, then
  // by pseudonym (so the order is stable and carries no other meaning).
  std::vector<EmployerOutcome> discordant;
  // Inference clustered by employer (TestByEmployer): the sign-flip test that
  // swaps the arms of all of one employer's pairs at once, and whether its
  // two-sided decision at alpha differs from the pair-level exact McNemar
  // test's (which treats pairs of one employer as independent).
  bool flip_tested = false;
  int64_t employers_with_several = 0;  // employers with more than one analysed pair
  stats::ClusterFlipResult flip;
  bool flip_disagrees = false;
};

// `sets` are the complete sets with an employer key (core/fieldwork.h);
// only sets of two probes count (arm 0 is the reference). Give none for a
// design that is not paired.
EmployerOutcomes SummariseEmployers(const std::vector<EmployerSets>& sets);

// Runs the employer sign-flip test (stats/cluster_permutation.h) on the
// employers' discordant counts, seeded with `seed` (used only when the exact
// distribution is too large), and compares its two-sided decision at
// `alpha` with the pair-level test's p `pair_level_p`. No-op unless
// `out.available`.
void TestByEmployer(EmployerOutcomes& out, uint64_t seed, double pair_level_p, double alpha);

}  // namespace twinprobe
