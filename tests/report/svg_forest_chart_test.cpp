// The forest chart, fed plain rows directly (no analysis needed): log axis,
// edge cases drawn as arrows or words, accessible title and description.
#include <catch2/catch.hpp>

#include <cmath>
#include <limits>

#include "report/html_inspect.h"
#include "report/svg_forest_chart.h"

using namespace twinprobe;
using testing::ParsedHtml;

namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();

svg::ForestChart Chart(std::vector<svg::ForestRow> rows) {
  svg::ForestChart c;
  c.id = "forest";
  c.title = "Odds ratios by occupation";
  c.description = "Forest chart of four strata and the Mantel-Haenszel summary.";
  c.left_note = "favours coastal";
  c.right_note = "favours inland";
  c.rows = std::move(rows);
  return c;
}

ParsedHtml Page(const std::string& svg) { return ParsedHtml("<!DOCTYPE html><html><body>" + svg + "</body></html>"); }

size_t Count(const ParsedHtml& page, const std::string& tag, const std::string& cls) {
  size_t n = 0;
  page.ForEachElement([&](const GumboNode* e) {
    if (ParsedHtml::TagName(e) == tag && ParsedHtml::Attribute(e, "class") == cls) ++n;
  });
  return n;
}

}  // namespace

TEST_CASE("forest chart: accessible svg with title, description and role=img") {
  auto page = Page(svg::RenderForestChart(Chart({{"bookkeeper", 1.875, 0.75, 5.0, 0.21, false}})));
  const auto* s = page.ElementById("forest");
  REQUIRE(s != nullptr);
  CHECK(ParsedHtml::Attribute(s, "role") == "img");
  CHECK(ParsedHtml::Attribute(s, "aria-labelledby") == "forest-title forest-desc");
  REQUIRE(page.ElementById("forest-title") != nullptr);
  CHECK(ParsedHtml::TextOf(page.ElementById("forest-title")) == "Odds ratios by occupation");
  CHECK(ParsedHtml::TextOf(page.ElementById("forest-desc")) ==
        "Forest chart of four strata and the Mantel-Haenszel summary.");
}

TEST_CASE("forest chart: finite rows draw a square and no arrow, values and p printed") {
  auto page = Page(svg::RenderForestChart(Chart({{"bookkeeper", 1.875, 0.75, 5.0, 0.21, false},
                                                  {"care assistant", 1.82, 0.83, 4.2, 0.0123, false}})));
  CHECK(Count(page, "path", "arrow") == 0);
  CHECK(page.ElementsByTag("rect").size() == 2);
  const std::string text = page.AllText();
  CHECK(text.find("1.88 (0.75 to 5)") != std::string::npos);
  CHECK(text.find("0.0123") != std::string::npos);
  CHECK(text.find("favours inland") != std::string::npos);
}

TEST_CASE("forest chart: infinite upper limit and zero lower limit end in arrows at the axis edges") {
  // b = 5, c = 0 gives OR = inf with an exact interval (lower, inf); b = 0 gives OR = 0, interval (0, upper).
  auto page = Page(svg::RenderForestChart(Chart({{"junior developer", kInf, 1.9, kInf, 0.0625, false},
                                                  {"warehouse clerk", 0.0, 0.0, 0.52, 0.0625, false}})));
  // Row 1: arrow for the infinite limit and one for the infinite estimate; row 2: the same on the left.
  CHECK(Count(page, "path", "arrow") == 4);
  const std::string text = page.AllText();
  CHECK(text.find("\u221E (1.9 to \u221E)") != std::string::npos);
  CHECK(text.find("0 (0 to 0.52)") != std::string::npos);
}

TEST_CASE("forest chart: limits beyond the axis ceiling are arrows, the axis never passes floor and ceiling") {
  auto c = Chart({{"region", 3.0, 0.5, 5000.0, std::nullopt, false}});
  auto page = Page(svg::RenderForestChart(c));
  CHECK(Count(page, "path", "arrow") == 1);
  std::vector<std::string> ticks;
  page.ForEachElement([&](const GumboNode* e) {
    if (ParsedHtml::Attribute(e, "class") == "tick") ticks.push_back(ParsedHtml::TextOf(e));
  });
  REQUIRE_FALSE(ticks.empty());
  CHECK(ticks.front() == "0.5");
  CHECK(ticks.back() == "100");
}

TEST_CASE("forest chart: a NaN estimate reads 'not estimable' and draws nothing") {
  auto page = Page(svg::RenderForestChart(Chart({{"no discordant pairs", NAN, NAN, NAN, 1.0, false}})));
  CHECK(page.AllText().find("not estimable") != std::string::npos);
  CHECK(page.ElementsByTag("rect").empty());
  CHECK(Count(page, "path", "arrow") == 0);
}

TEST_CASE("forest chart: the summary row is a diamond, not a square") {
  auto page = Page(svg::RenderForestChart(Chart({{"stratum", 2.0, 1.0, 4.0, 0.05, false},
                                                  {"Mantel-Haenszel", 2.06, 1.35, 3.14, 0.001, true}})));
  CHECK(page.ElementsByTag("rect").size() == 1);
  size_t diamonds = 0;
  page.ForEachElement([&](const GumboNode* e) {
    if (ParsedHtml::TagName(e) == "path" && ParsedHtml::Attribute(e, "fill") == "#000000") ++diamonds;
  });
  CHECK(diamonds == 1);
}

TEST_CASE("forest chart: hostile labels come out as text") {
  const std::string hostile = "<script>alert('x')</script> & \"q\" \xE2\x80\xAE";
  auto page = Page(svg::RenderForestChart(Chart({{hostile, 2.0, 1.0, 4.0, 0.05, false}})));
  CHECK(page.ElementsByTag("script").empty());
  CHECK(page.AllText().find(hostile) != std::string::npos);
}

TEST_CASE("forest chart: ratio formatting") {
  CHECK(svg::FormatRatio(1.74418) == "1.74");
  CHECK(svg::FormatRatio(kInf) == "\u221E");
  CHECK(svg::FormatRatio(NAN) == "not estimable");
  CHECK(svg::FormatRatio(0.004) == "4.00e-03");
  CHECK(svg::FormatRatioInterval(3.0, 1.0, kInf) == "3 (1 to \u221E)");
}
