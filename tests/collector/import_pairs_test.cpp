// `import pairs`: a whole dataset from elsewhere (collector/import_pairs.h).
// Real stores in temp folders; every bad-row message is asserted exactly.
#include <catch2/catch.hpp>

#include <filesystem>

#include "core/read_study.h"
#include "analysis/analyze.h"
#include "collector/import_pairs.h"
#include "collector/collector_fixtures.h"
#include "core/meta.h"
#include "planner/design_file.h"

using namespace twinprobe;
using testing::FingerprintOf;
namespace fs = std::filesystem;

namespace {

const std::string kHeader = "vacancy,arm,outcome,sent_at,responded_at,occupation,region\n";
const std::string kGood =
    kHeader +
    "V1,inland,1,2027-03-01,2027-03-04,bookkeeper,Orlinde\n"
    "V1,coastal,0,2027-03-01,,bookkeeper,Orlinde\n"
    "V2,inland,0,2027-03-02T09:00,,care assistant,Brakkeport\n"
    "V2,coastal,1,2027-03-02T09:30,2027-03-09T10:30,care assistant,Brakkeport\n";

PairsImportOptions Options() {
  PairsImportOptions o;
  o.reference = "inland";
  o.strata = {"occupation", "region"};
  o.strata_given = true;
  o.progress = false;
  return o;
}

// A folder with no design; each Import() writes the CSV and imports it.
struct Folder {
  testing::TempDir dir;
  std::string csv = dir / "p.csv";
  std::string db = dir / "study/study.db";
  Result<PairsImportSummary> Import(const std::string& text, const PairsImportOptions& o = Options(),
                                    const Design* design = nullptr) {
    testing::WriteFile(csv, text);
    return ImportPairs(db, design, csv, o);
  }
  // The message of a failed import, checking that no store was created.
  std::string Fails(const std::string& text, const PairsImportOptions& o = Options()) {
    auto r = Import(text, o);
    REQUIRE_FALSE(r.ok());
    CHECK_FALSE(fs::exists(db));
    return r.error().Message();
  }
  std::string At(int line) const { return csv + ":" + std::to_string(line) + ": "; }
};

std::string Replace(std::string text, const std::string& from, const std::string& to) {
  size_t at = text.find(from);
  REQUIRE(at != std::string::npos);
  return text.replace(at, from.size(), to);
}

}  // namespace

TEST_CASE("import pairs: a folder without a design becomes a paired study that analysis can read") {
  Folder f;
  auto r = f.Import(kGood);
  INFO((r.ok() ? "" : r.error().Message()));
  REQUIRE(r.ok());
  const PairsImportSummary& s = r.value();
  CHECK(s.new_plan);
  CHECK(s.kind == "paired");
  CHECK(s.arms == std::vector<std::string>{"inland", "coastal"});
  CHECK(s.strata == std::vector<std::string>{"occupation", "region"});
  CHECK(s.rows_landed == 4);
  CHECK(s.vacancies_landed == 2);
  CHECK(s.sendings == 4);
  CHECK(s.rows_rejected == 0);
  CHECK(s.late == 0);

  auto store = Store::Open(f.db, false);
  REQUIRE(store.ok());
  Store& st = *store.value();
  CHECK(st.QueryInt("SELECT count(*) FROM plan WHERE origin = 'import'") == 1);
  CHECK(st.QueryInt("SELECT count(*) FROM arm WHERE label = 'inland' AND is_reference = 1") == 1);
  CHECK(st.QueryInt("SELECT count(*) FROM current_probe") == 4);
  CHECK(st.QueryInt("SELECT count(*) FROM vacancy_stratum") == 4);
  CHECK(st.QueryInt("SELECT count(*) FROM response WHERE origin = 'import' AND code IN ('0', '1')") == 4);
  CHECK(st.QueryInt("SELECT count(*) FROM response WHERE received_at IS NULL") == 2);
  Stmt t = st.Prepare("SELECT s.sent_at, r.received_at FROM probe p JOIN sending s ON s.probe_id = p.id "
                      "JOIN response r ON r.probe_id = p.id WHERE p.ref = 'P00004'");
  REQUIRE(t.Step());
  CHECK(t.Text(0) == "2027-03-02T09:30:00Z");
  CHECK(t.Text(1) == "2027-03-09T10:30:00Z");
  CHECK(MetaList(st, "strata") == std::vector<std::string>{"occupation", "region"});
  CHECK(MetaValue(st, "study_id") == "study");
  CHECK(VerifyAudit(st).ok());

  // The stored scheme says 1 is a positive callback; analysis reads it.
  OutcomeScheme scheme = StoredOutcomeScheme(st);
  CHECK(scheme.is_positive("1"));
  CHECK_FALSE(scheme.is_positive("0"));
  auto a = Analyze(ReadStudy(st, scheme), st.path(), scheme, AnalysisPlan{});
  REQUIRE(a.ok());
  CHECK(a.value().has_paired);
  CHECK(a.value().reference_label == "inland");
  CHECK(a.value().paired.a == 0);
  CHECK(a.value().paired.b == 1);  // V1: only the reference arm called back
  CHECK(a.value().paired.c == 1);  // V2: only the other arm
  CHECK(a.value().paired.d == 0);
}

