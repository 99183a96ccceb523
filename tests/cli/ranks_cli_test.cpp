// End-to-end tests of `import ranks`, the listing audit in `analyze`, and
// `calc wilcoxon` / `calc emd`, on the real binary.
#include <catch2/catch.hpp>

#include <filesystem>
#include <set>
#include <sstream>

#include <nlohmann/json.hpp>

#include "testing/testing.h"

using namespace twinprobe;
using testing::RunCli;
using Catch::Matchers::WithinRel;

namespace {

const char* kRanks =
    "listing,query,location,position,item,gender,origin\n"
    "L1,clerk,Orlinde,1,a,f,inland\n"
    "L1,clerk,Orlinde,2,b,m,coastal\n"
    "L1,clerk,Orlinde,3,c,f,coastal\n"
    "L2,clerk,Tessvale,1,d,m,inland\n"
    "L2,clerk,Tessvale,2,a,f,inland\n"
    "L2,clerk,Tessvale,3,e,m,coastal\n";

std::string DemoRanks() { return testing::SourceDir() + "/templates/demo/listings/ranks.csv"; }

// Distinct item keys in the demo file (column 7; the file has no quoted fields).
size_t DemoItems() {
  std::set<std::string> items;
  std::istringstream in(testing::ReadFile(DemoRanks()));
  std::string line;
  std::getline(in, line);  // header
  while (std::getline(in, line)) {
    std::istringstream fields(line);
    std::string f;
    for (int k = 0; k < 7; ++k) std::getline(fields, f, ',');
    items.insert(f);
  }
  return items.size();
}

}  // namespace

TEST_CASE("import ranks: a folder without a design gets a store, and analyze shows the listing audit") {
  testing::TempDir dir;
  const std::string study = dir / "audit";
  auto r = RunCli({"--study", study, "import", "ranks", DemoRanks()});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  CHECK(r.out == "Imported 36 listings (720 positions, 12 query x location strata) from " + DemoRanks() +
                     "; " + std::to_string(2 * DemoItems()) + " item labels by gender, origin.\nRun 'twinprobe analyze' for the listing audit.\n" +
                     testing::HeadLine(study));
  CHECK(std::filesystem::exists(dir / "audit/study.db"));
  auto a = RunCli({"--study", study, "--json", "analyze"});
  INFO(a.err);
  REQUIRE(a.exit_code == 0);
  auto j = nlohmann::json::parse(a.out);
  CHECK(j["kind"] == "listing");
  const auto& audit = j["listing_audit"];
  CHECK(audit["listings"] == 36);
  CHECK(audit["appearances"] == 720);
  CHECK(audit["strata"] == 12);
  CHECK(audit["discount"] == "log2");
  // The invented board favours inland origins (generate_ranks.py: +0.8).
  bool found = false;
  for (const auto& c : audit["comparisons"])
    if (c["factor"] == "origin") {
      found = true;
      CHECK(c["exposure_gap"].get<double>() > 0);
      CHECK(c["emd"].get<double>() > 0);
    }
  CHECK(found);
  CHECK(audit["widest_split"]["split"] == "origin: inland | coastal");
  auto text = RunCli({"--study", study, "analyze"});
  CHECK(text.exit_code == 0);
  CHECK(text.out.rfind("Listing audit\n=============\n\n36 ranked lists", 0) == 0);
  CHECK(text.out.find("Widest split of the listed population: origin: inland | coastal") != std::string::npos);
  auto verify = RunCli({"--study", study, "verify"});
  CHECK(verify.exit_code == 0);
}

TEST_CASE("import ranks: JSON output, and a second import of the same file adds nothing") {
  testing::TempDir dir;
  testing::WriteFile(dir / "r.csv", kRanks);
  auto r = RunCli({"--study", dir / "s", "--json", "import", "ranks", dir / "r.csv"});
  REQUIRE(r.exit_code == 0);
  auto j = nlohmann::json::parse(r.out);
  CHECK(j["listings"] == 2);
  CHECK(j["positions"] == 6);
  CHECK(j["labels_added"] == 10);  // 5 items x 2 factors
  CHECK(j["strata"] == 2);
  CHECK(j["factors"] == nlohmann::json::array({"gender", "origin"}));
  CHECK(j["already_imported"] == false);
  auto again = RunCli({"--study", dir / "s", "import", "ranks", dir / "r.csv"});
  CHECK(again.exit_code == 0);
  CHECK(again.out == "This file was imported before; nothing was added.\n");
}

