#include "report/svg_interval_chart.h"

#include <algorithm>

#include "report/html_escape.h"
#include "report/svg_common.h"

namespace twinprobe::svg {

std::string RenderIntervalChart(const IntervalChart& c) {
  size_t label_chars = 6;
  for (const auto& r : c.rows) label_chars = std::max(label_chars, CodePoints(r.label));
  label_chars = std::min<size_t>(label_chars, 28);
  const double width = 640, left = 16 + 7.2 * static_cast<double>(label_chars), right = 180;
  const double top = 14, row_h = 42, bottom = 52;
  const double height = top + row_h * static_cast<double>(std::max<size_t>(c.rows.size(), 1)) + bottom;

  double hi = c.axis_max;
  if (std::isnan(hi)) {
    hi = c.axis_min;
    for (const auto& r : c.rows)
      for (double v : {r.estimate, r.high})
        if (std::isfinite(v)) hi = std::max(hi, v);
    if (hi <= c.axis_min) hi = c.axis_min + (c.percent ? 0.1 : 1.0);
    hi = NiceUpper(c.axis_min, hi, 5);
  }
  const LinearScale x{c.axis_min, hi, left, width - right};
  auto clamp = [&](double v) { return x(std::clamp(v, c.axis_min, hi)); };
  const double plot_bottom = top + row_h * static_cast<double>(std::max<size_t>(c.rows.size(), 1));

  std::string o = OpenSvg(c.id, width, height, c.title, c.description);
  o += "<g class=\"grid\">";
  for (double t : NiceTicks(c.axis_min, hi, 5)) {
    o += "<line x1=\"" + Coord(x(t)) + "\" x2=\"" + Coord(x(t)) + "\" y1=\"" + Coord(top) + "\" y2=\"" +
         Coord(plot_bottom) + "\"/>";
    o += "<text x=\"" + Coord(x(t)) + "\" y=\"" + Coord(plot_bottom + 18) + "\" text-anchor=\"middle\" class=\"tick\">" +
         EscapeHtml(TickLabel(t, c.percent)) + "</text>";
  }
  o += "</g><line class=\"axis\" x1=\"" + Coord(left) + "\" x2=\"" + Coord(width - right) + "\" y1=\"" +
       Coord(plot_bottom) + "\" y2=\"" + Coord(plot_bottom) + "\"/>";
  o += "<text x=\"" + Coord((left + width - right) / 2) + "\" y=\"" + Coord(plot_bottom + 40) +
       "\" text-anchor=\"middle\" class=\"axis-label\">" + EscapeHtml(c.axis_label) + "</text>";

  for (size_t i = 0; i < c.rows.size(); ++i) {
    const IntervalRow& r = c.rows[i];
    const double y = top + row_h * (static_cast<double>(i) + 0.5);
    const std::string colour = SeriesColour(i);
    o += "<g class=\"row\">";
    o += LabelText(r.label, left - 10, y + 4.5, "end", 28);
    if (std::isfinite(r.low) && std::isfinite(r.high)) {
      const double x0 = clamp(r.low), x1 = clamp(r.high);
      o += "<line x1=\"" + Coord(x0) + "\" x2=\"" + Coord(x1) + "\" y1=\"" + Coord(y) + "\" y2=\"" + Coord(y) +
           "\" stroke=\"" + colour + "\" stroke-width=\"3\"/>";
      for (double xe : {x0, x1})
        o += "<line x1=\"" + Coord(xe) + "\" x2=\"" + Coord(xe) + "\" y1=\"" + Coord(y - 8) + "\" y2=\"" +
             Coord(y + 8) + "\" stroke=\"" + colour + "\" stroke-width=\"2\"/>";
    }
    if (std::isfinite(r.estimate)) o += Marker(i, clamp(r.estimate), y, 7);
    o += "<text x=\"" + Coord(width - right + 12) + "\" y=\"" + Coord(y + 4.5) + "\" class=\"val\">" +
         EscapeHtml(r.value_text) + "</text>";
    o += "</g>";
  }
  return o + "</svg>";
}

}  // namespace twinprobe::svg
