// The one p-value rule: every output (analyze, report, monitor, calc) prints
// p through these two functions.
#include "report/p_value.h"

#include <catch2/catch.hpp>
#include <cmath>
#include <limits>

using namespace twinprobe;

TEST_CASE("p value: three significant digits, then an exponent, then a floor") {
  CHECK(FormatP(1.0) == "1");
  CHECK(FormatP(0.5) == "0.5");
  CHECK(FormatP(0.24285714) == "0.243");
  CHECK(FormatP(0.001) == "0.001");
  CHECK(FormatP(0.00076993) == "7.70e-04");
  CHECK(FormatP(1e-16) == "1.00e-16");
  CHECK(FormatP(9.9e-17) == "< 1e-16");
  CHECK(FormatP(0.0) == "< 1e-16");
  CHECK(FormatP(std::numeric_limits<double>::quiet_NaN()) == "not defined");
}

TEST_CASE("p value: a sentence says p < 1e-16, never p = < 1e-16") {
  CHECK(PEquals(0.0312) == "p = 0.0312");
  CHECK(PEquals(3e-20) == "p < 1e-16");
  CHECK(PEquals(std::numeric_limits<double>::quiet_NaN()) == "p not defined");
}

TEST_CASE("p value: an exact p kept in log space adds its log10 below the floor") {
  stats::PValue underflowed{0.0, -1504.8};
  CHECK(FormatP(underflowed) == "< 1e-16 (log10 p = -1504.8)");
  CHECK(PEquals(underflowed) == "p < 1e-16 (log10 p = -1504.8)");
  stats::PValue ordinary{0.0312, std::log10(0.0312)};
  CHECK(PEquals(ordinary) == "p = 0.0312");
}
