// `twinprobe report` end to end: the real binary on real study folders.
#include <catch2/catch.hpp>

#include <functional>

#include <nlohmann/json.hpp>

#include "core/store.h"
#include "report/html_inspect.h"
#include "report/text_report.h"
#include "testing/testing.h"

using namespace twinprobe;
using testing::ParsedHtml;
using testing::RunCli;

namespace {

struct Demo {
  testing::TempDir dir;
  std::string study = dir / "demo";
  Demo() {
    auto r = RunCli({"demo", "--out", study}, {"TWINPROBE_NOW=2027-06-01T12:00:00Z"});
    INFO(r.err);
    REQUIRE(r.exit_code == 0);
  }
  testing::CliRun Report(std::vector<std::string> args) {
    args.insert(args.begin(), {"--study", study});
    return RunCli(args, {"TWINPROBE_NOW=2027-06-01T12:00:00Z"});
  }
};

// Employer names of the demo, from its vacancies file (column 2).
std::vector<std::string> DemoEmployerNames(const std::string& study) {
  std::vector<std::string> names;
  std::string csv = testing::ReadFile(study + "/vacancies.csv");
  size_t line_start = csv.find('\n') + 1;
  while (line_start < csv.size()) {
    size_t end = csv.find('\n', line_start);
    std::string line = csv.substr(line_start, end - line_start);
    size_t c1 = line.find(','), c2 = line.find(',', c1 + 1);
    if (c1 != std::string::npos && c2 != std::string::npos) names.push_back(line.substr(c1 + 1, c2 - c1 - 1));
    if (end == std::string::npos) break;
    line_start = end + 1;
  }
  return names;
}

}  // namespace

TEST_CASE("report: HTML, text and JSON carry the same key numbers") {
  Demo d;
  auto html_run = d.Report({"report", "--out", d.study + "/reports/r.html"});
  REQUIRE(html_run.exit_code == 0);
  CHECK(html_run.out == "Report written to " + d.study + "/reports/r.html\n");
  const std::string html_text = ParsedHtml(testing::ReadFile(d.study + "/reports/r.html")).AllText();
  auto text = d.Report({"report", "--text"});
  REQUIRE(text.exit_code == 0);
  auto json_run = d.Report({"--json", "report"});
  REQUIRE(json_run.exit_code == 0);
  const auto j = nlohmann::json::parse(json_run.out);

  std::vector<std::string> numbers;
  for (const auto& a : j["arms"]) {
    numbers.push_back(std::to_string(a["positive"].get<int>()));
    numbers.push_back(FormatPercent(a["rate"].get<double>()));
    numbers.push_back(FormatPercent(a["conf_int"][0].get<double>()));
    numbers.push_back(FormatPercent(a["conf_int"][1].get<double>()));
  }
  for (const char* cell : {"a", "b", "c", "d"}) numbers.push_back(std::to_string(j["paired"]["table"][cell].get<int>()));
  numbers.push_back(FormatP(j["paired"]["mcnemar_exact_p"].get<double>()));
  numbers.push_back(j["design"]["design_sha256"].get<std::string>());
  // Effect estimates (analysis/effects.h): conditional odds ratio and its interval, adjusted stratum p-values.
  char buf[32];
  for (const auto& v : {j["effects"]["comparisons"][0]["conditional_odds_ratio"]["estimate"],
                        j["effects"]["comparisons"][0]["conditional_odds_ratio"]["conf_int"][0],
                        j["effects"]["comparisons"][0]["conditional_odds_ratio"]["conf_int"][1]}) {
    std::snprintf(buf, sizeof buf, "%.3g", v.get<double>());
    numbers.push_back(buf);
  }
  for (const auto& s : j["effects"]["strata"]) {
    std::snprintf(buf, sizeof buf, "%.3g", s["p_adjusted"].get<double>());
    numbers.push_back(buf);
  }
  for (const auto& a : j["response_times"]["arms"]) {
    const auto& last = a["milestones"].back();
    numbers.push_back(std::to_string(last["any"].get<int>()) + " (" + FormatPercent(last["any_share"].get<double>()) + ")");
    numbers.push_back(std::to_string(last["positive"].get<int>()) + " (" +
                      FormatPercent(last["positive_share"].get<double>()) + ")");
  }
  numbers.push_back(std::to_string(j["employers"]["employers_discordant"].get<int>()));
  numbers.push_back(j["report"]["audit_head"].get<std::string>());
  for (const auto& n : numbers) {
    INFO(n);
    CHECK(html_text.find(n) != std::string::npos);
    CHECK(text.out.find(n) != std::string::npos);
  }
  // The JSON holds the same values as numbers (checked above by formatting them), and the counts.
  CHECK(j["counts"]["sets_analysed"] == 400);
  CHECK(j["report"]["tool_version"] == "0.1.0");
  CHECK(j["report"]["generated_at"] == "2027-06-01T12:00:00Z");
  CHECK(j["report"]["employers_revealed"] == false);
}

