#pragma once
// A power curve as a self-contained SVG image (no scripts, no external fonts
// or styles): power (0..1) against the number of sets or vacancies, one line
// per method, an optional dashed target line and an optional marker at the
// design's N. Used by `twinprobe power --plot`. Renders only the numbers it
// is given.
#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace twinprobe {

struct PowerCurveSeries {
  std::string name;                             // legend text
  std::vector<std::pair<double, double>> xy;    // (N, power), x increasing
  bool dashed = false;
};

struct PowerCurveChart {
  std::string title;
  std::string x_label;
  std::string y_label = "Power";
  std::vector<PowerCurveSeries> series;
  std::optional<double> target_power;  // horizontal dashed line
  std::optional<double> marker_x;      // vertical line at the design's N
  std::string marker_label;
};

std::string RenderPowerCurveSvg(const PowerCurveChart& chart);

}  // namespace twinprobe