TEST_CASE("import pairs: importing the same file twice adds nothing the second time") {
  Folder f;
  REQUIRE(f.Import(kGood).ok());
  const std::string before = FingerprintOf(f.db);
  auto again = f.Import(kGood);
  REQUIRE(again.ok());
  CHECK(again.value().already_imported);
  CHECK(again.value().rows_landed == 0);
  CHECK(FingerprintOf(f.db) == before);
  // Same bytes under another name are the same file.
  testing::WriteFile(f.dir / "copy.csv", kGood);
  auto copy = ImportPairs(f.db, nullptr, f.dir / "copy.csv", Options());
  REQUIRE(copy.ok());
  CHECK(copy.value().already_imported);
  CHECK(FingerprintOf(f.db) == before);
}

TEST_CASE("import pairs: bad-row battery, each with its exact message, nothing written") {
  Folder f;
  const std::string kFixCount = "check for a missing or extra comma, or quote fields that contain commas";
  CHECK(f.Fails(Replace(kGood, "V1,coastal,0,2027-03-01,,bookkeeper,Orlinde", "V1,coastal,0")) ==
        f.At(3) + "the row has 3 fields but the header has 7 \u2014 " + kFixCount);
  CHECK(f.Fails(Replace(kGood, "V1,coastal", ",coastal")) ==
        f.At(3) + "the vacancy is empty \u2014 give every row the reference of its vacancy");
  CHECK(f.Fails(Replace(kGood, "V1,coastal", "V1,")) ==
        f.At(3) + "the arm is empty \u2014 use one of: inland");
  CHECK(f.Fails(Replace(kGood, "V1,coastal,0", "V1,coastal,")) ==
        f.At(3) + "the outcome is empty \u2014 use 1 or 0 (a positive callback or not), or one of: none, rejection, "
                  "info_request, invitation, offer");
  CHECK(f.Fails(Replace(kGood, "V1,coastal,0", "V1,coastal,yes")) ==
        f.At(3) + "outcome 'yes' is not 1, 0 or a response code \u2014 use 1 or 0 (a positive callback or not), or one "
                  "of: none, rejection, info_request, invitation, offer");
  CHECK(f.Fails(Replace(kGood, "V1,coastal,0", "V1,coastal,invitaton")) ==
        f.At(3) + "outcome 'invitaton' is not 1, 0 or a response code (did you mean 'invitation'?) \u2014 use 1 or 0 (a "
                  "positive callback or not), or one of: none, rejection, info_request, invitation, offer");
  CHECK(f.Fails(Replace(kGood, "V1,coastal,0,2027-03-01", "V1,coastal,0,2027-02-30")) ==
        f.At(3) + "sent_at '2027-02-30' is not a date or time \u2014 write it as YYYY-MM-DD or YYYY-MM-DDTHH:MM (UTC)");
  CHECK(f.Fails(Replace(kGood, "2027-03-04,bookkeeper", "04/03/2027,bookkeeper")) ==
        f.At(2) + "responded_at '04/03/2027' is not a date or time \u2014 write it as YYYY-MM-DD or YYYY-MM-DDTHH:MM (UTC)");
  CHECK(f.Fails(Replace(kGood, "2027-03-01,2027-03-04", "2027-03-05,2027-03-04")) ==
        f.At(2) + "responded_at 2027-03-04T00:00:00Z is before sent_at 2027-03-05T00:00:00Z \u2014 check the dates; a "
                  "response cannot precede the application");
  CHECK(f.Fails(Replace(kGood, "V1,coastal,0,2027-03-01,,bookkeeper,Orlinde", "V1,coastal,0,2027-03-01,,bookkeeper,")) ==
        f.At(3) + "the stratum 'region' is empty \u2014 fill it in (use 'unknown' if it is not known)");
  CHECK(f.Fails(Replace(kGood, "V1,coastal", "V1,inland")) ==
        f.At(3) + "vacancy 'V1' has a second row for arm 'inland' (the first is on line 2) \u2014 keep one row per "
                  "vacancy and arm");
  CHECK(f.Fails(Replace(kGood, "V1,coastal,0,2027-03-01,,bookkeeper", "V1,coastal,0,2027-03-01,,care assistant")) ==
        f.At(3) + "vacancy 'V1' has occupation 'care assistant' here but 'bookkeeper' on line 2 \u2014 a vacancy's "
                  "strata are the same on all its rows");
  CHECK(f.Fails(Replace(kGood, "V2,coastal,1,2027-03-02T09:30,2027-03-09T10:30,care assistant,Brakkeport\n", "")) ==
        f.At(4) + "vacancy 'V2' has no row for arm 'coastal' \u2014 every vacancy needs one row per arm (inland, "
                  "coastal); add the missing row or remove the vacancy");
}

