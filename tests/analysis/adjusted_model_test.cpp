// analysis/adjusted_model.h against R's survival::clogit run live
// (tests/stats/r_eval.h): triplets of three arms with counterbalanced
// templates and rotated send positions, outcomes drawn with a template and a
// position effect so every term is estimable.
#include <catch2/catch.hpp>

#include <cmath>
#include <sstream>

#include "analysis/adjusted_model.h"
#include "stats/r_eval.h"
#include "stats/random.h"

using namespace twinprobe;
using Catch::Matchers::WithinRel;

namespace {

std::vector<std::vector<LaidOutProbe>> DrawTriplets(uint64_t seed, int vacancies) {
  stats::Rng rng(seed);
  const char* templates[] = {"cv_a.md", "cv_b.md", "cv_c.md"};
  std::vector<std::vector<LaidOutProbe>> sets;
  for (int v = 0; v < vacancies; ++v) {
    const double u = rng.Uniform() * 2.5 - 1.8;  // the vacancy's own propensity
    std::vector<LaidOutProbe> set;
    for (int arm = 0; arm < 3; ++arm) {
      const int tmpl = (arm + v) % 3;
      const int position = 1 + (arm + 2 * v) % 3;
      const double eta = u - 0.5 * (arm == 1) - 0.9 * (arm == 2) + 0.3 * (tmpl == 1) - 0.4 * (position == 3);
      set.push_back({arm, rng.Bernoulli(1 / (1 + std::exp(-eta))), templates[tmpl], position});
    }
    sets.push_back(set);
  }
  return sets;
}

}  // namespace

TEST_CASE("adjusted model: arm, template and send-position terms agree with survival::clogit") {
  const auto sets = DrawTriplets(20261202, 240);
  const AdjustedModel m = FitAdjustedModel(sets, {"age=28", "age=45", "age=58"}, 0.95);
  REQUIRE(m.present);
  REQUIRE(m.failure.empty());
  REQUIRE(m.terms.size() == 6);
  CHECK(m.terms[0].name == "arm: age=45");
  CHECK(m.terms[2].name == "template: cv_b.md");
  CHECK(m.terms[3].kind == "template");
  CHECK(m.terms[5].name == "send position 3");
  CHECK(m.nuisance_df == 4);

  std::ostringstream data;
  data << "d <- data.frame(set = integer(), y = integer(), arm = character(), tmpl = character(), pos = character())\n"
       << "rows <- list(\n";
  for (size_t s = 0; s < sets.size(); ++s)
    for (size_t i = 0; i < sets[s].size(); ++i) {
      const auto& p = sets[s][i];
      data << (s || i ? ",\n" : "") << "list(" << s << ", " << (p.positive ? 1 : 0) << ", 'a" << p.arm << "', '"
           << p.template_path << "', 'p" << p.send_order << "')";
    }
  data << ")\n"
       << "d <- do.call(rbind, lapply(rows, function(r) data.frame(set = r[[1]], y = r[[2]], arm = r[[3]],\n"
       << "  tmpl = r[[4]], pos = r[[5]])))\n";
  const auto r = testing::RunR(
      "suppressMessages(library(survival))\n" + data.str() +
      "ctl <- coxph.control(eps = 1e-14, iter.max = 100)\n"
      "fit <- clogit(y ~ arm + tmpl + pos + strata(set), data = d, method = 'exact', control = ctl)\n"
      "red <- clogit(y ~ arm + strata(set), data = d, method = 'exact', control = ctl)\n"
      "lr <- 2 * (fit$loglik[2] - red$loglik[2])\n"
      "cat(format(c(coef(fit), sqrt(diag(vcov(fit))), lr, pchisq(lr, 4, lower.tail = FALSE)), digits = 17), sep = '\\n')\n");
  INFO(r.error);
  REQUIRE(r.ok);
  REQUIRE(r.values.size() == 14);
  for (size_t j = 0; j < 6; ++j) {
    // coef(fit) and sqrt(diag(vcov(fit))) of clogit(y ~ arm + tmpl + pos + strata(set), method = "exact").
    CHECK_THAT(m.terms[j].coefficient, WithinRel(r.values[j], 1e-6));
    CHECK_THAT(m.terms[j].standard_error, WithinRel(r.values[6 + j], 1e-6));
  }
  // 2 * (fit$loglik[2] - red$loglik[2]) with red = clogit(y ~ arm + strata(set)), on 4 df.
  CHECK_THAT(m.nuisance_lr, WithinRel(r.values[12], 1e-6));
  CHECK_THAT(m.nuisance_p, WithinRel(r.values[13], 1e-6));
}

TEST_CASE("adjusted model: unmatched probes give no model") {
  const std::vector<std::vector<LaidOutProbe>> sets = {{{0, true, "cv_a.md", 1}}, {{1, false, "cv_a.md", 1}}};
  CHECK_FALSE(FitAdjustedModel(sets, {"origin=coastal", "origin=inland"}, 0.95).present);
}
