// The worked examples of the docs cannot go stale: each page's examples are
// re-run on the real binary, in order, as one shell session, and compared
// with what the page shows. The rules (what an example is, elisions, set-up
// comments, refusals) live in one place, scripts/update-doc-examples, which
// also rewrites the pages; this test runs its --check mode on each page (one
// test case per page, so ctest runs them in parallel and names the page that
// differs) and holds how many examples each page must have, so a page that
// loses its examples, or a reader that stops finding them, fails here.
#include <catch2/catch.hpp>

#include <array>
#include <cstdio>
#include <string>
#include <sys/wait.h>

#include "testing/testing.h"

namespace {

struct ScriptRun {
  int exit_code = -1;
  std::string out;  // standard output and standard error together
};

std::string Quote(const std::string& s) {
  std::string q = "'";
  for (char ch : s) q += ch == '\'' ? std::string("'\\''") : std::string(1, ch);
  return q + "'";
}

// Runs scripts/update-doc-examples --check on `page` (a path, relative to the
// source tree unless absolute) with the binary under test.
ScriptRun CheckPage(const std::string& page) {
  const std::string source = twinprobe::testing::SourceDir();
  const std::string cmd = "cd " + Quote(source) + " && /usr/bin/python3 scripts/update-doc-examples --check --binary " +
                          Quote(twinprobe::testing::BinaryPath()) + " " + Quote(page) + " 2>&1";
  ScriptRun run;
  FILE* pipe = popen(cmd.c_str(), "r");
  REQUIRE(pipe != nullptr);
  std::array<char, 4096> buf{};
  size_t n = 0;
  while ((n = fread(buf.data(), 1, buf.size(), pipe)) > 0) run.out.append(buf.data(), n);
  const int status = pclose(pipe);
  run.exit_code = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
  return run;
}

void RequirePage(const std::string& page, int examples) {
  const ScriptRun run = CheckPage(page);
  INFO(run.out);
  CHECK(run.exit_code == 0);
  CHECK(run.out.find(page + ": " + std::to_string(examples) + " examples compared\n") != std::string::npos);
}

}  // namespace

TEST_CASE("docs examples: a session page runs in order and takes elisions") {
  twinprobe::testing::TempDir dir;
  const std::string page = dir / "page.md";
  twinprobe::testing::WriteFile(page,
                                "<!-- example-file: names.txt -->\n```\na\nb\nc\nd\n```\n"
                                "```\n$ twinprobe --version > version.txt\n$ cat names.txt\na\n\u2026\nd\n"
                                "$ head -1 names.txt && echo x = 1 and more\na\nx = 1 \u2026\n```\n");
  const ScriptRun run = CheckPage(page);
  INFO(run.out);
  CHECK(run.exit_code == 0);
  CHECK(run.out == page + ": 2 examples compared\n");
}

TEST_CASE("docs examples: a changed line fails and names the page line") {
  twinprobe::testing::TempDir dir;
  const std::string page = dir / "page.md";
  twinprobe::testing::WriteFile(page, "```\n$ twinprobe --version >/dev/null && echo 'p = 0.00105.'\np = 7.70e-04.\n```\n");
  const ScriptRun run = CheckPage(page);
  CHECK(run.exit_code == 1);
  CHECK(run.out == page + ":2: $ twinprobe --version >/dev/null && echo 'p = 0.00105.'\n" +
                       "  the page and the program differ:\n--- shown\n+++ printed\n@@ -1 +1 @@\n-p = 7.70e-04.\n+p = 0.00105.\n" +
                       page + ": 1 examples compared, 1 problems\n");
}

TEST_CASE("docs examples: a refusal shown as one must fail, a success must succeed") {
  twinprobe::testing::TempDir dir;
  const std::string page = dir / "page.md";
  twinprobe::testing::WriteFile(page, "```\n$ twinprobe --study nowhere verify\ntwinprobe: \u2026\n$ twinprobe nosuchcommand\nok\n```\n");
  const ScriptRun run = CheckPage(page);
  CHECK(run.exit_code == 1);
  CHECK(run.out.find(page + ":4: $ twinprobe nosuchcommand\n  shown as succeeding, but it exited with 2\n") != std::string::npos);
  CHECK(run.out.find(page + ": 2 examples compared, 2 problems\n") != std::string::npos);
}

// One case per page; the number is the page's examples shown with output.
#define DOCS_PAGE(page, examples) \
  TEST_CASE("docs examples: " page " prints what it shows") { RequirePage(page, examples); }

DOCS_PAGE("docs/analyze.md", 2)
DOCS_PAGE("docs/calc.md", 5)
DOCS_PAGE("docs/check.md", 4)
DOCS_PAGE("docs/decline.md", 6)
DOCS_PAGE("docs/demo.md", 1)
DOCS_PAGE("docs/designs.md", 3)
DOCS_PAGE("docs/desk.md", 1)
DOCS_PAGE("docs/export.md", 4)
DOCS_PAGE("docs/fetch.md", 2)
DOCS_PAGE("docs/freeze.md", 7)
DOCS_PAGE("docs/history.md", 2)
DOCS_PAGE("docs/import.md", 28)
DOCS_PAGE("docs/init.md", 3)
DOCS_PAGE("docs/mail.md", 2)
DOCS_PAGE("docs/monitor.md", 1)
DOCS_PAGE("docs/offices.md", 13)
DOCS_PAGE("docs/plan.md", 1)
DOCS_PAGE("docs/power.md", 8)
DOCS_PAGE("docs/purge.md", 4)
DOCS_PAGE("docs/ranks.md", 5)
DOCS_PAGE("docs/record.md", 10)
DOCS_PAGE("docs/render.md", 10)
DOCS_PAGE("docs/report.md", 3)
DOCS_PAGE("docs/review.md", 8)
DOCS_PAGE("docs/safety.md", 2)
DOCS_PAGE("docs/schedule.md", 4)
DOCS_PAGE("docs/verify.md", 7)
DOCS_PAGE("docs/withdraw.md", 6)
