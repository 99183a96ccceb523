// The README's "A short tour", run as written: every line of its shell
// blocks that starts with "twinprobe" runs, in order, in one empty folder,
// and must succeed. A comment after " #" is dropped, as the shell would.
//
// The tour names files it does not show (a mailbox, an outcomes file, an
// applications file): the test writes an invented one of each just before
// the line that reads it. The study clock moves as a season does: the
// fieldwork runs on 2027-03-05, a few days after the tour's first sending,
// and `purge` runs on the day after the retention period that
// `purge --dry-run` states, since purging earlier is refused by design.
#include <catch2/catch.hpp>

#include <nlohmann/json.hpp>

#include <filesystem>
#include <map>
#include <regex>
#include <sstream>
#include <string>
#include <vector>

#include "core/clock.h"
#include "testing/testing.h"

namespace {

using twinprobe::testing::CliRun;
using twinprobe::testing::ReadFile;
using twinprobe::testing::RunCliIn;
using twinprobe::testing::WriteFile;

const char* kFieldworkClock = "TWINPROBE_NOW=2027-03-05T12:00:00Z";

// The tour's command lines: the `twinprobe …` and `mkdir …` lines of the
// ```sh blocks between "## A short tour" and the next "## " heading,
// comments cut, a line ending in " \" joined with the next.
std::vector<std::string> TourLines(const std::string& readme) {
  std::vector<std::string> out;
  std::istringstream in(readme);
  std::string line;
  bool in_tour = false, in_block = false, continued = false;
  while (std::getline(in, line)) {
    if (line.rfind("## ", 0) == 0) in_tour = line == "## A short tour";
    if (!in_tour) continue;
    if (line.rfind("```", 0) == 0) {
      in_block = !in_block && line == "```sh";
      continue;
    }
    if (!in_block) continue;
    if (const size_t hash = line.find(" #"); hash != std::string::npos) line.erase(hash);
    while (!line.empty() && line.back() == ' ') line.pop_back();
    if (continued) {  // the line before ended in " \\": this one goes on with it
      const size_t text = line.find_first_not_of(' ');
      out.back() += " " + (text == std::string::npos ? std::string() : line.substr(text));
    } else if (line.rfind("twinprobe ", 0) == 0 || line.rfind("mkdir ", 0) == 0) {
      out.push_back(line);
    } else {
      continue;
    }
    continued = out.back().size() >= 2 && out.back().compare(out.back().size() - 2, 2, " \\") == 0;
    if (continued) out.back().erase(out.back().size() - 2);
  }
  return out;
}

// Splits on spaces, keeping 'single' or "double" quoted words whole.
std::vector<std::string> Words(const std::string& line) {
  std::vector<std::string> out;
  std::string cur;
  char quote = 0;
  bool any = false;
  for (char ch : line) {
    if (quote) {
      if (ch == quote) quote = 0;
      else cur += ch;
    } else if (ch == '\'' || ch == '"') quote = ch, any = true;
    else if (ch == ' ') {
      if (any) out.push_back(cur);
      cur.clear(), any = false;
    } else cur += ch, any = true;
  }
  if (any) out.push_back(cur);
  return out;
}

bool Has(const std::vector<std::string>& words, const std::string& w) {
  for (const auto& x : words)
    if (x == w) return true;
  return false;
}

// The value after `--study`, or "".
std::string StudyOf(const std::vector<std::string>& words) {
  for (size_t i = 0; i + 1 < words.size(); ++i)
    if (words[i] == "--study") return words[i + 1];
  return "";
}

// One invented reply to the probe the tour marked sent first, addressed to
// the mailbox its rendered application gives and naming the vacancy's
// reference the application quotes (as employers' replies do).
std::string Mailbox(const std::string& dir, const std::string& study, const std::string& probe) {
  const std::string material = ReadFile(dir + "/" + study + "/materials/" + probe + ".txt");
  std::smatch m, vacancy;
  REQUIRE(std::regex_search(material, m, std::regex("([a-z.]+@[a-z.]+\\.example)")));
  REQUIRE(std::regex_search(material, vacancy, std::regex("V[0-9]{4}")));
  return "From hiring@tollbridge-joinery.example Wed Mar  3 10:00:00 2027\n"
         "From: Hiring desk <hiring@tollbridge-joinery.example>\n"
         "To: " + m[1].str() + "\n"
         "Subject: Your application for " + vacancy[0].str() + "\n"
         "Date: Wed, 03 Mar 2027 10:00:00 +0000\n"
         "Message-ID: <tour-1@tollbridge-joinery.example>\n"
         "\n"
         "Thank you for applying. We would like to invite you to an interview next week.\n\n";
}

// An invented paired file as data collected elsewhere would come: five
// vacancies, one inland and one coastal application each.
std::string Applications() {
  return "vacancy,arm,outcome,occupation,region\n"
         "T-001,inland,1,clerk,Orlinde\nT-001,coastal,0,clerk,Orlinde\n"
         "T-002,inland,1,bookkeeper,Tessvale\nT-002,coastal,1,bookkeeper,Tessvale\n"
         "T-003,inland,0,clerk,Tessvale\nT-003,coastal,0,clerk,Tessvale\n"
         "T-004,inland,1,bookkeeper,Orlinde\nT-004,coastal,0,bookkeeper,Orlinde\n"
         "T-005,inland,0,clerk,Orlinde\nT-005,coastal,1,clerk,Orlinde\n";
}

// An invented applicant file as an HR department keeps it, under its own
// column names: 24 applications in three requisitions.
std::string Applicants() {
  std::string csv = "applicant,req_id,gender,invited\n";
  const char* rows[] = {"R-101,woman,yes", "R-101,woman,no", "R-101,man,yes", "R-101,man,yes",
                        "R-101,woman,no",  "R-101,man,no",   "R-102,woman,yes", "R-102,man,yes",
                        "R-102,man,no",    "R-102,woman,no", "R-102,man,yes",   "R-102,woman,no",
                        "R-103,woman,yes", "R-103,man,no",   "R-103,man,yes",   "R-103,woman,no",
                        "R-103,woman,yes", "R-103,man,yes",  "R-103,man,no",    "R-103,woman,no",
                        "R-101,man,yes",   "R-102,woman,yes", "R-103,man,yes",  "R-101,woman,no"};
  int n = 0;
  for (const char* row : rows) csv += "A" + std::to_string(++n) + "," + row + "\n";
  return csv;
}

}  // namespace

