// `export` (collector/export.h): the layout of docs/export.md, read back by
// R's read.csv and by pandas (Debian's r-base-core and python3-pandas, run
// live), pseudonymised unless identities are asked for.
#include <catch2/catch.hpp>

#include <nlohmann/json.hpp>

#include "collector/export.h"
#include "collector/import_pairs.h"
#include "collector/collector_fixtures.h"
#include "core/clock.h"
#include "core/csv.h"
#include "core/meta.h"

using namespace twinprobe;
using testing::RunCli;

namespace {

// An imported study whose values are awkward for CSV: commas, quotes, a
// line break, non-ASCII letters, an empty stratum column clash.
struct AwkwardStudy {
  testing::TempDir dir;
  std::string db = dir / "s/study.db";
  AwkwardStudy() {
    std::string csv = dir / "pairs.csv";
    testing::WriteFile(csv,
                       "vacancy,arm,outcome,sent_at,responded_at,occupation,region,employer\n"
                       "\"V 1, north\",inland,invitation,2027-03-01,2027-03-03,\"caf\xC3\xA9 \"\"Ost\"\"\",Orlinde,"
                       "Galengate Logistics (invented)\n"
                       "\"V 1, north\",coastal,none,2027-03-01,,\"caf\xC3\xA9 \"\"Ost\"\"\",Orlinde,"
                       "Galengate Logistics (invented)\n"
                       "V2,inland,0,2027-03-02,,\"line one\nline two\",Brakkeport,\n"
                       "V2,coastal,1,2027-03-02,2027-04-10,\"line one\nline two\",Brakkeport,\n");
    PairsImportOptions o;
    o.reference = "inland";
    o.strata = {"occupation", "region"};
    o.strata_given = true;
    o.progress = false;
    auto r = ImportPairs(db, nullptr, csv, o);
    INFO((r.ok() ? "" : r.error().Message()));
    REQUIRE(r.ok());
  }
  ExportSummary Export(const std::string& path, const std::string& format, bool identities = false) {
    auto store = Store::Open(db, false);
    REQUIRE(store.ok());
    ExportOptions o;
    o.format = format;
    o.identities = identities;
    o.now = ParseIsoTime("2027-06-01T00:00:00Z");  // after every window
    auto r = ExportStudy(*store.value(), StoredOutcomeScheme(*store.value()), path, o);
    INFO((r.ok() ? "" : r.error().Message()));
    REQUIRE(r.ok());
    return r.value();
  }
};

// Runs a command with a UTF-8 locale; returns its standard output.
std::string Run(const std::string& command) {
  testing::TempDir io;
  std::string full = "LANG=C.UTF-8 LC_ALL=C.UTF-8 " + command + " >'" + io / "out" + "' 2>'" + io / "err" + "'";
  int rc = std::system(full.c_str());
  INFO(testing::ReadFile(io / "err"));
  CHECK(rc == 0);
  return testing::ReadFile(io / "out");
}

}  // namespace

TEST_CASE("export: CSV files in the documented layout, pseudonymised by default") {
  AwkwardStudy s;
  std::string out = s.dir / "export";
  ExportSummary sum = s.Export(out, "csv");
  CHECK(sum.vacancies == 2);
  CHECK(sum.probes == 4);
  CHECK(sum.responses == 4);
  auto probes = ReadCsvFile(out + "/probes.csv");
  REQUIRE(probes.ok());
  CHECK(probes.value().header ==
        std::vector<std::string>{"probe", "vacancy", "arm", "reference", "profile", "template", "send_order",
                                 "planned_at", "sent_at", "outcome", "positive", "received_at", "channel", "late",
                                 "responses", "state", "factor_arm", "occupation", "region"});
  CHECK(probes.value().rows[0].fields ==
        std::vector<std::string>{"P00001", "V 1, north", "inland", "1", "", "", "1", "", "2027-03-01T00:00:00Z",
                                 "invitation", "1", "2027-03-03T00:00:00Z", "", "0", "1", "closed", "inland",
                                 "caf\xC3\xA9 \"Ost\"", "Orlinde"});
  // An imported file's one factor is named "arm" like the fixed column: written as factor_arm.
  CHECK(probes.value().rows[3].fields[13] == "1");  // 39 days after sending: late
  auto vacancies = ReadCsvFile(out + "/vacancies.csv");
  REQUIRE(vacancies.ok());
  CHECK(vacancies.value().header == std::vector<std::string>{"vacancy", "employer_key", "source", "opened_on",
                                                             "closed_on", "occupation", "region"});
  CHECK(vacancies.value().rows[0].fields[1].rfind("E-", 0) == 0);
  CHECK(vacancies.value().rows[1].fields[1].empty());
  std::string everything = testing::ReadFile(out + "/vacancies.csv") + testing::ReadFile(out + "/probes.csv") +
                           testing::ReadFile(out + "/responses.csv");
  CHECK(everything.find("Galengate") == std::string::npos);
  auto manifest = nlohmann::json::parse(testing::ReadFile(out + "/manifest.json"));
  CHECK(manifest["format"] == "twinprobe-export");
  CHECK(manifest["version"] == 1);
  CHECK(manifest["identities"] == false);
  CHECK(manifest["audit_intact"] == true);
  CHECK(manifest["audit_head"] == sum.audit_head);
  CHECK(manifest["rows"]["probes"] == 4);
  CHECK(manifest["positive_codes"] == nlohmann::json({"info_request", "invitation", "offer", "1"}));
}

