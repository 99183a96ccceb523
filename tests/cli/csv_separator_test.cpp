// Issue 17, item 7: a semicolon-separated CSV is refused with a message that
// names the separator, and every importer takes --separator.
#include <catch2/catch.hpp>

#include <filesystem>

#include "testing/testing.h"

using namespace twinprobe;
using testing::RunCli;

namespace {

// Ten invented pairs as an applications file, fields joined by `sep`.
std::string Pairs(const std::string& sep) {
  std::string text = "vacancy" + sep + "arm" + sep + "outcome\n";
  for (int v = 1; v <= 10; ++v) {
    text += "V" + std::to_string(v) + sep + "majority" + sep + (v <= 4 ? "1" : "0") + "\n";
    text += "V" + std::to_string(v) + sep + "minority" + sep + (v <= 2 ? "1" : "0") + "\n";
  }
  return text;
}

}  // namespace

TEST_CASE("issue 17: a semicolon-separated file is refused by name and nothing is written") {
  testing::TempDir dir;
  const std::string csv = dir / "applications.csv";
  testing::WriteFile(csv, Pairs(";"));
  auto r = RunCli({"--study", dir / "s", "import", "pairs", csv, "--reference", "majority"});
  CHECK(r.exit_code == 1);
  CHECK(r.err == "twinprobe: " + csv +
                     ":1: the file looks semicolon-separated \u2014 save it as CSV with commas, or pass --separator "
                     "';'\n");
  CHECK(r.out.empty());
  CHECK_FALSE(std::filesystem::exists(dir / "s/study.db"));
}

TEST_CASE("issue 17: --separator reads semicolon and tab files like their comma twins") {
  testing::TempDir dir;
  for (const auto& [sep, option] : std::vector<std::pair<std::string, std::string>>{{";", ";"}, {"\t", "tab"}}) {
    const std::string study = dir / ("s" + option), csv = dir / ("a" + option + ".csv");
    testing::WriteFile(csv, Pairs(sep));
    auto r = RunCli({"--study", study, "import", "pairs", csv, "--reference", "majority", "--separator", option});
    INFO(r.err);
    CHECK(r.exit_code == 0);
    CHECK(r.out.rfind("Created a paired study from " + csv + ": 20 probes in 10 vacancies; reference arm majority", 0) ==
          0);
  }
}

TEST_CASE("issue 17: every importer lists --separator and an unknown one is a usage error") {
  for (const char* importer : {"outcomes", "sendings", "pairs", "ranks", "labels"}) {
    INFO(importer);
    auto help = RunCli({"import", importer, "--help"});
    CHECK(help.exit_code == 0);
    CHECK(help.out.find("--separator") != std::string::npos);
  }
  testing::TempDir dir;
  auto bad = RunCli({"--study", dir / "s", "import", "pairs", dir / "a.csv", "--separator", "semicolon"});
  CHECK(bad.exit_code == 2);
  CHECK(bad.err.find("give ',', ';', '|' or tab, not 'semicolon'") != std::string::npos);
}
