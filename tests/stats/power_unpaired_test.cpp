#include <catch2/catch.hpp>

#include <cstdio>

#include "core/csv.h"
#include "stats/power_unpaired.h"
#include "testing/testing.h"

using namespace twinprobe;
using namespace twinprobe::stats;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

TEST_CASE("power unpaired: agrees with R's power.prop.test on the generated grid") {
  // tests/reference/power/power_prop_test.csv, written by power_prop_test.R
  // (R 4.2.2, stats::power.prop.test; n and p2 solved at uniroot tol 1e-12).
  auto table = ReadCsvFile(testing::SourceDir() + "/tests/reference/power/power_prop_test.csv");
  REQUIRE(table.ok());
  const auto& t = table.value();
  REQUIRE(t.rows.size() == 72);
  auto col = [&](const CsvRecord& r, const char* name) { return r.fields[t.Column(name)]; };
  auto num = [&](const CsvRecord& r, const char* name) { return std::stod(col(r, name)); };
  for (const auto& r : t.rows) {
    double p1 = num(r, "p1"), p2 = num(r, "p2"), alpha = num(r, "sig_level"), n = num(r, "n");
    int sides = static_cast<int>(num(r, "sides"));
    bool strict = col(r, "strict") == "true";
    INFO("line " << r.line);
    CHECK_THAT(NormalTwoProportionPower(n, p1, p2, alpha, sides, strict), WithinAbs(num(r, "power_at_n"), 1e-13));
    double n_solved = NormalTwoProportionSampleSize(p1, p2, alpha, num(r, "target_power"), sides, strict);
    CHECK_THAT(n_solved, WithinRel(num(r, "n_solved"), 1e-8));
    // R's own default tolerance (.Machine$double.eps^0.25) is much looser.
    CHECK_THAT(n_solved, WithinAbs(num(r, "n_default"), 1e-3));
    auto p2_solved = NormalTwoProportionDetectable(n, p1, alpha, num(r, "target_power"), true, sides, strict);
    REQUIRE(p2_solved.has_value());
    CHECK_THAT(*p2_solved, WithinAbs(num(r, "p2_solved"), 1e-8));
  }
}

TEST_CASE("power unpaired: live R check of the normal approximation") {
  // Runs R's power.prop.test now (r-base-core is a test dependency) on cases
  // outside the generated grid.
  const char* cmd =
      "Rscript -e 'x <- power.prop.test(n = 1356, p1 = 0.10, p2 = 0.07); "
      "y <- power.prop.test(p1 = 0.0965, p2 = 0.0645, power = 0.8, tol = 1e-12); "
      "z <- power.prop.test(n = 40, p1 = 0.5, p2 = 0.2, sig.level = 0.01, strict = TRUE); "
      "cat(sprintf(\"%.17g %.17g %.17g\", x$power, y$n, z$power))' 2>&1";
  FILE* pipe = popen(cmd, "r");
  REQUIRE(pipe != nullptr);
  double power_a = 0, n_b = 0, power_c = 0;
  REQUIRE(fscanf(pipe, "%lf %lf %lf", &power_a, &n_b, &power_c) == 3);
  REQUIRE(pclose(pipe) == 0);
  CHECK_THAT(NormalTwoProportionPower(1356, 0.10, 0.07, 0.05), WithinAbs(power_a, 1e-13));
  CHECK_THAT(NormalTwoProportionSampleSize(0.0965, 0.0645, 0.05, 0.8), WithinRel(n_b, 1e-8));
  CHECK_THAT(NormalTwoProportionPower(40, 0.5, 0.2, 0.01, 2, true), WithinAbs(power_c, 1e-13));
}

TEST_CASE("power unpaired: check values for callback-rate gaps") {
  // Fleiss without continuity correction; R 4.2.2 power.prop.test(p1, p2,
  // power = 0.8)$n gives 1355.37 and 1133.53: 10% vs 7% needs 1,356 per arm; 9.65% vs 6.45% needs 1,134.
  CHECK(std::ceil(NormalTwoProportionSampleSize(0.10, 0.07, 0.05, 0.80)) == 1356);
  CHECK(std::ceil(NormalTwoProportionSampleSize(0.0965, 0.0645, 0.05, 0.80)) == 1134);
}

TEST_CASE("power unpaired: the detectable p2 below p1 mirrors the one above") {
  auto below = NormalTwoProportionDetectable(1356, 0.10, 0.05, 0.80, false);
  REQUIRE(below.has_value());
  CHECK_THAT(NormalTwoProportionPower(1356, 0.10, *below, 0.05), WithinAbs(0.80, 1e-9));
  CHECK(*below < 0.10);
  CHECK_THAT(*below, WithinAbs(0.07, 0.001));  // 1,356 per arm was the size for 10% vs 7%
  // Nothing below p1 = 0.02 is detectable with 30 per arm.
  CHECK_FALSE(NormalTwoProportionDetectable(30, 0.02, 0.05, 0.80, false).has_value());
}
