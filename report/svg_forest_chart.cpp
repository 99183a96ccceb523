#include "report/svg_forest_chart.h"

#include <algorithm>
#include <cstdio>

#include "report/html_escape.h"
#include "report/svg_common.h"
#include "report/text_report.h"

namespace twinprobe::svg {
namespace {

// The palette's first series colour (Okabe–Ito blue) for the rows, its
// black for the summary diamond: colours come only from svg_common.
constexpr size_t kRowSeries = 0, kSummarySeries = 6;

// A filled arrowhead whose tip is at (x, y), pointing left (dir = -1) or right (+1).
std::string ArrowHead(double x, double y, int dir, const std::string& colour) {
  const double back = x - dir * 9.0;
  return "<path class=\"arrow\" d=\"M" + Coord(x) + " " + Coord(y) + " L" + Coord(back) + " " + Coord(y - 5.5) + " L" +
         Coord(back) + " " + Coord(y + 5.5) + " Z\" fill=\"" + colour + "\"/>";
}

}  // namespace

std::string FormatRatio(double v) {
  if (std::isnan(v)) return "not estimable";
  if (std::isinf(v)) return v > 0 ? "\u221E" : "-\u221E";
  char buf[32];
  if (v != 0 && (v < 0.01 || v >= 1000)) std::snprintf(buf, sizeof buf, "%.2e", v);
  else std::snprintf(buf, sizeof buf, "%.3g", v);
  return buf;
}

std::string FormatRatioInterval(double estimate, double low, double high) {
  if (std::isnan(estimate)) return "not estimable";
  std::string s = FormatRatio(estimate);
  if (!std::isnan(low) && !std::isnan(high)) s += " (" + FormatRatio(low) + " to " + FormatRatio(high) + ")";
  return s;
}

std::string RenderForestChart(const ForestChart& c) {
  size_t label_chars = 8;
  for (const auto& r : c.rows) label_chars = std::max(label_chars, CodePoints(r.label));
  label_chars = std::min<size_t>(label_chars, 30);
  const double width = 760, left = 16 + 7.0 * static_cast<double>(label_chars), right_cols = 230;
  const double plot_l = left, plot_r = width - right_cols;
  const double top = 30, row_h = 28, bottom = 62;
  const size_t n = std::max<size_t>(c.rows.size(), 1);
  const double plot_bottom = top + row_h * static_cast<double>(n);
  const double height = plot_bottom + bottom;

  // Axis: every finite, positive value, and the null value, within the
  // floor and ceiling, widened to 1-2-5 ticks.
  double lo = c.null_value, hi = c.null_value;
  for (const auto& r : c.rows)
    for (double v : {r.estimate, r.low, r.high})
      if (std::isfinite(v) && v > 0) lo = std::min(lo, v), hi = std::max(hi, v);
  lo = std::max(lo, c.axis_floor);
  hi = std::min(hi, c.axis_ceiling);
  double axis_lo = c.axis_floor, axis_hi = c.axis_ceiling;
  for (double t : LogTicks(c.axis_floor, c.axis_ceiling)) {
    if (t <= lo * (1 + 1e-9)) axis_lo = t;
    if (t >= hi * (1 - 1e-9) && axis_hi == c.axis_ceiling) axis_hi = t;
  }
  if (axis_hi <= axis_lo) axis_hi = axis_lo * 10;
  const LogScale x{axis_lo, axis_hi, plot_l, plot_r};
  auto inside = [&](double v) { return v >= axis_lo * (1 - 1e-9) && v <= axis_hi * (1 + 1e-9); };

  std::string o = OpenSvg(c.id, width, height, c.title, c.description);
  // Column heads.
  o += "<text x=\"" + Coord(plot_r + 12) + "\" y=\"18\" class=\"head\">estimate (interval)</text>";
  o += "<text x=\"" + Coord(width - 8) + "\" y=\"18\" text-anchor=\"end\" class=\"head\">" + EscapeHtml(c.p_header) +
       "</text>";
  // Grid, ticks and the null line.
  o += "<g class=\"grid\">";
  for (double t : LogTicks(axis_lo, axis_hi)) {
    o += "<line x1=\"" + Coord(x(t)) + "\" x2=\"" + Coord(x(t)) + "\" y1=\"" + Coord(top) + "\" y2=\"" +
         Coord(plot_bottom) + "\"/>";
    o += "<text x=\"" + Coord(x(t)) + "\" y=\"" + Coord(plot_bottom + 17) + "\" text-anchor=\"middle\" class=\"tick\">" +
         EscapeHtml(TickLabel(t, false)) + "</text>";
  }
  o += "</g>";
  o += "<line class=\"axis\" x1=\"" + Coord(plot_l) + "\" x2=\"" + Coord(plot_r) + "\" y1=\"" + Coord(plot_bottom) +
       "\" y2=\"" + Coord(plot_bottom) + "\"/>";
  const double xnull = x(c.null_value);
  o += "<line class=\"null\" x1=\"" + Coord(xnull) + "\" x2=\"" + Coord(xnull) + "\" y1=\"" + Coord(top - 6) +
       "\" y2=\"" + Coord(plot_bottom) + "\"/>";
  o += "<text x=\"" + Coord((plot_l + plot_r) / 2) + "\" y=\"" + Coord(plot_bottom + 36) +
       "\" text-anchor=\"middle\" class=\"axis-label\">" + EscapeHtml(c.axis_label) + "</text>";
  if (!c.left_note.empty())
    o += LabelText("\u2190 " + c.left_note, xnull - 6, plot_bottom + 54, "end", 40, "note");
  if (!c.right_note.empty())
    o += LabelText(c.right_note + " \u2192", xnull + 6, plot_bottom + 54, "start", 40, "note");

  for (size_t i = 0; i < c.rows.size(); ++i) {
    const ForestRow& r = c.rows[i];
    const double y = top + row_h * (static_cast<double>(i) + 0.5);
    const std::string colour = SeriesColour(r.summary ? kSummarySeries : kRowSeries);
    o += std::string("<g class=\"row") + (r.summary ? " summary" : "") + "\">";
    if (r.summary)
      o += "<line class=\"sep\" x1=\"8\" x2=\"" + Coord(width - 8) + "\" y1=\"" + Coord(y - row_h / 2) + "\" y2=\"" +
           Coord(y - row_h / 2) + "\"/>";
    o += LabelText(r.label, left - 10, y + 4.5, "end", 30, r.summary ? "lbl strong" : "lbl");
    if (std::isnan(r.estimate)) {
      o += "<text x=\"" + Coord(xnull + 8) + "\" y=\"" + Coord(y + 4.5) + "\" class=\"na\">not estimable</text>";
    } else {
      // Interval: a limit of 0 or infinity, or off the axis, ends in an arrow.
      bool diamond = false;
      if (!std::isnan(r.low) && !std::isnan(r.high)) {
        const bool low_off = !(r.low > 0) || !inside(r.low);
        const bool high_off = std::isinf(r.high) || !inside(r.high);
        const double x0 = low_off ? plot_l : x(r.low);
        const double x1 = high_off ? plot_r : x(r.high);
        if (r.summary && !low_off && !high_off && std::isfinite(r.estimate) && inside(r.estimate)) {
          const double xe = x(r.estimate);
          diamond = true;
          o += "<path d=\"M" + Coord(x0) + " " + Coord(y) + " L" + Coord(xe) + " " + Coord(y - 8) + " L" + Coord(x1) +
               " " + Coord(y) + " L" + Coord(xe) + " " + Coord(y + 8) + " Z\" fill=\"" + colour + "\"/>";
        } else {
          o += "<line x1=\"" + Coord(x0) + "\" x2=\"" + Coord(x1) + "\" y1=\"" + Coord(y) + "\" y2=\"" + Coord(y) +
               "\" stroke=\"" + colour + "\" stroke-width=\"2.5\"/>";
          if (low_off) o += ArrowHead(plot_l - 4, y, -1, colour);
          if (high_off) o += ArrowHead(plot_r + 4, y, +1, colour);
        }
      }
      // Estimate: a square, or an arrowhead at the edge when 0, infinite or off the axis.
      if (!diamond) {
        if (!(r.estimate > 0) || r.estimate < axis_lo) o += ArrowHead(plot_l - 4, y, -1, colour);
        else if (std::isinf(r.estimate) || r.estimate > axis_hi) o += ArrowHead(plot_r + 4, y, +1, colour);
        else
          o += "<rect x=\"" + Coord(x(r.estimate) - 5.5) + "\" y=\"" + Coord(y - 5.5) +
               "\" width=\"11\" height=\"11\" fill=\"" + colour + "\"/>";
      }
    }
    o += "<text x=\"" + Coord(plot_r + 12) + "\" y=\"" + Coord(y + 4.5) + "\" class=\"val\">" +
         EscapeHtml(FormatRatioInterval(r.estimate, r.low, r.high)) + "</text>";
    if (r.p)
      o += "<text x=\"" + Coord(width - 8) + "\" y=\"" + Coord(y + 4.5) + "\" text-anchor=\"end\" class=\"val\">" +
           EscapeHtml(FormatP(*r.p)) + "</text>";
    o += "</g>";
  }
  return o + "</svg>";
}

}  // namespace twinprobe::svg