TEST_CASE("report: the demo writes a self-contained HTML report with every section") {
  Demo d;
  const std::string path = d.study + "/reports/report.html";
  ParsedHtml page(testing::ReadFile(path));
  for (const char* id : {"summary", "design", "flow", "rates", "paired", "strata", "responses", "employers", "listing-audit",
                         "methods", "cautions", "stamp"}) {
    INFO(id);
    CHECK(page.ElementById(id) != nullptr);
  }
  CHECK(testing::ExternalReferences(page).empty());
  CHECK(page.ElementsByTag("script").empty());
  // Every chart is an accessible SVG with a data table beside it.
  const auto figures = page.ElementsByTag("figure");
  CHECK(figures.size() >= 5);
  for (const auto* fig : figures) {
    bool has_svg = false, has_table = false;
    std::function<void(const GumboNode*)> walk = [&](const GumboNode* n) {
      if (n->type != GUMBO_NODE_ELEMENT) return;
      const std::string tag = ParsedHtml::TagName(n);
      if (tag == "svg") {
        has_svg = true;
        CHECK(ParsedHtml::Attribute(n, "role") == "img");
        CHECK_FALSE(ParsedHtml::Attribute(n, "aria-labelledby").empty());
      }
      if (tag == "table") has_table = true;
      const GumboVector& kids = n->v.element.children;
      for (unsigned i = 0; i < kids.length; ++i) walk(static_cast<const GumboNode*>(kids.data[i]));
    };
    walk(fig);
    CHECK(has_svg);
    CHECK(has_table);
  }
  auto demo_out = RunCli({"demo", "--out", d.dir / "again"});
  CHECK(demo_out.out.find(d.dir / "again/reports/report.html") != std::string::npos);
}

TEST_CASE("report: without --reveal-employers no employer name appears in any format") {
  Demo d;
  const auto names = DemoEmployerNames(d.study);
  REQUIRE(names.size() == 400);
  REQUIRE(d.Report({"report", "--out", d.study + "/r.html"}).exit_code == 0);
  const std::string outputs[] = {testing::ReadFile(d.study + "/r.html"), d.Report({"report", "--text"}).out,
                                 d.Report({"--json", "report"}).out, testing::ReadFile(d.study + "/reports/report.html"),
                                 testing::ReadFile(d.study + "/reports/report.json"),
                                 testing::ReadFile(d.study + "/reports/report.txt")};
  for (const auto& out : outputs) {
    REQUIRE_FALSE(out.empty());
    for (const auto& name : names) {
      // Names are written as-is in text and JSON, and & ' escaped in HTML; none has markup characters.
      INFO(name);
      CHECK(out.find(name) == std::string::npos);
    }
  }
}

TEST_CASE("report: --reveal-employers is recorded in the audit chain and shows names") {
  Demo d;
  auto before = nlohmann::json::parse(d.Report({"--json", "verify"}).out);
  auto r = d.Report({"--json", "report", "--reveal-employers"});
  REQUIRE(r.exit_code == 0);
  const auto j = nlohmann::json::parse(r.out);
  CHECK(j["report"]["employers_revealed"] == true);
  const auto names = DemoEmployerNames(d.study);
  REQUIRE_FALSE(j["employers"]["discordant"].empty());
  for (const auto& row : j["employers"]["discordant"]) {
    REQUIRE(row["name"].is_string());
    CHECK(std::find(names.begin(), names.end(), row["name"].get<std::string>()) != names.end());
  }
  auto after = nlohmann::json::parse(d.Report({"--json", "verify"}).out);
  CHECK(after["ok"] == true);
  CHECK(after["entries"].get<int>() == before["entries"].get<int>() + 1);
  auto store = Store::Open(d.study + "/study.db", false);
  REQUIRE(store.ok());
  Stmt q = store.value()->Prepare("SELECT command, summary FROM audit ORDER BY seq DESC LIMIT 1");
  REQUIRE(q.Step());
  CHECK(q.Text(0) == "report --reveal-employers");
  CHECK(q.Text(1) == "report with employer names written to standard output");
  // The HTML says so at the top.
  REQUIRE(d.Report({"report", "--reveal-employers", "--out", d.study + "/named.html"}).exit_code == 0);
  CHECK(ParsedHtml(testing::ReadFile(d.study + "/named.html")).AllText().find("This copy names employers") !=
        std::string::npos);
}

