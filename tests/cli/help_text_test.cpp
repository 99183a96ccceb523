// Help, README and manual pages say what the commands do: each claim a
// newcomer tripped over is checked against the real binary here.
#include <catch2/catch.hpp>

#include <sstream>
#include <string>

#include "testing/testing.h"

using twinprobe::testing::ReadFile;
using twinprobe::testing::RunCli;

namespace {

std::string Source(const std::string& rel) { return ReadFile(std::string(TWINPROBE_SOURCE_DIR) + "/" + rel); }

// Markdown wraps sentences; compare with every run of whitespace as one space.
std::string Collapsed(const std::string& s) {
  std::string out;
  for (char c : s) {
    bool space = c == ' ' || c == '\n' || c == '\t';
    if (space && !out.empty() && out.back() == ' ') continue;
    out += space ? ' ' : c;
  }
  return out;
}

}  // namespace

TEST_CASE("help: usage errors exit 2 and bad input exits 1, as the README says") {
  auto usage = RunCli({"calc", "binom", "--no-such-option"});
  CHECK(usage.exit_code == 2);
  auto bad = RunCli({"calc", "binom", "--x", "5", "--n", "3"});
  CHECK(bad.exit_code == 1);
  std::string readme = Collapsed(Source("README.md"));
  CHECK(readme.find("Errors in the input name the place (`study.toml:14:3`, `responses.csv:12`) and how to fix "
                    "it, exit with 1, and leave the store as it was; usage errors (an unknown command or option, a "
                    "missing or malformed argument) exit with 2, and an internal error (a full disk, a damaged "
                    "store) with 3.") != std::string::npos);
}

TEST_CASE("help: calc wilcoxon --exact says it warns and falls back with ties, and it does") {
  auto help = RunCli({"calc", "wilcoxon", "--help"});
  CHECK(help.exit_code == 0);
  CHECK(Collapsed(help.out).find("Exact null distribution; with ties or zeros (or samples too large) it warns and "
                                 "falls back to the normal approximation, as R") != std::string::npos);
  auto run = RunCli({"calc", "wilcoxon", "--x", "1,1,2,3,-4", "--exact"});
  CHECK(run.exit_code == 0);
  CHECK(run.err ==
        "twinprobe: warning: an exact p-value needs no ties; the normal approximation with continuity correction is "
        "used, as R's wilcox.test does\n");
}

TEST_CASE("help: report --help says plain text is the default") {
  auto help = RunCli({"report", "--help"});
  CHECK(help.exit_code == 0);
  std::string out = Collapsed(help.out);
  CHECK(out.find("Write the study report: plain text (the default), self-contained HTML with charts (--html), or "
                 "JSON (--json)") != std::string::npos);
  CHECK(out.find("Plain-text report (the default when neither --html, --json nor --out FILE.html/.json is given)") !=
        std::string::npos);
}

TEST_CASE("help: docs/init.md shows what init prints, file count included") {
  twinprobe::testing::TempDir dir;
  auto run = RunCli({"--study", dir / "harbour-study", "init"});
  REQUIRE(run.exit_code == 0);
  std::string first = run.out.substr(0, run.out.find('\n'));
  CHECK(first == "Created an example study in " + (dir / "harbour-study") +
                     " (14 files: study.toml, vacancies.csv, name pools, templates, a ranks file for a listing audit, the "
                     "ethics folder).");
  CHECK(Source("docs/init.md").find("Created an example study in harbour-study (14 files: study.toml, vacancies.csv, "
                                    "name pools, templates, a ranks file for a listing audit, the ethics folder).") !=
        std::string::npos);
}

TEST_CASE("help: docs/calc.md's synopsis names every calc subcommand") {
  auto help = RunCli({"calc", "--help"});
  REQUIRE(help.exit_code == 0);
  std::string doc = Source("docs/calc.md");
  std::istringstream lines(help.out.substr(help.out.find("Subcommands:")));
  std::string line;
  std::getline(lines, line);  // "Subcommands:"
  int seen = 0;
  while (std::getline(lines, line) && !line.empty() && line[0] == ' ') {
    std::string name = line.substr(line.find_first_not_of(' '));
    name = name.substr(0, name.find(' '));
    INFO(name);
    CHECK(doc.find("twinprobe calc " + name + " ") != std::string::npos);
    ++seen;
  }
  CHECK(seen == 11);  // binom mcnemar fisher mh adjust ratio homogeneity equivalence employers wilcoxon emd
}