TEST_CASE("export: R's read.csv reads the files as they are") {
  AwkwardStudy s;
  std::string out = s.dir / "export";
  s.Export(out, "csv");
  std::string script = s.dir / "read.R";
  testing::WriteFile(script,
                     "d <- commandArgs(trailingOnly = TRUE)[1]\n"
                     "p <- read.csv(file.path(d, 'probes.csv'), encoding = 'UTF-8', stringsAsFactors = FALSE)\n"
                     "v <- read.csv(file.path(d, 'vacancies.csv'), encoding = 'UTF-8', stringsAsFactors = FALSE)\n"
                     "r <- read.csv(file.path(d, 'responses.csv'), encoding = 'UTF-8', stringsAsFactors = FALSE)\n"
                     "cat(nrow(p), ncol(p), nrow(v), nrow(r), '\\n')\n"
                     "cat(class(p$positive), sum(p$positive), class(p$reference), '\\n')\n"
                     "cat(p$vacancy[1], '|', p$occupation[1], '|', p$occupation[3], '\\n')\n"
                     "cat(sum(is.na(r$supersedes)), class(r$current), sum(p$late), '\\n')\n"
                     "cat(tapply(p$positive, p$arm, sum)[c('inland', 'coastal')], '\\n')\n");
  CHECK(Run("Rscript '" + script + "' '" + out + "'") ==
        "4 19 2 4 \n"
        "integer 2 integer \n"
        "V 1, north | caf\xC3\xA9 \"Ost\" | line one\nline two \n"
        "4 integer 1 \n"
        "1 1 \n");
}

TEST_CASE("export: pandas reads the CSV files and the JSON document") {
  AwkwardStudy s;
  std::string out = s.dir / "export";
  s.Export(out, "csv");
  std::string json = s.dir / "export.json";
  s.Export(json, "json");
  std::string script = s.dir / "read.py";
  testing::WriteFile(script,
                     "import json, sys\n"
                     "import pandas as pd\n"
                     "d, j = sys.argv[1], sys.argv[2]\n"
                     "p = pd.read_csv(d + '/probes.csv')\n"
                     "v = pd.read_csv(d + '/vacancies.csv')\n"
                     "r = pd.read_csv(d + '/responses.csv')\n"
                     "print(len(p), len(p.columns), len(v), len(r))\n"
                     "print(p['positive'].dtype, int(p['positive'].sum()), p['vacancy'][0], '|', p['occupation'][0])\n"
                     "print(int(r['supersedes'].isna().sum()), int(p['late'].sum()), repr(p['occupation'][2]))\n"
                     "doc = json.load(open(j, encoding='utf-8'))\n"
                     "jp = pd.DataFrame(doc['probes'])\n"
                     "print(doc['format'], doc['version'], len(jp), list(jp.columns) == list(p.columns))\n"
                     "print(jp['positive'].tolist(), jp['received_at'].isna().sum())\n"
                     "print(pd.DataFrame(doc['vacancies'])['employer_key'].isna().tolist())\n");
  CHECK(Run("/usr/bin/python3 '" + script + "' '" + out + "' '" + json + "'") ==
        "4 19 2 4\n"
        "int64 2 V 1, north | caf\xC3\xA9 \"Ost\"\n"
        "4 1 'line one\\nline two'\n"
        "twinprobe-export 1 4 True\n"
        "[True, False, False, True] 2\n"
        "[False, True]\n");
}

