#include "report/svg_power.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <sstream>

namespace twinprobe {
namespace {

constexpr double kWidth = 720, kHeight = 440;
constexpr double kLeft = 70, kRight = 180, kTop = 50, kBottom = 60;  // margins; legend on the right
const char* const kColours[] = {"#1f5fa8", "#c2561a", "#3b8a3b", "#7a4aa0"};

std::string Escape(const std::string& s) {
  std::string out;
  for (char c : s) {
    switch (c) {
      case '&': out += "&amp;"; break;
      case '<': out += "&lt;"; break;
      case '>': out += "&gt;"; break;
      case '"': out += "&quot;"; break;
      default: out += c;
    }
  }
  return out;
}

std::string Num(double v) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.1f", v);
  return buf;
}

// A "nice" tick step (1, 2 or 5 times a power of ten) giving about 5 ticks.
double TickStep(double span) {
  double raw = span / 5.0;
  double mag = std::pow(10.0, std::floor(std::log10(raw)));
  for (double m : {1.0, 2.0, 5.0, 10.0})
    if (m * mag >= raw) return m * mag;
  return 10 * mag;
}

std::string TickLabel(double v) {
  char buf[32];
  if (std::fabs(v - std::round(v)) < 1e-9) std::snprintf(buf, sizeof buf, "%.0f", v);
  else std::snprintf(buf, sizeof buf, "%g", v);
  return buf;
}

}  // namespace

std::string RenderPowerCurveSvg(const PowerCurveChart& chart) {
  double x_max = 1;
  for (const auto& s : chart.series)
    for (const auto& p : s.xy) x_max = std::max(x_max, p.first);
  if (chart.marker_x) x_max = std::max(x_max, *chart.marker_x);
  const double step = TickStep(x_max);
  x_max = std::ceil(x_max / step) * step;
  const double plot_w = kWidth - kLeft - kRight, plot_h = kHeight - kTop - kBottom;
  auto px = [&](double x) { return kLeft + plot_w * x / x_max; };
  auto py = [&](double y) { return kTop + plot_h * (1.0 - y); };

  std::ostringstream o;
  o << "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"" << kWidth << "\" height=\"" << kHeight
    << "\" viewBox=\"0 0 " << kWidth << " " << kHeight << "\" font-family=\"sans-serif\" font-size=\"12\">\n";
  o << "<title>" << Escape(chart.title) << "</title>\n";
  o << "<rect width=\"100%\" height=\"100%\" fill=\"#ffffff\"/>\n";
  o << "<text x=\"" << kWidth / 2 << "\" y=\"28\" text-anchor=\"middle\" font-size=\"15\" font-weight=\"bold\">"
    << Escape(chart.title) << "</text>\n";
  // Grid and ticks.
  for (int i = 0; i <= 10; i += 2) {
    double y = i / 10.0;
    o << "<line x1=\"" << Num(px(0)) << "\" y1=\"" << Num(py(y)) << "\" x2=\"" << Num(px(x_max)) << "\" y2=\""
      << Num(py(y)) << "\" stroke=\"#e3e3e3\"/>\n";
    o << "<text x=\"" << Num(kLeft - 8) << "\" y=\"" << Num(py(y) + 4) << "\" text-anchor=\"end\">"
      << TickLabel(y) << "</text>\n";
  }
  for (double x = 0; x <= x_max + 1e-9; x += step) {
    o << "<line x1=\"" << Num(px(x)) << "\" y1=\"" << Num(py(0)) << "\" x2=\"" << Num(px(x)) << "\" y2=\""
      << Num(py(0) + 5) << "\" stroke=\"#333333\"/>\n";
    o << "<text x=\"" << Num(px(x)) << "\" y=\"" << Num(py(0) + 19) << "\" text-anchor=\"middle\">" << TickLabel(x)
      << "</text>\n";
  }
  o << "<rect x=\"" << kLeft << "\" y=\"" << kTop << "\" width=\"" << plot_w << "\" height=\"" << plot_h
    << "\" fill=\"none\" stroke=\"#333333\"/>\n";
  // Axis labels.
  o << "<text x=\"" << Num(kLeft + plot_w / 2) << "\" y=\"" << Num(kHeight - 16) << "\" text-anchor=\"middle\">"
    << Escape(chart.x_label) << "</text>\n";
  o << "<text transform=\"translate(20 " << Num(kTop + plot_h / 2) << ") rotate(-90)\" text-anchor=\"middle\">"
    << Escape(chart.y_label) << "</text>\n";
  // Target and marker.
  if (chart.target_power) {
    o << "<line x1=\"" << Num(px(0)) << "\" y1=\"" << Num(py(*chart.target_power)) << "\" x2=\"" << Num(px(x_max))
      << "\" y2=\"" << Num(py(*chart.target_power)) << "\" stroke=\"#888888\" stroke-dasharray=\"6 4\"/>\n";
  }
  if (chart.marker_x) {
    o << "<line x1=\"" << Num(px(*chart.marker_x)) << "\" y1=\"" << Num(py(0)) << "\" x2=\"" << Num(px(*chart.marker_x))
      << "\" y2=\"" << Num(py(1)) << "\" stroke=\"#888888\" stroke-dasharray=\"2 3\"/>\n";
    o << "<text x=\"" << Num(px(*chart.marker_x) + 4) << "\" y=\"" << Num(py(1) + 14) << "\" fill=\"#555555\">"
      << Escape(chart.marker_label) << "</text>\n";
  }
  // Curves and legend.
  for (size_t s = 0; s < chart.series.size(); ++s) {
    const auto& series = chart.series[s];
    const char* colour = kColours[s % 4];
    o << "<polyline fill=\"none\" stroke=\"" << colour << "\" stroke-width=\"2\""
      << (series.dashed ? " stroke-dasharray=\"7 4\"" : "") << " points=\"";
    for (size_t i = 0; i < series.xy.size(); ++i)
      o << (i ? " " : "") << Num(px(series.xy[i].first)) << "," << Num(py(std::clamp(series.xy[i].second, 0.0, 1.0)));
    o << "\"/>\n";
    const double ly = kTop + 16 + 20.0 * static_cast<double>(s);
    o << "<line x1=\"" << Num(kWidth - kRight + 16) << "\" y1=\"" << Num(ly) << "\" x2=\"" << Num(kWidth - kRight + 40)
      << "\" y2=\"" << Num(ly) << "\" stroke=\"" << colour << "\" stroke-width=\"2\""
      << (series.dashed ? " stroke-dasharray=\"7 4\"" : "") << "/>\n";
    o << "<text x=\"" << Num(kWidth - kRight + 46) << "\" y=\"" << Num(ly + 4) << "\">" << Escape(series.name)
      << "</text>\n";
  }
  o << "</svg>\n";
  return o.str();
}

}  // namespace twinprobe
