#include <catch2/catch.hpp>

#include "planner/design_file.h"
#include "templates/embedded.h"

using namespace twinprobe;

namespace {

std::string DemoDesign() {
  for (const auto& f : DemoStudyFiles())
    if (f.path == "study.toml") return std::string(f.content);
  return {};
}

std::string Replace(std::string s, const std::string& from, const std::string& to) {
  auto pos = s.find(from);
  REQUIRE(pos != std::string::npos);
  return s.replace(pos, from.size(), to);
}

}  // namespace

TEST_CASE("design: the demo design parses with its arms and reference") {
  auto d = ParseDesign(DemoDesign(), "study.toml", "");
  REQUIRE(d.ok());
  const Design& design = d.value();
  CHECK(design.study_id == "veldmark-callbacks-demo");
  REQUIRE(design.arms.size() == 2);
  CHECK(design.arms[design.reference_arm].label == "origin=inland");
  CHECK(design.outcomes.is_positive("invitation"));
  CHECK_FALSE(design.outcomes.is_positive("rejection"));
  CHECK(design.strata == std::vector<std::string>{"occupation", "region"});
  CHECK(design.ethics.decline_within_hours == 24);
}

TEST_CASE("design: the canonical form ignores comments and layout") {
  auto a = ParseDesign(DemoDesign(), "study.toml", "");
  auto b = ParseDesign("# a new comment\n" + DemoDesign(), "study.toml", "");
  REQUIRE(a.ok());
  REQUIRE(b.ok());
  CHECK(a.value().canonical == b.value().canonical);
}

TEST_CASE("design: a TOML syntax error points at line and column") {
  auto d = ParseDesign("[study]\nid = \"x\"\nseed = = 3\n", "study.toml", "");
  REQUIRE_FALSE(d.ok());
  CHECK(d.error().where == "study.toml:3:8");
}

TEST_CASE("design: a misspelt key is named with a suggestion") {
  auto d = ParseDesign(Replace(DemoDesign(), "window_days = 28", "windwo_days = 28"), "study.toml", "");
  REQUIRE_FALSE(d.ok());
  CHECK(d.error().what == "unknown key 'windwo_days' in [outcomes] (did you mean 'window_days'?)");
}

TEST_CASE("design: interim looks in a design monitor cannot watch are refused, naming why") {
  auto d = ParseDesign(Replace(DemoDesign(), "kind = \"paired\"", "kind = \"sets\""), "study.toml", "");
  REQUIRE_FALSE(d.ok());
  CHECK(d.error().where == "study.toml:60:9");
  CHECK(d.error().what ==
        "[analysis].looks plans interim looks, but monitor can only watch a paired design (two arms, a set of two "
        "probes per vacancy) and this design is 'sets'");
  CHECK(d.error().fix == "remove looks and analyse once at the end of fieldwork with 'twinprobe analyze'");
}

TEST_CASE("design: an arm naming an unknown factor is refused") {
  std::string text = Replace(DemoDesign(), "include = \"all\"", "list = [{origin = \"inland\"}, {orgin = \"coastal\"}]");
  auto d = ParseDesign(text, "study.toml", "");
  REQUIRE_FALSE(d.ok());
  CHECK(d.error().what == "arm names unknown factor 'orgin' (did you mean 'origin'?)");
}

TEST_CASE("design: a level without a name pool is refused") {
  std::string text = Replace(DemoDesign(), "[[profiles.pool]]\nfactor = \"origin\"\nlevel = \"coastal\"\nfile = \"names/coastal.csv\"",
                             "");
  auto d = ParseDesign(text, "study.toml", "");
  REQUIRE_FALSE(d.ok());
  CHECK(d.error().what == "level 'coastal' of factor 'origin' has no name pool");
}

TEST_CASE("design: a reversed gap range is refused with its position") {
  auto d = ParseDesign(Replace(DemoDesign(), "gap_hours = [24, 72]", "gap_hours = [72, 24]"), "study.toml", "");
  REQUIRE_FALSE(d.ok());
  CHECK(d.error().what == "[schedule].gap_hours is reversed: min 72 > max 24");
  CHECK(d.error().where.rfind("study.toml:", 0) == 0);
}

