// `analyze` on applicant records (`import applications`) whose group names
// and stratum values hold non-ASCII letters: the text tables pad by code
// points (core/text.h PadRight), and the k-level section and the data lines
// speak of groups of applications, never of a correspondence test's probes,
// callbacks, employers, design hash or seed. The file: 72 invented
// applications, groups nord (reference), süd and øst, 8 per group in each of
// three invented towns.
#include <catch2/catch.hpp>

#include <regex>
#include <sstream>

#include <nlohmann/json.hpp>

#include "core/sha256.h"
#include "core/text.h"
#include "testing/testing.h"

using namespace twinprobe;
using testing::RunCli;

namespace {

// Row k of a group's 8 in a town is positive when (k + town + 2 x group) is a
// multiple of 3: 3/8 or 2/8 per cell, 8/24 per group.
std::string RecordsFile() {
  const char* towns[] = {"Weidenbr\xC3\xBC" "ck", "\xC3\x85lholm", "Norbury"};
  const char* groups[] = {"nord", "s\xC3\xBC" "d", "\xC3\xB8st"};
  std::string csv = "G,O,town\n";
  for (int t = 0; t < 3; ++t)
    for (int g = 0; g < 3; ++g)
      for (int k = 0; k < 8; ++k)
        csv += std::string(groups[g]) + "," + ((k + t + 2 * g) % 3 == 0 ? "yes" : "no") + "," + towns[t] + "\n";
  return csv;
}

struct RecordsStudy {
  testing::TempDir dir;
  std::string file = dir / "f.csv";
  std::string study = dir / "s";
  RecordsStudy() {
    testing::WriteFile(file, RecordsFile());
    auto r = RunCli({"--study", study, "import", "applications", file, "--kind", "unpaired", "--columns",
                     "arm=G,outcome=O", "--positive", "yes", "--factor", "name origin", "--strata", "town",
                     "--reference", "nord"});
    INFO(r.err);
    REQUIRE(r.exit_code == 0);
  }
};

// The lines of `text` from the one starting with `first` up to the next blank line.
std::vector<std::string> Block(const std::string& text, const std::string& first) {
  std::vector<std::string> lines;
  std::istringstream in(text.substr(text.find("\n" + first) + 1));
  for (std::string line; std::getline(in, line) && !line.empty();) lines.push_back(line);
  return lines;
}

// The code-point offset of `token` in `line` (npos when absent).
size_t Column(const std::string& line, const std::string& token) {
  const size_t at = line.find(token);
  return at == std::string::npos ? at : CodePoints(line.substr(0, at));
}

}  // namespace

TEST_CASE("issue 19: text tables of records with non-ASCII names keep their columns") {
  RecordsStudy s;
  auto a = RunCli({"--study", s.study, "analyze"});
  REQUIRE(a.exit_code == 0);
  const auto strata = Block(a.out, "By stratum");
  REQUIRE(strata.size() == 7);
  CHECK(strata[2] == "  town         Weidenbr\xC3\xBC" "ck        s\xC3\xBC" "d            3/8 vs 3/8  p 1          adj 1        "
                     "OR 1 [0.0855, 11.7]");
  for (size_t i = 1; i < strata.size(); ++i) {
    INFO(strata[i]);
    // 2 + 12 (column) + 1 + 18 (value) + 1 + 14 (group) + 1 code points, then "3/8".
    CHECK(Column(strata[i], "/8 vs") == 50);
    CHECK(Column(strata[i], " p ") == 60);
  }
  const auto rates = Block(a.out, "Positive outcome (yes) by group");
  REQUIRE(rates.size() == 4);
  CHECK(rates[3] == "  \xC3\xB8st                               8 / 24       33.3%   [15.6%, 55.3%]");
  for (size_t i = 1; i < rates.size(); ++i) CHECK(Column(rates[i], " / ") == 37);
  const auto levels = Block(a.out, "Factor name origin");
  REQUIRE(levels.size() >= 4);
  for (size_t i = 1; i < 4; ++i) CHECK(Column(levels[i], " / ") == 29);
}

