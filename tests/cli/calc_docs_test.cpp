// The worked examples of docs/calc.md cannot go stale: every example that
// shows output is re-run on the real binary and compared line for line.
#include <catch2/catch.hpp>

#include <sstream>
#include <string>
#include <vector>

#include "testing/testing.h"

namespace {

struct Example {
  std::string command;  // after "$ twinprobe "
  std::string output;   // the lines after the command, each ending in '\n'
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
      out.push_back({line.substr(12), ""});
      current = &out.back();
    } else if (current) {
      current->output += line + "\n";
    }
  }
  return out;
}

}  // namespace

TEST_CASE("calc docs: every worked example with output in docs/calc.md prints exactly that") {
  const auto examples = Examples(twinprobe::testing::ReadFile(twinprobe::testing::SourceDir() + "/docs/calc.md"));
  int compared = 0;
  for (const auto& e : examples) {
    if (e.output.empty()) continue;  // a command shown without output
    INFO("$ twinprobe " << e.command);
    auto r = twinprobe::testing::RunCli(Words(e.command));
    CHECK(r.exit_code == 0);
    CHECK(r.out == e.output);
    ++compared;
  }
  CHECK(compared == 5);
}
