// The interval, step and bar charts and the shared SVG helpers.
#include <catch2/catch.hpp>

#include <cmath>

#include "report/html_inspect.h"
#include "report/svg_bar_chart.h"
#include "report/svg_common.h"
#include "report/svg_interval_chart.h"
#include "report/svg_step_chart.h"

using namespace twinprobe;
using testing::ParsedHtml;

namespace {

ParsedHtml Page(const std::string& svg) { return ParsedHtml("<!DOCTYPE html><html><body>" + svg + "</body></html>"); }

void RequireAccessible(const ParsedHtml& page, const std::string& id, const std::string& title) {
  const auto* s = page.ElementById(id);
  REQUIRE(s != nullptr);
  CHECK(ParsedHtml::TagName(s) == "svg");
  CHECK(ParsedHtml::Attribute(s, "role") == "img");
  CHECK(ParsedHtml::Attribute(s, "aria-labelledby") == id + "-title " + id + "-desc");
  REQUIRE(page.ElementById(id + "-title") != nullptr);
  CHECK(ParsedHtml::TextOf(page.ElementById(id + "-title")) == title);
  REQUIRE(page.ElementById(id + "-desc") != nullptr);
  CHECK_FALSE(ParsedHtml::TextOf(page.ElementById(id + "-desc")).empty());
}

std::vector<std::string> TickLabels(const ParsedHtml& page) {
  std::vector<std::string> ticks;
  page.ForEachElement([&](const GumboNode* e) {
    if (ParsedHtml::Attribute(e, "class") == "tick") ticks.push_back(ParsedHtml::TextOf(e));
  });
  return ticks;
}

}  // namespace

TEST_CASE("svg: the palette is Okabe-Ito, in its published order") {
  const auto& p = svg::OkabeIto();
  REQUIRE(p.size() == 8);
  CHECK(std::string(p[0].hex) == "#000000");
  CHECK(std::string(p[1].hex) == "#E69F00");
  CHECK(std::string(p[5].name) == "blue");
  CHECK(std::string(p[5].hex) == "#0072B2");
  CHECK(std::string(p[6].hex) == "#D55E00");
  // The series colours are drawn from it (yellow left out).
  for (size_t i = 0; i < 7; ++i) {
    bool found = false;
    for (const auto& c : p) found = found || svg::SeriesColour(i) == c.hex;
    CHECK(found);
    CHECK(svg::SeriesColour(i) != "#F0E442");
  }
}

TEST_CASE("svg: nice ticks and log ticks") {
  const auto ticks = svg::NiceTicks(0, 0.4, 5);
  REQUIRE(ticks.size() == 5);
  for (size_t i = 0; i < ticks.size(); ++i) CHECK(ticks[i] == Approx(0.1 * static_cast<double>(i)).margin(1e-12));
  CHECK(svg::NiceUpper(0, 0.324, 5) == Approx(0.4));
  CHECK(svg::NiceUpper(0, 66, 5) == Approx(80));
  CHECK(svg::LogTicks(0.5, 10) == std::vector<double>{0.5, 1, 2, 5, 10});
  CHECK(svg::TickLabel(0.25, true) == "25%");
  CHECK(svg::Coord(12.3456) == "12.35");
  CHECK(svg::Coord(-0.001) == "0");
}

TEST_CASE("svg: a long label is shortened on a code point boundary, the full text kept in its <title>") {
  const std::string label = "\xC3\xA5\xC3\xA5\xC3\xA5\xC3\xA5\xC3\xA5";  // five 'å'
  const std::string out = svg::LabelText(label, 0, 0, "end", 3);
  CHECK(out.find(">\xC3\xA5\xC3\xA5\u2026</text>") != std::string::npos);
  CHECK(out.find("<title>" + label + "</title>") != std::string::npos);
}

TEST_CASE("interval chart: rows, values and an axis that covers every upper limit") {
  svg::IntervalChart c;
  c.id = "rates";
  c.title = "Rates";
  c.description = "Two groups.";
  c.percent = true;
  c.rows = {{"inland", 0.2775, 0.234, 0.324, "27.8% (23.4% to 32.4%)"},
            {"coastal", 0.1925, 0.155, 0.235, "19.2% (15.5% to 23.5%)"}};
  auto page = Page(svg::RenderIntervalChart(c));
  RequireAccessible(page, "rates", "Rates");
  CHECK(page.AllText().find("27.8% (23.4% to 32.4%)") != std::string::npos);
  auto ticks = TickLabels(page);
  REQUIRE_FALSE(ticks.empty());
  CHECK(ticks.front() == "0%");
  CHECK(ticks.back() == "40%");
  CHECK(page.ElementsByTag("circle").size() == 1);  // first series: circle
  CHECK(page.ElementsByTag("rect").size() == 1);    // second series: square
}

TEST_CASE("step chart: each series starts at 0, steps at its points and runs to x_max") {
  svg::StepChart c;
  c.id = "steps";
  c.title = "Answered by day";
  c.description = "Two curves.";
  c.x_max = 28;
  c.y_percent = true;
  c.y_max = 0.5;
  c.series = {{"inland", {{2, 0.1}, {7, 0.25}}, "25.0%"}, {"coastal", {{3, 0.05}}, "5.0%"}};
  auto page = Page(svg::RenderStepChart(c));
  RequireAccessible(page, "steps", "Answered by day");
  std::vector<std::string> paths;
  page.ForEachElement([&](const GumboNode* e) {
    if (ParsedHtml::Attribute(e, "class") == "series") paths.push_back(ParsedHtml::Attribute(e, "d"));
  });
  REQUIRE(paths.size() == 2);
  // Plot: x from 64 to 640 - (24 + 7*7 + 52) = 515 over 0..28 days; y from 320 (0) up to 20 (50%).
  // Day 2 -> 64 + 2/28*451 = 96.21; 10% -> 320 - 0.2*300 = 260; day 7 -> 176.75; 25% -> 170.
  CHECK(paths[0] == "M64 320 H96.21 V260 H176.75 V170 H515");
  CHECK(paths[1] == "M64 320 H112.32 V290 H515");
  CHECK(page.AllText().find("25.0%") != std::string::npos);
  CHECK(paths[0] != paths[1]);
}

TEST_CASE("bar chart: one bar per value, value texts printed, legend for several series") {
  svg::BarChart c;
  c.id = "bars";
  c.title = "Codes";
  c.description = "Grouped bars.";
  c.series_labels = {"inland", "coastal"};
  c.groups = {{"none", {183, 196}, {"183", "196"}}, {"invitation", {77, 54}, {"77", "54"}}};
  auto page = Page(svg::RenderBarChart(c));
  RequireAccessible(page, "bars", "Codes");
  // 4 bars + 2 legend swatches.
  CHECK(page.ElementsByTag("rect").size() == 6);
  const std::string text = page.AllText();
  for (const char* v : {"183", "196", "77", "54", "inland", "coastal", "none", "invitation"})
    CHECK(text.find(v) != std::string::npos);
}
