// The one-attribute proof: the demo passes, leaks are caught with the field
// and the probes involved, over fixed cases and random designs.
#include <catch2/catch.hpp>

#include <filesystem>
#include <fstream>

#include "planner/one_difference.h"
#include "planner/random_study.h"
#include "planner/study_check.h"
#include "templates/embedded.h"
#include "testing/testing.h"

using namespace twinprobe;

namespace {

// The embedded demo study written into DIR/s; returns that folder.
std::string WriteDemo(const testing::TempDir& dir) {
  std::string study = dir / "s";
  for (const auto& f : DemoStudyFiles()) testing::WriteFile(study + "/" + std::string(f.path), std::string(f.content));
  return study;
}

void Edit(const std::string& path, const std::string& from, const std::string& to) {
  std::string text = testing::ReadFile(path);
  auto pos = text.find(from);
  REQUIRE(pos != std::string::npos);
  testing::WriteFile(path, text.replace(pos, from.size(), to));
}

// Adds a column to a name pool CSV: value(i) for the i-th name.
void AddPoolColumn(const std::string& path, const std::string& column, const std::function<std::string(int)>& value) {
  std::ifstream in(path);
  std::string line, out;
  int i = -1;
  while (std::getline(in, line)) {
    out += line + "," + (i < 0 ? column : value(i)) + "\n";
    ++i;
  }
  testing::WriteFile(path, out);
}

Result<StudyProof> Prove(const std::string& study) {
  auto s = CheckStudy(study);
  if (!s.ok()) return s.error();
  return ProveStudy(study, s.value());
}

TemplateDoc Doc(const std::string& path, const std::vector<std::string>& fields) {
  TemplateDoc d;
  d.path = path;
  int line = 1;
  for (const auto& f : fields) {
    d.segments.push_back({false, "text ", path, line, 1});
    d.segments.push_back({true, f, path, line, 6});
    ++line;
  }
  return d;
}

}  // namespace

TEST_CASE("one difference: the demo study passes, every set rendered") {
  testing::TempDir dir;
  auto proof = Prove(WriteDemo(dir));
  REQUIRE(proof.ok());
  const auto& r = proof.value().report;
  CHECK(r.ok());
  CHECK(r.sets_checked == 400);
  CHECK(r.renderings == 400 * 2 * 2);  // two templates per pair, each with both probes' fields
}

TEST_CASE("one difference: a pool column used by a template and differing within sets is reported") {
  testing::TempDir dir;
  std::string study = WriteDemo(dir);
  AddPoolColumn(study + "/names/inland.csv", "hometown", [](int i) { return i % 2 ? "Orlinde" : "Tessvale"; });
  AddPoolColumn(study + "/names/coastal.csv", "hometown", [](int) { return "Brakkeport"; });
  Edit(study + "/templates/cv_meadow.md", "Veldmark\n", "Veldmark\nFrom {{hometown}}.\n");
  auto proof = Prove(study);
  REQUIRE(proof.ok());
  const auto& r = proof.value().report;
  REQUIRE(r.leaks.size() == 1);
  const FieldLeak& leak = r.leaks.front();
  CHECK(leak.field == "hometown");
  CHECK(leak.template_path == "templates/cv_meadow.md");
  CHECK(leak.where == study + "/templates/cv_meadow.md:4:6");
  // Every pair uses cv_meadow.md once (two templates, two arms), and an inland
  // hometown is never Brakkeport: all 400 sets differ.
  CHECK(leak.sets_affected == 400);
  const auto& [vacancy, probes] = leak.sets.front();
  CHECK(vacancy == "V0001");
  REQUIRE(probes.size() == 2);
  CHECK(probes[0].probe == "P00001");
  CHECK(probes[1].probe == "P00002");
  CHECK(probes[0].value != probes[1].value);
  Error e = leak.AsError();
  CHECK(e.where == study + "/templates/cv_meadow.md:4:6");
  CHECK(e.what == "field 'hometown' differs between the probes of 400 sets, but no factor controls it (set V0001: P00001 '" +
                      *probes[0].value + "', P00002 '" + *probes[1].value + "')");
  // Declaring that a factor sets it makes it allowed.
  Edit(study + "/study.toml", "factor_fields = [\"given_name\"", "factor_fields = [\"hometown\", \"given_name\"");
  auto declared = Prove(study);
  REQUIRE(declared.ok());
  CHECK(declared.value().report.ok());
}

TEST_CASE("one difference: a column that one pool has and another lacks is a difference") {
  testing::TempDir dir;
  std::string study = WriteDemo(dir);
  AddPoolColumn(study + "/names/coastal.csv", "school", [](int) { return "Harbour School"; });
  Edit(study + "/templates/cv_lantern.md", "## Education\n", "## Education\n- {{school}}\n");
  auto proof = Prove(study);
  REQUIRE(proof.ok());
  REQUIRE(proof.value().report.leaks.size() == 1);
  const auto& leak = proof.value().report.leaks.front();
  CHECK(leak.field == "school");
  bool missing_seen = false;
  for (const auto& p : leak.sets.front().second) missing_seen = missing_seen || !p.value;
  CHECK(missing_seen);
  CHECK(leak.AsError().what.find("(no such field)") != std::string::npos);
}

