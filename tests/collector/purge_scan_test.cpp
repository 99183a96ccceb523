// Issue 17, item 4: after `purge`, no file of the study folder (the store,
// its write-ahead log and shared memory included) holds an employer's name,
// contact address or the address of anyone who wrote to a profile. Checked
// on the demo and on a study that read mail.
#include <catch2/catch.hpp>

#include <algorithm>
#include <filesystem>
#include <regex>
#include <set>

#include <nlohmann/json.hpp>

#include "collector/mail_fixture.h"
#include "core/csv.h"
#include "core/text.h"
#include "testing/testing.h"

using namespace twinprobe;
using testing::RunCli;
namespace fs = std::filesystem;

namespace {

const std::vector<std::string> kAfterRetention = {"TWINPROBE_NOW=2030-01-01"};

// Employer names (as written, and without the demo's " (invented)") and
// contact addresses of a vacancies file.
std::set<std::string> EmployerIdentities(const std::string& vacancies_csv) {
  auto table = ReadCsvFile(vacancies_csv);
  REQUIRE(table.ok());
  const int employer = table.value().Column("employer"), contact = table.value().Column("contact");
  std::set<std::string> out;
  for (const auto& row : table.value().rows) {
    const std::string& name = row.fields[employer];
    out.insert(name);
    out.insert(name.substr(0, name.find(" (invented)")));
    if (!row.fields[contact].empty()) out.insert(row.fields[contact]);
  }
  return out;
}

// The addresses (and plain display names) of every sender in the mail files
// under `dir`, except the profiles' own invented mail host.
std::set<std::string> SenderIdentities(const std::string& dir) {
  std::set<std::string> out;
  const std::regex named(R"(^From: *([^<\n]*?) *<([^<>\s]+@[^<>\s]+)>)", std::regex::multiline);
  const std::regex bare(R"(^From: *([^<>\s]+@[^<>\s]+)\s*$)", std::regex::multiline);
  const std::regex plain_name("[A-Za-z][A-Za-z ]+");
  for (const auto& e : fs::recursive_directory_iterator(dir)) {
    if (!e.is_regular_file()) continue;
    const std::string text = testing::ReadFile(e.path().string());
    for (const auto* re : {&named, &bare})
      for (auto it = std::sregex_iterator(text.begin(), text.end(), *re); it != std::sregex_iterator(); ++it) {
        const bool has_name = re == &named;
        const std::string address = (*it)[has_name ? 2 : 1];
        if (address.find("@postbox.example") != std::string::npos) continue;
        out.insert(address);
        // Encoded words (=?UTF-8?B?…?=) are left out: the scan reads bytes.
        if (has_name && std::regex_match((*it)[1].str(), plain_name)) out.insert((*it)[1]);
      }
  }
  return out;
}

// "FILE: NEEDLE" for every needle found (ignoring case) in any file under
// `study`.
std::vector<std::string> Scan(const std::string& study, const std::set<std::string>& needles) {
  std::vector<std::string> hits;
  for (const auto& e : fs::recursive_directory_iterator(study)) {
    if (!e.is_regular_file()) continue;
    const std::string bytes = Lower(testing::ReadFile(e.path().string()));
    for (const auto& n : needles)
      if (bytes.find(Lower(n)) != std::string::npos)
        hits.push_back(fs::relative(e.path(), study).generic_string() + ": " + n);
  }
  return hits;
}

std::vector<std::string> Files(const std::string& study) {
  std::vector<std::string> out;
  for (const auto& e : fs::recursive_directory_iterator(study))
    if (e.is_regular_file()) out.push_back(fs::relative(e.path(), study).generic_string());
  std::sort(out.begin(), out.end());
  return out;
}

}  // namespace

