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
};

// `sets` are the complete sets with an employer key (core/fieldwork.h);
// only sets of two probes count (arm 0 is the reference). Give none for a
// design that is not paired.
EmployerOutcomes SummariseEmployers(const std::vector<EmployerSets>& sets);

}  // namespace twinprobe