TEST_CASE("one difference: a template that never shows the factor is refused") {
  testing::TempDir dir;
  std::string study = WriteDemo(dir);
  testing::WriteFile(study + "/templates/cv_lantern.md", "Dear team, I apply. {{mailbox}}\n");
  auto proof = Prove(study);
  REQUIRE_FALSE(proof.ok());
  CHECK(proof.error().Message() ==
        study + "/templates/cv_lantern.md: the template never shows factor 'origin' (it uses none of given_name, "
                "family_name, full_name) \u2014 use one of these fields, or the probes sent with this template carry no "
                "signal of it");
}

TEST_CASE("one difference: an unknown field is one positioned error with a suggestion") {
  testing::TempDir dir;
  std::string study = WriteDemo(dir);
  Edit(study + "/templates/cv_lantern.md", "Kind regards,\n{{full_name}}", "Kind regards,\n{{ful_name}}");
  auto proof = Prove(study);
  REQUIRE_FALSE(proof.ok());
  CHECK(proof.error().where == study + "/templates/cv_lantern.md:17:1");
  CHECK(proof.error().what == "unknown field 'ful_name' (did you mean 'full_name'?)");
}

TEST_CASE("one difference: an unpaired design reports a field whose values differ by arm") {
  testing::TempDir dir;
  std::string study = WriteDemo(dir);
  Edit(study + "/study.toml", "kind = \"paired\"", "kind = \"unpaired\"");
  Edit(study + "/study.toml", "looks = [200]\n", "");  // interim looks are for paired designs only
  AddPoolColumn(study + "/names/inland.csv", "hometown", [](int) { return "Orlinde"; });
  AddPoolColumn(study + "/names/coastal.csv", "hometown", [](int) { return "Brakkeport"; });
  Edit(study + "/templates/cv_meadow.md", "Veldmark\n", "Veldmark, from {{hometown}}\n");
  auto proof = Prove(study);
  REQUIRE(proof.ok());
  REQUIRE(proof.value().report.leaks.size() == 1);
  Error e = proof.value().report.leaks.front().AsError();
  CHECK(e.what.rfind("field 'hometown' takes different values in different arms, but no factor controls it (", 0) == 0);
  CHECK(e.what.find("'Orlinde'") != std::string::npos);
  CHECK(e.what.find("'Brakkeport'") != std::string::npos);
}

TEST_CASE("one difference: factor fields may differ, over random designs a leaking template is always caught") {
  int caught = 0, clean = 0;
  for (uint64_t seed = 1; seed <= 150; ++seed) {
    auto s = testing::MakeRandomStudy(seed);
    INFO("seed " << seed << "\n" << s.toml);
    const Design& d = s.design;
    // Every template shows every factor: the names, and each field a factor sets.
    std::vector<std::string> shown = {"full_name", "vacancy"};
    for (const auto& f : d.factors)
      for (const auto& [field, values] : f.fields) shown.push_back(field);
    std::map<std::string, TemplateDoc> docs;
    for (const auto& t : d.templates) docs[t] = Doc(t, shown);

    auto plan = AssignProbes(d, s.vacancies, s.pools);
    REQUIRE(plan.ok());
    auto materials = PlannedMaterials(d, s.vacancies, s.pools, plan.value());
    REQUIRE(materials.ok());
    auto ok = ProveOneDifference(d, docs, materials.value());
    REQUIRE(ok.ok());
    CHECK(ok.value().ok());
    ++clean;

    // The leak: a pool column, different for every name of every pool,
    // shown by one template.
    for (auto& pool : s.pools) {
      pool.extra_columns = {"hometown"};
      for (size_t i = 0; i < pool.names.size(); ++i) pool.extra[i] = {pool.file + "#" + std::to_string(i)};
    }
    const std::string leaky = d.templates[seed % d.templates.size()];
    docs[leaky].segments.push_back({true, "hometown", leaky, 99, 1});
    auto leaking_plan = AssignProbes(d, s.vacancies, s.pools);
    REQUIRE(leaking_plan.ok());
    auto leaking = PlannedMaterials(d, s.vacancies, s.pools, leaking_plan.value());
    REQUIRE(leaking.ok());
    auto report = ProveOneDifference(d, docs, leaking.value());
    REQUIRE(report.ok());
    if (d.kind != "unpaired") {
      // Every set that uses the leaking template has two probes with different names.
      int64_t sets_using = 0;
      for (size_t i = 0; i < leaking.value().size(); ++i)
        if (leaking.value()[i].template_path == leaky) ++sets_using;
      if (sets_using == 0) continue;
      REQUIRE(report.value().leaks.size() == 1);
      CHECK(report.value().leaks.front().field == "hometown");
      CHECK(report.value().leaks.front().sets_affected == sets_using);
      ++caught;
    } else {
      // Arms drawing names from different pools offer disjoint hometowns.
      std::set<std::string> pools_seen;
      for (const auto& m : leaking.value())
        if (m.template_path == leaky) pools_seen.insert(m.source);
      if (pools_seen.size() < 2) continue;
      REQUIRE(report.value().leaks.size() == 1);
      CHECK(report.value().leaks.front().field == "hometown");
      ++caught;
    }
  }
  CHECK(clean == 150);
  CHECK(caught > 100);
}
