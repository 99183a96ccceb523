#include "analysis/balance.h"

#include <algorithm>
#include <map>
#include <optional>
#include <set>


namespace twinprobe {
namespace {

const char* const kWeekdays[] = {"mon", "tue", "wed", "thu", "fri", "sat", "sun"};

// A small, stable hash for the per-table Monte Carlo seed (FNV-1a).
uint64_t Fnv1a(const std::string& s) {
  uint64_t h = 1469598103934665603ULL;
  for (unsigned char c : s) h = (h ^ c) * 1099511628211ULL;
  return h;
}

// One arm x variable table from tallies keyed (arm, column label).
BalanceTable MakeTable(const std::string& variable, const std::string& title, const std::vector<std::string>& arms,
                       std::vector<std::string> columns, const std::map<std::pair<int, std::string>, int64_t>& tally,
                       uint64_t seed, int replicates) {
  BalanceTable t;
  t.variable = variable;
  t.title = title;
  t.arms = arms;
  t.columns = std::move(columns);
  t.counts.assign(arms.size(), std::vector<int64_t>(t.columns.size(), 0));
  for (const auto& [cell, n] : tally) {
    auto it = std::find(t.columns.begin(), t.columns.end(), cell.second);
    t.counts[static_cast<size_t>(cell.first)][static_cast<size_t>(it - t.columns.begin())] += n;
  }
  for (size_t j = 0; j < t.columns.size(); ++j) {
    int64_t lo = INT64_MAX, hi = 0;
    for (const auto& row : t.counts) lo = std::min(lo, row[j]), hi = std::max(hi, row[j]);
    t.max_spread = std::max(t.max_spread, hi - lo);
  }
  t.test = stats::PearsonIndependence(t.counts, seed ^ Fnv1a(variable), replicates);
  return t;
}

// The distinct column labels of a tally, sorted.
std::vector<std::string> Columns(const std::map<std::pair<int, std::string>, int64_t>& tally) {
  std::set<std::string> seen;
  for (const auto& [cell, n] : tally) seen.insert(cell.second);
  return {seen.begin(), seen.end()};
}

}  // namespace

BalanceReport ComputeBalance(const Fieldwork& f, int replicates) {
  BalanceReport report;
  if (!f.has_plan) return report;
  report.present = true;
  if (f.probes_planned == 0) return report;
  const uint64_t seed = static_cast<uint64_t>(f.seed.value_or(0));
  std::vector<std::string> arms;
  for (const auto& a : f.arms) arms.push_back(a.label);
  const BalanceTallies& b = f.balance;

  if (!b.templates.empty())
    report.tables.push_back(
        MakeTable("template", "arm x template", arms, Columns(b.templates), b.templates, seed, replicates));
  // Imported data without send times have no send order, only the order of
  // the file's rows: nothing to test.
  if (f.plan_origin != "import" || f.probes_sent > 0) {
    std::map<std::pair<int, std::string>, int64_t> orders;
    int max_order = 0;
    for (const auto& [cell, n] : b.send_orders) {
      orders[{cell.first, std::to_string(cell.second)}] += n;
      max_order = std::max(max_order, cell.second);
    }
    std::vector<std::string> columns;
    for (int k = 1; k <= max_order; ++k) columns.push_back(std::to_string(k));
    report.tables.push_back(MakeTable("send_order", "arm x send order", arms, columns, orders, seed, replicates));
  }
  for (const auto& [name, tally] : b.strata)
    if (!tally.empty())
      report.tables.push_back(MakeTable("stratum:" + name, "arm x " + name, arms, Columns(tally), tally, seed, replicates));
  {
    std::map<std::pair<int, std::string>, int64_t> days;
    bool seen[7] = {};
    for (size_t arm = 0; arm < b.weekdays.size(); ++arm)
      for (int d = 0; d < 7; ++d)
        if (b.weekdays[arm][static_cast<size_t>(d)] > 0) {
          days[{static_cast<int>(arm), kWeekdays[d]}] += b.weekdays[arm][static_cast<size_t>(d)];
          seen[d] = true;
        }
    std::vector<std::string> columns;
    for (int d = 0; d < 7; ++d)
      if (seen[d]) columns.push_back(kWeekdays[d]);
    if (!days.empty()) report.tables.push_back(MakeTable("weekday", "arm x weekday", arms, columns, days, seed, replicates));
  }
  return report;
}

}  // namespace twinprobe
