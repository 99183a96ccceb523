#pragma once
// Dot-and-interval chart: one row per item (e.g. an arm's positive-callback
// rate with its confidence interval) on a shared linear axis. Each row has
// its own colour and marker shape (report/svg_common.h); the value text is
// printed at the right so the chart reads without the axis.
#include <cmath>
#include <string>
#include <vector>

namespace twinprobe::svg {

struct IntervalRow {
  std::string label;       // user string (escaped and isolated)
  double estimate = 0;
  double low = 0;          // interval limits; NaN draws no interval
  double high = 0;
  std::string value_text;  // e.g. "27.5% (23.2% to 32.1%)"
};

struct IntervalChart {
  std::string id;           // unique in the page
  std::string title;        // <title>
  std::string description;  // <desc>: the chart in words, with its numbers
  std::string axis_label;
  bool percent = false;     // tick labels as percentages
  double axis_min = 0;
  double axis_max = NAN;    // NaN: a round value above every limit
  std::vector<IntervalRow> rows;
};

// The SVG element. Rows keep their order; values outside the axis are
// clamped to its ends.
std::string RenderIntervalChart(const IntervalChart& chart);

}  // namespace twinprobe::svg
