#pragma once
// Runs a short R program live (Rscript, installed by scripts/setup as
// r-base-core) and returns the numbers it prints, for tests that compare
// twinprobe with R's own functions. The program should end with
// cat(format(c(...), digits = 17), sep = "\n"); NaN, Inf and -Inf parse as
// such. A missing Rscript or an R error fails the calling test through the
// returned `ok` and `error`.
#include <cmath>
#include <cstdlib>
#include <sstream>
#include <string>
#include <vector>

#include "testing/testing.h"

namespace twinprobe::testing {

struct REval {
  bool ok = false;
  std::string error;
  std::vector<double> values;
};

inline REval RunR(const std::string& program) {
  REval r;
  TempDir dir;
  WriteFile(dir / "check.R", program);
  const std::string cmd = "Rscript '" + (dir / "check.R") + "' >'" + (dir / "out.txt") + "' 2>'" + (dir / "err.txt") + "'";
  const int rc = std::system(cmd.c_str());
  r.error = ReadFile(dir / "err.txt");
  if (rc != 0) return r;
  std::istringstream in(ReadFile(dir / "out.txt"));
  std::string word;
  while (in >> word) {
    if (word == "NaN" || word == "NA") r.values.push_back(NAN);
    else if (word == "Inf") r.values.push_back(INFINITY);
    else if (word == "-Inf") r.values.push_back(-INFINITY);
    else r.values.push_back(std::strtod(word.c_str(), nullptr));
  }
  r.ok = true;
  return r;
}

}  // namespace twinprobe::testing