TEST_CASE("issue 17: after purge no file of the demo's folder names an employer or a contact") {
  testing::TempDir dir;
  const std::string demo = dir / "demo";
  REQUIRE(RunCli({"demo", "--out", demo}).exit_code == 0);
  testing::WriteFile(demo + "/materials/P00001.txt", "Dear Galengate Logistics (invented), ...");
  const std::set<std::string> needles = EmployerIdentities(demo + "/vacancies.csv");
  REQUIRE(needles.size() == 1200);  // 400 names, 400 without "(invented)", 400 addresses
  REQUIRE_FALSE(Scan(demo, needles).empty());  // the scan finds them before
  const std::string analysis = RunCli({"--study", demo, "--json", "analyze"}).out;

  auto dry = RunCli({"--study", demo, "purge", "--dry-run"}, kAfterRetention);
  CHECK(dry.exit_code == 0);
  CHECK(dry.out == "Purge would delete: 400 employer identities, 0 free-text notes, 0 mail excerpts, 0 raw snapshots, "
                   "1 rendered material file, 0 mailbox files.\n"
                   "The fieldwork ended 2027-04-26T14:59:00Z (the 28-day window of the last application sent); the retention "
                   "period ended 2028-04-25T14:59:00Z.\n"
                   "It would touch:\n  " +
                       demo + "/study.db: tables employer and secret emptied; columns response.note and "
                              "mail_message.excerpt cleared\n  " +
                       demo + "/vacancies.csv: column employer replaced by employer pseudonyms in 400 rows\n  " + demo +
                       "/vacancies.csv: column contact emptied in 400 rows\n  " + demo +
                       "/materials/P00001.txt: deleted\n"
                       "Pseudonymised outcomes are kept; 'twinprobe analyze' gives the same numbers afterwards.\n");
  CHECK_FALSE(Scan(demo, needles).empty());  // a dry run changes nothing

  auto done = RunCli({"--study", demo, "purge"}, kAfterRetention);
  INFO(done.err);
  REQUIRE(done.exit_code == 0);
  CHECK(Scan(demo, needles) == std::vector<std::string>{});
  CHECK(Files(demo) == std::vector<std::string>{".twinprobe-demo", "listings/generate_ranks.py", "listings/ranks.csv",
                                                "names/coastal.csv", "names/inland.csv", "reports/report.html",
                                                "reports/report.json", "reports/report.txt", "study.db", "study.toml",
                                                "templates/cv_lantern.md", "templates/cv_meadow.md", "vacancies.csv"});
  const std::string vacancies = testing::ReadFile(demo + "/vacancies.csv");
  CHECK(std::regex_search(vacancies, std::regex("^vacancy,employer,contact,occupation,region,opened_on\n"
                                                "V0001,E-[0-9a-f]{10},,bookkeeper,North Fen,2027-02-01\n")));
  // The rewritten folder is still a valid study, the numbers are the same,
  // the chain holds.
  CHECK(RunCli({"--study", demo, "check"}).exit_code == 0);
  CHECK(RunCli({"--study", demo, "--json", "analyze"}).out == analysis);
  CHECK(RunCli({"--study", demo, "verify"}).exit_code == 0);
}

TEST_CASE("issue 17: after purge no file of a study that read mail names an employer, contact or sender") {
  mailtest::PlannedMailStudy s;
  std::set<std::string> needles = EmployerIdentities(s.study + "/vacancies.csv");
  for (const auto& n : SenderIdentities(s.study + "/mail")) needles.insert(n);
  CHECK(needles.count("hanne.ostrel@orlinde-bakehouse.example") == 1);
  CHECK(needles.count("Hanne Ostrel") == 1);
  REQUIRE(RunCli({"--study", s.study, "mail"}).exit_code == 0);
  REQUIRE(RunCli({"--study", s.study, "sent", "P00001", "--at", "2027-03-02"}).exit_code == 0);
  REQUIRE(RunCli({"--study", s.study, "review", "1", "--confirm"}).exit_code == 0);
  REQUIRE_FALSE(Scan(s.study, needles).empty());

  auto dry = RunCli({"--study", s.study, "--json", "purge", "--dry-run"}, kAfterRetention);
  REQUIRE(dry.exit_code == 0);
  auto j = nlohmann::json::parse(dry.out);
  CHECK(j["mail_excerpts"] == 12);
  CHECK(j["mailbox_files"] == 7);
  CHECK(j["deleted_files"][0] == "mail/Maildir/cur/1804140900.M4P1.fixture:2,S");
  CHECK(j["deleted_files"][6] == "mail/inbox.mbox");
  CHECK(j["vacancy_columns"] == nlohmann::json::parse(R"([
    {"column": "employer", "action": "pseudonymised", "cells": 5},
    {"column": "contact", "action": "emptied", "cells": 5},
    {"column": "occupation", "action": "emptied", "cells": 5}])"));

  auto done = RunCli({"--study", s.study, "purge"}, kAfterRetention);
  INFO(done.err);
  REQUIRE(done.exit_code == 0);
  CHECK(Scan(s.study, needles) == std::vector<std::string>{});
  CHECK(RunCli({"--study", s.study, "verify"}).exit_code == 0);
  // The review queue still shows the sealed facts of each message.
  auto queue = RunCli({"--study", s.study, "review", "--all"});
  CHECK(queue.exit_code == 0);
  CHECK(queue.out.find("(purged: sender, subject and excerpt were removed)") != std::string::npos);
}

