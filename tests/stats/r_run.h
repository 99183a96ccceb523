#pragma once
// Runs one of the R scripts in tests/reference/models/ live on an input file
// written by a test, and reads back its "key v1 v2 ..." lines. A missing
// Rscript fails the test (scripts/setup installs r-base-core, r-cran-survival
// and r-cran-mass): it is never skipped silently.
#include <catch2/catch.hpp>

#include <cstdlib>
#include <map>
#include <sstream>
#include <string>
#include <vector>

#include "testing/testing.h"

namespace twinprobe::testing {

using RValues = std::map<std::string, std::vector<double>>;

inline RValues ParseRValues(const std::string& text) {
  RValues values;
  std::istringstream lines(text);
  std::string line;
  while (std::getline(lines, line)) {
    std::istringstream words(line);
    std::string key, word;
    words >> key;
    if (key.empty()) continue;
    auto& v = values[key];
    while (words >> word) v.push_back(word == "Inf" ? HUGE_VAL : word == "-Inf" ? -HUGE_VAL : std::strtod(word.c_str(), nullptr));
  }
  return values;
}

// Writes `input` to a temporary IN.tsv, runs `INTERPRETER SCRIPT IN.tsv
// OUT.txt ARGS` in tests/reference/models/ and returns OUT.txt's values.
inline RValues RunReferenceScript(const std::string& interpreter, const std::string& script, const std::string& input,
                                  const std::string& args) {
  TempDir dir;
  WriteFile(dir / "in.tsv", input);
  const std::string cmd = "cd '" + SourceDir() + "/tests/reference/models' && " + interpreter + " " + script + " '" +
                          (dir / "in.tsv") + "' '" + (dir / "out.txt") + "' " + args + " 2>'" + (dir / "err.txt") + "'";
  const int rc = std::system(cmd.c_str());
  INFO(ReadFile(dir / "err.txt"));
  REQUIRE(rc == 0);
  return ParseRValues(ReadFile(dir / "out.txt"));
}

inline RValues RunRScript(const std::string& script, const std::string& input, const std::string& args = "") {
  REQUIRE(std::system("command -v Rscript >/dev/null 2>&1") == 0);
  return RunReferenceScript("Rscript", script, input, args);
}

// The same with Debian's python3 (python3-scipy, python3-statsmodels), by
// its full path so that another python3 earlier on PATH is not picked up.
inline RValues RunPythonScript(const std::string& script, const std::string& input, const std::string& args = "") {
  REQUIRE(std::system("test -x /usr/bin/python3") == 0);
  return RunReferenceScript("/usr/bin/python3", script, input, args);
}

}  // namespace twinprobe::testing