TEST_CASE("issue 19: analyze words records as groups of applications, with the file they came from") {
  RecordsStudy s;
  auto a = RunCli({"--study", s.study, "analyze"});
  REQUIRE(a.exit_code == 0);
  const auto factor = Block(a.out, "Factor name origin");
  REQUIRE(factor.size() == 11);
  CHECK(factor[0] == "Factor name origin (groups of applications), positive outcome by group:");
  CHECK(factor[1] == "  nord                      8 / 24       33.3%");
  CHECK(factor[4] == "  The test of equal positive rates across the 3 levels of name origin (k x 2");
  CHECK(factor[5] == "  table of applications) does not reject equality at alpha 0.05:");
  CHECK(factor[7] == "  Every pair of groups (Fisher's exact test; p adjusted by holm over the 3 pairs):");
  const std::string sha = Sha256Hex(testing::ReadFile(s.file));
  CHECK(Block(a.out, "Data: ") ==
        std::vector<std::string>{"Data: applicant records; groups nord (reference), s\xC3\xBC" "d and \xC3\xB8st of name "
                                 "origin; a positive outcome is yes; strata town.",
                                 "Imported from " + s.file + ": 72 rows, SHA-256 " + sha + "."});
  // Nothing of a correspondence test: no probes, callbacks, sendings,
  // fictitious applicants, employers, design hash or seed.
  const std::regex test_words("\\b(callbacks?|probes?|sent|fictitious|employers?|seed|Design hash)\\b", std::regex::icase);
  std::smatch m;
  CHECK_FALSE(std::regex_search(a.out, m, test_words));
  INFO(m.str());
  auto j = nlohmann::json::parse(RunCli({"--study", s.study, "--json", "analyze"}).out);
  CHECK(j["design"]["design_sha256"].is_null());
  CHECK(j["design"]["seed"].is_null());
}

TEST_CASE("issue 19: the HTML design section of records describes the imported file") {
  RecordsStudy s;
  auto r = RunCli({"--study", s.study, "report", "--out", s.dir / "r.html"}, {"TWINPROBE_NOW=2027-04-26T14:59:00Z"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  const std::string html = testing::ReadFile(s.dir / "r.html");
  const size_t from = html.find("id=\"design\""), to = html.find("id=\"rates\"");
  REQUIRE(from != std::string::npos);
  const std::string design = html.substr(from, to - from);
  CHECK(design.find("<h2>The data</h2>") != std::string::npos);
  CHECK(design.find("Fictitious") == std::string::npos);
  CHECK(design.find("Applications sent") == std::string::npos);
  CHECK(design.find("Design hash") == std::string::npos);
  CHECK(design.find(Sha256Hex(testing::ReadFile(s.file))) != std::string::npos);
  CHECK(design.find("Applications by town") != std::string::npos);
}

TEST_CASE("issue 19: the HTML report of records speaks of applications and outcomes, not of a test sent out") {
  RecordsStudy s;
  auto r = RunCli({"--study", s.study, "report", "--out", s.dir / "r.html"}, {"TWINPROBE_NOW=2027-04-26T14:59:00Z"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  const std::string html = testing::ReadFile(s.dir / "r.html");
  CHECK(html.find("<p class=\"kicker\">Applicant records report</p>") != std::string::npos);
  // No vacancy column: the masthead counts applications, not invented vacancies.
  CHECK(html.find(" · 72 applications · ") != std::string::npos);
  CHECK(html.find("72 vacancies") == std::string::npos);
  CHECK(html.find("<h2>Positive outcomes by group</h2>") != std::string::npos);
  for (const char* word : {"Correspondence test report", "allback", "Flow of the study", "Declines of positive",
                           "from sending", "Sets analysed", "applicant who does not exist"}) {
    INFO(word);
    CHECK(html.find(word) == std::string::npos);
  }
}
