// The power curve uses the report's one SVG toolkit: its escaping and its
// colour-blind-safe palette (Okabe & Ito 2008).
#include "report/svg_power.h"

#include <catch2/catch.hpp>

#include "report/svg_common.h"

using namespace twinprobe;

TEST_CASE("svg power: labels are escaped as in the report and series take the report's palette") {
  PowerCurveChart chart;
  chart.title = "Power for <Nordby & Vale's> arms";
  chart.x_label = "Vacancies";
  chart.series = {{"exact", {{10, 0.2}, {40, 0.8}}, false}, {"Connor \u202E", {{10, 0.25}, {40, 0.85}}, true}};
  const std::string svg = RenderPowerCurveSvg(chart);
  CHECK(svg.find("<title>Power for &lt;Nordby &amp; Vale&#39;s&gt; arms</title>") != std::string::npos);
  CHECK(svg.find(">Connor &#x202E;</text>") != std::string::npos);
  CHECK(svg.find("stroke=\"" + svg::SeriesColour(0) + "\"") != std::string::npos);
  CHECK(svg.find("stroke=\"" + svg::SeriesColour(1) + "\"") != std::string::npos);
  CHECK(svg::SeriesColour(0) == "#0072B2");  // Okabe & Ito (2008): blue
}
