// The HTML report on a hand-made result: every section present, nothing
// outside the file, hostile strings in every user-supplied place come out
// as text.
#include <catch2/catch.hpp>

#include "report/html_inspect.h"
#include "report/html_report.h"

#include <cmath>
#include <limits>

using namespace twinprobe;
using testing::ParsedHtml;

namespace {

const std::string kRlo = "\xE2\x80\xAE";
const std::string kTitle = "Study <script>alert('title')</script> & \"friends\"";
const std::string kRef = "origin=<b>inland</b>";
const std::string kOther = "origin=coastal\" onmouseover=\"alert(1)";
const std::string kStratum = "<img src=http://tracker.example/p.png>" + kRlo + "gnp.exe";
const std::string kEmployerName = "Evil </td></tr></table><script>alert(2)</script> & Co " + kRlo + " (invented)";
const std::string kApproval = "REB-1 <a href=\"http://x.example\">click</a>";

AnalysisResult HostileResult() {
  AnalysisResult r;
  r.study_id = "id-<i>x</i>";
  r.title = kTitle;
  r.kind = "paired";
  r.plan_origin = "plan";
  r.correction = "holm";
  r.positive_codes = {"info_request", "invitation<svg onload=alert(3)>"};
  r.vacancies = 10;
  r.probes_planned = r.probes_sent = 20;
  r.responses = 12;
  r.sets_analysed = 10;
  r.arms = {{kRef, true, 10, 6, 0.6, {0.26, 0.88}}, {kOther, false, 10, 3, 0.3, {0.07, 0.65}}};
  r.has_paired = true;
  r.reference_label = kRef;
  r.other_label = kOther;
  r.paired = {2, 4, 1, 3};
  r.mcnemar_exact_p = 0.375;
  r.strata = {{"occupation<br>", kStratum, {1, 2, 0, 1}}, {"occupation<br>", "clerk", {1, 2, 1, 2}}};
  r.design.design_sha256 = "ab12";
  r.design.has_seed = true;
  r.design.seed = 7;
  r.design.window_days = 28;
  r.design.factors = {{"origin<u>", {"<b>inland</b>", "coastal"}, "<b>inland</b>", "", false, "", {}}};
  r.design.arms = {{kRef, true, 3, 10}, {kOther, false, 3, 10}};
  r.design.strata_columns = {"occupation<br>"};
  r.design.strata = {{"occupation<br>", kStratum, 4}, {"occupation<br>", "clerk", 6}};
  r.design.templates = {"templates/a.md", "templates/<x>.md"};
  r.design.employers = 9;
  r.design.first_sent_at = "2027-03-01T09:00:00Z";
  r.design.last_sent_at = "2027-03-05T09:00:00Z";
  r.response_times.available = true;
  r.response_times.window_days = 28;
  for (const auto& label : {kRef, kOther}) {
    ArmResponseTimes a;
    a.label = label;
    a.probes_sent = 10;
    a.responded = 2;
    a.median_days = 3;
    a.any = {{1.5, 1, 0.1}, {4.5, 2, 0.2}};
    a.positive = {{4.5, 1, 0.1}};
    a.milestones = {{7, 2, 0.2, 1, 0.1}, {28, 2, 0.2, 1, 0.1}};
    a.codes = {{"none", 8}, {"invitation<svg onload=alert(3)>", 2}};
    r.response_times.arms.push_back(a);
  }
  r.employers.available = true;
  r.employers.employers = 9;
  r.employers.employers_discordant = 2;
  r.employers.discordant = {{"E-<hostile>", 2, {0, 2, 0, 0}, 2}, {"E-0000000001", 1, {0, 0, 1, 0}, 1}};
  return r;
}

ReportContext Context(bool reveal) {
  ReportContext c;
  c.tool_version = "0.1.0";
  c.generated_at = "2027-04-01T10:00:00Z";
  c.audit_head = "cafe";
  c.audit_entries = 3;
  c.ethics_approval = kApproval;
  c.reveal_employers = reveal;
  if (reveal) c.employer_names["E-<hostile>"] = kEmployerName;
  return c;
}

}  // namespace

TEST_CASE("html report: every section is there, by id, in order, and the contents link to each") {
  const AnalysisResult r = HostileResult();
  ParsedHtml page(RenderHtmlReport(r, Context(false)));
  const auto ids = HtmlSectionIds(r);
  CHECK(ids == std::vector<std::string>{"summary", "design", "flow", "rates", "paired", "strata", "responses", "employers",
                                        "methods", "cautions", "stamp"});
  std::vector<std::string> toc;
  for (const auto* a : page.ElementsByTag("a")) toc.push_back(ParsedHtml::Attribute(a, "href"));
  for (const auto& id : ids) {
    INFO(id);
    const auto* s = page.ElementById(id);
    REQUIRE(s != nullptr);
    CHECK(ParsedHtml::TagName(s) == "section");
    CHECK(std::find(toc.begin(), toc.end(), "#" + id) != toc.end());
  }
  for (const char* fig : {"chart-rates", "chart-discordant", "chart-strata", "chart-codes", "chart-first-response",
                          "chart-first-positive"}) {
    INFO(fig);
    CHECK(page.ElementById(fig) != nullptr);
  }
}

