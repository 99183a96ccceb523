#include <catch2/catch.hpp>

#include "core/read_study.h"
#include "analysis/deviations.h"
#include "core/sha256.h"
#include "planner/design_file.h"
#include "planner/freeze.h"
#include "planner/study_fixture.h"

using namespace twinprobe;

namespace {

Design Parse(const std::string& text) {
  auto d = ParseDesign(text, "study.toml", "");
  REQUIRE(d.ok());
  return d.value();
}

std::string Replaced(std::string s, const std::string& from, const std::string& to) {
  auto pos = s.find(from);
  REQUIRE(pos != std::string::npos);
  return s.replace(pos, from.size(), to);
}

}  // namespace

// Reads what the store holds (core's read models) and checks it.
PreregistrationStatus Check(Store& store, const Design* current, const AnalysisPlan& used) {
  return CheckPreregistration(ReadFreeze(store), ReadStoredDesign(store), ReadFieldwork(store, OutcomeScheme{}), current,
                              used);
}

TEST_CASE("deviations: not frozen means no registration to compare with") {
  testing::StoredDemo demo;
  auto s = Check(*demo.store, &demo.checked.design, demo.checked.design.analysis);
  CHECK_FALSE(s.frozen);
  CHECK(s.deviations.empty());
  CHECK(s.current_design_sha256 == Sha256Hex(demo.checked.design.canonical));
  CHECK_FALSE(s.IsExploratoryStratum("anything"));
}

TEST_CASE("deviations: the frozen design analysed as frozen has none") {
  testing::StoredDemo demo;
  auto frozen = FreezeStudy(*demo.store, demo.checked.design);
  REQUIRE(frozen.ok());
  auto s = Check(*demo.store, &demo.checked.design, demo.checked.design.analysis);
  CHECK(s.frozen);
  CHECK(s.frozen_at == frozen.value().at);
  CHECK(s.design_sha256 == frozen.value().design_sha256);
  CHECK(s.analysis_sha256 == Sha256Hex(CanonicalAnalysisPlan(demo.checked.design)));
  CHECK(s.deviations.empty());
  CHECK(s.exploratory.empty());
  CHECK(s.frozen_strata == std::vector<std::string>{"occupation", "region"});
  // A comment does not change the canonical design.
  std::string text = testing::ReadFile(demo.study + "/study.toml");
  Design commented = Parse("# reviewed again\n" + text);
  CHECK(Check(*demo.store, &commented, commented.analysis).deviations.empty());
}

TEST_CASE("deviations: an edited design, an added stratum and another correction are each listed") {
  testing::StoredDemo demo;
  REQUIRE(FreezeStudy(*demo.store, demo.checked.design).ok());
  std::string text = testing::ReadFile(demo.study + "/study.toml");
  text = Replaced(text, "columns = [\"occupation\", \"region\"]", "columns = [\"occupation\", \"region\", \"opened_on\"]");
  text = Replaced(text, "correction = \"holm\"", "correction = \"bh\"");
  Design edited = Parse(text);
  auto s = Check(*demo.store, &edited, edited.analysis);
  REQUIRE(s.deviations.size() == 3);
  CHECK(s.deviations[0].kind == "design_edited");
  CHECK(s.deviations[0].what == "study.toml was edited after the freeze (frozen design sha256 " +
                                    s.design_sha256.substr(0, 12) + "…, now " + s.current_design_sha256.substr(0, 12) + "…)");
  CHECK(s.deviations[1].kind == "stratum_added");
  CHECK(s.deviations[1].what == "stratum 'opened_on' was added after the freeze");
  CHECK(s.deviations[2].kind == "correction_changed");
  CHECK(s.deviations[2].what == "the multiple-comparison correction is bh; the frozen plan names holm");
  REQUIRE(s.exploratory.size() == 2);
  CHECK(s.exploratory[0].what == "results by stratum 'opened_on'");
  CHECK(s.exploratory[1].what == "p-values adjusted by bh");
  CHECK(s.IsExploratoryStratum("opened_on"));
  CHECK_FALSE(s.IsExploratoryStratum("region"));
}

TEST_CASE("deviations: the analysis plan in use counts, not only the file") {
  testing::StoredDemo demo;
  REQUIRE(FreezeStudy(*demo.store, demo.checked.design).ok());
  AnalysisPlan used = demo.checked.design.analysis;
  used.alpha = 0.1;
  auto s = Check(*demo.store, &demo.checked.design, used);
  REQUIRE(s.deviations.size() == 1);
  CHECK(s.deviations[0].kind == "alpha_changed");
  CHECK(s.deviations[0].what == "alpha is 0.10000000000000001; the frozen plan names 0.050000000000000003");
}

TEST_CASE("deviations: without a design file the store's plan is compared") {
  testing::StoredDemo demo;
  std::string text = testing::ReadFile(demo.study + "/study.toml");
  Design other = Parse(Replaced(text, "positive = [\"info_request\", \"invitation\", \"offer\"]",
                                "positive = [\"invitation\", \"offer\"]"));
  REQUIRE(FreezeStudy(*demo.store, other).ok());
  auto s = Check(*demo.store, nullptr, demo.checked.design.analysis);
  // The plan was made from the demo design; the freeze registered another one.
  std::vector<std::string> kinds;
  for (const auto& d : s.deviations) kinds.push_back(d.kind);
  CHECK(kinds == std::vector<std::string>{"plan_from_other_design", "primary_outcome_changed"});
  CHECK(s.deviations[1].what == "positive is info_request,invitation,offer; the frozen plan says invitation,offer");
  CHECK(s.current_design_sha256.empty());
}

TEST_CASE("freeze: stored once, refused the second time, and records fieldwork before it") {
  testing::StoredDemo demo;
  demo.store->Exec(
      "INSERT INTO audit(seq, at, actor, command, summary, content_sha256, prev_hash, hash) "
      "VALUES (99, 'x', 't', 'test', '', '', '', '')");
  demo.store->Exec(
      "INSERT INTO sending(probe_id, sent_at, entered_by, entered_at, audit_seq) "
      "SELECT id, '2027-03-01T10:00:00Z', 't', 'x', 99 FROM current_probe WHERE ref IN ('P00001', 'P00002')");
  auto first = FreezeStudy(*demo.store, demo.checked.design);
  REQUIRE(first.ok());
  CHECK(first.value().sent_before == 2);
  CHECK(first.value().design_sha256 == Sha256Hex(demo.checked.design.canonical));
  auto read = ReadFreeze(*demo.store);
  REQUIRE(read);
  CHECK(read->analysis_plan == CanonicalAnalysisPlan(demo.checked.design));
  int64_t meta_rows = demo.store->QueryInt("SELECT count(*) FROM meta");
  auto second = FreezeStudy(*demo.store, demo.checked.design);
  REQUIRE_FALSE(second.ok());
  CHECK(second.error().what == "the study was frozen at " + first.value().at + " (design sha256 " +
                                   first.value().design_sha256 + ") and a pre-registration cannot be replaced");
  CHECK(demo.store->QueryInt("SELECT count(*) FROM meta") == meta_rows);
  auto s = Check(*demo.store, &demo.checked.design, demo.checked.design.analysis);
  REQUIRE(s.deviations.size() == 1);
  CHECK(s.deviations[0].kind == "frozen_after_fieldwork");
}
