// Issue 23: outputs are safe to open and writes stay inside the study. Each
// case plants what the adversarial run planted (control characters in stored
// text, formula cells, links where outputs go) and runs the real binary.
#include <catch2/catch.hpp>

#include <filesystem>

#include "collector/collector_fixtures.h"
#include "core/csv.h"

using namespace twinprobe;
using testing::RunCli;
namespace fs = std::filesystem;

namespace {

const std::vector<std::string> kEnv = {"TWINPROBE_ACTOR=ana", "TWINPROBE_NOW=2027-03-06T08:00"};

// Sends `probe` on 2027-03-01 (a response needs a sending), then records an
// invitation with `note`.
void Record(const testing::PlannedStudy& s, const std::string& probe, const std::string& note) {
  testing::SendProbes(s.path, {probe}, "2027-03-01", kEnv);
  auto r = RunCli({"--study", s.path, "record", probe, "invitation", "--at", "2027-03-05", "--note", note}, kEnv);
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
}

// The cell of `column` in the first data row of a CSV file.
std::string FirstCell(const std::string& path, const std::string& column) {
  auto t = ReadCsvFile(path);
  REQUIRE(t.ok());
  int c = t.value().Column(column);
  REQUIRE(c >= 0);
  REQUIRE(!t.value().rows.empty());
  return t.value().rows[0].fields[static_cast<size_t>(c)];
}

}  // namespace

