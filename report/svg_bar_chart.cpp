#include "report/svg_bar_chart.h"

#include <algorithm>
#include <cmath>

#include "report/html_escape.h"
#include "report/svg_common.h"

namespace twinprobe::svg {

std::string RenderBarChart(const BarChart& c) {
  const size_t n_series = std::max<size_t>(c.series_labels.size(), 1);
  size_t label_chars = 6;
  for (const auto& g : c.groups) label_chars = std::max(label_chars, CodePoints(g.label));
  label_chars = std::min<size_t>(label_chars, 28);
  const double width = 640, left = 16 + 7.2 * static_cast<double>(label_chars), right = 110;
  const bool legend = c.series_labels.size() > 1;
  const double top = legend ? 36 : 12, bar_h = n_series == 1 ? 22 : 15, gap = 16;
  const double group_h = bar_h * static_cast<double>(n_series) + gap;
  const double plot_b = top + group_h * static_cast<double>(std::max<size_t>(c.groups.size(), 1));
  const double height = plot_b + 48;

  double hi = c.axis_max;
  if (hi <= 0) {
    for (const auto& g : c.groups)
      for (double v : g.values)
        if (std::isfinite(v)) hi = std::max(hi, v);
    hi = NiceUpper(0, hi > 0 ? hi : (c.percent ? 0.1 : 1.0), 5);
  }
  const LinearScale x{0, hi, left, width - right};

  std::string o = OpenSvg(c.id, width, height, c.title, c.description);
  if (legend) {
    double lx = left;
    for (size_t s = 0; s < c.series_labels.size(); ++s) {
      o += "<rect x=\"" + Coord(lx) + "\" y=\"8\" width=\"14\" height=\"14\" fill=\"" + SeriesColour(s) + "\"/>";
      o += LabelText(c.series_labels[s], lx + 20, 20, "start", 28);
      lx += 40 + 7.0 * static_cast<double>(std::min<size_t>(CodePoints(c.series_labels[s]), 28));
    }
  }
  o += "<g class=\"grid\">";
  for (double t : NiceTicks(0, hi, 5)) {
    o += "<line x1=\"" + Coord(x(t)) + "\" x2=\"" + Coord(x(t)) + "\" y1=\"" + Coord(top) + "\" y2=\"" + Coord(plot_b) +
         "\"/>";
    o += "<text x=\"" + Coord(x(t)) + "\" y=\"" + Coord(plot_b + 17) + "\" text-anchor=\"middle\" class=\"tick\">" +
         EscapeHtml(TickLabel(t, c.percent)) + "</text>";
  }
  o += "</g>";
  o += "<text x=\"" + Coord((left + width - right) / 2) + "\" y=\"" + Coord(plot_b + 38) +
       "\" text-anchor=\"middle\" class=\"axis-label\">" + EscapeHtml(c.axis_label) + "</text>";

  for (size_t gi = 0; gi < c.groups.size(); ++gi) {
    const BarGroup& g = c.groups[gi];
    const double gy = top + group_h * static_cast<double>(gi) + gap / 2;
    o += "<g class=\"row\">";
    o += LabelText(g.label, left - 10, gy + bar_h * static_cast<double>(n_series) / 2 + 4.5, "end", 28);
    for (size_t s = 0; s < g.values.size() && s < n_series; ++s) {
      const double v = g.values[s];
      const double y = gy + bar_h * static_cast<double>(s);
      if (std::isfinite(v)) {
        const double w = std::max(0.0, x(std::min(v, hi)) - left);
        o += "<rect x=\"" + Coord(left) + "\" y=\"" + Coord(y + 1) + "\" width=\"" + Coord(std::max(w, 1.0)) +
             "\" height=\"" + Coord(bar_h - 2) + "\" fill=\"" + SeriesColour(c.colour_by_group ? gi : s) + "\"/>";
      }
      if (s < g.value_texts.size() && !g.value_texts[s].empty())
        o += "<text x=\"" + Coord(x(std::isfinite(v) ? std::min(v, hi) : 0) + 6) + "\" y=\"" + Coord(y + bar_h - 3.5) +
             "\" class=\"val small\">" + EscapeHtml(g.value_texts[s]) + "</text>";
    }
    o += "</g>";
  }
  o += "<line class=\"axis\" x1=\"" + Coord(left) + "\" x2=\"" + Coord(left) + "\" y1=\"" + Coord(top) + "\" y2=\"" +
       Coord(plot_b) + "\"/>";
  return o + "</svg>";
}

}  // namespace twinprobe::svg
