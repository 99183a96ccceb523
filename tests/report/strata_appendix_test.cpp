// The HTML appendix of per-stratum tables for unpaired records
// (report/strata_appendix.h): one compact table per requisition, counts by
// group and outcome and the requisition's Fisher p, in the HTML only.
#include <catch2/catch.hpp>

#include <string>

#include "testing/testing.h"

using namespace twinprobe;
using testing::RunCli;

namespace {

size_t CountOf(const std::string& text, const std::string& what) {
  size_t n = 0;
  for (size_t at = text.find(what); at != std::string::npos; at = text.find(what, at + 1)) ++n;
  return n;
}

}  // namespace

TEST_CASE("report: records of an unpaired study get an appendix with one table per requisition") {
  testing::TempDir dir;
  const std::string study = dir / "hr";
  REQUIRE(RunCli({"--study", study, "import", "applications", testing::SourceDir() + "/tests/cli/data/hr_applications.csv",
                  "--kind", "unpaired", "--columns", "arm=gender,outcome=invited,vacancy=req_id", "--reference", "woman",
                  "--positive", "yes"})
              .exit_code == 0);
  REQUIRE(RunCli({"--study", study, "report", "--out", dir / "r.html"}).exit_code == 0);
  const std::string html = testing::ReadFile(dir / "r.html");
  const size_t at = html.find("<section id=\"appendix-strata\">");
  REQUIRE(at != std::string::npos);
  const std::string appendix = html.substr(at, html.find("</section>", at) - at);
  CHECK(html.find("<section", at + 1) == std::string::npos);  // the last section
  CHECK(CountOf(appendix, "<table class=\"data stratum-table\">") == 14);  // 14 requisitions
  // REQ-001: woman 1 invited of 4, man 2 of 3;
  // fisher.test(matrix(c(1, 2, 3, 1), 2))$p.value = 0.48571428571428577
  CHECK(appendix.find("<caption><bdi>vacancy: REQ-001</bdi></caption>") != std::string::npos);
  CHECK(appendix.find("<tr><th scope=\"row\"><bdi>woman (reference)</bdi></th><td class=\"num\">1</td><td "
                      "class=\"num\">3</td><td class=\"num\"></td></tr><tr><th scope=\"row\"><bdi>man</bdi></th><td "
                      "class=\"num\">2</td><td class=\"num\">1</td><td class=\"num\">0.486</td></tr>") != std::string::npos);
  // Not in the text report.
  CHECK(RunCli({"--study", study, "analyze"}).out.find("REQ-001") == std::string::npos);
}
