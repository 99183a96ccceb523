#pragma once
// Cumulative step chart: for each series, a right-continuous step function
// that starts at (0, 0) and rises at each point, drawn to x_max (e.g. the
// share of applications answered by day d of the observation window).
// Series differ by colour and dash and carry a direct label at their end.
#include <string>
#include <vector>

namespace twinprobe::svg {

struct StepPoint {
  double x = 0;  // where the step happens
  double y = 0;  // the value from x on
};

struct StepSeries {
  std::string label;  // user string
  std::vector<StepPoint> points;  // increasing x
  std::string end_text;           // printed after the label at the curve's end, e.g. "41.3%"
};

struct StepChart {
  std::string id;
  std::string title;
  std::string description;
  std::string x_label;
  std::string y_label;
  double x_max = 1;          // the curves run to here
  bool y_percent = false;
  double y_max = 0;          // 0: a round value above every series
  std::vector<double> x_marks;  // optional vertical guides (e.g. day 7, 14)
  std::vector<StepSeries> series;
};

std::string RenderStepChart(const StepChart& chart);

}  // namespace twinprobe::svg