TEST_CASE("export: --identities adds employer names, mailboxes and notes, the CLI warns") {
  testing::PlannedStudy s;
  testing::SendProbes(s.path, {"P00001"}, "2027-03-01");
  REQUIRE(RunCli({"--study", s.path, "record", "P00001", "invitation", "--at", "2027-03-05", "--note",
                  "Ms Invented, \"HR\", called"})
              .exit_code == 0);
  auto plain = RunCli({"--study", s.path, "export", "--out", s.dir / "plain"});
  CHECK(plain.exit_code == 0);
  CHECK(plain.err.empty());
  CHECK(testing::ReadFile(s.dir / "plain/probes.csv").find("@postbox.example") == std::string::npos);
  CHECK(testing::ReadFile(s.dir / "plain/responses.csv").find("Ms Invented") == std::string::npos);
  CHECK(testing::ReadFile(s.dir / "plain/vacancies.csv").find("(invented)") == std::string::npos);

  auto full = RunCli({"--study", s.path, "export", "--identities", "--out", s.dir / "full"});
  CHECK(full.exit_code == 0);
  CHECK(full.err == "twinprobe: warning: the export holds employer names and contacts, profile mailboxes and notes: "
                    "personal data; keep it as safe as the store and delete it when your retention period ends\n");
  auto probes = ReadCsvFile(s.dir / "full/probes.csv");
  REQUIRE(probes.ok());
  CHECK(probes.value().Column("profile_mailbox") == 5);
  CHECK(probes.value().rows[0].fields[5].find("@postbox.example") != std::string::npos);
  auto responses = ReadCsvFile(s.dir / "full/responses.csv");
  REQUIRE(responses.ok());
  CHECK(responses.value().rows[0].fields.back() == "Ms Invented, \"HR\", called");
  auto vacancies = ReadCsvFile(s.dir / "full/vacancies.csv");
  CHECK(vacancies.value().rows[0].fields[2].find("(invented)") != std::string::npos);

  auto json = RunCli({"--study", s.path, "--json", "export", "--format", "json", "--out", s.dir / "e.json"});
  CHECK(json.exit_code == 0);
  auto summary = nlohmann::json::parse(json.out);
  CHECK(summary["probes"] == 800);
  CHECK(summary["responses"] == 1);
  auto doc = nlohmann::json::parse(testing::ReadFile(s.dir / "e.json"));
  CHECK(doc["probes"].size() == 800);
  CHECK(doc["probes"][0]["positive"] == true);
  CHECK(doc["probes"][1]["positive"].is_null());
}

TEST_CASE("export: a store without a plan is refused") {
  testing::TempDir dir;
  auto r = RunCli({"--study", dir.path(), "export"});
  CHECK(r.exit_code == 1);
  CHECK(r.err == "twinprobe: " + dir / "study.db" + ": no study store here \u2014 run 'twinprobe plan' (or 'twinprobe "
                                                    "import pairs') first, or pass --study DIR\n");
}

