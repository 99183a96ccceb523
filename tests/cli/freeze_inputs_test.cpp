// Issue 16, item 4: the freeze covers every input of the analysis. After
// `freeze`, the vacancy list is cut, a name in a pool changed and a template
// edited, then the study is planned again: `analyze` lists every change with
// its file and key, and the report marks what they touch as exploratory.
#include <catch2/catch.hpp>

#include <nlohmann/json.hpp>

#include "testing/testing.h"

using namespace twinprobe;
using testing::RunCli;

namespace {

void Edit(const std::string& path, const std::string& from, const std::string& to) {
  std::string text = testing::ReadFile(path);
  const size_t at = text.find(from);
  REQUIRE(at != std::string::npos);
  text.replace(at, from.size(), to);
  testing::WriteFile(path, text);
}

// The first `keep` lines of a file (header included).
void Cut(const std::string& path, size_t keep) {
  const std::string text = testing::ReadFile(path);
  size_t at = 0;
  for (size_t i = 0; i < keep; ++i) at = text.find('\n', at) + 1;
  testing::WriteFile(path, text.substr(0, at));
}

const nlohmann::json* Find(const nlohmann::json& deviations, const std::string& kind, const std::string& file) {
  for (const auto& d : deviations)
    if (d["kind"] == kind && d["file"] == file) return &d;
  return nullptr;
}

}  // namespace

TEST_CASE("freeze inputs: a cut vacancy list, a changed name and an edited template are listed by file and key") {
  testing::TempDir dir;
  const std::string study = dir / "s";
  REQUIRE(RunCli({"--study", study, "init"}).exit_code == 0);
  REQUIRE(RunCli({"--study", study, "plan"}).exit_code == 0);
  auto frozen = RunCli({"--study", study, "--json", "freeze"});
  INFO(frozen.err);
  REQUIRE(frozen.exit_code == 0);
  auto f = nlohmann::json::parse(frozen.out);
  REQUIRE(f["inputs"].size() == 6);  // study.toml, vacancies.csv, two name pools, two templates
  CHECK(f["inputs"][1]["file"] == "vacancies.csv");
  CHECK(f["inputs"][1]["records"] == 400);  // one record per vacancy

  // Untouched, nothing is a deviation.
  auto same = nlohmann::json::parse(RunCli({"--study", study, "--json", "analyze"}).out);
  CHECK(same["preregistration"]["deviations"].empty());

  Cut(study + "/vacancies.csv", 201);                                   // 400 -> 200 vacancies
  Edit(study + "/names/coastal.csv", "Tavi,Morunde", "Tavi,Morunda");   // line 3
  Edit(study + "/templates/cv_meadow.md", "lives in Brakkeport", "lives near Brakkeport");  // line 3
  Edit(study + "/study.toml", "looks = [200]", "looks = [100]");
  auto plan = RunCli({"--study", study, "plan"});
  INFO(plan.err);
  REQUIRE(plan.exit_code == 0);

  auto r = RunCli({"--study", study, "--json", "analyze"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  const auto pre = nlohmann::json::parse(r.out)["preregistration"];
  const auto& devs = pre["deviations"];
  const nlohmann::json* v = Find(devs, "input_changed", "vacancies.csv");
  REQUIRE(v);
  CHECK((*v)["what"] == "vacancies.csv (the vacancy file) changed after the freeze: 200 removed (V0201, V0202, V0203, "
                        "V0204, V0205 and 195 more)");
  CHECK((*v)["keys"].size() == 200);
  CHECK((*v)["keys"][0] == "V0201");
  const nlohmann::json* n = Find(devs, "input_changed", "names/coastal.csv");
  REQUIRE(n);
  CHECK((*n)["what"] == "names/coastal.csv (a name pool) changed after the freeze: 1 changed (line 3)");
  CHECK((*n)["keys"] == nlohmann::json::array({"line 3"}));
  const nlohmann::json* t = Find(devs, "input_changed", "templates/cv_meadow.md");
  REQUIRE(t);
  CHECK((*t)["what"] == "templates/cv_meadow.md (a template) changed after the freeze: 1 changed (line 3)");
  const nlohmann::json* d = Find(devs, "design_edited", "study.toml");
  REQUIRE(d);
  CHECK((*d)["keys"] == nlohmann::json::array({"[analysis].looks"}));
  CHECK(Find(devs, "looks_changed", "study.toml"));
  bool other_design = false;
  for (const auto& x : devs) other_design |= x["kind"] == "plan_from_other_design";
  CHECK(other_design);
  // The untouched pool and template are not listed.
  CHECK(!Find(devs, "input_changed", "names/inland.csv"));
  CHECK(!Find(devs, "input_changed", "templates/cv_lantern.md"));
  bool every_result = false;
  for (const auto& e : pre["exploratory"]) every_result |= e["what"] == "every result";
  CHECK(every_result);

  // The text report says the same, one line per deviation.
  auto text = RunCli({"--study", study, "analyze"}).out;
  CHECK(text.find("    - names/coastal.csv (a name pool) changed after the freeze: 1 changed (line 3) [input_changed]\n") !=
        std::string::npos);
}
