#pragma once
// The balance of the current plan (core/fieldwork.h tallies): how the arms spread
// over templates, send positions, strata and weekdays, each as an arm x
// variable table with Pearson's test of independence (stats/contingency.h).
// A well-made plan is balanced by construction (planner/assign.h), so these
// tables are its proof: template and send order (and, in paired and sets
// designs, every stratum) give X^2 = 0 or close to it and p near 1.
//
// The weekday is the day a probe was sent (its newest `sent` entry), else the
// day it is planned for. Tables whose variable is unknown for every probe
// (an imported plan without templates or times) are left out.
#include <cstdint>
#include <string>
#include <vector>

#include "core/fieldwork.h"
#include "stats/contingency.h"

namespace twinprobe {

struct BalanceTable {
  std::string variable;                 // "template", "send_order", "weekday", "stratum:region" …
  std::string title;                    // "arm x template", "arm x region" …
  std::vector<std::string> arms;        // row labels, reference first
  std::vector<std::string> columns;     // column labels
  stats::CountTable counts;             // arms x columns
  stats::IndependenceTest test;
  int64_t max_spread = 0;  // largest difference between two arms' counts in one column
};

struct BalanceReport {
  bool present = false;  // false when the store holds no plan
  std::vector<BalanceTable> tables;
};

// `replicates` is B for Monte Carlo p-values (tables with small expected
// counts); the draws are seeded from the plan's seed. present = false when
// the fieldwork has no plan.
BalanceReport ComputeBalance(const Fieldwork& fieldwork, int replicates = 9999);

}  // namespace twinprobe