TEST_CASE("import pairs: problems with the arms, the reference and the columns") {
  Folder f;
  std::string one_arm = kHeader + "V1,inland,1,,,bookkeeper,Orlinde\nV2,inland,0,,,bookkeeper,Orlinde\n";
  CHECK(f.Fails(one_arm) == f.csv + ": the arm column holds only one arm ('inland') \u2014 a comparison needs at "
                                     "least two arms; check the arm column");
  PairsImportOptions no_ref = Options();
  no_ref.reference.clear();
  CHECK(f.Fails(kGood, no_ref) ==
        "the reference arm is not named \u2014 add --reference ARM; the arms in " + f.csv + " are 'inland', 'coastal'");
  PairsImportOptions bad_ref = Options();
  bad_ref.reference = "inlnd";
  CHECK(f.Fails(kGood, bad_ref) ==
        "--reference 'inlnd' is not an arm of " + f.csv + " (did you mean 'inland'?) \u2014 use one of: inland, coastal");
  // A rare value one typo away from a common arm is a typo, not a third arm.
  std::string typo = kGood + "V3,inland,0,,,bookkeeper,Tessvale\nV3,coastl,0,,,bookkeeper,Tessvale\n";
  CHECK(f.Fails(typo) == f.At(7) + "unknown arm 'coastl' (did you mean 'coastal'?) \u2014 'coastl' is on 1 row and "
                                   "'coastal' on 2; correct the typo");
  CHECK(f.Fails("vacancy,arm,outcomes,occupation,region\nV1,a,1,x,y\n") ==
        f.At(1) + "the column 'outcome' is missing (did you mean 'outcomes'?) \u2014 a pairs file has the columns "
                  "vacancy,arm,outcome, optionally sent_at,responded_at,probe,employer, and its stratum columns");
  PairsImportOptions sector = Options();
  sector.strata = {"occupation", "sector"};
  CHECK(f.Fails(kGood, sector) == f.At(1) + "the stratum column 'sector' named in --strata is missing \u2014 add the "
                                            "column, or name the file's stratum columns with --strata");
  PairsImportOptions arm_stratum = Options();
  arm_stratum.strata = {"arm"};
  CHECK(f.Fails(kGood, arm_stratum) ==
        "'arm' is a column of its own and cannot be a stratum \u2014 name other columns with --strata");
  CHECK(f.Fails(kHeader) == f.At(2) + "the file has no data rows \u2014 add one row per probe under the header");
  CHECK(f.Fails(kHeader + "V1,\"in\"land,1,,,x,y\n") ==
        f.csv + ":2:8: text follows a closing quote \u2014 quote the whole field and double any quote inside it");
  CHECK(f.Fails(kHeader + "V1,in\"land,1,,,x,y\n") ==
        f.csv + ":2:6: a double quote inside an unquoted field \u2014 quote the whole field and write the quote as \"\"");
  std::string twice = "vacancy,arm,outcome,probe\nV1,a,1,A-1\nV1,b,0,A-1\n";
  PairsImportOptions plain = Options();
  plain.strata.clear();
  plain.reference = "a";
  CHECK(f.Fails(twice, plain) ==
        f.At(3) + "probe 'A-1' appears twice (first on line 2) \u2014 give each probe its own reference");
  std::string employers = "vacancy,arm,outcome,employer\nV1,a,1,Galengate (invented)\nV1,b,0,Skarnfield (invented)\n";
  CHECK(f.Fails(employers, plain) ==
        f.At(3) + "vacancy 'V1' has employer 'Skarnfield (invented)' here but 'Galengate (invented)' on line 2 \u2014 a "
                  "vacancy has one employer on all its rows");
}

