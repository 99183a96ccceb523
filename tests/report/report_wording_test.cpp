// Wording of the text and HTML reports that readers tripped over: counted
// nouns ("1 pair", never "1 pairs") and sentences that refer only to what the
// report holds (the text report has no charts).
#include <catch2/catch.hpp>

#include <string>

#include "analysis/analyze.h"
#include "report/html_style.h"
#include "report/plain_summary.h"
#include "report/plural.h"
#include "report/text_report.h"

using namespace twinprobe;

namespace {

// A paired study with a single pair, treated unequally.
AnalysisResult OnePair() {
  AnalysisResult r;
  r.kind = "paired";
  r.has_paired = true;
  r.reference_label = "origin=inland";
  r.other_label = "origin=coastal";
  r.paired = {0, 1, 0, 0};
  r.mcnemar_exact_p = 1.0;
  // One closed set of two sent probes (not an early state).
  r.probes_sent = 2;
  r.sets_analysed = 1;
  return r;
}

// The text report wraps lines; compare with every run of whitespace as one space.
std::string Collapsed(const std::string& s) {
  std::string out;
  for (char c : s) {
    bool space = c == ' ' || c == '\n';
    if (space && !out.empty() && out.back() == ' ') continue;
    out += space ? ' ' : c;
  }
  return out;
}

std::string AllParagraphs(const AnalysisResult& r) {
  std::string all;
  for (const auto& p : PlainSummary(r)) all += p.text + "\n";
  return all;
}

}  // namespace

TEST_CASE("plural: one noun, counted") {
  CHECK(Count(1, "entry", "entries") == "1 entry");
  CHECK(Count(0, "entry", "entries") == "0 entries");
  CHECK(Count(2, "pair", "pairs") == "2 pairs");
}

TEST_CASE("report wording: one pair reads 'the 1 pair', not 'the 1 pairs'") {
  std::string text = AllParagraphs(OnePair());
  CHECK(text.find("Of the 1 pair, both applicants were answered positively in 0 and neither in 0. In the 1 pair "
                  "where the employer treated the two differently") != std::string::npos);
  CHECK(text.find("a split of the 1 unequal-treatment pair at least as uneven as 1 to 0") != std::string::npos);
  CHECK(text.find("1 pairs") == std::string::npos);
  std::string report = Collapsed(RenderTextReport(OnePair()));
  CHECK(report.find("Exact McNemar test (conditional binomial on the 1 discordant pair, two-sided): p = 1.") !=
        std::string::npos);
  CHECK(report.find("1 pairs") == std::string::npos);
}

TEST_CASE("report wording: the summary names the intervals, not a chart the text report lacks") {
  AnalysisResult r = OnePair();
  std::string text = Collapsed(RenderTextReport(r));
  CHECK(text.find("chart") == std::string::npos);
  CHECK(text.find("The 95% confidence intervals of the callback rates show how high or low each group's true "
                  "callback rate may plausibly be.") != std::string::npos);
}

TEST_CASE("report on paper: a heading keeps its introduction and first chart or table on its page") {
  // Printed with chromium --print-to-pdf, the demo report left "Positive
  // callbacks by group" and "Time to first response" at the foot of a page
  // without their charts until the introduction paragraph was laid out as a
  // table that may not be broken after.
  const std::string& css = ReportCss();
  CHECK(css.find("  h2 + p, h3 + p, h2 + p + p, h3 + p + p {\n"
                 "    display: table; break-inside: avoid; page-break-inside: avoid; break-after: avoid; "
                 "page-break-after: avoid;\n  }\n") != std::string::npos);
  CHECK(css.find("  figure, table.data, .keyfigs, dl.facts { break-inside: avoid; page-break-inside: avoid; }") !=
        std::string::npos);
}
