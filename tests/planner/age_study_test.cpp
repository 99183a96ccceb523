// The 3-level ordered age study with gender assigned between vacancies
// (tests/planner/age_study.h, the worked example of docs/designs.md):
// between assignment, labels and scores, the design in words, the signal,
// what the store keeps, and the carry-over balance.
#include <catch2/catch.hpp>

#include <map>
#include <set>

#include "core/factor_signal.h"
#include "core/read_design.h"
#include "core/read_set_design.h"
#include "core/store.h"
#include "planner/age_study.h"
#include "planner/assign.h"
#include "planner/carry_over.h"
#include "planner/design_words.h"
#include "planner/plan_store.h"
#include "planner/study_check.h"
#include "planner/study_fixture.h"

using namespace twinprobe;
using namespace twinprobe::testing;

namespace {

struct AgeStudy {
  TempDir dir;
  std::string study = dir / "age";
  CheckedStudy checked;
  Plan plan;

  AgeStudy() {
    WriteAgeStudy(study);
    auto c = CheckStudy(study);
    INFO((c.ok() ? "" : c.error().Message()));
    REQUIRE(c.ok());
    checked = c.value();
    auto p = AssignProbes(checked.design, checked.vacancies, checked.pools);
    REQUIRE(p.ok());
    plan = p.value();
  }
};

}  // namespace

TEST_CASE("age study: each vacancy receives the three ages from applicants of one gender") {
  AgeStudy s;
  const Design& d = s.checked.design;
  REQUIRE(d.arms.size() == 6);
  std::map<int, std::vector<const PlannedProbe*>> sets;
  for (const auto& p : s.plan.probes) sets[p.vacancy].push_back(&p);
  REQUIRE(sets.size() == 48);
  std::map<std::string, std::map<std::string, int>> gender_by_region;  // region -> gender -> vacancies
  for (const auto& [v, probes] : sets) {
    REQUIRE(probes.size() == 3);
    std::set<std::string> genders, ages, templates;
    for (const auto* p : probes) {
      genders.insert(d.arms[static_cast<size_t>(p->arm)].levels.at("gender"));
      ages.insert(d.arms[static_cast<size_t>(p->arm)].levels.at("age"));
      templates.insert(d.templates[static_cast<size_t>(p->template_index)]);
    }
    CHECK(genders.size() == 1);
    CHECK(ages == std::set<std::string>{"28", "45", "58"});
    CHECK(templates.size() == 3);
    ++gender_by_region[s.checked.vacancies[static_cast<size_t>(v)].strata.at("region")][*genders.begin()];
  }
  // Blocked randomisation: each region holds both genders equally often.
  CHECK(gender_by_region["Northmere"] == std::map<std::string, int>{{"f", 15}, {"m", 15}});
  CHECK(gender_by_region["Saltbridge"] == std::map<std::string, int>{{"f", 9}, {"m", 9}});
}

TEST_CASE("age study: the design in words, the labels, scores and signal") {
  AgeStudy s;
  const Design& d = s.checked.design;
  CHECK(DescribeVariation(d) ==
        "age (years) (age) varies within each vacancy (3 levels: aged 28, aged 45, aged 58); gender is assigned "
        "between vacancies (2 levels: woman, man, balanced within region)");
  CHECK(d.factors[0].DisplayName() == "age (years)");
  CHECK(d.factors[0].LevelLabel("45") == "aged 45");
  CHECK(d.factors[0].scores == std::vector<double>{28, 45, 58});
  CHECK(d.factors[1].LevelLabel("m") == "man");
  CHECK(d.factors[1].DisplayName() == "gender");
  CHECK(DescribeSignal(SignalOf(d, d.factors[0])) == "the template fields birth_year and graduation_year");
  CHECK(DescribeSignal(SignalOf(d, d.factors[1])) == "the applicant's name and contact details");
}

TEST_CASE("age study: the one-attribute proof passes: within a set only the age fields and names differ") {
  AgeStudy s;
  auto proof = ProveStudy(s.study, s.checked);
  REQUIRE(proof.ok());
  CHECK(proof.value().report.ok());
  CHECK(proof.value().report.sets_checked == 48);
  CHECK(proof.value().report.renderings == 48 * 3 * 3);
}

