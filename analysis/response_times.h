#pragma once
// What came back to each arm, and how fast: the current outcome code of
// every sent probe, and the time from sending to the first response.
//
// Definitions (docs/report.md, "Responses over time"):
// - A probe counts once it was sent (it has a `sending` row; the earliest
//   sent_at is its send time). Probes never sent are left out.
// - Its first response is the earliest received_at among its current
//   responses (corrections replace what they supersede) whose code is not
//   "none". Its first positive response is the earliest such response whose
//   code the scheme counts as positive.
// - Time is (received_at - sent_at) in days (86,400 s). The observation
//   window (the scheme's window_days) censors: a first response after the
//   window counts as no response ("late"), so every curve ends at the
//   window. This is the empirical cumulative share, not a survival estimate.
//   Probes still within their window at the study clock (SentProbe::open)
//   are left out: their sets are not analysed yet.
// - Probes with a response but no received_at (possible in imported data)
//   are counted in `responses_without_time` and not placed on the curve.
#include <cstdint>
#include <string>
#include <vector>

#include "core/design.h"
#include "core/fieldwork.h"

namespace twinprobe {

// One point of a cumulative step curve: by `day`, `count` probes of the arm
// had their first response, which is `share` of the arm's sent probes.
struct CumulativePoint {
  double day = 0;
  int64_t count = 0;
  double share = 0;
};

// The curves read at a fixed day (a row of the report's table).
struct ResponseMilestone {
  int day = 0;
  int64_t any = 0;  // first response (any code but "none") by this day
  double any_share = 0;
  int64_t positive = 0;  // first positive response by this day
  double positive_share = 0;
};

struct CodeCount {
  std::string code;  // a code of the scheme; "none" also counts probes with no response
  int64_t probes = 0;
};

struct ArmResponseTimes {
  std::string label;
  bool is_reference = false;
  int64_t probes_sent = 0;
  int64_t responded = 0;           // first response within the window
  int64_t responded_positive = 0;  // first positive response within the window
  int64_t late = 0;                // first response after the window (censored)
  int64_t responses_without_time = 0;
  double median_days = -1;         // median time to first response among `responded`; -1 when none
  std::vector<CumulativePoint> any;       // steps of the cumulative share, in day order
  std::vector<CumulativePoint> positive;  // same, first positive response
  std::vector<ResponseMilestone> milestones;
  // The curves read at every whole day 1 … window (the same counts as
  // `milestones`, at each day): what `--json` writes instead of the steps,
  // whose count grows with the distinct response times (one a second in
  // imported data), so the document stays the size of the window.
  std::vector<ResponseMilestone> by_day;
  std::vector<CodeCount> codes;  // current outcome of each sent probe, in the scheme's code order
};

struct ResponseTimes {
  bool available = false;  // false when no probe has a send time (e.g. imported outcomes only)
  int window_days = 0;
  std::vector<ArmResponseTimes> arms;  // reference arm first, then by arm id
};

// From the sent probes core/fieldwork.h reads (their first response times
// and current codes). Never fails on data: missing times are counted, not
// errors.
ResponseTimes ComputeResponseTimes(const Fieldwork& fieldwork, const OutcomeScheme& scheme);

// The days at which the report tabulates the curves: 1, 2, 3, 7, 14, 21,
// 28 … up to the window, and the window itself.
std::vector<int> MilestoneDays(int window_days);

}  // namespace twinprobe