TEST_CASE("issue 23: control characters in a note are shown escaped by history, never sent raw") {
  testing::PlannedStudy s;
  Record(s, "P00001", "\x1b]0;owned\x07" "fine\n  2027-03-05T08:00:00Z      9  mallory       forged\x1b[2J");
  auto r = RunCli({"--study", s.path, "history", "P00001"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  CHECK(r.out.find('\x1b') == std::string::npos);
  CHECK(r.out.find('\x07') == std::string::npos);
  CHECK(r.out.find("note: \\x1b]0;owned\\x07fine\\n  2027-03-05T08:00:00Z      9  mallory       forged\\x1b[2J\n") !=
        std::string::npos);
  CHECK(r.out.find("\n  2027-03-05T08:00:00Z      9  mallory") == std::string::npos);  // no forged line
}

TEST_CASE("issue 23: an error message echoes a control character escaped") {
  testing::PlannedStudy s;
  auto r = RunCli({"--study", s.path, "record", "P\x1b[2J1", "invitation", "--at", "2027-03-05"}, kEnv);
  CHECK(r.exit_code == 1);
  CHECK(r.err.find('\x1b') == std::string::npos);
  CHECK(r.err.find("'P\\x1b[2J1'") != std::string::npos);
}

TEST_CASE("issue 23: a line break in TWINPROBE_ACTOR is refused before anything is written") {
  testing::PlannedStudy s;
  const std::string before = testing::FingerprintOf(s.db());
  auto r = RunCli({"--study", s.path, "record", "P00001", "invitation", "--at", "2027-03-05"},
                  {"TWINPROBE_ACTOR='ana\n  2027-03-05T08:00:00Z      9  mallory'", "TWINPROBE_NOW=2027-03-06T08:00"});
  CHECK(r.exit_code == 1);
  CHECK(r.out == "");
  CHECK(r.err ==
        "twinprobe: TWINPROBE_ACTOR: holds a line break or another control character \u2014 set it to one line of "
        "text, e.g. TWINPROBE_ACTOR=ana\n");
  CHECK(testing::FingerprintOf(s.db()) == before);
}

TEST_CASE("issue 23: exported cells that a spreadsheet would run as formulas begin with a quote, unless --raw-cells") {
  testing::PlannedStudy s;
  const std::string formula = "=HYPERLINK(\"http://example.invalid/\",\"open\")";
  Record(s, "P00001", formula);
  auto r = RunCli({"--study", s.path, "export", "--identities"}, kEnv);
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  CHECK(FirstCell(s.path + "/export/responses.csv", "note") == "'" + formula);
  auto raw = RunCli({"--study", s.path, "export", "--identities", "--raw-cells"}, kEnv);
  REQUIRE(raw.exit_code == 0);
  CHECK(FirstCell(s.path + "/export/responses.csv", "note") == formula);
}

TEST_CASE("issue 23: a link planted at export/probes.csv is replaced, the file it points at is untouched") {
  testing::PlannedStudy s;
  testing::TempDir outside;
  testing::WriteFile(outside / "bashrc", "keep me\n");
  fs::create_directory(s.path + "/export");
  fs::create_symlink(outside / "bashrc", s.path + "/export/probes.csv");
  auto r = RunCli({"--study", s.path, "export"}, kEnv);
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  CHECK(testing::ReadFile(outside / "bashrc") == "keep me\n");
  CHECK_FALSE(fs::is_symlink(s.path + "/export/probes.csv"));
  CHECK(FirstCell(s.path + "/export/probes.csv", "probe") == "P00001");
  for (const auto& e : fs::directory_iterator(s.path))  // no temporary folder left beside it
    CHECK(e.path().filename().string().find(".tmp-") == std::string::npos);
}

TEST_CASE("issue 23: an export folder that holds other files is not replaced") {
  testing::PlannedStudy s;
  fs::create_directory(s.path + "/export");
  testing::WriteFile(s.path + "/export/thesis.tex", "mine\n");
  auto r = RunCli({"--study", s.path, "export"}, kEnv);
  CHECK(r.exit_code == 1);
  CHECK(r.err == "twinprobe: " + s.path +
                     "/export: the folder holds 'thesis.tex', which is not part of an export \u2014 choose a new "
                     "folder with --out, or empty this one; an export replaces its whole folder\n");
  CHECK(testing::ReadFile(s.path + "/export/thesis.tex") == "mine\n");
}

TEST_CASE("issue 23: a link planted at the report's path is replaced, the file it points at is untouched") {
  testing::PlannedStudy s;
  testing::TempDir outside;
  testing::WriteFile(outside / "notes.txt", "keep me\n");
  fs::create_directory(s.path + "/reports");
  fs::create_symlink(outside / "notes.txt", s.path + "/reports/report.txt");
  auto r = RunCli({"--study", s.path, "report", "--out", s.path + "/reports/report.txt"}, kEnv);
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  CHECK(testing::ReadFile(outside / "notes.txt") == "keep me\n");
  CHECK_FALSE(fs::is_symlink(s.path + "/reports/report.txt"));
  CHECK(testing::ReadFile(s.path + "/reports/report.txt").empty() == false);
}

TEST_CASE("issue 23: a reject file that would replace the input is refused, input and store unchanged") {
  testing::PlannedStudy s;
  const std::string csv = s.path + "/outcomes.csv";
  const std::string text = "probe,code,received_at\nP00001,invitation,2027-03-05\nP9,offer,2027-03-06\n";
  testing::WriteFile(csv, text);
  const std::string before = testing::FingerprintOf(s.db());
  auto r = RunCli({"--study", s.path, "import", "outcomes", csv, "--skip-bad", "--rejects", csv}, kEnv);
  CHECK(r.exit_code == 1);
  CHECK(r.err == "twinprobe: " + csv +
                     ": the reject file is the file being imported \u2014 name another file with --rejects (the "
                     "default is FILE.rejects.csv)\n");
  CHECK(testing::ReadFile(csv) == text);
  CHECK(testing::FingerprintOf(s.db()) == before);
}

TEST_CASE("issue 23: a link planted at the reject file's path is replaced, formula cells are quoted") {
  testing::PlannedStudy s;
  testing::TempDir outside;
  testing::WriteFile(outside / "profile", "keep me\n");
  const std::string csv = s.path + "/outcomes.csv";
  testing::SendProbes(s.path, {"P00001"}, "2027-03-01", kEnv);
  testing::WriteFile(csv, "probe,code,received_at,note\nP00001,invitation,2027-03-05,ok\n@P9,offer,2027-03-06,-1+1\n");
  fs::create_symlink(outside / "profile", csv + ".rejects.csv");
  auto r = RunCli({"--study", s.path, "import", "outcomes", csv, "--skip-bad"}, kEnv);
  INFO(r.err);
  REQUIRE(r.exit_code == 1);  // --skip-bad exits 1 when a row was left out
  CHECK(testing::ReadFile(outside / "profile") == "keep me\n");
  CHECK(testing::ReadFile(csv + ".rejects.csv") ==
        "reject_line,reject_reason,probe,code,received_at,note\r\n3,unknown probe '@P9','@P9,offer,2027-03-06,'-1+1\r\n");
}

TEST_CASE("issue 23: a link planted at materials/P00001.html is replaced, the file it points at is untouched") {
  testing::PlannedStudy s;
  testing::TempDir outside;
  testing::WriteFile(outside / "index.html", "keep me\n");
  fs::create_directory(s.path + "/materials");
  fs::create_symlink(outside / "index.html", s.path + "/materials/P00001.html");
  auto r = RunCli({"--study", s.path, "render"}, kEnv);
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  CHECK(testing::ReadFile(outside / "index.html") == "keep me\n");
  CHECK_FALSE(fs::is_symlink(s.path + "/materials/P00001.html"));
  CHECK(testing::ReadFile(s.path + "/materials/P00001.html").rfind("<!DOCTYPE html>", 0) == 0);
}