TEST_CASE("import pairs: CSV details (quotes, CRLF, BOM, probe and employer columns, ignored columns)") {
  Folder f;
  std::string text =
      "\xEF\xBB\xBFvacancy,arm,outcome,probe,employer,comment\r\n"
      "\"V 1, north\",a,1,HR-17,\"Galengate Logistics (invented)\",\"said \"\"come in\"\"\"\r\n"
      "\"V 1, north\",b,0,HR-18,\"Galengate Logistics (invented)\",\"two\nlines\"\r\n";
  PairsImportOptions o = Options();
  o.strata.clear();
  o.reference = "a";
  auto r = f.Import(text, o);
  INFO((r.ok() ? "" : r.error().Message()));
  REQUIRE(r.ok());
  CHECK(r.value().ignored_columns == std::vector<std::string>{"comment"});
  CHECK(r.value().kind == "paired");
  auto store = Store::Open(f.db, false);
  Store& st = *store.value();
  CHECK(st.QueryInt("SELECT count(*) FROM vacancy WHERE ref = 'V 1, north'") == 1);
  CHECK(st.QueryInt("SELECT count(*) FROM probe WHERE ref IN ('HR-17', 'HR-18')") == 2);
  // The employer is stored under its pseudonym; its name only in the purgeable table.
  CHECK(st.QueryInt("SELECT count(*) FROM vacancy WHERE employer_key LIKE 'E-%'") == 1);
  CHECK(st.QueryInt("SELECT count(*) FROM employer WHERE name = 'Galengate Logistics (invented)'") == 1);
  CHECK(VerifyAudit(st).ok());
}

