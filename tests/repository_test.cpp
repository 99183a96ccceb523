// Rules about the repository itself, checked on every ctest run so they
// cannot drift: it stands alone (no reference to notes kept outside it), its
// modules are layered (docs/architecture.md, "Layers"), cli/ never calls the
// SQLite API, and (hidden until the statements have moved) SQL lives only in
// core/. Each finding names FILE:LINE so it can be fixed where it is.
#include <catch2/catch.hpp>

#include "testing/repository_scan.h"

#include <string>
#include <vector>

using twinprobe::testing::FindCliSqliteCalls;
using twinprobe::testing::FindLayerViolations;
using twinprobe::testing::FindOutsideReferences;
using twinprobe::testing::FindSqlOutsideCore;
using twinprobe::testing::RepositoryFiles;

namespace {

// Reports every finding as its own failure, so the log lists them all.
void RequireNone(const std::vector<std::string>& findings) {
  for (const auto& f : findings) FAIL_CHECK(f);
  CHECK(findings.empty());
}

// The forbidden names are assembled here so this file does not match itself.
const std::string kNotes = std::string("METH") + "ODS.md";

}  // namespace

TEST_CASE("repository scan: a reference to notes outside the repository is named with file and line") {
  auto found = FindOutsideReferences("stats/x.h", "// fine\n// see " + kNotes + " 7.1\n// and ../sha" "red/y\n");
  REQUIRE(found.size() == 2);
  CHECK(found[0] == "stats/x.h:2: refers to '" + kNotes + "', a file outside the repository: cite the published source itself");
  CHECK(found[1] == "stats/x.h:3: refers to '../sha" "red/', a file outside the repository: cite the published source itself");
}

TEST_CASE("repository scan: a module including a module above it is named, one below is not") {
  CHECK(FindLayerViolations("planner/a.cpp", "#include \"core/store.h\"\n#include \"stats/random.h\"\n").empty());
  auto found = FindLayerViolations("analysis/a.cpp", "#include \"core/store.h\"\n#include \"report/text_report.h\"\n");
  REQUIRE(found.size() == 1);
  CHECK(found[0] == "analysis/a.cpp:2: analysis/ includes report/text_report.h, a module above it "
                    "(order: core, stats < planner, collector < analysis < report < desk < cli)");
  auto sideways = FindLayerViolations("planner/b.h", "#include \"collector/responses.h\"\n");
  REQUIRE(sideways.size() == 1);
  CHECK(sideways[0] == "planner/b.h:1: planner/ includes collector/responses.h, a module beside it "
                       "(order: core, stats < planner, collector < analysis < report < desk < cli)");
}

TEST_CASE("repository scan: cli calling the SQLite API is named") {
  auto found = FindCliSqliteCalls("cli/x_cmd.cpp", "#include <sqlite3.h>\n  sqlite3_exec(db, q, 0, 0, 0);\n");
  REQUIRE(found.size() == 2);
  CHECK(found[1] == "cli/x_cmd.cpp:2: cli/ calls the SQLite API: go through a function in core/");
  CHECK(FindCliSqliteCalls("collector/x.cpp", "sqlite3_exec(db);\n").empty());
}

TEST_CASE("repository scan: SQL outside core is named, comments and core are not") {
  auto found = FindSqlOutsideCore("analysis/a.cpp",
                                  "// SELECT in a comment\n"
                                  "  Stmt s = store.Prepare(\"SELECT count(*) FROM probe\");\n"
                                  "  store.Exec(\"DELETE FROM x\");\n");
  REQUIRE(found.size() == 2);
  CHECK(found[0] == "analysis/a.cpp:2: SQL outside core/: Stmt s = store.Prepare(\"SELECT count(*) FROM probe\");");
  CHECK(FindSqlOutsideCore("core/a.cpp", "store.Prepare(\"SELECT 1\");\n").empty());
}

TEST_CASE("repository: no tracked file refers to a file outside the repository") {
  auto files = RepositoryFiles();
  REQUIRE(files.size() > 100);
  std::vector<std::string> all;
  for (const auto& f : files)
    for (auto& finding : FindOutsideReferences(f.path, f.text)) all.push_back(std::move(finding));
  RequireNone(all);
}

TEST_CASE("repository: no module includes a header of a module above it") {
  std::vector<std::string> all;
  for (const auto& f : RepositoryFiles())
    for (auto& finding : FindLayerViolations(f.path, f.text)) all.push_back(std::move(finding));
  RequireNone(all);
}

TEST_CASE("repository: cli does not call the SQLite API") {
  std::vector<std::string> all;
  for (const auto& f : RepositoryFiles())
    for (auto& finding : FindCliSqliteCalls(f.path, f.text)) all.push_back(std::move(finding));
  RequireNone(all);
}

// Only core/ speaks SQL: a statement elsewhere is named with file and line.
TEST_CASE("repository: SQL statements only in core", "[sql-outside-core]") {
  std::vector<std::string> all;
  for (const auto& f : RepositoryFiles())
    for (auto& finding : FindSqlOutsideCore(f.path, f.text)) all.push_back(std::move(finding));
  RequireNone(all);
}