namespace {

// A two-factor design: names signal origin, age_band shows through fields.
std::string TwoFactorDesign(const std::string& arms, const std::string& kind = "sets") {
  return "[study]\nid = \"two\"\nkind = \"" + kind +
         "\"\n\n"
         "[[factor]]\nname = \"origin\"\nlevels = [\"inland\", \"coastal\"]\n\n"
         "[[factor]]\nname = \"age_band\"\nlevels = [\"younger\", \"older\", \"oldest\"]\nreference = \"younger\"\n"
         "fields = { birth_year = [\"2003\", \"1979\", \"1966\"] }\n\n"
         "[arms]\n" + arms + "\n\n"
         "[profiles]\n[[profiles.pool]]\nfactor = \"origin\"\nlevel = \"inland\"\nfile = \"names/inland.csv\"\n"
         "[[profiles.pool]]\nfactor = \"origin\"\nlevel = \"coastal\"\nfile = \"names/coastal.csv\"\n\n"
         "[templates]\nfiles = [\"a.md\", \"b.md\", \"c.md\", \"d.md\", \"e.md\", \"f.md\"]\n";
}

}  // namespace

TEST_CASE("design: arms 'neighbours' are the reference and every arm changing one level") {
  auto d = ParseDesign(TwoFactorDesign("include = \"neighbours\""), "study.toml", "");
  REQUIRE(d.ok());
  std::vector<std::string> labels;
  for (const auto& a : d.value().arms) labels.push_back(a.label);
  CHECK(labels == std::vector<std::string>{"age_band=younger,origin=inland", "age_band=older,origin=inland",
                                           "age_band=oldest,origin=inland", "age_band=younger,origin=coastal"});
  CHECK(d.value().arms[d.value().reference_arm].label == "age_band=younger,origin=inland");
  CHECK(d.value().name_factors == std::vector<std::string>{"origin"});
  CHECK(d.value().factors[1].fields.at("birth_year") == std::vector<std::string>{"2003", "1979", "1966"});
  auto all = ParseDesign(TwoFactorDesign("include = \"all\""), "study.toml", "");
  REQUIRE(all.ok());
  CHECK(all.value().arms.size() == 6);
}

TEST_CASE("design: a factor's fields must give one text per level") {
  std::string text = Replace(TwoFactorDesign("include = \"all\""), "\"1979\", \"1966\"", "\"1979\"");
  auto d = ParseDesign(text, "study.toml", "");
  REQUIRE_FALSE(d.ok());
  CHECK(d.error().Message() == "study.toml:13:25: fields.birth_year of factor 'age_band' must list 3 texts, one per "
                               "level (younger, older, oldest) \u2014 give one text for each level, in the order of levels");
}

TEST_CASE("design: a factor that neither names nor fields signal is refused at its declaration") {
  std::string text = Replace(TwoFactorDesign("include = \"all\""), "fields = { birth_year = [\"2003\", \"1979\", \"1966\"] }\n", "");
  auto d = ParseDesign(text, "study.toml", "");
  REQUIRE_FALSE(d.ok());
  CHECK(d.error().Message() == "study.toml:9:1: factor 'age_band' changes nothing in the applications: no name pool is "
                               "keyed by it and it sets no template field \u2014 add fields = { … } to its [[factor]], or "
                               "key the name pools by it");
}