TEST_CASE("import ranks: bad rows are named by FILE:LINE and nothing is written") {
  testing::TempDir dir;
  struct Case {
    std::string csv, message;
  };
  const std::string f = dir / "bad.csv";
  std::vector<Case> cases = {
      {"listing,position,gender\nL1,1,f\n",
       f + ":1: a ranks file needs the column 'item' \u2014 name the columns listing,position,item, then one column "
           "per protected attribute (e.g. gender,origin) and optionally query,location,seen_by,score"},
      {"listing,position,item,query\nL1,1,a,q\n",
       f + ":1: the file has no group column \u2014 add one column per protected attribute (e.g. gender, origin) "
           "holding each item's level"},
      {"listing,position,item,gender\nL1,1,a,f\nL1,0,b,m\n",
       f + ":3: position '0' is not a whole number from 1 to 1000000 \u2014 write the place in the list, 1 for the top"},
      {"listing,position,item,gender\nL1,1,a,f\nL1,1,b,m\n",
       f + ":3: listing L1 has position 1 twice (first on line 2) \u2014 each place of a list holds one item"},
      {"listing,position,item,gender\nL1,1,a,f\nL1,2,a,f\n",
       f + ":3: item a appears twice in listing L1 (first on line 2) \u2014 an item has one place in a list; check "
           "the item keys"},
      {"listing,position,item,gender\nL1,1,a,f\nL2,1,a,m\n",
       f + ":3: item a is gender=f on line 2 but gender=m here \u2014 an item keeps its group; correct one of the "
           "two rows"},
      {"listing,query,position,item,gender\nL1,clerk,1,a,f\nL1,cook,2,b,m\n",
       f + ":3: listing L1 has query 'clerk' on line 2 but 'cook' here \u2014 one listing is one list: give all its "
           "rows the same query, or a new listing name"},
      {"listing,position,item,page,gender\nL1,1,a,1,f\n",
       f + ":1: a ranks file has no page column: a position counts from the top of the whole list \u2014 number the "
           "places across pages (page 2 of 20 starts at 21) and drop the page column"},
      {"listing,position,item,gender\n,1,a,f\n",
       f + ":2: the listing is empty \u2014 give every row the listing it belongs to"},
      {"listing,position,item,gender,score\nL1,1,a,f,high\n",
       f + ":2: score 'high' is not a number \u2014 write a number such as 0.82, or leave it empty"},
      {"listing,position,item,gender\nL1,1,a,f,extra\n",
       f + ":2: the row has 5 fields but the header has 4 \u2014 check for a missing or extra comma, or quote fields "
           "that contain commas"},
  };
  for (const auto& c : cases) {
    testing::WriteFile(f, c.csv);
    auto r = RunCli({"--study", dir / "s", "import", "ranks", f});
    CHECK(r.exit_code == 1);
    CHECK(r.err == "twinprobe: " + c.message + "\n");
    CHECK_FALSE(std::filesystem::exists(dir / "s/study.db"));  // the file is checked before the store is made
  }
}

TEST_CASE("import ranks: an item's group in the store cannot be changed by a later file") {
  testing::TempDir dir;
  testing::WriteFile(dir / "r.csv", kRanks);
  REQUIRE(RunCli({"--study", dir / "s", "import", "ranks", dir / "r.csv"}).exit_code == 0);
  testing::WriteFile(dir / "r2.csv", "listing,position,item,gender\nL9,1,a,m\n");
  auto r = RunCli({"--study", dir / "s", "import", "ranks", dir / "r2.csv"});
  CHECK(r.exit_code == 1);
  CHECK(r.err == "twinprobe: " + (dir / "r2.csv") +
                     ": item a is gender=f in the store (audit entry 1) but gender=m in this file \u2014 an item keeps "
                     "its group here; use a new item key, or correct the label with 'twinprobe import labels'\n");
  auto a = RunCli({"--study", dir / "s", "--json", "analyze"});
  CHECK(nlohmann::json::parse(a.out)["listing_audit"]["listings"] == 2);  // the store is unchanged
}