TEST_CASE("html report: sections that do not apply are left out") {
  AnalysisResult r = HostileResult();
  r.has_paired = false;
  r.strata.clear();
  r.employers = {};
  CHECK(HtmlSectionIds(r) ==
        std::vector<std::string>{"summary", "design", "flow", "rates", "responses", "methods", "cautions", "stamp"});
  ParsedHtml page(RenderHtmlReport(r, Context(false)));
  CHECK(page.ElementById("paired") == nullptr);
  CHECK(page.ElementById("summary") != nullptr);
}

TEST_CASE("html report: nothing refers to anything outside the file") {
  for (bool reveal : {false, true}) {
    ParsedHtml page(RenderHtmlReport(HostileResult(), Context(reveal)));
    CHECK(testing::ExternalReferences(page).empty());
    CHECK(page.ElementsByTag("style").size() == 1);
  }
}

TEST_CASE("html report: the checker itself finds outside references (so the test above can fail)") {
  ParsedHtml bad(
      "<html><head><link rel=stylesheet href=\"https://cdn.example/x.css\"><style>@import 'x.css'; "
      "body{background:url(http://x.example/a.png)} p{background:url(data:image/png;base64,AA)}</style></head>"
      "<body><img src=\"//x.example/p.gif\"><a href=\"http://x.example\">x</a><a href=\"#ok\">ok</a>"
      "<svg><image href=\"https://x.example/i.png\"/></svg><p style=\"background:url('https://x.example')\" "
      "onclick=\"x()\">p</p></body></html>");
  const auto problems = testing::ExternalReferences(bad);
  auto found = [&](const std::string& needle) {
    for (const auto& p : problems)
      if (p.find(needle) != std::string::npos) return true;
    return false;
  };
  CHECK(found("<link href=\"https://cdn.example/x.css\">"));
  CHECK(found("element <link>"));
  CHECK(found("<style>: @import"));
  CHECK(found("<style>: url() not data:"));
  CHECK(found("<img src=\"//x.example/p.gif\">"));
  CHECK(found("<a href=\"http://x.example\">"));
  CHECK(found("href=\"https://x.example/i.png\">"));
  CHECK(found("style attribute on <p>: url() not data:"));
  CHECK(found("event handler onclick"));
  CHECK_FALSE(found("#ok"));
  CHECK(problems.size() == 11);
}

TEST_CASE("html report: hostile strings in names and labels come out as text, never as markup") {
  ParsedHtml page(RenderHtmlReport(HostileResult(), Context(true)));
  CHECK(page.ElementsByTag("script").empty());
  CHECK(page.ElementsByTag("img").empty());
  CHECK(page.ElementsByTag("u").empty());
  CHECK(page.ElementsByTag("br").empty());
  // No element carries an event handler.
  for (const auto& a : page.AllAttributes()) CHECK(a.name.rfind("on", 0) != 0);
  // Bold appears only where the report itself uses it (<b> is never used by the report).
  CHECK(page.ElementsByTag("b").empty());
  // The hrefs are the report's own anchors only (the approval's <a href> stayed text).
  for (const auto* a : page.ElementsByTag("a")) CHECK(ParsedHtml::Attribute(a, "href").rfind("#", 0) == 0);
  const std::string text = page.AllText();
  for (const std::string& s : {kTitle, kStratum, kEmployerName, kApproval, std::string("id-<i>x</i>"),
                               std::string("occupation<br>"), std::string("origin<u>"), std::string("E-<hostile>")}) {
    INFO(s);
    CHECK(text.find(s) != std::string::npos);
  }
  // Arm labels appear through ArmName (the level part) and whole in the design table.
  CHECK(text.find("<b>inland</b>") != std::string::npos);
  CHECK(text.find(kOther) != std::string::npos);
  // The page title is text too.
  REQUIRE(page.ElementsByTag("title").size() >= 1);
  CHECK(ParsedHtml::TextOf(page.ElementsByTag("title").front()).find(kTitle) == 0);
}

TEST_CASE("html report: employers appear by pseudonym unless revealed") {
  const AnalysisResult r = HostileResult();
  const std::string hidden = ParsedHtml(RenderHtmlReport(r, Context(false))).AllText();
  CHECK(hidden.find("E-<hostile>") != std::string::npos);
  CHECK(hidden.find("Evil") == std::string::npos);
  CHECK(hidden.find("This copy names employers") == std::string::npos);
  const std::string shown = ParsedHtml(RenderHtmlReport(r, Context(true))).AllText();
  CHECK(shown.find(kEmployerName + " (E-<hostile>)") != std::string::npos);
  CHECK(shown.find("This copy names employers") != std::string::npos);
}