TEST_CASE("design: pools keyed by several factors cover every arm") {
  std::string text = TwoFactorDesign("list = [{origin = \"inland\", age_band = \"younger\"}, {origin = \"coastal\", age_band = \"older\"}]",
                                     "paired");
  text = Replace(text, "factor = \"origin\"\nlevel = \"inland\"", "levels = { origin = \"inland\", age_band = \"younger\" }");
  text = Replace(text, "factor = \"origin\"\nlevel = \"coastal\"", "levels = { origin = \"coastal\", age_band = \"older\" }");
  auto d = ParseDesign(text, "study.toml", "");
  REQUIRE(d.ok());
  CHECK(d.value().name_factors == std::vector<std::string>{"age_band", "origin"});
  CHECK(d.value().arms.size() == 2);
  // Listing an arm whose combination has no pool is refused.
  std::string missing = Replace(text, "{origin = \"coastal\", age_band = \"older\"}", "{origin = \"coastal\", age_band = \"oldest\"}");
  auto m = ParseDesign(missing, "study.toml", "");
  REQUIRE_FALSE(m.ok());
  CHECK(m.error().what == "the levels age_band=oldest,origin=coastal have no name pool");
  // Pools keyed inconsistently are refused.
  std::string mixed = Replace(text, "levels = { origin = \"coastal\", age_band = \"older\" }", "factor = \"origin\"\nlevel = \"coastal\"");
  auto x = ParseDesign(mixed, "study.toml", "");
  REQUIRE_FALSE(x.ok());
  CHECK(x.error().what == "this name pool is keyed by origin but the first pool by age_band, origin");
}

TEST_CASE("design: two pools for one level are refused") {
  std::string text = Replace(DemoDesign(), "level = \"coastal\"\nfile = \"names/coastal.csv\"",
                             "level = \"inland\"\nfile = \"names/coastal.csv\"");
  auto d = ParseDesign(text, "study.toml", "");
  REQUIRE_FALSE(d.ok());
  CHECK(d.error().what == "two name pools are given for origin=inland");
}

TEST_CASE("design: contact patterns accept only known placeholders") {
  auto d = ParseDesign(Replace(DemoDesign(), "{given}.{family}@postbox.example", "{given}.{surname}@postbox.example"),
                       "study.toml", "");
  REQUIRE_FALSE(d.ok());
  CHECK(d.error().what == "[profiles].mailbox uses unknown placeholder '{surname}'");
}

TEST_CASE("design: sending hours, sets per day and a gap range that cannot be kept") {
  auto hours = ParseDesign(Replace(DemoDesign(), "hours = [9, 17]", "hours = [17, 9]"), "study.toml", "");
  REQUIRE_FALSE(hours.ok());
  CHECK(hours.error().what == "[schedule].hours must satisfy 0 <= open < close <= 24, got [17, 9]");
  auto ok = ParseDesign(Replace(Replace(DemoDesign(), "hours = [9, 17]", "hours = [8, 18]"), "sets_per_day = 20",
                                "sets_per_day = 7"),
                        "study.toml", "");
  REQUIRE(ok.ok());
  CHECK(ok.value().schedule.hour_open == 8);
  CHECK(ok.value().schedule.sets_per_day == 7);
  auto narrow = ParseDesign(Replace(DemoDesign(), "gap_hours = [24, 72]", "gap_hours = [24, 30]"), "study.toml", "");
  REQUIRE_FALSE(narrow.ok());
  CHECK(narrow.error().Message() ==
        "study.toml:43:13: [schedule].gap_hours = [24, 30] cannot be kept for a probe sent on fri 09:00 UTC: no sending "
        "time lies 24 to 30 hours later \u2014 widen the gap range, or add sending days or hours");
}

TEST_CASE("design: include must be all or neighbours") {
  auto d = ParseDesign(Replace(DemoDesign(), "include = \"all\"", "include = \"neighbors\""), "study.toml", "");
  REQUIRE_FALSE(d.ok());
  CHECK(d.error().what == "[arms].include must be \"all\" or \"neighbours\", got 'neighbors' (did you mean 'neighbours'?)");
}

TEST_CASE("design: the canonical analysis plan lists its items in a fixed order") {
  auto d = ParseDesign(DemoDesign(), "study.toml", "");
  REQUIRE(d.ok());
  CHECK(CanonicalAnalysisPlan(d.value()) ==
        "kind=paired\narms=origin=inland|origin=coastal\nreference=origin=inland\n"
        "codes=none,rejection,info_request,invitation,offer\npositive=info_request,invitation,offer\nwindow_days=28\n"
        "strata=occupation,region\nprimary=positive_callback\ncorrection=holm\nalpha=0.050000000000000003\nlooks=200\n"
        "spending=obf\n");
}
