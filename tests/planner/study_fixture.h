#pragma once
// A demo study written into a temporary folder, checked, planned in memory
// and stored in a real SQLite file (tests of what reads the store).
#include <catch2/catch.hpp>

#include <memory>
#include <string>

#include "core/store.h"
#include "planner/plan_store.h"
#include "planner/study_check.h"
#include "templates/embedded.h"
#include "testing/testing.h"

namespace twinprobe::testing {

struct StoredDemo {
  TempDir dir;
  std::string study;
  CheckedStudy checked;
  Plan plan;
  std::unique_ptr<Store> store;

  explicit StoredDemo(bool make_plan = true) : study(dir / "s") {
    for (const auto& f : DemoStudyFiles()) WriteFile(study + "/" + std::string(f.path), std::string(f.content));
    auto c = CheckStudy(study);
    REQUIRE(c.ok());
    checked = c.value();
    auto p = AssignProbes(checked.design, checked.vacancies, checked.pools);
    REQUIRE(p.ok());
    plan = p.value();
    auto s = Store::Open(study + "/study.db", true);
    REQUIRE(s.ok());
    store = std::move(s).value();
    if (make_plan) REQUIRE(StorePlan(*store, checked.design, checked.vacancies, plan).ok());
  }
};

}  // namespace twinprobe::testing
