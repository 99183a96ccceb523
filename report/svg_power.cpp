#include "report/svg_power.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <sstream>

#include "report/html_escape.h"
#include "report/svg_common.h"

namespace twinprobe {
namespace {

constexpr double kWidth = 720, kHeight = 440;
constexpr double kLeft = 70, kRight = 180, kTop = 50, kBottom = 60;  // margins; legend on the right
// Neutral inks of the report's stylesheet (report/html_style.cpp): this
// image stands alone, without that CSS, so they are written out here.
constexpr char kInk[] = "#1b1b1b", kMuted[] = "#555555", kGrid[] = "#e4e4e4", kGuide[] = "#888888";

}  // namespace

std::string RenderPowerCurveSvg(const PowerCurveChart& chart) {
  double x_max = 1;
  for (const auto& s : chart.series)
    for (const auto& p : s.xy) x_max = std::max(x_max, p.first);
  if (chart.marker_x) x_max = std::max(x_max, *chart.marker_x);
  x_max = svg::NiceUpper(0, x_max, 5);
  const double plot_w = kWidth - kLeft - kRight, plot_h = kHeight - kTop - kBottom;
  auto px = [&](double x) { return kLeft + plot_w * x / x_max; };
  auto py = [&](double y) { return kTop + plot_h * (1.0 - y); };

  std::ostringstream o;
  o << "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"" << kWidth << "\" height=\"" << kHeight
    << "\" viewBox=\"0 0 " << kWidth << " " << kHeight << "\" font-family=\"sans-serif\" font-size=\"12\">\n";
  o << "<title>" << EscapeHtml(chart.title) << "</title>\n";
  o << "<rect width=\"100%\" height=\"100%\" fill=\"#ffffff\"/>\n";
  o << "<text x=\"" << kWidth / 2 << "\" y=\"28\" text-anchor=\"middle\" font-size=\"15\" font-weight=\"bold\">"
    << EscapeHtml(chart.title) << "</text>\n";
  // Grid and ticks.
  for (int i = 0; i <= 10; i += 2) {
    double y = i / 10.0;
    o << "<line x1=\"" << svg::Coord(px(0)) << "\" y1=\"" << svg::Coord(py(y)) << "\" x2=\"" << svg::Coord(px(x_max)) << "\" y2=\""
      << svg::Coord(py(y)) << "\" stroke=\"" << kGrid << "\"/>\n";
    o << "<text x=\"" << svg::Coord(kLeft - 8) << "\" y=\"" << svg::Coord(py(y) + 4) << "\" text-anchor=\"end\">"
      << svg::TickLabel(y, false) << "</text>\n";
  }
  for (double x : svg::NiceTicks(0, x_max, 5)) {
    o << "<line x1=\"" << svg::Coord(px(x)) << "\" y1=\"" << svg::Coord(py(0)) << "\" x2=\"" << svg::Coord(px(x)) << "\" y2=\""
      << svg::Coord(py(0) + 5) << "\" stroke=\"" << kInk << "\"/>\n";
    o << "<text x=\"" << svg::Coord(px(x)) << "\" y=\"" << svg::Coord(py(0) + 19) << "\" text-anchor=\"middle\">" << svg::TickLabel(x, false)
      << "</text>\n";
  }
  o << "<rect x=\"" << kLeft << "\" y=\"" << kTop << "\" width=\"" << plot_w << "\" height=\"" << plot_h
    << "\" fill=\"none\" stroke=\"" << kInk << "\"/>\n";
  // Axis labels.
  o << "<text x=\"" << svg::Coord(kLeft + plot_w / 2) << "\" y=\"" << svg::Coord(kHeight - 16) << "\" text-anchor=\"middle\">"
    << EscapeHtml(chart.x_label) << "</text>\n";
  o << "<text transform=\"translate(20 " << svg::Coord(kTop + plot_h / 2) << ") rotate(-90)\" text-anchor=\"middle\">"
    << EscapeHtml(chart.y_label) << "</text>\n";
  // Target and marker.
  if (chart.target_power) {
    o << "<line x1=\"" << svg::Coord(px(0)) << "\" y1=\"" << svg::Coord(py(*chart.target_power)) << "\" x2=\"" << svg::Coord(px(x_max))
      << "\" y2=\"" << svg::Coord(py(*chart.target_power)) << "\" stroke=\"" << kGuide << "\" stroke-dasharray=\"6 4\"/>\n";
  }
  if (chart.marker_x) {
    o << "<line x1=\"" << svg::Coord(px(*chart.marker_x)) << "\" y1=\"" << svg::Coord(py(0)) << "\" x2=\"" << svg::Coord(px(*chart.marker_x))
      << "\" y2=\"" << svg::Coord(py(1)) << "\" stroke=\"" << kGuide << "\" stroke-dasharray=\"2 3\"/>\n";
    o << "<text x=\"" << svg::Coord(px(*chart.marker_x) + 4) << "\" y=\"" << svg::Coord(py(1) + 14) << "\" fill=\"" << kMuted << "\">"
      << EscapeHtml(chart.marker_label) << "</text>\n";
  }
  // Curves and legend.
  for (size_t s = 0; s < chart.series.size(); ++s) {
    const auto& series = chart.series[s];
    const std::string colour = svg::SeriesColour(s);
    o << "<polyline fill=\"none\" stroke=\"" << colour << "\" stroke-width=\"2\""
      << (series.dashed ? " stroke-dasharray=\"7 4\"" : "") << " points=\"";
    for (size_t i = 0; i < series.xy.size(); ++i)
      o << (i ? " " : "") << svg::Coord(px(series.xy[i].first)) << "," << svg::Coord(py(std::clamp(series.xy[i].second, 0.0, 1.0)));
    o << "\"/>\n";
    const double ly = kTop + 16 + 20.0 * static_cast<double>(s);
    o << "<line x1=\"" << svg::Coord(kWidth - kRight + 16) << "\" y1=\"" << svg::Coord(ly) << "\" x2=\"" << svg::Coord(kWidth - kRight + 40)
      << "\" y2=\"" << svg::Coord(ly) << "\" stroke=\"" << colour << "\" stroke-width=\"2\""
      << (series.dashed ? " stroke-dasharray=\"7 4\"" : "") << "/>\n";
    o << "<text x=\"" << svg::Coord(kWidth - kRight + 46) << "\" y=\"" << svg::Coord(ly + 4) << "\">" << EscapeHtml(series.name)
      << "</text>\n";
  }
  o << "</svg>\n";
  return o.str();
}

}  // namespace twinprobe
