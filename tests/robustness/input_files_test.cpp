// Issue 23: inputs are regular files inside their bounds. `import outcomes
// /dev/zero` hung and a FIFO blocked; vacancies.csv and name pools linked to
// files outside the study were read, though templates were refused.
#include <catch2/catch.hpp>

#include <sys/stat.h>

#include <chrono>
#include <filesystem>

#include "collector/collector_fixtures.h"

using namespace twinprobe;
using testing::RunCli;
namespace fs = std::filesystem;

namespace {

const std::vector<std::string> kEnv = {"TWINPROBE_ACTOR=ana", "TWINPROBE_NOW=2027-03-06T08:00"};

// A copy of the robustness fixture study in a temp folder.
std::string CopyFixture(const testing::TempDir& dir) {
  const std::string study = dir / "study";
  fs::copy(testing::SourceDir() + "/tests/robustness/fixture_study", study, fs::copy_options::recursive);
  return study;
}

}  // namespace

TEST_CASE("issue 23: import outcomes of /dev/zero is refused at once, store unchanged") {
  testing::PlannedStudy s;
  const std::string before = testing::FingerprintOf(s.db());
  auto start = std::chrono::steady_clock::now();
  auto r = RunCli({"--study", s.path, "import", "outcomes", "/dev/zero"}, kEnv);
  CHECK(std::chrono::steady_clock::now() - start < std::chrono::seconds(5));
  CHECK(r.exit_code == 1);
  CHECK(r.err ==
        "twinprobe: /dev/zero: is a device, not a file that can be read to its end \u2014 give a regular file, e.g. a "
        "CSV saved to disk\n");
  CHECK(testing::FingerprintOf(s.db()) == before);
}

TEST_CASE("issue 23: import pairs of a FIFO is refused at once instead of blocking") {
  testing::TempDir dir;
  const std::string fifo = dir / "pairs.csv";
  REQUIRE(::mkfifo(fifo.c_str(), 0600) == 0);
  auto r = RunCli({"--study", dir / "study", "import", "pairs", fifo, "--reference", "a"}, kEnv);
  CHECK(r.exit_code == 1);
  CHECK(r.err == "twinprobe: " + fifo +
                     ": is a FIFO (named pipe), not a file that can be read to its end \u2014 give a regular file, "
                     "e.g. a CSV saved to disk\n");
}

TEST_CASE("issue 23: a vacancies file linked to a file outside the study is refused like a template") {
  testing::TempDir dir;
  const std::string study = CopyFixture(dir);
  fs::rename(study + "/vacancies.csv", dir / "elsewhere.csv");
  fs::create_symlink(dir / "elsewhere.csv", study + "/vacancies.csv");
  auto r = RunCli({"--study", study, "check"});
  CHECK(r.exit_code == 1);
  CHECK(r.err.find("the vacancies file 'vacancies.csv' resolves outside the study folder (a symbolic link?) \u2014 "
                   "copy the file into the study folder instead of linking to it\n") != std::string::npos);
}

TEST_CASE("issue 23: a name pool linked to a file outside the study is refused") {
  testing::TempDir dir;
  const std::string study = CopyFixture(dir);
  fs::rename(study + "/names/inland.csv", dir / "inland.csv");
  fs::create_symlink(dir / "inland.csv", study + "/names/inland.csv");
  auto r = RunCli({"--study", study, "check"});
  CHECK(r.exit_code == 1);
  CHECK(r.err.find("the name pool 'names/inland.csv' resolves outside the study folder (a symbolic link?)") !=
        std::string::npos);
}

TEST_CASE("issue 23: a vacancies file that is a FIFO is refused without blocking") {
  testing::TempDir dir;
  const std::string study = CopyFixture(dir);
  fs::remove(study + "/vacancies.csv");
  REQUIRE(::mkfifo((study + "/vacancies.csv").c_str(), 0600) == 0);
  auto r = RunCli({"--study", study, "check"});
  CHECK(r.exit_code == 1);
  CHECK(r.err.find("the vacancies file 'vacancies.csv' is not a regular file \u2014 give a plain file\n") !=
        std::string::npos);
}

TEST_CASE("issue 23: import pairs --id ../../evil is refused, nothing is created") {
  testing::TempDir dir;
  testing::WriteFile(dir / "pairs.csv", "vacancy,arm,outcome\nV1,a,1\nV1,b,0\n");
  auto r = RunCli({"--study", dir / "study", "import", "pairs", dir / "pairs.csv", "--reference", "a", "--id",
                   "../../evil"},
                  kEnv);
  CHECK(r.exit_code == 1);
  CHECK(r.err ==
        "twinprobe: --id: the study id may hold only letters, digits, '-', '_' and '.' (at most 100 of them) \u2014 "
        "choose an id such as veldmark-2027\n");
  CHECK_FALSE(fs::exists(dir / "study/study.db"));
}
