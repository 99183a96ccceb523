// `import sendings FILE.csv` (collector/import_sendings.h) end to end: the
// checks of `sent` on every row, all or nothing or --skip-bad with a reject
// file, idempotent, one audit entry. The example study's clock is pinned
// ten days into its season.
#include <catch2/catch.hpp>

#include "collector/collector_fixtures.h"

using namespace twinprobe;
using testing::RunCli;

namespace {

const std::vector<std::string> kNow = {"TWINPROBE_NOW=2027-03-10T12:00:00Z"};

struct Log {
  testing::PlannedStudy study;
  std::string csv = study.dir / "sendings.csv";
  testing::CliRun Import(const std::string& text, std::vector<std::string> extra = {}) {
    testing::WriteFile(csv, text);
    std::vector<std::string> args = {"--study", study.path, "import", "sendings", csv};
    args.insert(args.end(), extra.begin(), extra.end());
    return RunCli(args, kNow);
  }
  int64_t Count(const std::string& sql) {
    auto s = study.Open();
    return s->QueryInt(sql);
  }
};

const char kGood[] =
    "probe,sent_at,channel,by\n"
    "P00001,2027-03-01T09:40,mail,Ines\n"
    "P00002,2027-03-03T13:10+01:00,,\n"
    "P00003,2027-03-02,letter,\n";

}  // namespace

TEST_CASE("import sendings: a log lands with channel and sender under one audit entry, twice adds nothing") {
  Log log;
  const int64_t entries = log.Count("SELECT count(*) FROM audit");
  auto r = log.Import(kGood);
  INFO(r.err);
  CHECK(r.exit_code == 0);
  CHECK(r.out == "Imported 3 sendings from " + log.csv + ".\n" + testing::HeadLine(log.study.path));
  CHECK(log.Count("SELECT count(*) FROM audit") == entries + 1);
  CHECK(log.Count("SELECT count(*) FROM audit WHERE command = 'import sendings' AND summary = 'import sendings " +
                  log.csv + ": 3 rows landed, 0 rejected'") == 1);
  CHECK(log.Count("SELECT count(*) FROM sending s JOIN probe p ON p.id = s.probe_id WHERE p.ref = 'P00002' AND "
                  "s.sent_at = '2027-03-03T12:10:00Z'") == 1);
  CHECK(log.Count("SELECT count(*) FROM sending_detail WHERE channel = 'mail' AND sent_by = 'Ines'") == 1);
  CHECK(log.Count("SELECT count(*) FROM sending_detail WHERE channel = 'letter' AND sent_by IS NULL") == 1);
  CHECK(log.Count("SELECT count(*) FROM sending_detail") == 2);  // P00002 gave neither

  auto again = log.Import(kGood);
  CHECK(again.exit_code == 0);
  CHECK(again.out == "This file was imported before; nothing was added.\n");
  // The log grown by a row: only the new row lands.
  auto grown = log.Import(std::string(kGood) + "P00004,2027-03-04T10:00,phone,Ines\n");
  CHECK(grown.exit_code == 0);
  CHECK(grown.out == "Imported 1 sending from " + log.csv + "; 3 rows were already recorded at that time.\n" +
                         testing::HeadLine(log.study.path));
  CHECK(log.Count("SELECT count(*) FROM sending") == 4);
  auto verify = RunCli({"--study", log.study.path, "verify"}, kNow);
  INFO(verify.out << verify.err);
  CHECK(verify.exit_code == 0);
}

TEST_CASE("import sendings: one bad row refuses the file with the sent checks, the store unchanged") {
  Log log;
  const std::string before = testing::FingerprintOf(log.study.db());
  auto refused = [&](const std::string& row) {
    auto r = log.Import(std::string(kGood) + row);
    CHECK(r.exit_code == 1);
    CHECK(r.out.empty());
    CHECK(testing::FingerprintOf(log.study.db()) == before);
    return r.err;
  };
  CHECK(refused("P00013,2031-01-01,,\n") ==
        "twinprobe: " + log.csv +
            ":5: the sending time 2031-01-01T00:00:00Z of P00013 is in the future (now is 2027-03-10T12:00:00Z) "
            "\u2014 check the date; record an event once it has happened\n");
  CHECK(refused("P00023,2026-12-02,,\n") ==
        "twinprobe: " + log.csv +
            ":5: the sending time 2026-12-02T00:00:00Z of P00023 is before the schedule starts "
            "(2027-03-01T09:32:00Z, less [schedule] early_days = 1) \u2014 check the date; if the applications "
            "really left earlier, raise [schedule] early_days in study.toml\n");
  CHECK(refused("P99999,2027-03-02,,\n") ==
        "twinprobe: " + log.csv + ":5: unknown probe 'P99999' \u2014 use a probe reference from 'twinprobe schedule'\n");
  CHECK(refused("P00001,2027-03-05,,\n") ==
        "twinprobe: " + log.csv +
            ":5: probe 'P00001' appears twice (first on line 2) \u2014 keep one row per probe; to correct a sending "
            "time, import a later file or use 'sent'\n");
  CHECK(refused("P00005,,,\n") == "twinprobe: " + log.csv +
                                      ":5: sent_at is empty \u2014 give the time the application left (YYYY-MM-DD "
                                      "or YYYY-MM-DDTHH:MM)\n");
  CHECK(refused("P00005,2027-03-02,fax,\n") ==
        "twinprobe: " + log.csv + ":5: unknown channel 'fax' \u2014 use mail, phone, letter or other\n");
  auto missing = log.Import("probe,sent\nP00001,2027-03-02\n");
  CHECK(missing.err == "twinprobe: " + log.csv +
                           ":1: the column 'sent_at' is missing \u2014 a sendings file has "
                           "the columns probe,sent_at and optionally channel,by\n");
}

TEST_CASE("import sendings: --skip-bad lands the good rows and writes each bad one with its reason") {
  Log log;
  auto r = log.Import(std::string(kGood) + "P00013,2031-01-01,mail,Ines\n", {"--skip-bad"});
  CHECK(r.exit_code == 1);
  CHECK(r.out == "Imported 3 sendings from " + log.csv + "; 1 bad row was written with the reasons to " + log.csv +
                     ".rejects.csv.\n" + testing::HeadLine(log.study.path));
  CHECK(testing::ReadFile(log.csv + ".rejects.csv") ==
        "reject_line,reject_reason,probe,sent_at,channel,by\r\n"
        "5,the sending time 2031-01-01T00:00:00Z of P00013 is in the future (now is 2027-03-10T12:00:00Z),P00013,"
        "2031-01-01,mail,Ines\r\n");
  CHECK(log.Count("SELECT count(*) FROM sending") == 3);
}

TEST_CASE("import sendings: a response recorded before the logged time refuses the row") {
  Log log;
  REQUIRE(RunCli({"--study", log.study.path, "sent", "P00001", "--at", "2027-03-01T09:40"}, kNow).exit_code == 0);
  REQUIRE(RunCli({"--study", log.study.path, "record", "P00001", "rejection", "--at", "2027-03-02T08:00"}, kNow)
              .exit_code == 0);
  auto r = log.Import("probe,sent_at\nP00001,2027-03-03\n");
  CHECK(r.exit_code == 1);
  CHECK(r.err == "twinprobe: " + log.csv +
                     ":2: P00001 already has a response received 2027-03-02T08:00:00Z, before 2027-03-03T00:00:00Z "
                     "\u2014 check the date; a probe is sent before it is answered\n");
}
