#include "report/svg_step_chart.h"

#include <algorithm>
#include <cmath>

#include "report/html_escape.h"
#include "report/svg_common.h"

namespace twinprobe::svg {

std::string RenderStepChart(const StepChart& c) {
  size_t label_chars = 6;
  for (const auto& s : c.series) label_chars = std::max(label_chars, CodePoints(s.label));
  label_chars = std::min<size_t>(label_chars, 24);
  const double width = 640, left = 64, right = 24 + 7.0 * static_cast<double>(label_chars) + 52;
  const double top = 20, plot_h = 300, bottom = 50;
  const double height = top + plot_h + bottom;
  const double plot_r = width - right, plot_b = top + plot_h;

  double y_max = c.y_max;
  if (y_max <= 0) {
    for (const auto& s : c.series)
      for (const auto& p : s.points) y_max = std::max(y_max, p.y);
    y_max = NiceUpper(0, y_max > 0 ? y_max : (c.y_percent ? 0.1 : 1.0), 5);
  }
  const LinearScale x{0, c.x_max > 0 ? c.x_max : 1, left, plot_r};
  const LinearScale y{0, y_max, plot_b, top};

  std::string o = OpenSvg(c.id, width, height, c.title, c.description);
  o += "<g class=\"grid\">";
  for (double t : NiceTicks(0, y_max, 5)) {
    o += "<line x1=\"" + Coord(left) + "\" x2=\"" + Coord(plot_r) + "\" y1=\"" + Coord(y(t)) + "\" y2=\"" +
         Coord(y(t)) + "\"/>";
    o += "<text x=\"" + Coord(left - 8) + "\" y=\"" + Coord(y(t) + 4) + "\" text-anchor=\"end\" class=\"tick\">" +
         EscapeHtml(TickLabel(t, c.y_percent)) + "</text>";
  }
  std::vector<double> xticks = c.x_marks.empty() ? NiceTicks(0, c.x_max, 7) : c.x_marks;
  for (double t : xticks) {
    if (t < 0 || t > c.x_max) continue;
    o += "<line x1=\"" + Coord(x(t)) + "\" x2=\"" + Coord(x(t)) + "\" y1=\"" + Coord(top) + "\" y2=\"" +
         Coord(plot_b) + "\"/>";
    o += "<text x=\"" + Coord(x(t)) + "\" y=\"" + Coord(plot_b + 17) + "\" text-anchor=\"middle\" class=\"tick\">" +
         EscapeHtml(TickLabel(t, false)) + "</text>";
  }
  o += "</g>";
  o += "<path class=\"axis\" d=\"M" + Coord(left) + " " + Coord(top) + " L" + Coord(left) + " " + Coord(plot_b) + " L" +
       Coord(plot_r) + " " + Coord(plot_b) + "\" fill=\"none\"/>";
  o += "<text x=\"" + Coord((left + plot_r) / 2) + "\" y=\"" + Coord(plot_b + 40) +
       "\" text-anchor=\"middle\" class=\"axis-label\">" + EscapeHtml(c.x_label) + "</text>";
  o += "<text transform=\"translate(16 " + Coord((top + plot_b) / 2) +
       ") rotate(-90)\" text-anchor=\"middle\" class=\"axis-label\">" + EscapeHtml(c.y_label) + "</text>";

  // Direct labels at the right end, nudged apart when the curves end close together.
  std::vector<std::pair<double, size_t>> ends;
  for (size_t i = 0; i < c.series.size(); ++i) {
    const auto& s = c.series[i];
    double last = 0;
    for (const auto& p : s.points)
      if (p.x <= c.x_max) last = p.y;
    ends.emplace_back(y(std::min(last, y_max)), i);
  }
  std::sort(ends.begin(), ends.end());
  for (size_t k = 1; k < ends.size(); ++k)
    if (ends[k].first - ends[k - 1].first < 16) ends[k].first = ends[k - 1].first + 16;

  for (size_t i = 0; i < c.series.size(); ++i) {
    const auto& s = c.series[i];
    std::string d = "M" + Coord(x(0)) + " " + Coord(y(0));
    for (const auto& p : s.points) {
      if (p.x > c.x_max) break;
      d += " H" + Coord(x(std::max(0.0, p.x))) + " V" + Coord(y(std::min(p.y, y_max)));
    }
    d += " H" + Coord(x(c.x_max));
    const std::string dash = SeriesDash(i);
    o += "<path class=\"series\" d=\"" + d + "\" fill=\"none\" stroke=\"" + SeriesColour(i) +
         "\" stroke-width=\"2.5\"" + (dash.empty() ? "" : " stroke-dasharray=\"" + dash + "\"") + "/>";
    double label_y = 0;
    for (const auto& [ly, idx] : ends)
      if (idx == i) label_y = ly;
    o += Marker(i, plot_r + 10, label_y, 5);
    o += LabelText(s.label, plot_r + 20, label_y + 4.5, "start", 24);
    if (!s.end_text.empty())
      o += "<text x=\"" + Coord(plot_r + 28 + 7.0 * static_cast<double>(std::min<size_t>(CodePoints(s.label), 24))) +
           "\" y=\"" + Coord(label_y + 4.5) + "\" class=\"val\">" + EscapeHtml(s.end_text) + "</text>";
  }
  return o + "</svg>";
}

}  // namespace twinprobe::svg