TEST_CASE("calc wilcoxon: Cureton's differences, exact, as R") {
  auto r = RunCli({"--json", "calc", "wilcoxon", "--x", "6,8,14,16,23,24,28,29,41,-48,49,56,60,-67,75"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  auto j = nlohmann::json::parse(r.out);
  CHECK(j["statistic"] == 96.0);
  CHECK_THAT(j["p_value"].get<double>(), WithinRel(0.041259765625, 1e-12));
  CHECK(j["exact"] == true);
  CHECK(j.contains("estimate"));
}

TEST_CASE("calc wilcoxon: paired and two-sample forms, text output") {
  // Hollander & Wolfe (1973) p. 29 via R's ?wilcox.test: two-sided exact p = 2 * 10/512.
  auto paired = RunCli({"--json", "calc", "wilcoxon", "--x", "1.83,0.50,1.62,2.48,1.68,1.88,1.55,3.06,1.30", "--y",
                        "0.878,0.647,0.598,2.05,1.06,1.29,1.06,3.14,1.29", "--paired"});
  REQUIRE(paired.exit_code == 0);
  auto j = nlohmann::json::parse(paired.out);
  CHECK(j["statistic"] == 40.0);
  CHECK_THAT(j["p_value"].get<double>(), WithinRel(20.0 / 512.0, 1e-12));
  auto greater = RunCli({"--json", "calc", "wilcoxon", "--x", "1.83,0.50,1.62,2.48,1.68,1.88,1.55,3.06,1.30", "--y",
                         "0.878,0.647,0.598,2.05,1.06,1.29,1.06,3.14,1.29", "--paired", "--alternative", "greater"});
  REQUIRE(greater.exit_code == 0);
  CHECK_THAT(nlohmann::json::parse(greater.out)["p_value"].get<double>(), WithinRel(10.0 / 512.0, 1e-12));  // R: 0.01953
  auto text = RunCli({"calc", "wilcoxon", "--x", "0.80,0.83,1.89,1.04,1.45,1.38,1.91,1.64,0.73,1.46", "--y",
                      "1.15,0.88,0.90,0.74,1.21", "--normal"});
  REQUIRE(text.exit_code == 0);
  CHECK(text.out.rfind("Wilcoxon-Mann-Whitney rank-sum test, two-sided, normal approximation with continuity "
                       "correction:\n  W = 35, p = ",
                       0) == 0);
}

TEST_CASE("calc wilcoxon: bad input and usage errors") {
  auto bad = RunCli({"calc", "wilcoxon", "--x", "1,two,3"});
  CHECK(bad.exit_code == 1);
  CHECK(bad.err == "twinprobe: --x: 'two' is not a number \u2014 write numbers separated by commas, e.g. --x 1.5,2,3\n");
  auto alt = RunCli({"calc", "wilcoxon", "--x", "1,2", "--alternative", "bigger"});
  CHECK(alt.exit_code == 1);
  CHECK(alt.err == "twinprobe: --alternative: unknown alternative 'bigger' \u2014 use two-sided, less or greater\n");
  auto both = RunCli({"calc", "wilcoxon", "--x", "1,2", "--exact", "--normal"});
  CHECK(both.exit_code == 2);
  auto lengths = RunCli({"calc", "wilcoxon", "--x", "1,2", "--y", "1", "--paired"});
  CHECK(lengths.exit_code == 1);
  CHECK(lengths.err == "twinprobe: --y: --x has 2 values but --y has 1 \u2014 paired data need one y for each x\n");
  auto ties = RunCli({"calc", "wilcoxon", "--x", "1,1,2", "--exact"});
  CHECK(ties.exit_code == 0);
  CHECK(ties.err ==
        "twinprobe: warning: an exact p-value needs no ties; the normal approximation with continuity correction is "
        "used, as R's wilcox.test does\n");
}

TEST_CASE("calc emd: scipy's weighted example, and bad weights") {
  auto r = RunCli({"--json", "calc", "emd", "--u", "3.4,3.9,7.5,7.8", "--v", "4.5,1.4", "--u-weights",
                   "1.4,0.9,3.1,7.2", "--v-weights", "3.2,3.5"});
  REQUIRE(r.exit_code == 0);
  CHECK_THAT(nlohmann::json::parse(r.out)["distance"].get<double>(), WithinRel(4.0781331438, 1e-10));
  auto text = RunCli({"calc", "emd", "--u", "0,1,3", "--v", "5,6,8"});
  CHECK(text.out == "Earth mover's (1-Wasserstein) distance: 5\n");
  auto bad = RunCli({"calc", "emd", "--u", "1,2", "--v", "3", "--u-weights", "1"});
  CHECK(bad.exit_code == 1);
  CHECK(bad.err == "twinprobe: the sample u has 2 values but 1 weights \u2014 give as many non-negative weights as "
                   "values, with a positive sum\n");
}

TEST_CASE("demo: the report includes the listing audit of the invented job board") {
  testing::TempDir dir;
  auto r = RunCli({"demo", "--out", dir / "demo"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  CHECK(r.out.find("imported  36 invented candidate rankings") != std::string::npos);
  CHECK(r.out.find("Listing audit\n-------------\n") != std::string::npos);
  auto json = nlohmann::json::parse(testing::ReadFile(dir / "demo/reports/report.json"));
  const auto& audit = json["listing_audit"];
  CHECK(audit["listings"] == 36);
  // The demo plan's reference level (inland) is the listing reference too.
  CHECK(audit["factors"][1]["name"] == "origin");
  CHECK(audit["factors"][1]["reference"] == "inland");
}
