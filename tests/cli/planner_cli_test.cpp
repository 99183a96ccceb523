// End-to-end tests of the planner's commands on the real binary: check,
// plan, render, schedule, freeze, and what analyze reports about them.
#include <catch2/catch.hpp>

#include <nlohmann/json.hpp>

#include "core/sha256.h"
#include "core/store.h"
#include "testing/pinned_clock.h"
#include "testing/testing.h"

using namespace twinprobe;
using testing::RunCli;

namespace {

struct InitStudy {
  testing::PinnedClock clock;  // the season's end: fieldwork times may not lie in the future
  testing::TempDir dir;
  std::string study;
  InitStudy() : study(dir / "s") { REQUIRE(RunCli({"--study", study, "init"}).exit_code == 0); }
  void Edit(const std::string& file, const std::string& from, const std::string& to) const {
    std::string text = testing::ReadFile(study + "/" + file);
    auto pos = text.find(from);
    REQUIRE(pos != std::string::npos);
    testing::WriteFile(study + "/" + file, text.replace(pos, from.size(), to));
  }
  testing::CliRun Run(std::vector<std::string> args) const {
    args.insert(args.begin(), {"--study", study});
    return RunCli(args);
  }
};

// The stored plan as text, without the per-study secret employer keys.
std::string PlanDump(const std::string& study) {
  auto store = Store::Open(study + "/study.db", false);
  REQUIRE(store.ok());
  Stmt q = store.value()->Prepare(
      "SELECT p.ref, v.ref, a.label, p.template, p.send_order, p.planned_at, pr.display_name, pr.mailbox, pr.phone, "
      "pr.fields FROM current_probe p JOIN vacancy v ON v.id = p.vacancy_id JOIN arm a ON a.id = p.arm_id "
      "JOIN profile pr ON pr.id = p.profile_id ORDER BY p.id");
  std::string out;
  while (q.Step()) {
    for (int c = 0; c < 10; ++c) out += q.Text(c) + "|";
    out += "\n";
  }
  return out;
}

}  // namespace

