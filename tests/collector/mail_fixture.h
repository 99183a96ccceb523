#pragma once
// Shared by the mail tests: the fixture study planned in a temp folder, and
// the fixture IMAP server (tests/fixtures/mail/imap_server.py) on 127.0.0.1.
#include <signal.h>
#include <sys/types.h>
#include <unistd.h>

#include <catch2/catch.hpp>
#include <chrono>
#include <filesystem>
#include <string>
#include <thread>

#include "core/store.h"
#include "testing/pinned_clock.h"
#include "testing/testing.h"

namespace twinprobe::mailtest {

inline std::string FixturePath(const std::string& rel) { return testing::SourceDir() + "/tests/fixtures/mail/" + rel; }

// tests/fixtures/mail/study copied to a temp folder and planned with the
// real binary (10 probes: 5 vacancies x 2 profiles).
struct PlannedMailStudy {
  testing::PinnedClock clock;  // in the fixture's 2027 season: fieldwork times may not lie in the future
  testing::TempDir dir;
  std::string study;
  PlannedMailStudy() : study(dir / "study") {
    std::filesystem::copy(FixturePath("study"), study, std::filesystem::copy_options::recursive);
    auto plan = testing::RunCli({"--study", study, "plan"});
    INFO(plan.err);
    REQUIRE(plan.exit_code == 0);
  }
  std::unique_ptr<Store> Open() const {
    auto s = Store::Open(study + "/study.db", false);
    REQUIRE(s.ok());
    return std::move(s.value());
  }
  // Every probe sent on the schedule's first day, in one `import sendings`
  // (a reviewed message is recorded only for a probe with a sending).
  void SendAll() const {
    std::string csv = "probe,sent_at\n";
    {
      auto store = Open();
      Stmt q = store->Prepare("SELECT ref FROM current_probe ORDER BY ref");
      while (q.Step()) csv += q.Text(0) + ",2027-03-01\n";
    }
    testing::WriteFile(study + "/sendings.csv", csv);
    auto sent = testing::RunCli({"--study", study, "import", "sendings", study + "/sendings.csv"});
    INFO(sent.err);
    REQUIRE(sent.exit_code == 0);
  }
};

// The probe that `mailbox` was sent with to vacancy `vacancy_ref`.
inline std::string ProbeFor(Store& store, const std::string& vacancy_ref, const std::string& mailbox) {
  Stmt s = store.Prepare(
      "SELECT p.ref FROM current_probe p JOIN vacancy v ON v.id = p.vacancy_id JOIN profile pr ON pr.id = p.profile_id "
      "WHERE v.ref = ?1 AND pr.mailbox = ?2");
  s.Bind(1, vacancy_ref).Bind(2, mailbox);
  REQUIRE(s.Step());
  return s.Text(0);
}

// The fixture IMAP server, started on a free port of 127.0.0.1 and stopped
// (SIGTERM to its process) when this goes out of scope. It logs every
// command it receives to log_path() (LOGIN with the password as ***).
class ImapServer {
 public:
  ImapServer(const std::string& messages_dir, const std::string& user, const std::string& password) {
    std::string port_file = dir_ / "port", pid_file = dir_ / "pid";
    log_ = dir_ / "commands.log";
    std::string cmd = "python3 '" + FixturePath("imap_server.py") + "' --messages '" + messages_dir + "' --user '" +
                      user + "' --password '" + password + "' --port-file '" + port_file + "' --log '" + log_ + "' >'" +
                      (dir_ / "server.out") + "' 2>&1 </dev/null & echo $! > '" + pid_file + "'";
    REQUIRE(std::system(cmd.c_str()) == 0);
    pid_ = std::stoi(testing::ReadFile(pid_file));
    for (int i = 0; i < 200 && !std::filesystem::exists(port_file); ++i)
      std::this_thread::sleep_for(std::chrono::milliseconds(50));
    INFO(testing::ReadFile(dir_ / "server.out"));
    REQUIRE(std::filesystem::exists(port_file));
    port_ = testing::ReadFile(port_file);
  }
  ~ImapServer() {
    if (pid_ > 0) kill(pid_, SIGTERM);
  }
  ImapServer(const ImapServer&) = delete;
  ImapServer& operator=(const ImapServer&) = delete;

  std::string url(const std::string& folder = "INBOX") const { return "imap://127.0.0.1:" + port_ + "/" + folder; }
  std::string log() const { return testing::ReadFile(log_); }

 private:
  testing::TempDir dir_;
  std::string log_;
  std::string port_;
  pid_t pid_ = -1;
};

}  // namespace twinprobe::mailtest
