// Hiring stages (analysis/stages.h) on small invented counts, checked
// against R's fisher.test and p.adjust (calls beside the values).
#include <catch2/catch.hpp>

#include "analysis/stages.h"

using namespace twinprobe;
using Catch::Matchers::WithinRel;

TEST_CASE("stages: reached counts are suffix sums of the furthest stage, tested among all and among the previous") {
  // woman: 5 stopped at applied, 3 at screened, 2 hired; man: 2, 3, 5.
  const std::vector<StageCodeCount> counts = {{"woman", "applied", 5}, {"woman", "screened", 3}, {"woman", "hired", 2},
                                              {"man", "applied", 2},   {"man", "screened", 3},   {"man", "hired", 5},
                                              {"man", "withdrawn", 4}};
  HiringStages h = ComputeHiringStages({"applied", "screened", "hired"}, {"woman", "man"}, counts, "bonferroni", 0.95);
  REQUIRE(h.present);
  CHECK(h.correction == "bonferroni");
  CHECK(h.unknown_outcomes == 4);  // "withdrawn" is no stage
  REQUIRE(h.stages.size() == 3);
  CHECK(h.stages[0].tests.empty());
  CHECK(h.stages[1].groups[0].reached == 5);
  CHECK(h.stages[1].groups[1].reached == 8);
  CHECK(h.stages[2].groups[0].reached == 2);
  CHECK(h.stages[2].groups[0].previous == 5);
  CHECK(h.stages[2].groups[1].reached == 5);
  CHECK(h.stages[2].groups[1].previous == 8);
  CHECK(h.stages[2].groups[1].applications == 10);
  const StageTest& screened = h.stages[1].tests[0];
  const StageTest& hired = h.stages[2].tests[0];
  // fisher.test(matrix(c(5, 8, 5, 2), 2))$p.value: 5/10 against 8/10
  CHECK_THAT(screened.among_all.p.p, WithinRel(0.3498452012383898, 1e-9));
  CHECK_THAT(screened.among_previous.p.p, WithinRel(0.3498452012383898, 1e-9));
  // fisher.test(matrix(c(2, 5, 8, 5), 2))$p.value: 2/10 against 5/10
  CHECK_THAT(hired.among_all.p.p, WithinRel(0.3498452012383898, 1e-9));
  // fisher.test(matrix(c(2, 5, 3, 3), 2))$p.value: 2/5 against 5/8
  CHECK_THAT(hired.among_previous.p.p, WithinRel(0.59207459207459212, 1e-9));
  // p.adjust(c(0.3498452012383898, 0.59207459207459212), "bonferroni")
  CHECK_THAT(screened.among_previous_adjusted, WithinRel(0.6996904024767796, 1e-9));
  CHECK(hired.among_previous_adjusted == 1);
}

TEST_CASE("stages: no stages or one group gives nothing") {
  CHECK_FALSE(ComputeHiringStages({}, {"a", "b"}, {}, "holm", 0.95).present);
  CHECK_FALSE(ComputeHiringStages({"applied", "hired"}, {"a"}, {}, "holm", 0.95).present);
}
