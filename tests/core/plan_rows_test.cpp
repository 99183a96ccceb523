// core/plan_rows.h with the readers of the stored plan (core/schedule_rows.h,
// core/material_rows.h, core/plan_probes.h) on an in-memory store: one
// vacancy, two profiles, a pair of probes.
#include <catch2/catch.hpp>

#include "core/material_rows.h"
#include "core/plan_header.h"
#include "core/plan_probes.h"
#include "core/plan_rows.h"
#include "core/schedule_rows.h"
#include "core/store.h"

using namespace twinprobe;

namespace {

std::unique_ptr<Store> MemoryStore() {
  auto store = Store::Open(":memory:", true);
  REQUIRE(store.ok());
  return std::move(store.value());
}

Design PairDesign() {
  Design d;
  d.study_id = "veldmark-clerks";
  d.factors = {Factor{"origin", {"inland", "coastal"}, "inland", {}, {}, "within", "", {}, {}}};
  d.arms = {Arm{"origin=inland", {{"origin", "inland"}}, true}, Arm{"origin=coastal", {{"origin", "coastal"}}, false}};
  return d;
}

// Plans vacancy V1 (occupation bookkeeper) with probes P00001 (inland, sent
// first) and P00002 (coastal), under audit entry 1.
void StorePair(Store& store, bool with_template) {
  std::vector<int64_t> arm_ids;
  const int64_t plan = StorePlanHeader(store, 1, PlanOrigin::kPlanned, PairDesign(), arm_ids);
  PlanRowWriter rows(store);
  rows.InsertEmployer("E-0123456789", "Harbour Tools (invented)", "jobs@harbour.example");
  const int64_t v = rows.InsertVacancy(1, {plan, "V1", "E-0123456789", "2026-02-01"});
  rows.InsertVacancyStratum(1, v, "occupation", "bookkeeper");
  const int64_t inland = rows.InsertProfile(1, {plan, arm_ids[0], "Mara Olsen", "mara@mail.example", "", "{}"});
  const int64_t coastal =
      rows.InsertProfile(1, {plan, arm_ids[1], "Tove Brandt", "tove@mail.example", "", R"({"given_name":"Tove"})"});
  std::optional<std::string> tpl;
  if (with_template) tpl = "templates/cv.md";
  rows.InsertProbe(1, {plan, "P00001", v, inland, arm_ids[0], tpl, 1, "2026-03-02T09:00:00Z"});
  rows.InsertProbe(1, {plan, "P00002", v, coastal, arm_ids[1], tpl, 2, "2026-03-04T09:00:00Z"});
}

}  // namespace

TEST_CASE("plan header: the origin and kind are stored by their spellings, and a kind outside the table is refused") {
  auto store = MemoryStore();
  std::vector<int64_t> arm_ids;
  StorePlanHeader(*store, 1, "import", PairDesign(), arm_ids);
  CHECK(store->QueryInt("SELECT count(*) FROM plan WHERE origin = 'import' AND kind = 'paired'") == 1);
  Design odd = PairDesign();
  odd.kind = "triples";
  CHECK_THROWS_WITH(StorePlanHeader(*store, 2, PlanOrigin::kPlanned, odd, arm_ids),
                    "design kind 'triples' is not a stored design kind");
  CHECK_THROWS_WITH(StorePlanHeader(*store, 2, "imported", PairDesign(), arm_ids),
                    "plan origin 'imported' is not a stored origin (plan, import)");
  CHECK(store->QueryInt("SELECT count(*) FROM plan") == 1);
}

TEST_CASE("plan rows: an empty store has no plan and no fieldwork") {
  auto store = MemoryStore();
  CHECK_FALSE(HasCurrentPlan(*store));
  CHECK(ReadCurrentPlanFieldwork(*store).sendings == 0);
  CHECK(ReadCurrentPlanFieldwork(*store).responses == 0);
  CHECK(ReadScheduleRows(*store).empty());
}

TEST_CASE("plan rows: a stored pair reads back in the schedule, the materials and the demo's probe list") {
  auto store = MemoryStore();
  StorePair(*store, true);
  CHECK(HasCurrentPlan(*store));
  CHECK(store->QueryInt("SELECT count(*) FROM vacancy WHERE source = 'file'") == 1);

  auto schedule = ReadScheduleRows(*store);
  REQUIRE(schedule.size() == 2);
  CHECK(schedule[0].probe == "P00001");
  CHECK(schedule[0].vacancy == "V1");
  CHECK(schedule[0].employer == "E-0123456789");
  CHECK(schedule[0].arm == "origin=inland");
  CHECK(schedule[0].profile == "Mara Olsen");
  CHECK(schedule[0].mailbox == "mara@mail.example");
  CHECK(schedule[0].template_path == "templates/cv.md");
  CHECK(schedule[1].send_order == 2);
  CHECK(schedule[1].sent_at == "");

  auto materials = ReadMaterialRows(*store);
  REQUIRE(materials.size() == 2);
  CHECK(materials[1].probe_ref == "P00002");
  CHECK(materials[1].planned_at == "2026-03-04T09:00:00Z");
  CHECK(materials[1].profile_fields_json == std::optional<std::string>(R"({"given_name":"Tove"})"));

  auto probes = ReadPlannedProbes(*store, "occupation");
  REQUIRE(probes.size() == 2);
  CHECK(probes[0].ref == "P00001");
  CHECK(probes[0].stratum_value == "bookkeeper");
  CHECK(probes[0].arm_label == "origin=inland");
  CHECK(ReadPlannedProbes(*store, "region")[0].stratum_value == "");
}

TEST_CASE("plan rows: a plan without templates stores NULL, and sendings count as fieldwork") {
  auto store = MemoryStore();
  StorePair(*store, false);
  CHECK(store->QueryInt("SELECT count(*) FROM probe WHERE template IS NULL") == 2);
  CHECK(ReadMaterialRows(*store)[0].template_path == "");

  PlannedSendingWriter sendings(*store);
  sendings.Insert(2, ReadPlannedProbes(*store, "occupation")[0].id, "2026-03-02T09:00:00Z", "demo",
                  "2026-03-01T12:00:00Z");
  CHECK(ReadCurrentPlanFieldwork(*store).sendings == 1);
  CHECK(ReadScheduleRows(*store)[0].sent_at == "2026-03-02T09:00:00Z");
}