TEST_CASE("import pairs: --skip-bad lands whole good vacancies and writes every row left out with its reason") {
  Folder f;
  std::string text = kGood +
                     "V3,inland,1,2027-03-03,,junior developer,Tessvale\n"
                     "V3,coastal,maybe,2027-03-03,,junior developer,Tessvale\n"
                     "V4,inland,0,2027-03-04,,warehouse clerk,Orlinde\n";
  PairsImportOptions o = Options();
  o.skip_bad = true;
  auto r = f.Import(text, o);
  REQUIRE(r.ok());
  CHECK(r.value().rows_landed == 4);
  CHECK(r.value().vacancies_landed == 2);
  CHECK(r.value().rows_rejected == 3);
  CHECK(r.value().reject_path == f.csv + ".rejects.csv");
  CHECK(testing::ReadFile(f.csv + ".rejects.csv") ==
        "reject_line,reject_reason,vacancy,arm,outcome,sent_at,responded_at,occupation,region\r\n"
        "6,\"another row of vacancy 'V3' (line 7) is bad, so the whole set is left out\",V3,inland,1,2027-03-03,,"
        "junior developer,Tessvale\r\n"
        "7,\"outcome 'maybe' is not 1, 0 or a response code\",V3,coastal,maybe,2027-03-03,,junior developer,Tessvale\r\n"
        "8,vacancy 'V4' has no row for arm 'coastal',V4,inland,0,2027-03-04,,warehouse clerk,Orlinde\r\n");
  auto store = Store::Open(f.db, false);
  CHECK(store.value()->QueryInt("SELECT count(*) FROM import_file WHERE rows_landed = 4 AND rows_rejected = 3") == 1);

  // The reject file, corrected, imports as it is (its reject_* columns are skipped).
  std::string fixed = testing::ReadFile(f.csv + ".rejects.csv");
  fixed = Replace(fixed, "V3,coastal,maybe", "V3,coastal,0");
  fixed += "9,added,V4,coastal,1,2027-03-04,2027-03-06,warehouse clerk,Orlinde\r\n";
  testing::WriteFile(f.dir / "fixed.csv", fixed);
  auto again = ImportPairs(f.db, nullptr, f.dir / "fixed.csv", Options());
  INFO((again.ok() ? "" : again.error().Message()));
  REQUIRE(again.ok());
  CHECK_FALSE(again.value().new_plan);
  CHECK(again.value().ignored_columns.empty());
  CHECK(again.value().rows_landed == 4);
  CHECK(store.value()->QueryInt("SELECT count(*) FROM current_probe") == 8);
  CHECK(store.value()->QueryInt("SELECT count(DISTINCT ref) FROM current_probe") == 8);
  CHECK(VerifyAudit(*store.value()).ok());
}

TEST_CASE("import pairs: --skip-bad with no good row writes the rejects and leaves no store") {
  Folder f;
  PairsImportOptions o = Options();
  o.skip_bad = true;
  auto r = f.Import(kHeader + "V1,inland,x,,,a,b\nV1,coastal,y,,,a,b\n", o);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().Message() == f.csv + ": no row of the file can be imported \u2014 see the reasons in " + f.csv +
                                   ".rejects.csv; nothing was written to the store");
  CHECK_FALSE(fs::exists(f.db));
  CHECK(testing::ReadFile(f.csv + ".rejects.csv").find("2,\"outcome 'x' is not 1, 0 or a response code") !=
        std::string::npos);
}

TEST_CASE("import pairs: a later file joins the imported study, conflicts fail and change nothing") {
  Folder f;
  REQUIRE(f.Import(kGood).ok());
  const std::string before = FingerprintOf(f.db);
  std::string again = kHeader + "V2,inland,1,,,care assistant,Brakkeport\nV2,coastal,1,,,care assistant,Brakkeport\n";
  auto r = f.Import(again);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().Message() == f.At(2) + "vacancy 'V2' is already in the study (from an earlier import) \u2014 import "
                                         "only new vacancies; a corrected reject file can be imported as it is");
  CHECK(FingerprintOf(f.db) == before);
  PairsImportOptions other = Options();
  other.strata = {"region"};
  auto s = f.Import(kHeader + "V9,inland,1,,,x,y\nV9,coastal,0,,,x,y\n", other);
  REQUIRE_FALSE(s.ok());
  CHECK(s.error().Message() == "--strata region differs from the study's strata (occupation, region) \u2014 a later "
                               "import has the strata of the first; leave --strata out");
  PairsImportOptions ref = Options();
  ref.reference = "coastal";
  auto t = f.Import(kHeader + "V9,inland,1,,,x,y\nV9,coastal,0,,,x,y\n", ref);
  REQUIRE_FALSE(t.ok());
  CHECK(t.error().Message() == "--reference 'coastal' differs from the study's reference arm 'inland' \u2014 leave "
                               "--reference out; the reference arm is set by the design or the first import");
  auto u = f.Import(kHeader + "V9,inland,1,,,x,y\nV9,rural,0,,,x,y\n");
  REQUIRE_FALSE(u.ok());
  CHECK(u.error().Message() == f.At(3) + "unknown arm 'rural' \u2014 use one of the study's arms: inland, coastal");
  CHECK(FingerprintOf(f.db) == before);
  auto ok = f.Import(kHeader + "V9,inland,1,,,x,y\nV9,coastal,0,,,x,y\n");
  REQUIRE(ok.ok());
  CHECK(ok.value().rows_landed == 2);
  auto store = Store::Open(f.db, false);
  CHECK(store.value()->QueryInt("SELECT count(*) FROM current_probe WHERE ref IN ('P00005', 'P00006')") == 2);
}

