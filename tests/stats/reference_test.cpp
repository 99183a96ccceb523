// twinprobe's stats/ against the fixtures that tests/reference/generate.R
// (R 4.2.2's stats package) and tests/reference/generate.py (scipy 1.10.1,
// statsmodels 0.13.5) wrote: every value to 1e-9 relative, R's
// uniroot-based conditional odds ratios within R's own tolerance.
#include <catch2/catch.hpp>

#include <iostream>

#include "stats/reference_check.h"
#include "testing/testing.h"

using twinprobe::testing::CheckReferenceText;
using twinprobe::testing::ReadFile;
using twinprobe::testing::SourceDir;

namespace {

void CheckFixture(const std::string& name, int min_lines) {
  auto s = CheckReferenceText(ReadFile(SourceDir() + "/tests/reference/" + name));
  for (const auto& f : s.failures) UNSCOPED_INFO(f);
  CHECK(s.failures.empty());
  CHECK(s.lines >= min_lines);
  std::cout << name << ": " << s.lines << " cases, " << s.checks << " values at 1e-9 (max relative error "
            << s.max_rel_error << "), " << s.loose_checks << " within R's uniroot tolerance, " << s.underflow_checks
            << " p-values below 1e-300 on both sides\n";
}

}  // namespace

TEST_CASE("reference: every R fixture agrees to 1e-9") { CheckFixture("r_fixtures.tsv", 700); }

TEST_CASE("reference: every scipy and statsmodels fixture agrees to 1e-9") { CheckFixture("py_fixtures.tsv", 150); }
