#include <catch2/catch.hpp>

#include <map>

#include "core/fieldwork.h"
#include "analysis/balance.h"
#include "core/clock.h"
#include "planner/study_fixture.h"

using namespace twinprobe;

TEST_CASE("balance: the tables count the stored plan's probes, and a balanced plan tests as balanced") {
  testing::StoredDemo demo;
  BalanceReport b = ComputeBalance(ReadFieldwork(*demo.store, OutcomeScheme{}), 199);
  REQUIRE(b.present);
  std::map<std::string, const BalanceTable*> by;
  for (const auto& t : b.tables) by[t.variable] = &t;
  REQUIRE(by.size() == 5);  // template, send order, occupation, region, weekday
  const auto& design = demo.checked.design;

  // Recount from the in-memory plan the store was written from.
  std::map<std::pair<std::string, std::string>, int64_t> arm_template, arm_weekday;
  for (const auto& p : demo.plan.probes) {
    ++arm_template[{design.arms[p.arm].label, design.templates[p.template_index]}];
    static const char* kDays[] = {"mon", "tue", "wed", "thu", "fri", "sat", "sun"};
    ++arm_weekday[{design.arms[p.arm].label, kDays[WeekdayOf(p.planned_at)]}];
  }
  const BalanceTable& tmpl = *by.at("template");
  CHECK(tmpl.arms == std::vector<std::string>{"origin=inland", "origin=coastal"});  // reference first
  for (size_t i = 0; i < tmpl.arms.size(); ++i)
    for (size_t j = 0; j < tmpl.columns.size(); ++j) CHECK(tmpl.counts[i][j] == arm_template[{tmpl.arms[i], tmpl.columns[j]}]);
  const BalanceTable& day = *by.at("weekday");
  for (size_t i = 0; i < day.arms.size(); ++i)
    for (size_t j = 0; j < day.columns.size(); ++j) CHECK(day.counts[i][j] == arm_weekday[{day.arms[i], day.columns[j]}]);

  // Paired: every set holds both arms, so templates (2 x 2 rotation), send
  // positions and strata are exactly balanced.
  for (const char* v : {"template", "send_order", "stratum:occupation", "stratum:region"}) {
    INFO(v);
    CHECK(by.at(v)->max_spread == 0);
    CHECK(by.at(v)->test.statistic == 0);
    CHECK(by.at(v)->test.p() == 1.0);
  }
  CHECK(by.at("send_order")->columns == std::vector<std::string>{"1", "2"});
  CHECK(by.at("stratum:region")->title == "arm x region");
}

TEST_CASE("balance: sending times replace planned ones for the weekday") {
  testing::StoredDemo demo;
  // Send P00001 on a Sunday.
  demo.store->Exec(
      "INSERT INTO audit(seq, at, actor, command, summary, content_sha256, prev_hash, hash) "
      "VALUES (99, 'x', 't', 'test', '', '', '', '')");
  demo.store->Exec(
      "INSERT INTO sending(probe_id, sent_at, entered_by, entered_at, audit_seq) "
      "SELECT id, '2027-03-07T10:00:00Z', 't', 'x', 99 FROM current_probe WHERE ref = 'P00001'");
  BalanceReport b = ComputeBalance(ReadFieldwork(*demo.store, OutcomeScheme{}), 0);
  const BalanceTable* day = nullptr;
  for (const auto& t : b.tables)
    if (t.variable == "weekday") day = &t;
  REQUIRE(day != nullptr);
  CHECK(day->columns.back() == "sun");
  int64_t sunday = 0;
  for (const auto& row : day->counts) sunday += row.back();
  CHECK(sunday == 1);
}

TEST_CASE("balance: a store without a plan has no balance") {
  testing::StoredDemo demo(false);
  CHECK_FALSE(ComputeBalance(ReadFieldwork(*demo.store, OutcomeScheme{})).present);
}
