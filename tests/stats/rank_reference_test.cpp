// Rank statistics against reference libraries from Debian's packages:
// scipy 1.10 (wasserstein_distance) and R 4.2 (wilcox.test, binom.test,
// psignrank, pwilcox), through fixtures written by
// tests/reference/ranks/generate.py (rerun it to refresh them).
#include <catch2/catch.hpp>

#include <cmath>
#include <string>

#include <nlohmann/json.hpp>

#include "stats/wasserstein.h"
#include "stats/wilcoxon.h"
#include "testing/testing.h"

using namespace twinprobe::stats;
using Catch::Matchers::WithinAbs;
using Catch::Matchers::WithinRel;

namespace {

const nlohmann::json& Fixtures() {
  static const nlohmann::json j = nlohmann::json::parse(
      twinprobe::testing::ReadFile(twinprobe::testing::SourceDir() + "/tests/reference/ranks/fixtures.json"));
  return j;
}

Alternative ParseAlternative(const std::string& s) {
  return s == "less" ? Alternative::kLess : s == "greater" ? Alternative::kGreater : Alternative::kTwoSided;
}

RankMethod ParseExact(const std::string& s) {
  return s == "TRUE" ? RankMethod::kExact : s == "FALSE" ? RankMethod::kNormal : RankMethod::kAuto;
}

}  // namespace

TEST_CASE("rank reference: wasserstein distance equals scipy's wasserstein_distance") {
  const auto& cases = Fixtures()["wasserstein"];
  REQUIRE(cases.size() >= 40);
  for (const auto& c : cases) {
    auto u = c["u"].get<std::vector<double>>(), v = c["v"].get<std::vector<double>>();
    auto uw = c["uw"].get<std::vector<double>>(), vw = c["vw"].get<std::vector<double>>();
    REQUIRE(CheckWassersteinInput(u, v, uw, vw).empty());
    const double expected = c["distance"].get<double>();
    CHECK_THAT(Wasserstein1(u, v, uw, vw), WithinRel(expected, 1e-12) || WithinAbs(expected, 1e-14));
  }
}

TEST_CASE("rank reference: paired signed-rank test equals R's wilcox.test(x, y, paired = TRUE)") {
  const auto& cases = Fixtures()["signed_rank"];
  REQUIRE(cases.size() >= 30);
  int exact = 0, normal = 0;
  for (const auto& c : cases) {
    auto x = c["x"].get<std::vector<double>>(), y = c["y"].get<std::vector<double>>();
    std::vector<double> d(x.size());
    for (size_t i = 0; i < x.size(); ++i) d[i] = x[i] - y[i];
    RankTestResult r = WilcoxonSignedRank(d, ParseAlternative(c["alternative"]), ParseExact(c["exact"]),
                                          c["correct"] == "TRUE");
    INFO("n = " << x.size() << ", alternative " << c["alternative"] << ", exact " << c["exact"]);
    CHECK(r.exact == c["exact_used"].get<bool>());
    CHECK(r.statistic == c["statistic"].get<double>());
    CHECK_THAT(r.p_value, WithinRel(c["p_value"].get<double>(), 1e-9));
    // The Hodges-Lehmann estimate: R's median of the Walsh averages; R's own
    // wilcox.test estimate is the same number in its exact branch.
    CHECK_THAT(r.estimate, WithinRel(c["hodges_lehmann"].get<double>(), 1e-12) || WithinAbs(0, 1e-300));
    if (r.exact) CHECK(r.estimate == c["r_estimate"].get<double>());
    (r.exact ? exact : normal)++;
  }
  CHECK(exact >= 5);
  CHECK(normal >= 5);
}

TEST_CASE("rank reference: rank-sum test equals R's wilcox.test(x, y)") {
  const auto& cases = Fixtures()["rank_sum"];
  REQUIRE(cases.size() >= 30);
  int exact = 0, normal = 0;
  for (const auto& c : cases) {
    auto x = c["x"].get<std::vector<double>>(), y = c["y"].get<std::vector<double>>();
    RankTestResult r =
        MannWhitney(x, y, ParseAlternative(c["alternative"]), ParseExact(c["exact"]), c["correct"] == "TRUE");
    INFO("m = " << x.size() << ", n = " << y.size() << ", alternative " << c["alternative"] << ", exact " << c["exact"]);
    CHECK(r.exact == c["exact_used"].get<bool>());
    CHECK(r.statistic == c["statistic"].get<double>());
    CHECK_THAT(r.p_value, WithinRel(c["p_value"].get<double>(), 1e-9));
    CHECK_THAT(r.estimate, WithinRel(c["hodges_lehmann"].get<double>(), 1e-12) || WithinAbs(0, 1e-300));
    if (r.exact) CHECK(r.estimate == c["r_estimate"].get<double>());
    (r.exact ? exact : normal)++;
  }
  CHECK(exact >= 5);
  CHECK(normal >= 5);
}

TEST_CASE("rank reference: sign test equals R's binom.test(k, n, 0.5)") {
  for (const auto& c : Fixtures()["sign_test"]) {
    const int k = c["k"], n = c["n"];
    std::vector<double> d;
    for (int i = 0; i < n; ++i) d.push_back(i < k ? 1.0 : -1.0);
    d.push_back(0.0);  // a zero is dropped
    SignTestResult s = SignTest(d, ParseAlternative(c["alternative"]));
    CHECK(s.zeros == 1);
    CHECK_THAT(s.p_value, WithinRel(c["p_value"].get<double>(), 1e-12));
  }
}

TEST_CASE("rank reference: null distributions equal R's psignrank and pwilcox") {
  for (const auto& c : Fixtures()["psignrank"])
    CHECK_THAT(PSignRank(c["q"].get<double>(), c["n"].get<int64_t>()), WithinRel(c["p"].get<double>(), 1e-12));
  for (const auto& c : Fixtures()["pwilcox"])
    CHECK_THAT(PWilcox(c["q"].get<double>(), c["m"].get<int64_t>(), c["n"].get<int64_t>()),
               WithinRel(c["p"].get<double>(), 1e-12));
}
