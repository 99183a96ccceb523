#include "analysis/response_times.h"

#include <algorithm>
#include <map>
#include <optional>

#include "core/clock.h"
#include "core/store.h"

namespace twinprobe {
namespace {

constexpr double kSecondsPerDay = 86400.0;

// The steps of a cumulative share from sorted event times: one point per
// distinct time, so ties make one step of several probes.
std::vector<CumulativePoint> Steps(const std::vector<double>& sorted_days, int64_t denominator) {
  std::vector<CumulativePoint> out;
  for (size_t i = 0; i < sorted_days.size(); ++i) {
    const int64_t count = static_cast<int64_t>(i) + 1;
    const double share = static_cast<double>(count) / static_cast<double>(denominator);
    if (!out.empty() && out.back().day == sorted_days[i]) out.back() = {sorted_days[i], count, share};
    else out.push_back({sorted_days[i], count, share});
  }
  return out;
}

int64_t CountAtOrBefore(const std::vector<double>& sorted_days, double day) {
  return std::upper_bound(sorted_days.begin(), sorted_days.end(), day) - sorted_days.begin();
}

double Median(const std::vector<double>& sorted) {
  if (sorted.empty()) return -1;
  const size_t mid = sorted.size() / 2;
  return sorted.size() % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2.0;
}

struct ArmAccumulator {
  ArmResponseTimes out;
  std::vector<double> any_days, positive_days;
  std::map<std::string, int64_t> codes;
};

}  // namespace

std::vector<int> MilestoneDays(int window_days) {
  std::vector<int> days;
  for (int d : {1, 2, 3, 7, 14, 21})
    if (d < window_days) days.push_back(d);
  for (int d = 28; d < window_days; d += 14) days.push_back(d);
  if (window_days > 0) days.push_back(window_days);
  return days;
}

ResponseTimes ComputeResponseTimes(Store& store, const OutcomeScheme& scheme) {
  ResponseTimes rt;
  rt.window_days = scheme.window_days;
  const double window = static_cast<double>(scheme.window_days);

  std::vector<std::pair<int64_t, ArmAccumulator>> arms;
  Stmt a = store.Prepare(
      "SELECT id, label, is_reference FROM arm WHERE plan_id = (SELECT id FROM current_plan) "
      "ORDER BY is_reference DESC, id");
  while (a.Step()) {
    ArmAccumulator acc;
    acc.out.label = a.Text(1);
    acc.out.is_reference = a.Int(2) != 0;
    arms.emplace_back(a.Int(0), std::move(acc));
  }
  auto arm_of = [&arms](int64_t id) -> ArmAccumulator* {
    for (auto& [arm_id, acc] : arms)
      if (arm_id == id) return &acc;
    return nullptr;
  };

  // One row per (sent probe, current response); a probe without a response
  // comes once with NULLs. Times are compared in code, not SQL, so the
  // store's ISO strings go through the one parser the rest of the tool uses.
  Stmt q = store.Prepare(
      "SELECT p.id, p.arm_id, (SELECT min(s.sent_at) FROM sending s WHERE s.probe_id = p.id), "
      "  r.code, r.received_at, r.id "
      "FROM current_probe p LEFT JOIN current_response r ON r.probe_id = p.id "
      "WHERE EXISTS (SELECT 1 FROM sending s WHERE s.probe_id = p.id) "
      "ORDER BY p.id, r.id");
  struct ProbeState {
    int64_t arm_id = 0;
    std::optional<int64_t> sent;
    std::optional<double> first_any, first_positive;
    bool untimed_response = false;
    std::string current_code = "none";  // newest current response
  };
  std::map<int64_t, ProbeState> probes;
  while (q.Step()) {
    ProbeState& ps = probes[q.Int(0)];
    ps.arm_id = q.Int(1);
    ps.sent = ParseIsoTime(q.Text(2));
    if (q.IsNull(3)) continue;
    const std::string code = q.Text(3);
    ps.current_code = code;
    if (code == "none") continue;
    std::optional<int64_t> received = q.IsNull(4) ? std::nullopt : ParseIsoTime(q.Text(4));
    if (!received || !ps.sent) {
      ps.untimed_response = true;
      continue;
    }
    const double days = static_cast<double>(*received - *ps.sent) / kSecondsPerDay;
    if (!ps.first_any || days < *ps.first_any) ps.first_any = days;
    if (scheme.is_positive(code) && (!ps.first_positive || days < *ps.first_positive)) ps.first_positive = days;
  }

  for (const auto& [probe_id, ps] : probes) {
    ArmAccumulator* acc = arm_of(ps.arm_id);
    if (!acc) continue;
    ++acc->out.probes_sent;
    ++acc->codes[ps.current_code];
    if (ps.sent) rt.available = true;
    if (ps.first_any) {
      if (*ps.first_any <= window) acc->any_days.push_back(*ps.first_any);
      else ++acc->out.late;
    } else if (ps.untimed_response) {
      ++acc->out.responses_without_time;
    }
    if (ps.first_positive && *ps.first_positive <= window) acc->positive_days.push_back(*ps.first_positive);
  }

  const std::vector<int> milestone_days = MilestoneDays(scheme.window_days);
  for (auto& [id, acc] : arms) {
    ArmResponseTimes& out = acc.out;
    std::sort(acc.any_days.begin(), acc.any_days.end());
    std::sort(acc.positive_days.begin(), acc.positive_days.end());
    out.responded = static_cast<int64_t>(acc.any_days.size());
    out.responded_positive = static_cast<int64_t>(acc.positive_days.size());
    out.median_days = Median(acc.any_days);
    if (out.probes_sent > 0) {
      out.any = Steps(acc.any_days, out.probes_sent);
      out.positive = Steps(acc.positive_days, out.probes_sent);
      const double n = static_cast<double>(out.probes_sent);
      for (int day : milestone_days) {
        ResponseMilestone m;
        m.day = day;
        m.any = CountAtOrBefore(acc.any_days, day);
        m.positive = CountAtOrBefore(acc.positive_days, day);
        m.any_share = static_cast<double>(m.any) / n;
        m.positive_share = static_cast<double>(m.positive) / n;
        out.milestones.push_back(m);
      }
    }
    for (const auto& code : scheme.codes) {
      auto it = acc.codes.find(code);
      out.codes.push_back({code, it == acc.codes.end() ? 0 : it->second});
    }
    // Codes in the store that the current scheme no longer lists still count.
    for (const auto& [code, n] : acc.codes)
      if (!scheme.has_code(code)) out.codes.push_back({code, n});
    rt.arms.push_back(std::move(out));
  }
  return rt;
}

}  // namespace twinprobe