TEST_CASE("issue 17: purge names a mailbox outside the study folder and leaves it alone") {
  mailtest::PlannedMailStudy s;
  const std::string outside = s.dir / "elsewhere.mbox";
  fs::copy_file(s.study + "/mail/inbox.mbox", outside);
  std::string toml = testing::ReadFile(s.study + "/study.toml");
  const std::string from = "mbox = [\"mail/inbox.mbox\"]";
  REQUIRE(toml.find(from) != std::string::npos);
  testing::WriteFile(s.study + "/study.toml", toml.replace(toml.find(from), from.size(), "mbox = [\"../elsewhere.mbox\"]"));
  auto dry = RunCli({"--study", s.study, "purge", "--dry-run"}, kAfterRetention);
  CHECK(dry.exit_code == 0);
  // The mailbox left in the folder is no longer the design's, so purge only names it.
  CHECK(dry.err == "twinprobe: warning: " + s.study +
                       "/mail/inbox.mbox names an employer or holds a contact address; purge did not write it and "
                       "leaves it alone: delete it, or keep it only as your retention plan allows\n"
                       "twinprobe: warning: the mailbox ../elsewhere.mbox lies outside the study folder, so purge "
                       "leaves it alone; it still holds every sender's address: delete it when your retention plan "
                       "says so\n");
  REQUIRE(RunCli({"--study", s.study, "purge"}, kAfterRetention).exit_code == 0);
  CHECK(fs::exists(outside));
  CHECK(fs::exists(s.study + "/mail/inbox.mbox"));  // no longer named by the design, so not the study's mailbox
}

TEST_CASE("issue 17: purge names a report written with employer names and leaves it to the user") {
  testing::TempDir dir;
  const std::string demo = dir / "demo";
  REQUIRE(RunCli({"demo", "--out", demo}).exit_code == 0);
  REQUIRE(RunCli({"--study", demo, "report", "--reveal-employers", "--out", demo + "/reports/named.json"}).exit_code ==
          0);
  auto dry = RunCli({"--study", demo, "purge", "--dry-run"}, kAfterRetention);
  CHECK(dry.exit_code == 0);
  CHECK(dry.err == "twinprobe: warning: " + demo +
                       "/reports/named.json names an employer or holds a contact address; purge did not write it and "
                       "leaves it alone: delete it, or keep it only as your retention plan allows\n");
  auto j = nlohmann::json::parse(RunCli({"--study", demo, "--json", "purge", "--dry-run"}, kAfterRetention).out);
  CHECK(j["files_naming_employers"] == nlohmann::json::array({"reports/named.json"}));
  auto done = RunCli({"--study", demo, "purge"}, kAfterRetention);
  CHECK(done.exit_code == 0);
  CHECK(done.err == dry.err);
  CHECK(fs::exists(demo + "/reports/named.json"));
  // Once the names have left the store, purge can no longer tell which
  // file holds them: the warning came before, and the audit chain keeps
  // where the report went.
  CHECK(RunCli({"--study", demo, "purge", "--dry-run"}, kAfterRetention).err.empty());
}

TEST_CASE("issue 17: purge names a copy of the store, which it does not purge") {
  testing::TempDir dir;
  const std::string demo = dir / "demo";
  REQUIRE(RunCli({"demo", "--out", demo}).exit_code == 0);
  fs::copy_file(demo + "/study.db", demo + "/study.db.bak");
  auto dry = RunCli({"--study", demo, "purge", "--dry-run"}, kAfterRetention);
  CHECK(dry.exit_code == 0);
  CHECK(dry.err == "twinprobe: warning: " + demo +
                       "/study.db.bak names an employer or holds a contact address; purge did not write it and "
                       "leaves it alone: delete it, or keep it only as your retention plan allows\n");
}
