// Issue 16: a stratum column whose analysed sets all share one value gets
// one sentence in analyze and report (text, JSON, HTML), never a one-row
// stratified table.
#include <catch2/catch.hpp>

#include <nlohmann/json.hpp>

#include "collector/collector_fixtures.h"
#include "report/html_inspect.h"

using namespace twinprobe;
using testing::RunCli;

namespace {

const std::vector<std::string> kNow = {"TWINPROBE_NOW=2027-05-01T12:00:00Z"};

const char* kOccupation =
    "Every analysed set has occupation 'bookkeeper', so there is no analysis by occupation: a stratified analysis "
    "needs at least two values. Analyse again once sets with another occupation are closed; if the study has only "
    "one, leave 'occupation' out of [strata] columns in study.toml.";
const char* kRegion =
    "Every analysed set has region 'North Fen', so there is no analysis by region: a stratified analysis needs at "
    "least two values. Analyse again once sets with another region are closed; if the study has only one, leave "
    "'region' out of [strata] columns in study.toml.";

// Sends both probes of each vacancy and answers the reference probe
// positively in the first `reference_wins` of them.
void SendAndAnswer(const testing::PlannedStudy& s, const std::vector<std::string>& vacancies, size_t reference_wins) {
  auto store = s.Open();
  for (size_t i = 0; i < vacancies.size(); ++i) {
    Stmt q = store->Prepare(
        "SELECT p.ref, a.is_reference FROM current_probe p JOIN vacancy v ON v.id = p.vacancy_id "
        "JOIN arm a ON a.id = p.arm_id WHERE v.ref = ?1");
    q.Bind(1, vacancies[i]);
    while (q.Step()) {
      const std::string probe = q.Text(0);
      REQUIRE(RunCli({"--study", s.path, "sent", probe, "--at", "2027-03-01T09:00"}, kNow).exit_code == 0);
      if (q.Int(1) && i < reference_wins)
        REQUIRE(RunCli({"--study", s.path, "record", probe, "invitation", "--at", "2027-03-05"}, kNow).exit_code == 0);
    }
  }
}

}  // namespace

TEST_CASE("issue 16: one stratum value among the analysed sets gives one sentence, not a one-row table") {
  testing::PlannedStudy s;
  // Four vacancies of the demo that are all bookkeeper posts in North Fen.
  SendAndAnswer(s, {"V0001", "V0013", "V0025", "V0037"}, 3);

  const auto text = RunCli({"--study", s.path, "analyze"}, kNow);
  INFO(text.err);
  REQUIRE(text.exit_code == 0);
  CHECK(text.out.find(std::string("\n") + kOccupation + "\n") != std::string::npos);
  CHECK(text.out.find(std::string("\n") + kRegion + "\n") != std::string::npos);
  CHECK(text.out.find("By stratum") == std::string::npos);
  CHECK(text.out.find("Across occupation") == std::string::npos);

  const auto j = nlohmann::json::parse(RunCli({"--study", s.path, "--json", "analyze"}, kNow).out);
  CHECK(j["counts"]["sets_analysed"] == 4);
  CHECK(j["effects"]["single_strata"] ==
        nlohmann::json::array({{{"column", "occupation"}, {"value", "bookkeeper"}, {"sentence", kOccupation}},
                               {{"column", "region"}, {"value", "North Fen"}, {"sentence", kRegion}}}));
  CHECK(j["effects"]["strata"].empty());
  CHECK(j["effects"]["across_strata"].empty());
  CHECK(j["paired"]["strata"].empty());

  const std::string html = s.dir / "r.html";
  REQUIRE(RunCli({"--study", s.path, "report", "--html", "--out", html}, kNow).exit_code == 0);
  const testing::ParsedHtml page(testing::ReadFile(html));
  std::vector<std::string> paragraphs;
  for (const auto* p : page.ElementsByTag("p")) paragraphs.push_back(testing::ParsedHtml::TextOf(p));
  CHECK(std::count(paragraphs.begin(), paragraphs.end(), kOccupation) == 1);
  CHECK(std::count(paragraphs.begin(), paragraphs.end(), kRegion) == 1);
  CHECK(page.AllText().find("Unequal pairs by stratum") == std::string::npos);
}

TEST_CASE("issue 16: two values of a column keep the stratified analysis, one-valued columns get the sentence") {
  testing::PlannedStudy s;
  // Bookkeeper posts in North Fen and (V0005, V0017) on the Harbour Coast.
  SendAndAnswer(s, {"V0001", "V0005", "V0013", "V0017"}, 2);
  const auto j = nlohmann::json::parse(RunCli({"--study", s.path, "--json", "analyze"}, kNow).out);
  CHECK(j["effects"]["single_strata"] ==
        nlohmann::json::array({{{"column", "occupation"}, {"value", "bookkeeper"}, {"sentence", kOccupation}}}));
  bool region_across = false;
  for (const auto& a : j["effects"]["across_strata"]) region_across = region_across || a["column"] == "region";
  CHECK(region_across);
}
