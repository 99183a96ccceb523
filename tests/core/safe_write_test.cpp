#include "core/safe_write.h"

#include <catch2/catch.hpp>

#include <sys/stat.h>
#include <unistd.h>

#include <filesystem>

#include "testing/testing.h"

using namespace twinprobe;
namespace fs = std::filesystem;

namespace {

// Names in `dir` other than those listed: a leftover temporary shows here.
std::vector<std::string> Names(const std::string& dir) {
  std::vector<std::string> names;
  for (const auto& e : fs::directory_iterator(dir)) names.push_back(e.path().filename().string());
  std::sort(names.begin(), names.end());
  return names;
}

}  // namespace

TEST_CASE("safe write: a planted link at the target is replaced, the file it points at is untouched") {
  testing::TempDir dir;
  testing::WriteFile(dir / "outside.txt", "keep me\n");
  fs::create_directory(dir / "study");
  fs::create_symlink(dir / "outside.txt", dir / "study/report.html");
  REQUIRE(WriteFileSafely(dir / "study/report.html", "<p>report</p>\n").ok());
  CHECK(testing::ReadFile(dir / "outside.txt") == "keep me\n");
  CHECK_FALSE(fs::is_symlink(dir / "study/report.html"));
  CHECK(testing::ReadFile(dir / "study/report.html") == "<p>report</p>\n");
  CHECK(Names(dir / "study") == std::vector<std::string>{"report.html"});
}

TEST_CASE("safe write: the file gets the mode a plain open would give") {
  testing::TempDir dir;
  mode_t old = ::umask(022);
  REQUIRE(WriteFileSafely(dir / "a.csv", "x\n").ok());
  ::umask(old);
  struct stat st {};
  REQUIRE(::stat((dir / "a.csv").c_str(), &st) == 0);
  CHECK((st.st_mode & 0777) == 0644);
}

TEST_CASE("safe write: an uncommitted file leaves neither the target nor a temporary") {
  testing::TempDir dir;
  testing::WriteFile(dir / "old.csv", "old\n");
  {
    auto f = SafeFile::Create(dir / "old.csv");
    REQUIRE(f.ok());
    f.value()->out() << "half of a new";
  }
  CHECK(testing::ReadFile(dir / "old.csv") == "old\n");
  CHECK(Names(dir.path()) == std::vector<std::string>{"old.csv"});
}

TEST_CASE("safe write: a missing folder is a bad-input error naming the target") {
  testing::TempDir dir;
  Status s = WriteFileSafely(dir / "no/such/file.csv", "x");
  REQUIRE_FALSE(s.ok());
  CHECK(s.error().where == dir / "no/such/file.csv");
  CHECK(s.error().what == "cannot create the file (No such file or directory)");
  CHECK(s.error().fix == "check that the folder exists and is writable");
}

TEST_CASE("safe folder: replaces an older folder whole and leaves no temporary") {
  testing::TempDir dir;
  fs::create_directory(dir / "export");
  testing::WriteFile(dir / "export/probes.csv", "old\n");
  auto f = SafeFolder::Create(dir / "export");
  REQUIRE(f.ok());
  REQUIRE(WriteFileSafely(f.value()->path() + "/probes.csv", "new\n").ok());
  CHECK(testing::ReadFile(dir / "export/probes.csv") == "old\n");  // not in place before Commit
  REQUIRE(f.value()->Commit().ok());
  CHECK(testing::ReadFile(dir / "export/probes.csv") == "new\n");
  CHECK(Names(dir.path()) == std::vector<std::string>{"export"});
}

TEST_CASE("safe folder: an abandoned folder leaves the old one as it was") {
  testing::TempDir dir;
  {
    auto f = SafeFolder::Create(dir / "export");
    REQUIRE(f.ok());
    testing::WriteFile(f.value()->path() + "/probes.csv", "half");
  }
  CHECK(Names(dir.path()).empty());
}

TEST_CASE("safe folder: a link at the target is refused") {
  testing::TempDir dir;
  fs::create_directory(dir / "elsewhere");
  fs::create_directory_symlink(dir / "elsewhere", dir / "export");
  auto f = SafeFolder::Create(dir / "export");
  REQUIRE_FALSE(f.ok());
  CHECK(f.error().Message() == dir / "export" + ": is a symbolic link; nothing is written through one \u2014 remove the "
                                                "link or choose another folder");
}