TEST_CASE("import pairs: with a design, arms, scheme and strata come from study.toml") {
  testing::PlannedStudy s(false);  // init only: study.toml, no plan
  auto design = LoadDesign(s.path);
  REQUIRE(design.ok());
  std::string csv = s.dir / "d.csv";
  PairsImportOptions o;
  o.progress = false;
  testing::WriteFile(csv, "vacancy,arm,outcome,occupation,region\n"
                          "V1,inland,invitation,bookkeeper,North Fen\n"
                          "V1,origin=coastal,rejection,bookkeeper,North Fen\n"
                          "V2,inland,1,bookkeeper,North Fen\n"
                          "V2,coastel,none,bookkeeper,North Fen\n");
  auto bad = ImportPairs(s.db(), &design.value(), csv, o);
  REQUIRE_FALSE(bad.ok());
  CHECK(bad.error().Message() ==
        csv + ":4: outcome '1' is not a code of this study's scheme \u2014 use one of: none, rejection, info_request, "
              "invitation, offer (for 1/0 data, add \"0\" and \"1\" to [outcomes].codes and \"1\" to positive in "
              "study.toml)");
  testing::WriteFile(csv, "vacancy,arm,outcome,occupation,region\n"
                          "V1,inland,invitation,bookkeeper,North Fen\n"
                          "V1,origin=coastal,rejection,bookkeeper,North Fen\n"
                          "V2,inland,offer,bookkeeper,North Fen\n"
                          "V2,coastel,none,bookkeeper,North Fen\n");
  auto typo = ImportPairs(s.db(), &design.value(), csv, o);
  REQUIRE_FALSE(typo.ok());
  CHECK(typo.error().Message() == csv + ":5: unknown arm 'coastel' (did you mean 'coastal'?) \u2014 use one of the "
                                        "study's arms: origin=inland, origin=coastal");
  CHECK_FALSE(fs::exists(s.db()));
  testing::WriteFile(csv, "vacancy,arm,outcome,occupation,region\n"
                          "V1,inland,invitation,bookkeeper,North Fen\n"
                          "V1,origin=coastal,rejection,bookkeeper,North Fen\n");
  auto ok = ImportPairs(s.db(), &design.value(), csv, o);
  INFO((ok.ok() ? "" : ok.error().Message()));
  REQUIRE(ok.ok());
  CHECK(ok.value().arms == std::vector<std::string>{"origin=inland", "origin=coastal"});
  CHECK(ok.value().strata == std::vector<std::string>{"occupation", "region"});
  auto store = s.Open();
  CHECK(store->QueryInt("SELECT count(*) FROM plan WHERE origin = 'import' AND design_sha256 IS NOT NULL") == 1);
}

TEST_CASE("import pairs: a study planned by 'twinprobe plan' is refused and left as it was") {
  testing::PlannedStudy s;
  const std::string before = FingerprintOf(s.db());
  std::string csv = s.dir / "p.csv";
  testing::WriteFile(csv, kGood);
  auto design = LoadDesign(s.path);
  REQUIRE(design.ok());
  auto r = ImportPairs(s.db(), &design.value(), csv, Options());
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().Message() ==
        s.db() + ": this study was planned with 'twinprobe plan'; 'import pairs' brings in a whole dataset collected "
                 "elsewhere \u2014 use 'import outcomes' for responses to the planned probes, or import into a new folder");
  CHECK(FingerprintOf(s.db()) == before);
}

