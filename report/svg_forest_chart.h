#pragma once
// Forest chart: ratio estimates (odds ratios, rate ratios) with intervals on
// a log axis, one row per stratum or comparison, a vertical line at the null
// value (1), and an optional summary row drawn as a diamond.
//
// It takes plain rows so any analysis can feed it. Edge cases are drawn,
// never dropped: an interval limit of 0 or +infinity, or one beyond the
// axis, ends in an arrow at the axis edge; an estimate of 0 or +infinity is
// an arrowhead at that edge; a row whose estimate is NaN (not estimable,
// e.g. no discordant pairs) shows the words "not estimable".
#include <cmath>
#include <optional>
#include <string>
#include <vector>

namespace twinprobe::svg {

struct ForestRow {
  std::string label;    // user string
  double estimate = NAN;
  double low = NAN;     // 0 and +infinity allowed
  double high = NAN;
  std::optional<double> p;  // shown in the p column when present
  bool summary = false;     // drawn as a diamond spanning the interval
};

struct ForestChart {
  std::string id;
  std::string title;
  std::string description;
  std::string axis_label = "odds ratio (log scale)";
  std::string left_note;   // under the axis, left of 1, e.g. "favours coastal"
  std::string right_note;  // right of 1
  std::string p_header = "p";
  double null_value = 1;
  double axis_floor = 0.01;  // the axis never extends beyond [floor, ceiling]
  double axis_ceiling = 100;
  std::vector<ForestRow> rows;
};

// The SVG element.
std::string RenderForestChart(const ForestChart& chart);

// "1.74 (1.33 to 2.30)", "∞" for infinity, "not estimable" for NaN.
std::string FormatRatioInterval(double estimate, double low, double high);
std::string FormatRatio(double v);

}  // namespace twinprobe::svg