TEST_CASE("issue 24: a listing audit's store (ranked lists, no plan) exports its lists") {
  testing::TempDir dir;
  const std::string ranks = dir / "ranks.csv";
  testing::WriteFile(ranks,
                     "listing,query,location,position,item,origin\n"
                     "L1,clerk,Orlinde,1,vjx-1,inland\n"
                     "L1,clerk,Orlinde,2,vjx-2,coastal\n"
                     "L2,clerk,Tessvale,1,vjx-2,coastal\n");
  REQUIRE(RunCli({"--study", dir.path(), "import", "ranks", ranks}).exit_code == 0);
  auto r = RunCli({"--study", dir.path(), "export"});
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  CHECK(r.out.rfind("Exported 3 places in ranked lists to " + dir / "export" + " (listings.csv, manifest.json); ", 0) ==
        0);
  // Each list's places in order; the reference level (most places) first in the manifest.
  CHECK(testing::ReadFile(dir / "export/listings.csv") ==
        "listing,query,location,seen_by,position,item,origin\r\n"
        "1,clerk,Orlinde,,1,vjx-1,inland\r\n"
        "1,clerk,Orlinde,,2,vjx-2,coastal\r\n"
        "2,clerk,Tessvale,,1,vjx-2,coastal\r\n");
  auto manifest = nlohmann::json::parse(testing::ReadFile(dir / "export/manifest.json"));
  CHECK(manifest["kind"] == "listing");
  CHECK(manifest["lists"] == 2);
  CHECK(manifest["rows"]["listings"] == 3);
  CHECK(manifest["factors"][0]["levels"] == nlohmann::json::array({"coastal", "inland"}));
  auto j = RunCli({"--study", dir.path(), "--json", "export", "--format", "json"});
  REQUIRE(j.exit_code == 0);
  CHECK(nlohmann::json::parse(j.out)["listing_places"] == 3);
  const std::string text = testing::ReadFile(dir / "export.json");
  CHECK(text.find("\"listings\"") == text.rfind("\"listings\""));  // the table's key, once
  auto doc = nlohmann::json::parse(text);
  CHECK(doc["lists"] == 2);
  CHECK(doc["listings"].size() == 3);
  CHECK(doc["listings"][2]["location"] == "Tessvale");
}

TEST_CASE("issue 16: export states each probe by the one closed rule: open, late, withdrawn") {
  testing::PlannedStudy s;
  const std::vector<std::string> now = {"TWINPROBE_NOW=2027-04-19T12:00:00Z"};
  // P00001 sent, no answer yet (open); P00003 answered after its window
  // (late, closed); P00005's vacancy withdrawn; P00007 answered in time.
  for (const char* p : {"P00001", "P00003", "P00007"})
    REQUIRE(RunCli({"--study", s.path, "sent", p, "--at", "2027-03-01T09:00"}, now).exit_code == 0);
  REQUIRE(RunCli({"--study", s.path, "sent", "P00001", "--at", "2027-04-10T09:00"}, now).exit_code == 0);
  REQUIRE(RunCli({"--study", s.path, "record", "P00003", "invitation", "--at", "2027-04-10"}, now).exit_code == 0);
  REQUIRE(RunCli({"--study", s.path, "record", "P00007", "rejection", "--at", "2027-03-06"}, now).exit_code == 0);
  std::string vacancy;
  {
    auto store = s.Open();
    Stmt q = store->Prepare("SELECT v.ref FROM probe p JOIN vacancy v ON v.id = p.vacancy_id WHERE p.ref = 'P00005'");
    REQUIRE(q.Step());
    vacancy = q.Text(0);
  }
  REQUIRE(RunCli({"--study", s.path, "withdraw", vacancy, "--reason", "the posting closed"}, now).exit_code == 0);
  auto r = RunCli({"--study", s.path, "export", "--out", s.dir / "x"}, now);
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  auto probes = ReadCsvFile(s.dir / "x/probes.csv");
  REQUIRE(probes.ok());
  const auto& h = probes.value().header;
  const size_t late = static_cast<size_t>(std::find(h.begin(), h.end(), "late") - h.begin());
  const size_t state = static_cast<size_t>(std::find(h.begin(), h.end(), "state") - h.begin());
  REQUIRE(state < h.size());
  std::map<std::string, std::pair<std::string, std::string>> by_probe;  // probe -> (late, state)
  for (const auto& row : probes.value().rows) by_probe[row.fields[0]] = {row.fields[late], row.fields[state]};
  // The window runs from the first sending (1 March), so P00001's
  // second sending does not reopen it: 28 days end on 29 March.
  CHECK(by_probe["P00001"] == std::pair<std::string, std::string>{"", "closed"});
  CHECK(by_probe["P00003"] == std::pair<std::string, std::string>{"1", "closed"});
  CHECK(by_probe["P00005"] == std::pair<std::string, std::string>{"", "withdrawn"});
  CHECK(by_probe["P00007"] == std::pair<std::string, std::string>{"0", "closed"});
  CHECK(by_probe["P00009"] == std::pair<std::string, std::string>{"", "not_sent"});

  // Earlier in the season the same probes are open.
  auto early = RunCli({"--study", s.path, "export", "--out", s.dir / "y"}, {"TWINPROBE_NOW=2027-03-13T00:00:00Z"});
  REQUIRE(early.exit_code == 0);
  auto again = ReadCsvFile(s.dir / "y/probes.csv");
  REQUIRE(again.ok());
  for (const auto& row : again.value().rows) by_probe[row.fields[0]] = {row.fields[late], row.fields[state]};
  CHECK(by_probe["P00001"] == std::pair<std::string, std::string>{"", "open"});
  // The answer of 10 April has not come at this clock, but the store holds it:
  // it is late whatever the clock, and closes nothing before the window ends.
  CHECK(by_probe["P00003"] == std::pair<std::string, std::string>{"1", "open"});
  CHECK(by_probe["P00007"] == std::pair<std::string, std::string>{"0", "closed"});
}

