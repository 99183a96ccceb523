#pragma once
// Shared pieces of the report's SVG charts: the colour-blind-safe palette,
// scales and ticks, and the accessible <svg> envelope.
//
// Palette: Okabe & Ito (2008), "Color Universal Design (CUD): how to make
// figures and presentations that are friendly to colorblind people"
// (jfly.uni-koeln.de/color). Series also differ by marker shape and line
// dash, so a chart reads in greyscale and for every kind of colour vision.
#include <string>
#include <string_view>
#include <vector>

#include "core/text.h"

namespace twinprobe::svg {

struct NamedColour {
  const char* name;
  const char* hex;
};

// The eight Okabe–Ito colours, in their published order: black, orange, sky
// blue, bluish green, yellow, blue, vermillion, reddish purple.
const std::vector<NamedColour>& OkabeIto();

// Series i: colour (blue, vermillion, bluish green, reddish purple, orange,
// sky blue, black; yellow is left out, it is too light on white paper),
// dash pattern ("" = solid) and marker shape.
std::string SeriesColour(size_t i);
std::string SeriesDash(size_t i);
// A marker centred on (x, y) with "radius" r: circle, square, triangle,
// diamond … by series.
std::string Marker(size_t i, double x, double y, double r);

// A number as an SVG coordinate (at most 2 decimals, no exponent).
std::string Coord(double v);

// A linear map from the data interval [d0, d1] to pixels [r0, r1].
struct LinearScale {
  double d0 = 0, d1 = 1, r0 = 0, r1 = 1;
  double operator()(double v) const;
};

// A log10 map from [d0, d1] (both > 0) to pixels [r0, r1].
struct LogScale {
  double d0 = 0.1, d1 = 10, r0 = 0, r1 = 1;
  double operator()(double v) const;
};

// Round tick values covering [lo, hi] with about `target` steps of 1, 2 or
// 5 times a power of ten.
std::vector<double> NiceTicks(double lo, double hi, int target);
// The smallest tick of NiceTicks(lo, ·, target)'s step that is >= hi.
double NiceUpper(double lo, double hi, int target);
// Ticks for a log axis: 1, 2, 5 times powers of ten within [lo, hi].
std::vector<double> LogTicks(double lo, double hi);
// A tick label: "0.5", "2", "10", "25%".
std::string TickLabel(double v, bool percent);

// Opens an accessible chart: <svg role="img" aria-labelledby="ID-title ID-desc">
// with <title> and <desc> (both escaped). Close with "</svg>".
std::string OpenSvg(const std::string& id, double width, double height, std::string_view title,
                    std::string_view description);

// A <text> element holding one user string on its own (so a bidi override
// inside it cannot reorder anything else), shortened to `max_chars` with an
// ellipsis; the full string goes into a child <title> when shortened.
std::string LabelText(std::string_view label, double x, double y, const char* anchor, size_t max_chars,
                      const char* css_class = "lbl");

// Number of Unicode code points (for label widths): the one definition in
// core/text.h.
using ::twinprobe::CodePoints;

}  // namespace twinprobe::svg