TEST_CASE("cli check: the example study passes and the proof is summarised") {
  InitStudy s;
  auto r = s.Run({"check"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  CHECK(r.out ==
        "Design veldmark-callbacks-demo is valid: paired design, 2 arms, 400 vacancies, 2 templates.\n"
        "Factors: origin varies within each vacancy (2 levels).\n"
        "One-attribute proof: 400 sets rendered (1600 renderings compared); the probes differ only in fields a factor "
        "controls (used by the templates: full_name, mailbox, phone).\n");
  auto j = nlohmann::json::parse(s.Run({"--json", "check"}).out);
  CHECK(j["ok"] == true);
  CHECK(j["sets_checked"] == 400);
  CHECK(j["leaks"].empty());
  CHECK(j["arm_labels"] == nlohmann::json({"origin=inland", "origin=coastal"}));
  CHECK(!std::filesystem::exists(s.study + "/study.db"));  // check writes nothing
}

TEST_CASE("cli check: bad designs give one line with the place and exit 1") {
  struct Case {
    const char* file;
    const char* from;
    const char* to;
    const char* err;  // after "twinprobe: STUDY/"
  };
  const Case cases[] = {
      {"study.toml", "include = \"all\"", "list = [{origin = \"inland\"}, {orgin = \"coastal\"}]",
       "study.toml:18:39: arm names unknown factor 'orgin' (did you mean 'origin'?) \u2014 declare it as [[factor]] or "
       "fix the name"},
      {"study.toml", "[[profiles.pool]]\nfactor = \"origin\"\nlevel = \"coastal\"\nfile = \"names/coastal.csv\"\n", "",
       "study.toml:20:1: level 'coastal' of factor 'origin' has no name pool \u2014 add [[profiles.pool]] with factor = "
       "\"origin\", level = \"coastal\" and a names file"},
      {"study.toml", "gap_hours = [24, 72]", "gap_hours = [72, 24]",
       "study.toml:43:13: [schedule].gap_hours is reversed: min 72 > max 24 \u2014 write the smaller number first"},
      {"vacancies.csv", "V0004,", "V0003,",
       "vacancies.csv:5: vacancy 'V0003' appears twice (first on line 4) \u2014 give each vacancy a unique reference"},
      {"study.toml", "[templates]\nfiles = [\"templates/cv_lantern.md\"", "[templates]\nfiles = [\"../cv_lantern.md\"",
       "study.toml:35:10: the template '../cv_lantern.md' is outside the study folder \u2014 give a path inside the "
       "study folder"},
      {"names/coastal.csv", "Tavi,Morunde", "Kemi,Saralon",
       "names/coastal.csv:3: the name 'Kemi Saralon' appears twice \u2014 remove the duplicate"},
  };
  for (const auto& c : cases) {
    InitStudy s;
    s.Edit(c.file, c.from, c.to);
    for (const char* command : {"check", "plan"}) {
      auto r = s.Run({command});
      INFO(command << " " << c.err);
      CHECK(r.exit_code == 1);
      CHECK(r.out.empty());
      CHECK(r.err == "twinprobe: " + s.study + "/" + c.err + "\n");
    }
    CHECK(!std::filesystem::exists(s.study + "/study.db"));
  }
}

TEST_CASE("cli check: a leaking template fails check and plan with the field and the probes") {
  InitStudy s;
  std::string inland = testing::ReadFile(s.study + "/names/inland.csv");
  // Give every inland name a hometown the coastal pool lacks.
  std::string with_town;
  bool header = true;
  for (size_t pos = 0; pos < inland.size();) {
    size_t end = inland.find('\n', pos);
    with_town += inland.substr(pos, end - pos) + (header ? ",hometown\n" : ",Orlinde\n");
    header = false;
    pos = end + 1;
  }
  testing::WriteFile(s.study + "/names/inland.csv", with_town);
  s.Edit("templates/cv_lantern.md", "Kind regards,", "Born in {{hometown}}.\n\nKind regards,");
  auto check = s.Run({"check"});
  CHECK(check.exit_code == 1);
  CHECK(check.out.empty());
  CHECK(check.err.rfind("twinprobe: " + s.study + "/templates/cv_lantern.md:16:9: field 'hometown' differs between the "
                        "probes of 400 sets, but no factor controls it (set V0001: ", 0) == 0);
  CHECK(check.err.find("'Orlinde'") != std::string::npos);
  CHECK(check.err.find("(no such field)") != std::string::npos);
  CHECK(check.err.find("\u2014 make it the same in every name pool, remove it from the template, or list it in "
                       "[templates].factor_fields if a factor truly sets it\n") != std::string::npos);
  CHECK(std::count(check.err.begin(), check.err.end(), '\n') == 1);
  auto json = s.Run({"--json", "check"});
  CHECK(json.exit_code == 1);
  auto j = nlohmann::json::parse(json.out);
  CHECK(j["ok"] == false);
  REQUIRE(j["leaks"].size() == 1);
  CHECK(j["leaks"][0]["field"] == "hometown");
  CHECK(j["leaks"][0]["sets"].size() == 400);
  CHECK(j["leaks"][0]["sets"][0]["probes"].size() == 2);
  auto plan = s.Run({"plan"});
  CHECK(plan.exit_code == 1);
  CHECK(plan.err == check.err);
  CHECK(!std::filesystem::exists(s.study + "/study.db"));
}

TEST_CASE("cli plan: prints the balance, the same seed gives the same plan, and a plan in the field is kept") {
  InitStudy a, b;
  auto plan = a.Run({"plan"});
  INFO(plan.err);
  REQUIRE(plan.exit_code == 0);
  CHECK(plan.out.find("Balance of the plan") != std::string::npos);
  CHECK(plan.out.find("  arm x template: X2 = 0.00, df = 1, p = 1; largest difference between arms in a column: 0\n") !=
        std::string::npos);
  auto json = nlohmann::json::parse(b.Run({"--json", "plan"}).out);
  CHECK(json["probes"] == 800);
  REQUIRE(json["balance"]["tables"].size() == 5);
  CHECK(json["balance"]["tables"][0]["variable"] == "template");
  CHECK(json["balance"]["tables"][0]["counts"] == nlohmann::json({{200, 200}, {200, 200}}));
  // Two folders, the same design and seed: the same plan, byte for byte.
  CHECK(PlanDump(a.study) == PlanDump(b.study));
  // Replanning before fieldwork is allowed; once a probe is sent it is refused.
  REQUIRE(a.Run({"plan"}).exit_code == 0);
  REQUIRE(a.Run({"sent", "P00001", "--at", "2027-03-01T09:30"}).exit_code == 0);
  auto before = a.Run({"--json", "verify"}).out;
  auto again = a.Run({"plan"});
  CHECK(again.exit_code == 1);
  CHECK(again.err == "twinprobe: " + a.study + "/study.db: the current plan is in the field (1 probes sent, 0 responses "
                     "recorded) and cannot be replaced \u2014 start a new study folder for a new plan\n");
  CHECK(a.Run({"--json", "verify"}).out == before);
  // A different seed gives a different plan.
  b.Edit("study.toml", "seed = 20270301", "seed = 20270302");
  REQUIRE(b.Run({"plan"}).exit_code == 0);
  CHECK(PlanDump(a.study) != PlanDump(b.study));
}

TEST_CASE("cli render: one probe is counted in the singular") {
  InitStudy s;
  REQUIRE(s.Run({"plan"}).exit_code == 0);
  auto r = s.Run({"render", "--probe", "P00003"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  CHECK(r.out == "Rendered 1 probe of plan 1 into " + s.study +
                     "/materials (4 files: PROBE.md, PROBE.txt and PROBE.html each, and manifest.csv with their "
                     "SHA-256).\n" + testing::HeadLine(s.study));
}

TEST_CASE("cli render: three documents per probe, HTML-escaped, with a manifest of hashes") {
  InitStudy s;
  s.Edit("names/inland.csv", "given_name,family_name\n", "given_name,family_name\n\"<Ada> & \"\"Co\"\"\",O'Brien\n");
  REQUIRE(s.Run({"plan"}).exit_code == 0);
  auto r = s.Run({"render"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  CHECK(r.err.empty());  // no progress bar when stderr is not a terminal
  CHECK(r.out == "Rendered 800 probes of plan 1 into " + s.study +
                     "/materials (2401 files: PROBE.md, PROBE.txt and PROBE.html each, and manifest.csv with their "
                     "SHA-256).\n" + testing::HeadLine(s.study));
  std::string manifest = testing::ReadFile(s.study + "/materials/manifest.csv");
  CHECK(std::count(manifest.begin(), manifest.end(), '\n') == 801);
  // The manifest's hashes are those of the files.
  std::string html = testing::ReadFile(s.study + "/materials/P00001.html");
  CHECK(manifest.find("P00001.html," + Sha256Hex(html)) != std::string::npos);
  CHECK(html.rfind("<!DOCTYPE html>", 0) == 0);
  // Find the probe of the odd name: its HTML carries it escaped, never raw.
  auto store = Store::Open(s.study + "/study.db", false);
  REQUIRE(store.ok());
  Stmt q = store.value()->Prepare(
      "SELECT p.ref FROM current_probe p JOIN profile pr ON pr.id = p.profile_id "
      "WHERE pr.display_name LIKE '<Ada>%' ORDER BY p.id LIMIT 1");
  REQUIRE(q.Step());
  std::string ref = q.Text(0);
  std::string odd = testing::ReadFile(s.study + "/materials/" + ref + ".html");
  CHECK(odd.find("<h1>&lt;Ada&gt; &amp; &quot;Co&quot; O&#39;Brien</h1>") != std::string::npos);
  CHECK(odd.find("<Ada>") == std::string::npos);
  CHECK(testing::ReadFile(s.study + "/materials/" + ref + ".txt").rfind("<Ada> & \"Co\" O'Brien\n", 0) == 0);
  // One probe only, elsewhere.
  auto one = s.Run({"--json", "render", "--probe", "P00002", "--out", s.dir / "one"});
  REQUIRE(one.exit_code == 0);
  CHECK(nlohmann::json::parse(one.out)["files"] == 4);
  CHECK(std::filesystem::exists(s.dir / "one/P00002.md"));
  auto unknown = s.Run({"render", "--probe", "P99999"});
  CHECK(unknown.exit_code == 1);
  CHECK(unknown.err == "twinprobe: unknown probe 'P99999' \u2014 use a probe reference from 'twinprobe schedule' (e.g. P00001)\n");
}

TEST_CASE("cli render: an include outside the study folder is refused") {
  InitStudy s;
  testing::WriteFile(s.dir / "secret.md", "not for employers");
  s.Edit("templates/cv_meadow.md", "## Work", "{{include ../secret.md}}\n\n## Work");
  auto r = s.Run({"check"});
  CHECK(r.exit_code == 1);
  CHECK(r.err.find("twinprobe: " + s.study + "/templates/cv_meadow.md:") == 0);
  CHECK(r.err.find("the template file '../secret.md' is outside the study folder") != std::string::npos);
}

TEST_CASE("cli schedule: what to send by a date, in time order, and sent probes drop out") {
  InitStudy s;
  REQUIRE(s.Run({"plan"}).exit_code == 0);
  auto first_day = nlohmann::json::parse(s.Run({"--json", "schedule", "--due", "2027-03-01"}).out);
  // 20 sets start on the first sending day (Monday 2027-03-01); second probes follow 24-72 h later.
  CHECK(first_day["count"] == 20);
  std::string previous;
  for (const auto& p : first_day["probes"]) {
    CHECK(p["planned_at"].get<std::string>().rfind("2027-03-01T", 0) == 0);
    CHECK(p["send_order"] == 1);
    CHECK(p["planned_at"].get<std::string>() >= previous);
    previous = p["planned_at"].get<std::string>();
  }
  std::string probe = first_day["probes"][0]["probe"];
  REQUIRE(s.Run({"sent", probe, "--at", "2027-03-01T10:00"}).exit_code == 0);
  auto after = nlohmann::json::parse(s.Run({"--json", "schedule", "--due", "2027-03-01"}).out);
  CHECK(after["count"] == 19);
  auto all = nlohmann::json::parse(s.Run({"--json", "schedule", "--all"}).out);
  CHECK(all["count"] == 800);
  auto text = s.Run({"schedule", "--due", "2027-03-01"});
  CHECK(text.out.rfind("19 probes to send by 2027-03-01 (times UTC; mark each with 'twinprobe sent PROBE --at TIME'):\n", 0) == 0);
  auto bad = s.Run({"schedule", "--due", "March"});
  CHECK(bad.exit_code == 1);
  CHECK(bad.err == "twinprobe: --due: 'March' is not a date \u2014 write it as YYYY-MM-DD or YYYY-MM-DDTHH:MM\n");
}

TEST_CASE("cli freeze: hashes stored once, analyze lists deviations and marks exploratory results") {
  InitStudy s;
  auto freeze = s.Run({"--json", "freeze"});
  INFO(freeze.err);
  REQUIRE(freeze.exit_code == 0);
  auto f = nlohmann::json::parse(freeze.out);
  CHECK(f["design_sha256"].get<std::string>().size() == 64);
  CHECK(f["sent_before"] == 0);
  auto again = s.Run({"freeze"});
  CHECK(again.exit_code == 1);
  CHECK(again.err.rfind("twinprobe: " + s.study + "/study.db: the study was frozen at ", 0) == 0);
  REQUIRE(s.Run({"plan"}).exit_code == 0);
  auto clean = s.Run({"analyze"});
  REQUIRE(clean.exit_code == 0);
  CHECK(clean.out.find("  The analysis follows the frozen plan: no deviation.\n") != std::string::npos);
  CHECK(clean.out.find("  Design sha256        " + f["design_sha256"].get<std::string>() + "\n") != std::string::npos);
  CHECK(clean.out.find("Balance of the plan") != std::string::npos);

  s.Edit("study.toml", "columns = [\"occupation\", \"region\"]", "columns = [\"occupation\", \"region\", \"opened_on\"]");
  s.Edit("study.toml", "correction = \"holm\"", "correction = \"bh\"");
  auto text = s.Run({"analyze"});
  REQUIRE(text.exit_code == 0);
  CHECK(text.out.find("  3 deviations from the frozen plan:\n") != std::string::npos);
  CHECK(text.out.find("    - stratum 'opened_on' was added after the freeze [stratum_added]\n") != std::string::npos);
  CHECK(text.out.find("    - the multiple-comparison correction is bh; the frozen plan names holm [correction_changed]\n") !=
        std::string::npos);
  CHECK(text.out.find("    - p-values adjusted by bh: the frozen plan names holm\n") != std::string::npos);
  auto j = nlohmann::json::parse(s.Run({"--json", "analyze"}).out);
  CHECK(j["preregistration"]["deviations"].size() == 3);
  CHECK(j["preregistration"]["deviations"][0]["kind"] == "design_edited");
  CHECK(j["balance"]["tables"].size() == 5);
  // The HTML report carries the same: balance tables, deviations, exploratory results.
  auto html = s.Run({"report", "--html"});
  REQUIRE(html.exit_code == 0);
  CHECK(html.out.find("Balance of the plan") != std::string::npos);
  CHECK(html.out.find("Deviations from the frozen plan") != std::string::npos);
  CHECK(html.out.find("stratum &#39;opened_on&#39; was added after the freeze") != std::string::npos);
  CHECK(html.out.find("p-values adjusted by bh") != std::string::npos);
}

TEST_CASE("cli: help lists the planner's commands in workflow order") {
  auto help = RunCli({"--help"});
  REQUIRE(help.exit_code == 0);
  size_t plan = help.out.find("  plan "), freeze = help.out.find("  freeze "), render = help.out.find("  render "),
         schedule = help.out.find("  schedule "), sent = help.out.find("  sent ");
  REQUIRE(plan != std::string::npos);
  REQUIRE(freeze != std::string::npos);
  REQUIRE(render != std::string::npos);
  REQUIRE(schedule != std::string::npos);
  REQUIRE(sent != std::string::npos);
  CHECK(plan < freeze);
  CHECK(freeze < render);
  CHECK(render < schedule);
  CHECK(schedule < sent);
}