namespace {

ArmComparison PairedComparison(const std::string& other, stats::PairedCounts t, double est, double lo, double hi,
                               double p, double p_adj) {
  ArmComparison c;
  c.other_label = other;
  c.paired = true;
  c.pairs = t;
  c.conditional_or = {est, {lo, hi}};
  c.net.among_positive = {0.238, {0.104, 0.361}};
  c.net.over_all = {0.085, {0.037, 0.133}};
  c.mcnemar.exact = stats::PValue::FromValue(p);
  c.mcnemar.mid_p = stats::PValue::FromValue(p / 2);
  c.p = c.mcnemar.exact;
  c.p_adjusted = p_adj;
  return c;
}

}  // namespace

TEST_CASE("html report: per-stratum odds ratios feed the forest chart, edge cases included") {
  AnalysisResult r = HostileResult();
  const double inf = std::numeric_limits<double>::infinity();
  r.effects.correction = "holm";
  r.effects.comparisons = {PairedComparison(kOther, {2, 4, 1, 3}, 4.0, 0.395, 196.0, 0.375, 0.375)};
  r.effects.strata = {{"occupation<br>", kStratum, PairedComparison(kOther, {1, 2, 0, 1}, inf, 0.18, inf, 0.5, 0.5)},
                      {"occupation<br>", "clerk", PairedComparison(kOther, {1, 0, 0, 2}, NAN, NAN, NAN, 1.0, 1.0)}};
  AcrossStrata across;
  across.column = "occupation<br>";
  across.other_label = kOther;
  across.values = 2;
  across.discordant = {{2, 0}, {0, 0}};
  across.homogeneity.total_b = 2;
  across.homogeneity.total_c = 0;
  across.homogeneity.strata_used = 1;
  across.homogeneity.pooled_odds_ratio = {inf, {0.18, inf}};
  r.effects.across = {across};
  ParsedHtml page(RenderHtmlReport(r, Context(false)));
  const auto* forest = page.ElementById("chart-forest-0");
  REQUIRE(forest != nullptr);
  CHECK(ParsedHtml::Attribute(forest, "role") == "img");
  const std::string forest_text = ParsedHtml::TextOf(forest);
  CHECK(forest_text.find("not estimable") != std::string::npos);
  CHECK(forest_text.find("\u221E (0.18 to \u221E)") != std::string::npos);
  CHECK(forest_text.find("4 (0.395 to 196)") != std::string::npos);  // the all-pairs summary
  CHECK(forest_text.find("occupation<br>: " + kStratum) != std::string::npos);
  size_t arrows = 0;
  page.ForEachElement([&](const GumboNode* e) { arrows += ParsedHtml::Attribute(e, "class") == "arrow"; });
  CHECK(arrows >= 2);
  const std::string text = page.AllText();
  CHECK(text.find("23.8% (10.4% to 36.1%)") != std::string::npos);  // net discrimination
  CHECK(text.find("2/0 = \u221E (0.18 to \u221E)") != std::string::npos);  // pooled conditional odds ratio
  CHECK(text.find("not testable") != std::string::npos);  // one stratum value with discordant sets
  CHECK(page.ElementsByTag("script").empty());
  CHECK(testing::ExternalReferences(page).empty());
}

TEST_CASE("html report: an unpaired study compares each group with the reference in a forest chart") {
  AnalysisResult r = HostileResult();
  r.kind = "unpaired";
  r.has_paired = false;
  r.strata.clear();
  ArmComparison c;
  c.other_label = kOther;
  c.paired = false;
  c.table = {6, 4, 3, 7};
  c.fisher.estimate = 3.26;
  c.fisher.ci = {0.43, 30.1};
  c.p = stats::PValue::FromValue(0.37);
  c.p_adjusted = 0.37;
  r.effects.correction = "holm";
  r.effects.comparisons = {c};
  const auto ids = HtmlSectionIds(r);
  CHECK(std::find(ids.begin(), ids.end(), "comparisons") != ids.end());
  CHECK(std::find(ids.begin(), ids.end(), "paired") == ids.end());
  ParsedHtml page(RenderHtmlReport(r, Context(false)));
  REQUIRE(page.ElementById("chart-comparisons") != nullptr);
  CHECK(ParsedHtml::TextOf(page.ElementById("chart-comparisons")).find("3.26 (0.43 to 30.1)") != std::string::npos);
}

TEST_CASE("html report: a broken audit chain is announced at the top") {
  ReportContext c = Context(false);
  c.audit_intact = false;
  ParsedHtml page(RenderHtmlReport(HostileResult(), c));
  CHECK(page.AllText().find("The study's audit chain is broken.") != std::string::npos);
}