TEST_CASE("age study: the carry-over table counts each age after each other age of the same gender") {
  AgeStudy s;
  const CarryOverBalance b = ComputeCarryOver(s.checked.design, s.plan);
  REQUIRE(b.present);
  CHECK(b.pairs == 96);
  int64_t possible = 0, first = 0;
  for (size_t a = 0; a < b.arms.size(); ++a) {
    first += b.first[a];
    for (size_t p = 0; p < b.arms.size(); ++p) {
      const auto& x = s.checked.design.arms[a];
      const auto& y = s.checked.design.arms[p];
      // Possible exactly when the gender is the same and the age differs.
      CHECK(b.possible[a][p] == (x.levels.at("gender") == y.levels.at("gender") && x.levels.at("age") != y.levels.at("age")));
      if (b.possible[a][p]) ++possible;
      else CHECK(b.after[a][p] == 0);
    }
  }
  CHECK(first == 48);
  CHECK(possible == 12);
  // 24 sets per gender, 48 adjacent pairs over 6 ordered pairs: 8 each. The
  // region blocks of 15 and 9 sets per gender are odd, so the square and its
  // mirror alternate across blocks and even out over the plan.
  for (size_t a = 0; a < b.arms.size(); ++a)
    for (size_t p = 0; p < b.arms.size(); ++p)
      if (b.possible[a][p]) CHECK(b.after[a][p] == 8);
  CHECK(b.max_spread == 0);
  CHECK(b.test.statistic == 0.0);
  CHECK(b.test.df == 10);
  CHECK(b.test.p == 1.0);
}

TEST_CASE("age study: the store keeps how factors vary, their labels, scores and signal") {
  AgeStudy s;
  auto store = Store::Open(s.study + "/study.db", true);
  REQUIRE(store.ok());
  REQUIRE(StorePlan(*store.value(), s.checked.design, s.checked.vacancies, s.plan).ok());
  const StoredDesign d = ReadStoredDesign(*store.value());
  REQUIRE(d.factors.size() == 2);
  const StoredFactor& age = d.factors[0];
  CHECK(age.name == "age");
  CHECK_FALSE(age.between);
  CHECK(age.DisplayName() == "age (years)");
  CHECK(age.level_labels == std::vector<std::string>{"aged 28", "aged 45", "aged 58"});
  CHECK(age.scores == std::vector<double>{28, 45, 58});
  CHECK(DescribeSignal(age.signal) == "the template fields birth_year and graduation_year");
  const StoredFactor& gender = d.factors[1];
  CHECK(gender.between);
  CHECK(gender.LevelLabel("f") == "woman");
  CHECK(gender.scores.empty());
  CHECK(DescribeSignal(gender.signal) == "the applicant's name and contact details");

  // Per set: the between level and each probe's arm, levels, template and position.
  const auto sets = ReadSetDesigns(*store.value());
  REQUIRE(sets.size() == 48);
  for (const auto& set : sets) {
    REQUIRE(set.probes.size() == 3);
    REQUIRE(set.between.size() == 1);
    std::set<std::string> ages;
    for (size_t i = 0; i < set.probes.size(); ++i) {
      const auto& p = set.probes[i];
      CHECK(p.send_order == static_cast<int>(i) + 1);
      CHECK(p.levels.at("gender") == set.between.at("gender"));
      CHECK(p.arm_label == "age=" + p.levels.at("age") + ",gender=" + p.levels.at("gender"));
      CHECK(p.template_path.rfind("templates/cv_", 0) == 0);
      ages.insert(p.levels.at("age"));
    }
    CHECK(ages.size() == 3);
  }
  // The first set as planned, probe by probe.
  const auto& first = s.plan.probes.front();
  CHECK(sets.front().vacancy_ref == "A001");
  CHECK(sets.front().probes.front().arm_label == s.checked.design.arms[static_cast<size_t>(first.arm)].label);
  CHECK(sets.front().probes.front().template_path == s.checked.design.templates[static_cast<size_t>(first.template_index)]);
}

TEST_CASE("designs: the paired demo stores no design rows and reads as varied within, signalled by the name") {
  // Plans made before migration 11 have no factor_design or level_design
  // rows; a plain design writes none either, so both read the same.
  StoredDemo demo;
  CHECK(demo.store->QueryInt("SELECT count(*) FROM factor_design") == 0);
  CHECK(demo.store->QueryInt("SELECT count(*) FROM level_design") == 0);
  const StoredDesign d = ReadStoredDesign(*demo.store);
  REQUIRE(d.factors.size() == 1);
  CHECK_FALSE(d.factors[0].between);
  CHECK(d.factors[0].DisplayName() == "origin");
  CHECK(d.factors[0].LevelLabel("coastal") == "coastal");
  CHECK(d.factors[0].level_labels == std::vector<std::string>{"", ""});
  CHECK(d.factors[0].scores.empty());
  CHECK(DescribeSignal(d.factors[0].signal) == "the applicant's name and contact details");
  const auto sets = ReadSetDesigns(*demo.store);
  REQUIRE(sets.size() == 400);
  CHECK(sets.front().between.empty());
  CHECK(sets.front().probes.size() == 2);
}
