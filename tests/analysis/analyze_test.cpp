// Analyze() on study shapes built in memory (no store, no binary): the
// counts it forms from core's read model and the tests it runs on them.
#include <catch2/catch.hpp>

#include "analysis/analyze.h"

using namespace twinprobe;
using Catch::Matchers::WithinRel;

namespace {

SetShape Pair(bool ref_positive, bool other_positive, const std::string& region, int64_t count) {
  SetShape s;
  s.probes = {{0, true, true, ref_positive}, {1, true, true, other_positive}};
  s.strata = {{"region", region}};
  s.complete = true;
  s.count = count;
  return s;
}

// A paired study of 100 complete pairs in two regions (a, b, c, d per
// region: Orlinde 20, 8, 1, 21 and Brakkeport 10, 2, 1, 37) and 5 pairs whose
// second probe was never sent.
StudyReading PairedStudy() {
  StudyReading r;
  Fieldwork& f = r.fieldwork;
  f.has_plan = true;
  f.kind = "paired";
  f.plan_origin = "import";
  f.arms = {{1, "origin=inland", true, 105}, {2, "origin=coastal", false, 105}};
  f.sets = {Pair(true, true, "Orlinde", 20),     Pair(true, false, "Orlinde", 8),
            Pair(false, true, "Orlinde", 1),     Pair(false, false, "Orlinde", 21),
            Pair(true, true, "Brakkeport", 10),  Pair(true, false, "Brakkeport", 2),
            Pair(false, true, "Brakkeport", 1),  Pair(false, false, "Brakkeport", 37)};
  SetShape unsent = Pair(true, false, "Orlinde", 5);
  unsent.probes[1] = {1, false, false, false};
  unsent.complete = IsSetComplete(unsent.probes);
  f.sets.push_back(unsent);
  f.sets_complete = 100;
  f.sets_incomplete = 5;
  r.design.study_id = "veldmark-2027";
  return r;
}

}  // namespace

TEST_CASE("analyze in memory: counted set shapes give the paired table, exact McNemar and arm rates") {
  const StudyReading reading = PairedStudy();
  auto result = Analyze(reading, "study.db", OutcomeScheme{}, AnalysisPlan{});
  REQUIRE(result.ok());
  const AnalysisResult& r = result.value();
  CHECK(r.title == "veldmark-2027");
  REQUIRE(r.has_paired);
  CHECK(r.paired.a == 30);
  CHECK(r.paired.b == 10);
  CHECK(r.paired.c == 2);
  CHECK(r.paired.d == 58);
  CHECK(r.sets_analysed == 100);
  CHECK(r.sets_incomplete == 5);
  // R 4.2: binom.test(2, 12)$p.value = 0.03857421875 (= 158/4096, the exact
  // two-sided McNemar p on 12 discordant pairs).
  CHECK_THAT(r.mcnemar_exact_p, WithinRel(0.03857421875, 1e-12));
  REQUIRE(r.arms.size() == 2);
  CHECK(r.arms[0].probes == 100);
  CHECK(r.arms[0].positive == 40);
  CHECK(r.arms[1].positive == 32);
  REQUIRE(r.strata.size() == 2);
  CHECK(r.strata[0].value == "Brakkeport");
  CHECK(r.strata[0].table.b == 2);
  CHECK(r.strata[1].table.b == 8);
}

TEST_CASE("analyze in memory: across strata a paired study keeps the pairs (R's chisq.test and fisher.test)") {
  auto result = Analyze(PairedStudy(), "study.db", OutcomeScheme{}, AnalysisPlan{});
  REQUIRE(result.ok());
  REQUIRE(result.value().effects.across.size() == 1);
  const AcrossStrata& across = result.value().effects.across[0];
  CHECK(across.paired);
  CHECK(across.tables.empty());  // no arm x outcome tables, no Mantel-Haenszel for pairs
  const auto& h = across.homogeneity;
  // Discordant (b, c): Brakkeport (2, 1), Orlinde (8, 1). R 4.2.2:
  // chisq.test(cbind(c(2, 8), c(1, 1)), correct = FALSE): X-squared = 0.8,
  // p = 0.371093369522698; fisher.test(cbind(c(2, 8), c(1, 1)))$p.value =
  // 0.454545454545455; the pooled b/c = 10/2 with binom.test(10, 12)'s
  // interval mapped by p/(1-p): [1.06552784349944, 46.93283545239456].
  CHECK_THAT(h.chi2, WithinRel(0.8, 1e-9));
  CHECK_THAT(h.chi2_p.p, WithinRel(0.371093369522698, 1e-9));
  REQUIRE(h.exact_p.has_value());
  CHECK_THAT(*h.exact_p, WithinRel(0.454545454545455, 1e-9));
  CHECK(h.pooled_odds_ratio.estimate == 5.0);
  CHECK_THAT(h.pooled_odds_ratio.ci.low, WithinRel(1.06552784349944, 1e-9));
  CHECK_THAT(h.pooled_odds_ratio.ci.high, WithinRel(46.93283545239456, 1e-9));
}

TEST_CASE("analyze in memory: no plan and no listings is one clear error") {
  StudyReading empty;
  auto result = Analyze(empty, "/tmp/s/study.db", OutcomeScheme{}, AnalysisPlan{});
  REQUIRE_FALSE(result.ok());
  CHECK(result.error().where == "/tmp/s/study.db");
  CHECK(result.error().what == "the store holds no plan yet");
  CHECK(result.error().fix == "run 'twinprobe plan' or 'twinprobe import pairs' first");
}
