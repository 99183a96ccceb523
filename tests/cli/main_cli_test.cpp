// The command line itself: typo suggestions wherever the command word comes,
// global options in every --help, the usage line's name, `init DIR`, and the
// one list that orders the commands.
#include <catch2/catch.hpp>
#include <filesystem>

#include "testing/testing.h"

using namespace twinprobe;
using testing::RunCli;

TEST_CASE("cli: a misspelt command after global options still gets a suggestion") {
  auto r = RunCli({"--study", "x", "recrod"});
  CHECK(r.exit_code == 2);
  CHECK(r.err ==
        "twinprobe: unknown command 'recrod' (did you mean 'record'?) \u2014 run 'twinprobe --help' for the list\n");
  auto json = RunCli({"--json", "analyse"});
  CHECK(json.exit_code == 2);
  CHECK(json.err ==
        "twinprobe: unknown command 'analyse' (did you mean 'analyze'?) \u2014 run 'twinprobe --help' for the list\n");
}

TEST_CASE("cli: a misspelt subcommand of a group names the group") {
  auto r = RunCli({"import", "--study", "x", "pair", "a.csv"});
  CHECK(r.exit_code == 2);
  CHECK(
      r.err ==
      "twinprobe: unknown command 'pair' (did you mean 'pairs'?) \u2014 run 'twinprobe import --help' for the list\n");
  auto calc = RunCli({"calc", "mcnemr", "--table", "1,2,3,4"});
  CHECK(calc.err ==
        "twinprobe: unknown command 'mcnemr' (did you mean 'mcnemar'?) \u2014 run 'twinprobe calc --help' for the "
        "list\n");
}

TEST_CASE("cli: every subcommand's help shows the global options and the name twinprobe") {
  auto record = RunCli({"record", "--help"});
  CHECK(record.exit_code == 0);
  CHECK(record.out.find("Usage: twinprobe record [OPTIONS] probe code\n") != std::string::npos);
  CHECK(record.out.find("Global options (before or after the command):\n"
                        "  --study TEXT                Study folder (holds study.toml and study.db); default: current "
                        "folder\n"
                        "  --json                      Print a stable JSON document instead of text\n") !=
        std::string::npos);
  auto pairs = RunCli({"import", "pairs", "--help"});
  CHECK(pairs.out.find("Usage: twinprobe import pairs [OPTIONS] file\n") != std::string::npos);
  CHECK(pairs.out.find("  --json                      Print a stable JSON document instead of text\n") !=
        std::string::npos);
  auto top = RunCli({"--help"});
  CHECK(top.out.find("Usage: twinprobe [OPTIONS] SUBCOMMAND\n") != std::string::npos);
}

TEST_CASE("cli: global options also work after the command") {
  testing::TempDir dir;
  auto r = RunCli({"init", "--study", dir / "s", "--json"});
  CHECK(r.exit_code == 0);
  CHECK(r.out.find("\"study\": \"" + dir / "s" + "\"") != std::string::npos);
}

TEST_CASE("cli: init takes the study folder as an argument") {
  testing::TempDir dir;
  auto r = RunCli({"init", dir / "mine"});
  CHECK(r.exit_code == 0);
  CHECK(r.err.empty());
  CHECK(std::filesystem::exists(dir / "mine/study.toml"));
  auto both = RunCli({"--study", dir / "a", "init", dir / "b"});
  CHECK(both.exit_code == 2);
  CHECK(both.err == "twinprobe: init was given two study folders: --study " + dir / "a" + " and " + dir / "b" +
                        " \u2014 give the folder once, either as 'init DIR' or as '--study DIR init'\n");
  CHECK_FALSE(std::filesystem::exists(dir / "a"));
  CHECK_FALSE(std::filesystem::exists(dir / "b"));
}

TEST_CASE("cli: the import and calc groups list every subcommand in one order") {
  auto import = RunCli({"import", "--help"});
  CHECK(import.out.find("  outcomes ") < import.out.find("  pairs "));
  CHECK(import.out.find("  pairs ") < import.out.find("  ranks "));
  CHECK(import.out.find("  ranks ") < import.out.find("  labels "));
  auto calc = RunCli({"calc", "--help"});
  CHECK(calc.out.find("  adjust ") < calc.out.find("  wilcoxon "));
  CHECK(calc.out.find("  wilcoxon ") < calc.out.find("  emd "));
}
