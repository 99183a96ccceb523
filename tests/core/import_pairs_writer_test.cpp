// core/import_pairs_writer.h: the bulk writer behind `import pairs`: rows
// land whole under one audit entry, with every index kept, or not at all.
#include <catch2/catch.hpp>

#include <memory>
#include <string>
#include <vector>

#include "core/audit.h"
#include "core/import_pairs_writer.h"
#include "core/plan_header.h"
#include "core/store.h"

using namespace twinprobe;

namespace {

std::unique_ptr<Store> NewStore() {
  auto store = Store::Open(":memory:", true);
  REQUIRE(store.ok());
  return std::move(store).value();
}

Design TwoArms() {
  Design d;
  d.study_id = "harbour-test";
  d.title = "Two arms";
  Factor f;
  f.name = "arm";
  f.levels = {"inland", "coastal"};
  f.reference = "inland";
  d.factors = {f};
  d.arms = {Arm{"inland", {{"arm", "inland"}}, true}, Arm{"coastal", {{"arm", "coastal"}}, false}};
  d.strata = {"region"};
  return d;
}

// The store's own (named, not constraint) indexes on the tables an import fills.
std::vector<std::string> ImportIndexes(Store& store) {
  std::vector<std::string> names;
  Stmt q = store.Prepare(
      "SELECT name FROM sqlite_master WHERE type = 'index' AND sql IS NOT NULL "
      "AND tbl_name IN ('vacancy', 'vacancy_stratum', 'probe', 'sending', 'response') ORDER BY name");
  while (q.Step()) names.push_back(q.Text(0));
  return names;
}

const std::vector<std::string> kImportIndexes = {
    "probe_seq",    "probe_vacancy", "response_probe",      "response_seq",       "response_supersedes",
    "sending_probe", "sending_seq",  "vacancy_seq",         "vacancy_stratum_seq"};

// Writes `pairs` vacancies of two probes each (every probe sent, one
// response each) under one audited write, committed or not.
void WritePairs(Store& store, int pairs, bool commit) {
  AuditedWrite write(store, "import pairs");
  std::vector<int64_t> arm_ids;
  Design d = TwoArms();
  int64_t plan_id = store.QueryInt("SELECT id FROM current_plan");
  if (plan_id == 0) plan_id = StorePlanHeader(store, write.seq(), "import", d, arm_ids);
  else arm_ids = {store.QueryInt("SELECT min(id) FROM arm"), store.QueryInt("SELECT max(id) FROM arm")};
  PairsWriter writer(store, plan_id, write.seq(), write.actor(), write.at(), 4, 1);
  int64_t vacancy = writer.next_vacancy_id(), probe = writer.next_probe_id();
  for (int v = 0; v < pairs; ++v, ++vacancy) {
    writer.AddVacancy(vacancy, "V" + std::to_string(vacancy), "");
    writer.AddStratum(vacancy, "region", v % 2 ? "Orlinde" : "Brakkeport");
    for (int a = 0; a < 2; ++a, ++probe) {
      writer.AddProbe(probe, "P" + std::to_string(probe), vacancy, arm_ids[static_cast<size_t>(a)], a + 1);
      writer.AddSending(probe, "2027-03-01T00:00:00Z");
      writer.AddResponse(probe, a ? "0" : "1", a ? "" : "2027-03-04T00:00:00Z", false);
      writer.EndProbe();
    }
  }
  writer.Finish();
  if (commit) write.Commit("import pairs test: " + std::to_string(pairs) + " pairs");
}

}  // namespace

TEST_CASE("import pairs writer: the rows land whole, the indexes serve lookups and the seal verifies") {
  auto store = NewStore();
  WritePairs(*store, 9, true);
  CHECK(store->QueryInt("SELECT count(*) FROM probe") == 18);
  CHECK(store->QueryInt("SELECT count(*) FROM sending") == 18);
  CHECK(store->QueryInt("SELECT count(*) FROM current_response WHERE code = '1'") == 9);
  CHECK(store->QueryInt("SELECT count(*) FROM vacancy_stratum WHERE value = 'Orlinde'") == 4);
  CHECK(ImportIndexes(*store) == kImportIndexes);
  // The planner uses the index for a per-probe lookup.
  Stmt plan = store->Prepare("EXPLAIN QUERY PLAN SELECT sent_at FROM sending WHERE probe_id = 3");
  REQUIRE(plan.Step());
  CHECK(plan.Text(3) == "SEARCH sending USING INDEX sending_probe (probe_id=?)");
  AuditReport audit = VerifyAudit(*store);
  CHECK(audit.ok());
  CHECK(audit.entries == 1);
}

TEST_CASE("import pairs writer: a rolled-back import leaves nothing behind") {
  auto store = NewStore();
  WritePairs(*store, 3, false);  // never committed
  CHECK(ImportIndexes(*store) == kImportIndexes);
  CHECK(store->QueryInt("SELECT count(*) FROM probe") == 0);
  CHECK(store->QueryInt("SELECT count(*) FROM plan") == 0);
}

TEST_CASE("import pairs writer: a second import continues the ids and keeps the chain intact") {
  auto store = NewStore();
  WritePairs(*store, 10, true);
  WritePairs(*store, 2, true);
  CHECK(store->QueryInt("SELECT count(*) FROM probe") == 24);
  CHECK(store->QueryInt("SELECT max(id) FROM probe") == 24);
  CHECK(store->QueryInt("SELECT max(id) FROM vacancy") == 12);
  AuditReport audit = VerifyAudit(*store);
  CHECK(audit.ok());
  CHECK(audit.entries == 2);
}
