// desk/study_files.h: which files the desk serves.
#include "desk/study_files.h"

#include <catch2/catch.hpp>
#include <filesystem>

#include "testing/testing.h"

using namespace twinprobe;
namespace fs = std::filesystem;

TEST_CASE("desk files: only regular files under materials and reports, never through a symbolic link") {
  testing::TempDir dir;
  fs::create_directories(dir / "study/materials/sub");
  fs::create_directories(dir / "study/reports");
  testing::WriteFile(dir / "study/materials/P00001.html", "<p>letter</p>");
  testing::WriteFile(dir / "study/materials/sub/P00002.md", "letter");
  testing::WriteFile(dir / "study/reports/report.html", "<p>report</p>");
  testing::WriteFile(dir / "secret.txt", "outside");
  fs::create_symlink(dir / "secret.txt", dir / "study/materials/link.html");
  fs::create_directory_symlink(dir.path(), dir / "study/reports/up");
  const std::string study = dir / "study";

  auto ok = ResolveStudyFile(study, "/files/materials/P00001.html");
  REQUIRE(ok.ok());
  CHECK(ok.value().path == study + "/materials/P00001.html");
  CHECK(ok.value().content_type == "text/html; charset=utf-8");
  CHECK(ResolveStudyFile(study, "/files/materials/sub/P00002.md").value().content_type == "text/plain; charset=utf-8");
  CHECK(ResolveStudyFile(study, "/files/reports/report.html").ok());

  auto message = [&](const std::string& url) { return ResolveStudyFile(study, url).error().Message(); };
  CHECK(message("/files/study.db") ==
        "/files/study.db: only files under materials/ and reports/ are served \u2014 open files from the desk's links");
  CHECK(message("/files/materials/../study.db") ==
        "/files/materials/../study.db: the path has an empty, hidden or parent part \u2014 open files from the desk's "
        "links");
  CHECK(
      message("/files/materials/.hidden") ==
      "/files/materials/.hidden: the path has an empty, hidden or parent part \u2014 open files from the desk's links");
  CHECK(message("/files/materials//P00001.html") ==
        "/files/materials//P00001.html: the path has an empty, hidden or parent part \u2014 open files from the desk's "
        "links");
  CHECK(message("/files/materials/link.html") ==
        "/files/materials/link.html: the path goes through a symbolic link, which the desk does not follow \u2014 copy "
        "the file into the study folder instead of linking it");
  CHECK(message("/files/reports/up/secret.txt") ==
        "/files/reports/up/secret.txt: the path goes through a symbolic link, which the desk does not follow \u2014 "
        "copy the file into the study folder instead of linking it");
  CHECK(message("/files/materials/sub") ==
        "/files/materials/sub: not a regular file \u2014 open files from the desk's links");
  CHECK(message("/files/materials/P09999.html") ==
        "/files/materials/P09999.html: no such file \u2014 render the materials or the report first");
}