TEST_CASE("report: the format follows --html/--text/--json, else the --out extension") {
  Demo d;
  REQUIRE(d.Report({"report", "--out", d.study + "/r.json"}).exit_code == 0);
  CHECK(nlohmann::json::parse(testing::ReadFile(d.study + "/r.json"))["counts"]["vacancies"] == 400);
  REQUIRE(d.Report({"report", "--out", d.study + "/r.txt"}).exit_code == 0);
  CHECK(testing::ReadFile(d.study + "/r.txt").rfind("Callbacks for inland", 0) == 0);
  REQUIRE(d.Report({"report", "--html", "--out", d.study + "/r.txt2"}).exit_code == 0);
  CHECK(testing::ReadFile(d.study + "/r.txt2").rfind("<!DOCTYPE html>", 0) == 0);
  auto html_stdout = d.Report({"report", "--html"});
  CHECK(html_stdout.out.rfind("<!DOCTYPE html>", 0) == 0);
  auto text_stdout = d.Report({"report"});
  CHECK(text_stdout.out.rfind("Callbacks for inland", 0) == 0);
  auto both = d.Report({"report", "--html", "--text"});
  CHECK(both.exit_code == 2);
  CHECK(both.err ==
        "twinprobe: report takes one format, got more than one of --html, --text and --json \u2014 give one of them, or "
        "none and let --out's extension choose (.html, .json, anything else: text)\n");
}

TEST_CASE("report: analyze and verify still work beside it") {
  Demo d;
  auto a = d.Report({"analyze"});
  CHECK(a.exit_code == 0);
  CHECK(a.out.find("Exact McNemar test") != std::string::npos);
  CHECK(d.Report({"verify"}).exit_code == 0);
}

