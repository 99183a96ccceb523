#pragma once
// Horizontal grouped bar chart: one group per category (e.g. a response
// code, or a listing position band), one bar per series inside it (e.g. an
// arm), each bar with its value printed at its end. With one series it is a
// plain bar chart.
#include <string>
#include <vector>

namespace twinprobe::svg {

struct BarGroup {
  std::string label;                    // user string
  std::vector<double> values;           // one per series; NaN leaves a gap
  std::vector<std::string> value_texts; // printed at the bar ends ("" for none)
};

struct BarChart {
  std::string id;
  std::string title;
  std::string description;
  std::string axis_label;
  bool percent = false;
  double axis_max = 0;                     // 0: a round value above every bar
  std::vector<std::string> series_labels;  // legend (left out for one series)
  bool colour_by_group = false;            // one series: group i takes series colour i
  std::vector<BarGroup> groups;
};

// Requires every value >= 0 (bars start at zero).
std::string RenderBarChart(const BarChart& chart);

}  // namespace twinprobe::svg
