#include "analysis/response_times.h"

#include <algorithm>
#include <cmath>
#include <map>
#include <optional>


namespace twinprobe {
namespace {

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

ResponseTimes ComputeResponseTimes(const Fieldwork& f, const OutcomeScheme& scheme) {
  ResponseTimes rt;
  rt.window_days = scheme.window_days;
  const double window = static_cast<double>(scheme.window_days);

  std::vector<std::pair<int64_t, ArmAccumulator>> arms;
  for (const auto& a : f.arms) {
    ArmAccumulator acc;
    acc.out.label = a.label;
    acc.out.is_reference = a.is_reference;
    arms.emplace_back(a.id, std::move(acc));
  }
  for (const SentProbe& ps : f.sent) {
    if (ps.open) continue;  // still within its window: its set is not analysed yet
    ArmAccumulator* acc = &arms[static_cast<size_t>(ps.arm)].second;
    rt.available = true;
    ++acc->out.probes_sent;
    ++acc->codes[f.codes[static_cast<size_t>(ps.code)]];
    if (!std::isnan(ps.first_any_days)) {
      if (ps.first_any_days <= window) acc->any_days.push_back(ps.first_any_days);
      else ++acc->out.late;
    } else if (ps.untimed_response) {
      ++acc->out.responses_without_time;
    }
    if (!std::isnan(ps.first_positive_days) && ps.first_positive_days <= window)
      acc->positive_days.push_back(ps.first_positive_days);
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
      auto read_at = [&](int day) {
        ResponseMilestone m;
        m.day = day;
        m.any = CountAtOrBefore(acc.any_days, day);
        m.positive = CountAtOrBefore(acc.positive_days, day);
        m.any_share = static_cast<double>(m.any) / n;
        m.positive_share = static_cast<double>(m.positive) / n;
        return m;
      };
      for (int day : milestone_days) out.milestones.push_back(read_at(day));
      for (int day = 1; day <= scheme.window_days; ++day) out.by_day.push_back(read_at(day));
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