TEST_CASE("report: hostile title, stratum and employer name come out as text in the real HTML") {
  testing::TempDir dir;
  const std::string study = dir / "s";
  REQUIRE(RunCli({"--study", study, "init"}).exit_code == 0);
  const std::string rlo = "\xE2\x80\xAE";
  const std::string title = "<script>alert('t')</script> & \"Q\"";
  const std::string employer = "Evil <script>alert(1)</script> & Co" + rlo + " (invented)";
  const std::string occupation = "<img src=http://x.example/p.png> clerk";
  // Title: a TOML basic string with the quotes escaped.
  std::string toml = testing::ReadFile(study + "/study.toml");
  const size_t t0 = toml.find("title = \""), t1 = toml.find('\n', t0);
  toml.replace(t0, t1 - t0, "title = \"<script>alert('t')</script> & \\\"Q\\\"\"");
  // One employer gets two vacancies (four probes), so the cap must allow it.
  const size_t cap = toml.find("cap_per_employer = 2");
  REQUIRE(cap != std::string::npos);
  toml.replace(cap, 20, "cap_per_employer = 4");
  testing::WriteFile(study + "/study.toml", toml);
  // Vacancies V0001 and V0002 share the hostile employer and occupation.
  std::string csv = testing::ReadFile(study + "/vacancies.csv");
  std::vector<std::string> lines;
  for (size_t s = 0, e; s < csv.size(); s = e + 1) {
    e = csv.find('\n', s);
    if (e == std::string::npos) e = csv.size();
    lines.push_back(csv.substr(s, e - s));
  }
  for (int i : {1, 2}) {
    auto cols = lines[static_cast<size_t>(i)];
    std::vector<std::string> f;
    for (size_t s = 0, e;; s = e + 1) {
      e = cols.find(',', s);
      f.push_back(cols.substr(s, e == std::string::npos ? std::string::npos : e - s));
      if (e == std::string::npos) break;
    }
    lines[static_cast<size_t>(i)] = f[0] + ",\"" + employer + "\"," + f[2] + ",\"" + occupation + "\"," + f[4] + "," + f[5];
  }
  csv.clear();
  for (const auto& l : lines) csv += l + "\n";
  testing::WriteFile(study + "/vacancies.csv", csv);
  auto plan = RunCli({"--study", study, "plan"});
  INFO(plan.err);
  REQUIRE(plan.exit_code == 0);
  // Send both pairs; only the inland applicant is invited at each: two unequal pairs at one employer.
  auto store = Store::Open(study + "/study.db", false);
  REQUIRE(store.ok());
  Stmt q = store.value()->Prepare(
      "SELECT p.ref, a.label FROM current_probe p JOIN arm a ON a.id = p.arm_id JOIN vacancy v ON v.id = p.vacancy_id "
      "WHERE v.ref IN ('V0001', 'V0002') ORDER BY p.id");
  std::vector<std::pair<std::string, std::string>> probes;
  while (q.Step()) probes.emplace_back(q.Text(0), q.Text(1));
  REQUIRE(probes.size() == 4);
  for (const auto& [ref, arm] : probes) {
    // The clock inside the season: fieldwork times may not lie in the future.
    REQUIRE(RunCli({"--study", study, "sent", ref, "--at", "2027-03-01T09:00"}, {"TWINPROBE_NOW=2027-03-05T00:00:00Z"})
                .exit_code == 0);
    if (arm == "origin=inland")
      REQUIRE(RunCli({"--study", study, "record", ref, "invitation", "--at", "2027-03-04T09:00"},
                     {"TWINPROBE_NOW=2027-03-05T00:00:00Z"})
                  .exit_code == 0);
  }
  for (bool reveal : {false, true}) {
    std::vector<std::string> args = {"--study", study, "report", "--out", study + "/r.html"};
    if (reveal) args.push_back("--reveal-employers");
    // After the 28-day windows of the 1 March sendings: the sets are closed.
    auto r = RunCli(args, {"TWINPROBE_NOW=2027-04-01T00:00:00Z"});
    INFO(r.err);
    REQUIRE(r.exit_code == 0);
    ParsedHtml page(testing::ReadFile(study + "/r.html"));
    CHECK(page.ElementsByTag("script").empty());
    CHECK(page.ElementsByTag("img").empty());
    CHECK(testing::ExternalReferences(page).empty());
    const std::string text = page.AllText();
    CHECK(text.find(title) != std::string::npos);
    CHECK(text.find(occupation) != std::string::npos);
    CHECK((text.find(employer) != std::string::npos) == reveal);
  }
}

TEST_CASE("report: a store with ranked lists only gives the listing audit, and hostile labels stay text") {
  testing::TempDir dir;
  const std::string study = dir / "audit";
  const std::string query = "clerk <script>alert(1)</script>";
  std::string csv = "listing,position,item,query,location,origin\n";
  for (const char* listing : {"L1", "L2", "L3", "L4"})
    for (int pos = 1; pos <= 6; ++pos)
      csv += std::string(listing) + "," + std::to_string(pos) + ",item" + std::to_string((pos * 7) % 6) + ",\"" + query +
             "\"," + (listing[1] < '3' ? "Orlinde," : "Tessvale,") +
             ((pos * 7) % 6 < 3 ? "in<b>land" : "\"coast\"\"al & co\"") + "\n";
  testing::WriteFile(dir / "ranks.csv", csv);
  auto imported = RunCli({"--study", study, "import", "ranks", dir / "ranks.csv"});
  INFO(imported.err);
  REQUIRE(imported.exit_code == 0);
  auto r = RunCli({"--study", study, "report", "--out", study + "/r.html"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  ParsedHtml page(testing::ReadFile(study + "/r.html"));
  for (const char* id : {"summary", "listing-audit", "methods", "cautions", "stamp"}) {
    INFO(id);
    CHECK(page.ElementById(id) != nullptr);
  }
  for (const char* id : {"design", "rates", "responses", "paired"}) {
    INFO(id);
    CHECK(page.ElementById(id) == nullptr);
  }
  CHECK(page.ElementById("chart-listing-groups") != nullptr);
  CHECK(page.ElementsByTag("script").empty());
  CHECK(page.ElementsByTag("b").empty());
  CHECK(testing::ExternalReferences(page).empty());
  const std::string text = page.AllText();
  CHECK(text.find("origin=in<b>land") != std::string::npos);
  CHECK(text.find("origin=coast\"al & co") != std::string::npos);
  CHECK(text.find(query) != std::string::npos);
}