// Issue 17: the full sending history and every decline, and (issue 20) each
// probe's level of every factor, on the example design (factor `origin`,
// [ethics] decline_within_hours = 24).
TEST_CASE("issue 17: export writes every sending, every decline with its deadline, and a column per factor") {
  testing::PlannedStudy s;
  const std::vector<std::string> env = {"TWINPROBE_NOW=2027-03-06T08:00:00Z", "TWINPROBE_ACTOR=mira"};
  auto run = [&](std::vector<std::string> args) {
    args.insert(args.begin(), {"--study", s.path});
    auto r = testing::RunCli(args, env);
    INFO(r.err);
    REQUIRE(r.exit_code == 0);
  };
  run({"sent", "P00001", "--at", "2027-03-01"});
  run({"sent", "P00001", "--at", "2027-03-02T08:30"});  // a correction: both rows stay
  testing::WriteFile(s.path + "/sendings.csv", "probe,sent_at,channel,by\nP00002,2027-03-01T09:00,mail,jonas\n");
  run({"import", "sendings", s.path + "/sendings.csv"});
  run({"record", "P00001", "invitation", "--at", "2027-03-03T10:00"});
  run({"decline", "P00001", "--at", "2027-03-03T12:00"});  // 2 hours after: kept
  run({"record", "P00002", "offer", "--at", "2027-03-03T10:00"});
  run({"decline", "P00002", "--at", "2027-03-05"});  // 38 hours after: late
  run({"export"});

  const std::string dir = s.path + "/export/";
  CHECK(testing::ReadFile(dir + "sendings.csv") ==
        "sending,probe,sent_at,channel,sent_by,entered_by,entered_at,current\r\n"
        "1,P00001,2027-03-01T00:00:00Z,,,mira,2027-03-06T08:00:00Z,0\r\n"
        "2,P00001,2027-03-02T08:30:00Z,,,mira,2027-03-06T08:00:00Z,1\r\n"
        "3,P00002,2027-03-01T09:00:00Z,mail,jonas,mira,2027-03-06T08:00:00Z,1\r\n");
  CHECK(testing::ReadFile(dir + "declines.csv") ==
        "decline,probe,vacancy,response,code,received_at,deadline,declined_at,on_time,channel,entered_by,entered_at\r\n"
        "1,P00001,V0001,1,invitation,2027-03-03T10:00:00Z,2027-03-04T10:00:00Z,2027-03-03T12:00:00Z,1,,mira,"
        "2027-03-06T08:00:00Z\r\n"
        "2,P00002,V0001,2,offer,2027-03-03T10:00:00Z,2027-03-04T10:00:00Z,2027-03-05T00:00:00Z,0,,mira,"
        "2027-03-06T08:00:00Z\r\n");
  auto probes = ReadCsvFile(dir + "probes.csv");
  REQUIRE(probes.ok());
  const int origin = probes.value().Column("origin");
  REQUIRE(origin == 16);  // after the fixed columns, before the strata
  CHECK(probes.value().header[17] == "occupation");
  // Each probe's level is the level of its arm.
  const int arm = probes.value().Column("arm");
  for (const auto& row : probes.value().rows)
    CHECK(row.fields[static_cast<size_t>(arm)] == "origin=" + row.fields[static_cast<size_t>(origin)]);
  auto manifest = nlohmann::json::parse(testing::ReadFile(dir + "manifest.json"));
  CHECK(manifest["rows"]["sendings"] == 3);
  CHECK(manifest["rows"]["declines"] == 2);
  CHECK(manifest["files"]["declines"] == "declines.csv");
}
