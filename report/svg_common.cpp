#include "report/svg_common.h"

#include <cmath>
#include <cstdio>

#include "report/html_escape.h"

namespace twinprobe::svg {

const std::vector<NamedColour>& OkabeIto() {
  static const std::vector<NamedColour> colours = {
      {"black", "#000000"},       {"orange", "#E69F00"}, {"sky blue", "#56B4E9"},   {"bluish green", "#009E73"},
      {"yellow", "#F0E442"},      {"blue", "#0072B2"},   {"vermillion", "#D55E00"}, {"reddish purple", "#CC79A7"},
  };
  return colours;
}

std::string SeriesColour(size_t i) {
  static const char* order[] = {"#0072B2", "#D55E00", "#009E73", "#CC79A7", "#E69F00", "#56B4E9", "#000000"};
  return order[i % 7];
}

std::string SeriesDash(size_t i) {
  static const char* dashes[] = {"", "7 4", "2 3", "9 3 2 3"};
  return dashes[i % 4];
}

std::string Marker(size_t i, double x, double y, double r) {
  const std::string fill = "fill=\"" + SeriesColour(i) + "\"";
  switch (i % 4) {
    case 0:
      return "<circle cx=\"" + Coord(x) + "\" cy=\"" + Coord(y) + "\" r=\"" + Coord(r) + "\" " + fill + "/>";
    case 1:
      return "<rect x=\"" + Coord(x - r) + "\" y=\"" + Coord(y - r) + "\" width=\"" + Coord(2 * r) + "\" height=\"" +
             Coord(2 * r) + "\" " + fill + "/>";
    case 2:
      return "<path d=\"M" + Coord(x) + " " + Coord(y - r * 1.2) + " L" + Coord(x + r * 1.15) + " " +
             Coord(y + r * 0.9) + " L" + Coord(x - r * 1.15) + " " + Coord(y + r * 0.9) + " Z\" " + fill + "/>";
    default:
      return "<path d=\"M" + Coord(x) + " " + Coord(y - r * 1.3) + " L" + Coord(x + r * 1.3) + " " + Coord(y) + " L" +
             Coord(x) + " " + Coord(y + r * 1.3) + " L" + Coord(x - r * 1.3) + " " + Coord(y) + " Z\" " + fill + "/>";
  }
}

std::string Coord(double v) {
  if (!std::isfinite(v)) v = 0;
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.2f", v);
  std::string s = buf;
  while (!s.empty() && s.back() == '0') s.pop_back();
  if (!s.empty() && s.back() == '.') s.pop_back();
  if (s == "-0") s = "0";
  return s;
}

double LinearScale::operator()(double v) const {
  if (d1 == d0) return r0;
  return r0 + (v - d0) / (d1 - d0) * (r1 - r0);
}

double LogScale::operator()(double v) const {
  const double l0 = std::log10(d0), l1 = std::log10(d1);
  if (l1 == l0) return r0;
  return r0 + (std::log10(v) - l0) / (l1 - l0) * (r1 - r0);
}

namespace {
double NiceStep(double lo, double hi, int target) {
  const double raw = (hi - lo) / target;
  const double mag = std::pow(10.0, std::floor(std::log10(raw)));
  for (double m : {1.0, 2.0, 2.5, 5.0})
    if (m * mag >= raw * (1 - 1e-9)) return m * mag;
  return 10.0 * mag;
}
}  // namespace

double NiceUpper(double lo, double hi, int target) {
  if (!(hi > lo) || target < 1) return hi;
  const double step = NiceStep(lo, hi, target);
  return std::ceil(hi / step - 1e-9) * step;
}

std::vector<double> NiceTicks(double lo, double hi, int target) {
  std::vector<double> ticks;
  if (!(hi > lo) || target < 1) return {lo};
  const double step = NiceStep(lo, hi, target);
  const double first = std::ceil(lo / step - 1e-9) * step;
  for (double t = first; t <= hi + step * 1e-9; t += step) ticks.push_back(std::abs(t) < step * 1e-9 ? 0.0 : t);
  return ticks;
}

std::vector<double> LogTicks(double lo, double hi) {
  std::vector<double> ticks;
  for (int e = -6; e <= 6; ++e)
    for (double m : {1.0, 2.0, 5.0}) {
      const double t = m * std::pow(10.0, e);
      if (t >= lo * (1 - 1e-9) && t <= hi * (1 + 1e-9)) ticks.push_back(t);
    }
  return ticks;
}

std::string TickLabel(double v, bool percent) {
  char buf[32];
  if (percent) {
    std::snprintf(buf, sizeof buf, "%.4g%%", v * 100.0);
  } else {
    std::snprintf(buf, sizeof buf, "%.4g", v);
  }
  return buf;
}

std::string OpenSvg(const std::string& id, double width, double height, std::string_view title,
                    std::string_view description) {
  const std::string eid = EscapeHtml(id);
  return "<svg class=\"chart\" id=\"" + eid + "\" viewBox=\"0 0 " + Coord(width) +
         " " + Coord(height) + "\" width=\"" + Coord(width) + "\" height=\"" + Coord(height) +
         "\" role=\"img\" aria-labelledby=\"" + eid + "-title " + eid + "-desc\">" + "<title id=\"" + eid + "-title\">" +
         EscapeHtml(title) + "</title><desc id=\"" + eid + "-desc\">" + EscapeHtml(description) + "</desc>";
}

std::string LabelText(std::string_view label, double x, double y, const char* anchor, size_t max_chars,
                      const char* css_class) {
  std::string shown(label);
  bool shortened = false;
  if (CodePoints(label) > max_chars && max_chars > 1) {
    // Cut on a code point boundary.
    size_t cps = 0, i = 0;
    for (; i < label.size(); ++i) {
      if ((static_cast<unsigned char>(label[i]) & 0xC0) != 0x80) {
        if (cps == max_chars - 1) break;
        ++cps;
      }
    }
    shown = std::string(label.substr(0, i)) + "\u2026";
    shortened = true;
  }
  std::string o = "<text x=\"" + Coord(x) + "\" y=\"" + Coord(y) + "\" text-anchor=\"" + anchor + "\" class=\"" +
                  css_class + "\">";
  if (shortened) o += "<title>" + EscapeHtml(label) + "</title>";
  return o + EscapeHtml(shown) + "</text>";
}

}  // namespace twinprobe::svg
