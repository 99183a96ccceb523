#include "analysis/balance.h"

#include <algorithm>
#include <map>
#include <optional>

#include "core/clock.h"

namespace twinprobe {
namespace {

const char* const kWeekdays[] = {"mon", "tue", "wed", "thu", "fri", "sat", "sun"};

// A small, stable hash for the per-table Monte Carlo seed (FNV-1a).
uint64_t Fnv1a(const std::string& s) {
  uint64_t h = 1469598103934665603ULL;
  for (unsigned char c : s) h = (h ^ c) * 1099511628211ULL;
  return h;
}

struct ProbeFacts {
  int arm = 0;
  std::optional<std::string> template_path;
  int send_order = 1;
  std::optional<int> weekday;
  int64_t vacancy_id = 0;
};

BalanceTable MakeTable(const std::string& variable, const std::string& title, const std::vector<std::string>& arms,
                       std::vector<std::string> columns, const std::vector<std::pair<int, std::string>>& cells,
                       uint64_t seed, int replicates) {
  BalanceTable t;
  t.variable = variable;
  t.title = title;
  t.arms = arms;
  t.columns = std::move(columns);
  t.counts.assign(arms.size(), std::vector<int64_t>(t.columns.size(), 0));
  for (const auto& [arm, column] : cells) {
    auto it = std::find(t.columns.begin(), t.columns.end(), column);
    ++t.counts[arm][it - t.columns.begin()];
  }
  for (size_t j = 0; j < t.columns.size(); ++j) {
    int64_t lo = INT64_MAX, hi = 0;
    for (const auto& row : t.counts) lo = std::min(lo, row[j]), hi = std::max(hi, row[j]);
    t.max_spread = std::max(t.max_spread, hi - lo);
  }
  t.test = stats::PearsonIndependence(t.counts, seed ^ Fnv1a(variable), replicates);
  return t;
}

}  // namespace

BalanceReport ComputeBalance(Store& store, int replicates) {
  BalanceReport report;
  Stmt plan = store.Prepare("SELECT id, coalesce(seed, 0) FROM current_plan");
  if (!plan.Step()) return report;
  report.present = true;
  const int64_t plan_id = plan.Int(0);
  const uint64_t seed = static_cast<uint64_t>(plan.Int(1));

  std::vector<std::string> arms;
  std::map<int64_t, int> arm_index;
  Stmt a = store.Prepare("SELECT id, label FROM arm WHERE plan_id = ?1 ORDER BY is_reference DESC, id");
  a.Bind(1, plan_id);
  while (a.Step()) {
    arm_index[a.Int(0)] = static_cast<int>(arms.size());
    arms.push_back(a.Text(1));
  }

  std::vector<ProbeFacts> probes;
  Stmt q = store.Prepare(
      "SELECT p.arm_id, p.template, p.send_order, "
      "  coalesce((SELECT s.sent_at FROM sending s WHERE s.probe_id = p.id ORDER BY s.id DESC LIMIT 1), p.planned_at), "
      "  p.vacancy_id "
      "FROM current_probe p ORDER BY p.id");
  while (q.Step()) {
    ProbeFacts f;
    f.arm = arm_index.at(q.Int(0));
    f.template_path = q.OptText(1);
    f.send_order = static_cast<int>(q.Int(2));
    if (auto when = q.OptText(3))
      if (auto t = ParseIsoTime(*when)) f.weekday = WeekdayOf(*t);
    f.vacancy_id = q.Int(4);
    probes.push_back(std::move(f));
  }
  if (probes.empty()) return report;

  // arm x template
  {
    std::vector<std::pair<int, std::string>> cells;
    std::vector<std::string> columns;
    for (const auto& p : probes)
      if (p.template_path) {
        cells.emplace_back(p.arm, *p.template_path);
        if (std::find(columns.begin(), columns.end(), *p.template_path) == columns.end())
          columns.push_back(*p.template_path);
      }
    std::sort(columns.begin(), columns.end());
    if (!cells.empty())
      report.tables.push_back(MakeTable("template", "arm x template", arms, columns, cells, seed, replicates));
  }
  // arm x send order
  {
    std::vector<std::pair<int, std::string>> cells;
    int max_order = 0;
    for (const auto& p : probes) {
      cells.emplace_back(p.arm, std::to_string(p.send_order));
      max_order = std::max(max_order, p.send_order);
    }
    std::vector<std::string> columns;
    for (int k = 1; k <= max_order; ++k) columns.push_back(std::to_string(k));
    report.tables.push_back(MakeTable("send_order", "arm x send order", arms, columns, cells, seed, replicates));
  }
  // arm x each stratum
  {
    std::map<std::string, std::map<int64_t, std::string>> strata;  // name -> vacancy -> value
    Stmt s = store.Prepare(
        "SELECT vs.name, vs.vacancy_id, vs.value FROM vacancy_stratum vs JOIN vacancy v ON v.id = vs.vacancy_id "
        "WHERE v.plan_id = ?1");
    s.Bind(1, plan_id);
    while (s.Step()) strata[s.Text(0)][s.Int(1)] = s.Text(2);
    for (const auto& [name, values] : strata) {
      std::vector<std::pair<int, std::string>> cells;
      std::vector<std::string> columns;
      for (const auto& p : probes) {
        auto it = values.find(p.vacancy_id);
        if (it == values.end()) continue;
        cells.emplace_back(p.arm, it->second);
        if (std::find(columns.begin(), columns.end(), it->second) == columns.end()) columns.push_back(it->second);
      }
      std::sort(columns.begin(), columns.end());
      if (!cells.empty())
        report.tables.push_back(MakeTable("stratum:" + name, "arm x " + name, arms, columns, cells, seed, replicates));
    }
  }
  // arm x weekday
  {
    std::vector<std::pair<int, std::string>> cells;
    bool seen[7] = {};
    for (const auto& p : probes)
      if (p.weekday) {
        cells.emplace_back(p.arm, kWeekdays[*p.weekday]);
        seen[*p.weekday] = true;
      }
    std::vector<std::string> columns;
    for (int d = 0; d < 7; ++d)
      if (seen[d]) columns.push_back(kWeekdays[d]);
    if (!cells.empty())
      report.tables.push_back(MakeTable("weekday", "arm x weekday", arms, columns, cells, seed, replicates));
  }
  return report;
}

}  // namespace twinprobe
