// The worked examples of the docs cannot go stale: every example that shows
// output is re-run on the real binary and compared line for line. Examples
// on the demo study (`--study demo-study`) run on one demo built once per
// test run. A shown line "…" stands for any number of lines, and a line
// ending in " …" for any line that starts with the text before it, so an
// example may show the part of a long output that the page talks about.
// scripts/update-doc-examples PAGE rewrites a page's outputs from the binary.
#include <catch2/catch.hpp>

#include <cstdlib>
#include <map>
#include <sstream>
#include <string>
#include <vector>

#include "testing/testing.h"

namespace {

using twinprobe::testing::RunCli;

struct Example {
  std::string command;              // after "$ twinprobe "
  std::vector<std::string> output;  // the lines shown after the command
};

// Splits a command line on spaces, keeping "double-quoted" words whole.
std::vector<std::string> Words(const std::string& line) {
  std::vector<std::string> out;
  std::string cur;
  bool quoted = false, any = false;
  for (char ch : line) {
    if (ch == '"') quoted = !quoted, any = true;
    else if (ch == ' ' && !quoted) {
      if (any) out.push_back(cur);
      cur.clear(), any = false;
    } else cur += ch, any = true;
  }
  if (any) out.push_back(cur);
  return out;
}

std::vector<Example> Examples(const std::string& markdown) {
  std::vector<Example> out;
  std::istringstream in(markdown);
  std::string line;
  bool in_block = false;
  Example* current = nullptr;
  while (std::getline(in, line)) {
    if (line.rfind("```", 0) == 0) {
      in_block = !in_block;
      current = nullptr;
      continue;
    }
    if (!in_block) continue;
    if (line.rfind("$ twinprobe ", 0) == 0) {
      out.push_back({line.substr(12), {}});
      current = &out.back();
    } else if (line.rfind("$ ", 0) == 0) {
      current = nullptr;  // another shell command: not the program's output
    } else if (current) {
      current->output.push_back(line);
    }
  }
  // A blank line before the next command separates examples; it is not output.
  for (auto& e : out)
    while (!e.output.empty() && e.output.back().empty()) e.output.pop_back();
  return out;
}

std::vector<std::string> Lines(const std::string& text) {
  std::vector<std::string> out;
  std::istringstream in(text);
  std::string line;
  while (std::getline(in, line)) out.push_back(line);
  return out;
}

const std::string kEllipsis = "\u2026";

bool EndsWith(const std::string& s, const std::string& tail) {
  return s.size() >= tail.size() && s.compare(s.size() - tail.size(), tail.size(), tail) == 0;
}

bool LineMatches(const std::string& shown, const std::string& actual) {
  if (EndsWith(shown, " " + kEllipsis)) {
    const std::string prefix = shown.substr(0, shown.size() - kEllipsis.size() - 1);
    return actual.rfind(prefix, 0) == 0;
  }
  return shown == actual;
}

// Glob matching over lines: "…" (or "...") alone matches any run of lines.
bool OutputMatches(const std::vector<std::string>& shown, const std::vector<std::string>& actual) {
  // can[i][j]: shown[i..] matches actual[j..].
  std::vector<std::vector<char>> can(shown.size() + 1, std::vector<char>(actual.size() + 1, 0));
  can[shown.size()][actual.size()] = 1;
  for (size_t i = shown.size(); i-- > 0;) {
    const bool skip = shown[i] == kEllipsis || shown[i] == "...";
    for (size_t j = actual.size() + 1; j-- > 0;) {
      if (skip) can[i][j] = can[i + 1][j] || (j < actual.size() && can[i][j + 1]);
      else can[i][j] = j < actual.size() && LineMatches(shown[i], actual[j]) && can[i + 1][j + 1];
    }
  }
  return can[0][0];
}

std::string ReplaceAll(std::string s, const std::string& from, const std::string& to) {
  for (size_t at = s.find(from); at != std::string::npos; at = s.find(from, at + to.size())) s.replace(at, from.size(), to);
  return s;
}

// The demo study the pages call demo-study, built once per test run.
const std::string& DemoStudy() {
  static twinprobe::testing::TempDir dir;
  static const std::string path = [] {
    const std::string out = dir / "demo-study";
    auto run = RunCli({"demo", "--out", out});
    REQUIRE(run.exit_code == 0);
    return out;
  }();
  return path;
}

// Runs every example of `page` that shows output; returns how many ran.
int CheckPage(const std::string& page) {
  const auto examples = Examples(twinprobe::testing::ReadFile(twinprobe::testing::SourceDir() + "/" + page));
  int compared = 0;
  for (const auto& e : examples) {
    if (e.output.empty()) continue;  // a command shown without output
    INFO(page << ": $ twinprobe " << e.command);
    std::vector<std::string> args = Words(e.command);
    // `demo --out demo-study` writes a fresh demo; `--study demo-study` reads the shared one.
    twinprobe::testing::TempDir fresh;
    std::string study = DemoStudy();
    for (size_t i = 0; i < args.size(); ++i) {
      if (args[i] == "demo" && i + 2 < args.size() && args[i + 1] == "--out") study = fresh / "demo-study";
      args[i] = ReplaceAll(args[i], "demo-study", study);
    }
    auto r = RunCli(args);
    INFO(r.err);
    // An example showing "twinprobe: …" is a refusal: it must fail and say that on standard error.
    const bool refusal = e.output.front().rfind("twinprobe: ", 0) == 0;
    if (refusal) CHECK(r.exit_code != 0);
    else CHECK(r.exit_code == 0);
    const std::string out = ReplaceAll(refusal ? r.err : r.out, study, "demo-study");
    INFO("printed:\n" << out);
    CHECK(OutputMatches(e.output, Lines(out)));
    ++compared;
  }
  return compared;
}

}  // namespace

TEST_CASE("docs examples: the line matcher takes elisions and rejects a changed line") {
  CHECK(OutputMatches({"a", kEllipsis, "d"}, {"a", "b", "c", "d"}));
  CHECK(OutputMatches({"a", "...", "d"}, {"a", "d"}));
  CHECK(OutputMatches({"x = 1 " + kEllipsis}, {"x = 1 and more"}));
  CHECK_FALSE(OutputMatches({"a", kEllipsis, "d"}, {"a", "b", "c", "e"}));
  CHECK_FALSE(OutputMatches({"a", "b"}, {"a", "b", "c"}));
  CHECK_FALSE(OutputMatches({"p = 7.70e-04."}, {"p = 0.00105."}));
}

TEST_CASE("docs examples: every worked example with output in the pages prints exactly that") {
  // The pages show the demo as of the end of its simulated season (2027),
  // the time `demo` itself prints; scripts/update-doc-examples pins the same.
  setenv("TWINPROBE_NOW", "2027-04-26T14:59:00Z", 1);
  // The number of examples with output per page, so a page that loses its
  // examples (or a parser that stops finding them) fails here.
  const std::map<std::string, int> pages = {
      {"docs/calc.md", 5}, {"docs/analyze.md", 1}, {"docs/report.md", 3}, {"docs/monitor.md", 1}, {"docs/demo.md", 1},
      {"docs/power.md", 8}};
  for (const auto& [page, expected] : pages) {
    INFO(page);
    CHECK(CheckPage(page) == expected);
  }
}
