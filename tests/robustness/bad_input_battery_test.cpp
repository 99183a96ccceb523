// The bad-input battery (issue 12): malformed design files, CSVs, commands,
// listing inputs (ranks and labels files, [[source]] fetch and extraction
// rules) and mailboxes (mbox files, Maildir folders, IMAP URLs, [mail]),
// each giving exactly one error line (asserted in full), exit code 1, and an
// unchanged store. The cases live in bad_input_battery.json:
//   name    what is wrong
//   edit    {file, from, to | to_hex}: replace the first `from` in a fixture file
//   write   {file, text | hex}: write a file (text is written as Latin-1 bytes)
//   before  commands that must succeed first (e.g. a sending and a response
//           for a decline case); the store is compared after them
//   args    the command ("$S" is the study folder)
//   stderr  the exact message ("$S" is the study folder)
// The fixture is tests/robustness/fixture_study, planned once.
#include <catch2/catch.hpp>

#include <filesystem>

#include <nlohmann/json.hpp>

#include "core/audit.h"
#include "core/store.h"
#include "testing/testing.h"

using namespace twinprobe;
namespace fs = std::filesystem;

namespace {

std::string ReplaceAll(std::string s, const std::string& from, const std::string& to) {
  for (size_t pos = 0; (pos = s.find(from, pos)) != std::string::npos; pos += to.size()) s.replace(pos, from.size(), to);
  return s;
}

std::string FromHex(const std::string& hex) {
  std::string out;
  for (size_t i = 0; i + 1 < hex.size(); i += 2) out += static_cast<char>(std::stoi(hex.substr(i, 2), nullptr, 16));
  return out;
}

std::string Latin1(const std::string& utf8) {  // JSON text -> the bytes the case means
  std::string out;
  for (size_t i = 0; i < utf8.size(); ++i) {
    unsigned char c = static_cast<unsigned char>(utf8[i]);
    if (c < 0x80) out += static_cast<char>(c);
    else {  // two-byte UTF-8 sequences only (U+0080..U+00FF)
      out += static_cast<char>(((c & 0x1f) << 6) | (static_cast<unsigned char>(utf8[i + 1]) & 0x3f));
      ++i;
    }
  }
  return out;
}

// What must not change: the audit head and the number of rows of each table.
std::string StoreState(const std::string& db) {
  auto store = Store::Open(db, false);
  REQUIRE(store.ok());
  std::string state = AuditHead(*store.value());
  for (const char* t : {"plan", "vacancy", "probe", "profile", "response", "sending", "decline", "employer", "meta",
                        "import_file", "listing", "listing_item", "item_label", "fetch_log", "mail_message",
                        "review_decision"})
    state += std::string("|") + t + "=" + std::to_string(store.value()->QueryInt(std::string("SELECT count(*) FROM ") + t));
  return state;
}

// The fixture's season is 2027: the plausible-time rules need a clock in it.
const std::vector<std::string> kNow = {"TWINPROBE_NOW=2027-04-26T14:59:00Z"};

}  // namespace

TEST_CASE("bad-input battery: every malformed input gets its exact message, exit 1, and an unchanged store") {
  testing::TempDir dir;
  std::string base = dir / "base";
  fs::copy(testing::SourceDir() + "/tests/robustness/fixture_study", base, fs::copy_options::recursive);
  REQUIRE(testing::RunCli({"--study", base, "plan"}).exit_code == 0);

  auto cases = nlohmann::json::parse(testing::ReadFile(testing::SourceDir() + "/tests/robustness/bad_input_battery.json"));
  REQUIRE(cases.size() >= 130);  // 73 design, CSV and command cases; 57 listing and mail cases
  int n = 0;
  for (const auto& c : cases) {
    std::string study = dir / ("case" + std::to_string(n++));
    fs::copy(base, study, fs::copy_options::recursive);
    if (c.contains("edit")) {
      const auto& e = c["edit"];
      std::string path = study + "/" + e["file"].get<std::string>();
      std::string text = testing::ReadFile(path);
      std::string from = e["from"];
      std::string to = e.contains("to_hex") ? FromHex(e["to_hex"]) : e["to"].get<std::string>();
      auto pos = text.find(from);
      INFO(c["name"].get<std::string>());
      REQUIRE(pos != std::string::npos);
      testing::WriteFile(path, text.replace(pos, from.size(), to));
    }
    if (c.contains("write")) {
      const auto& w = c["write"];
      testing::WriteFile(study + "/" + w["file"].get<std::string>(),
                         w.contains("hex") ? FromHex(w["hex"]) : Latin1(w["text"]));
    }
    if (c.contains("before")) {
      for (const auto& command : c["before"]) {
        std::vector<std::string> setup = {"--study", study};
        for (const auto& a : command) setup.push_back(ReplaceAll(a, "$S", study));
        auto done = testing::RunCli(setup, kNow);
        INFO(c["name"].get<std::string>() << ": " << done.err);
        REQUIRE(done.exit_code == 0);
      }
    }
    std::vector<std::string> args = {"--study", study};
    for (const auto& a : c["args"]) args.push_back(ReplaceAll(a, "$S", study));

    std::string before = StoreState(study + "/study.db");
    auto r = testing::RunCli(args, kNow);
    INFO(c["name"].get<std::string>());
    CHECK(r.exit_code == 1);
    CHECK(r.err == ReplaceAll(c["stderr"], "$S", study));
    CHECK(std::count(r.err.begin(), r.err.end(), '\n') == 1);
    CHECK(StoreState(study + "/study.db") == before);
  }
  WARN("bad-input battery: " << n << " cases");
}