TEST_CASE("readme tour: every command of the short tour runs as written, in order") {
  const auto lines = TourLines(ReadFile(twinprobe::testing::SourceDir() + "/README.md"));
  // The tour shows the whole fieldwork: a parser that stops finding its
  // lines must not pass by running nothing.
  REQUIRE(lines.size() >= 20);
  twinprobe::testing::TempDir dir;
  std::string first_sent;  // the probe of the tour's first `sent` line
  std::map<std::string, std::string> printed;  // "STUDY COMMAND" -> what it printed last
  for (const auto& line : lines) {
    INFO("$ " << line);
    auto words = Words(line);
    if (words.front() == "mkdir") {
      std::filesystem::create_directories(dir / words.at(1));
      continue;
    }
    words.erase(words.begin());  // "twinprobe"
    const std::string study = StudyOf(words);
    for (size_t i = 0; i + 1 < words.size(); ++i)
      if (words[i] == "sent" && first_sent.empty()) first_sent = words[i + 1];
    if (Has(words, "inbox.mbox")) {
      REQUIRE_FALSE(first_sent.empty());
      WriteFile(dir / "inbox.mbox", Mailbox(dir.path(), study, first_sent));
    }
    if (Has(words, "responses.csv"))
      WriteFile(dir / "responses.csv", "probe,code,received_at,channel\nP00002,rejection,2027-03-04T10:00,mail\n");
    if (Has(words, "applications.csv")) WriteFile(dir / "applications.csv", Applications());
    if (Has(words, "applicants.csv")) WriteFile(dir / "applicants.csv", Applicants());
    if (Has(words, "sendings.csv")) WriteFile(dir / "sendings.csv", "probe,sent_at,channel,by\nP00002,2027-03-01T10:05,mail,Ada Moss\n");
    std::string clock = kFieldworkClock;
    if (Has(words, "purge") && !Has(words, "--dry-run")) {
      std::vector<std::string> dry = {"--study", study, "--json", "purge", "--dry-run"};
      const CliRun plan = RunCliIn(dir.path(), dry, {kFieldworkClock});
      REQUIRE(plan.exit_code == 0);
      const auto ends = twinprobe::ParseIsoTime(nlohmann::json::parse(plan.out)["retention_ends"].get<std::string>());
      REQUIRE(ends);
      clock = "TWINPROBE_NOW=" + twinprobe::FormatIsoTime(*ends + 86400);
    }
    const CliRun r = RunCliIn(dir.path(), words, {clock});
    INFO("stdout:\n" << r.out << "stderr:\n" << r.err);
    CHECK(r.exit_code == 0);
    CHECK_FALSE(r.out.empty());
    for (const auto& w : words)
      if (w.rfind("-", 0) != 0 && w != study) {
        printed[study + " " + w] = r.out;  // the study and the command (the first word that is neither)
        break;
      }
  }
  // What the tour promises along the way.
  CHECK(printed["my-study sent"].rfind("Marked " + first_sent + " as sent at 2027-03-01T09:14:00Z.\n", 0) == 0);
  CHECK(printed["my-study mail"].find("Matched to a probe (1)") != std::string::npos);
  CHECK(printed["my-study analyze"].find("Flow of the study:") != std::string::npos);
  CHECK(printed["my-study verify"].rfind("The audit chain is intact", 0) == 0);
  CHECK(printed["my-study purge"].rfind("Purged: ", 0) == 0);
  CHECK(printed["hr-audit analyze"].find("applications") != std::string::npos);
}