TEST_CASE("import pairs: responses after the observation window are flagged late") {
  Folder f;
  std::string text = kHeader + "V1,inland,1,2027-03-01,2027-03-29,x,y\nV1,coastal,1,2027-03-01,2027-03-30,x,y\n";
  auto r = f.Import(text);
  REQUIRE(r.ok());
  CHECK(r.value().late == 1);  // 29 days after sending; the default window is 28
  auto store = Store::Open(f.db, false);
  CHECK(store.value()->QueryInt("SELECT count(*) FROM response WHERE flags = 'late' AND received_at = "
                                "'2027-03-30T00:00:00Z'") == 1);
}

TEST_CASE("import pairs: three arms make a 'sets' study") {
  Folder f;
  PairsImportOptions o = Options();
  o.strata.clear();
  o.reference = "b";
  auto r = f.Import("vacancy,arm,outcome\nV1,a,1\nV1,b,0\nV1,c,1\nV2,c,0\nV2,b,0\nV2,a,1\n", o);
  REQUIRE(r.ok());
  CHECK(r.value().kind == "sets");
  CHECK(r.value().arms == std::vector<std::string>{"b", "a", "c"});
}

TEST_CASE("import pairs: an unpaired design takes one row per vacancy") {
  testing::PlannedStudy s(false);
  std::string toml = testing::ReadFile(s.path + "/study.toml");
  toml.replace(toml.find("kind = \"paired\""), 15, "kind = \"unpaired\"");
  toml.erase(toml.find("looks = [200]\n"), 14);  // interim looks are for paired designs only
  testing::WriteFile(s.path + "/study.toml", toml);
  auto design = LoadDesign(s.path);
  INFO((design.ok() ? "" : design.error().Message()));
  REQUIRE(design.ok());
  std::string csv = s.dir / "u.csv";
  PairsImportOptions o;
  o.progress = false;
  testing::WriteFile(csv, "vacancy,arm,outcome,occupation,region\n"
                          "V1,inland,invitation,bookkeeper,North Fen\n"
                          "V2,coastal,rejection,bookkeeper,North Fen\n"
                          "V2,inland,none,bookkeeper,North Fen\n");
  auto twice = ImportPairs(s.db(), &design.value(), csv, o);
  REQUIRE_FALSE(twice.ok());
  CHECK(twice.error().Message() == csv + ":4: vacancy 'V2' has a second row (the first is on line 3) \u2014 an unpaired "
                                         "study sends one application per vacancy; keep one row per vacancy");
  testing::WriteFile(csv, "vacancy,arm,outcome,occupation,region\n"
                          "V1,inland,invitation,bookkeeper,North Fen\n"
                          "V2,coastal,rejection,bookkeeper,North Fen\n");
  auto ok = ImportPairs(s.db(), &design.value(), csv, o);
  INFO((ok.ok() ? "" : ok.error().Message()));
  REQUIRE(ok.ok());
  CHECK(ok.value().kind == "unpaired");
  CHECK(ok.value().rows_landed == 2);
}

TEST_CASE("issue 24: a later import with another --id is refused, naming the study's id") {
  Folder f;
  REQUIRE(f.Import(kGood).ok());
  const std::string before = FingerprintOf(f.db);
  PairsImportOptions other = Options();
  other.study_id = "harbour-2027";
  auto r = f.Import(kHeader + "V9,inland,1,,,x,y\nV9,coastal,0,,,x,y\n", other);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().Message() == "--id harbour-2027 differs from the study's id (study) \u2014 a later import joins the "
                               "study of the first; leave --id out");
  CHECK(FingerprintOf(f.db) == before);
  other.study_id = "study";  // the same id is no change
  CHECK(f.Import(kHeader + "V9,inland,1,,,x,y\nV9,coastal,0,,,x,y\n", other).ok());
}
