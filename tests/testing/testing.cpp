#include "testing/testing.h"

#include <fcntl.h>
#include <signal.h>
#include <unistd.h>
#include <sys/wait.h>

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <stdexcept>

#include "core/audit.h"
#include "core/store.h"

namespace twinprobe::testing {
namespace fs = std::filesystem;

TempDir::TempDir() {
  std::string templ = (fs::temp_directory_path() / "twinprobe-test-XXXXXX").string();
  if (!mkdtemp(templ.data())) throw std::runtime_error("mkdtemp failed");
  path_ = templ;
}

TempDir::~TempDir() {
  std::error_code ec;
  fs::remove_all(path_, ec);
}

namespace {
std::string ShellQuote(const std::string& s) {
  std::string out = "'";
  for (char c : s) {
    if (c == '\'') out += "'\\''";
    else out += c;
  }
  return out + "'";
}
}  // namespace

std::string ReadFile(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  std::stringstream ss;
  ss << in.rdbuf();
  return ss.str();
}

void WriteFile(const std::string& path, const std::string& content) {
  fs::create_directories(fs::path(path).parent_path());
  std::ofstream out(path, std::ios::binary);
  out << content;
}

std::string SourceDir() { return TWINPROBE_SOURCE_DIR; }
std::string BinaryPath() { return TWINPROBE_BIN; }

CliRun RunCli(const std::vector<std::string>& args, const std::vector<std::string>& env) {
  return RunCliIn("", args, env);
}

CliRun RunCliIn(const std::string& dir, const std::vector<std::string>& args, const std::vector<std::string>& env) {
  TempDir io;
  std::string cmd = dir.empty() ? "" : "cd " + ShellQuote(dir) + " && ";
  for (const auto& e : env) cmd += e + " ";
  cmd += ShellQuote(BinaryPath());
  for (const auto& a : args) cmd += " " + ShellQuote(a);
  cmd += " </dev/null >" + ShellQuote(io / "out") + " 2>" + ShellQuote(io / "err");
  int status = std::system(cmd.c_str());
  CliRun r;
  r.exit_code = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
  r.out = ReadFile(io / "out");
  r.err = ReadFile(io / "err");
  return r;
}

int SpawnCli(const std::vector<std::string>& args, const std::vector<std::string>& env) {
  std::vector<std::string> argv_s = {BinaryPath()};
  argv_s.insert(argv_s.end(), args.begin(), args.end());
  pid_t pid = fork();
  if (pid < 0) throw std::runtime_error("fork failed");
  if (pid == 0) {
    int devnull = open("/dev/null", O_RDWR);
    dup2(devnull, 0);
    dup2(devnull, 1);
    dup2(devnull, 2);
    for (const auto& e : env) putenv(const_cast<char*>(e.c_str()));
    std::vector<char*> argv;
    for (auto& a : argv_s) argv.push_back(a.data());
    argv.push_back(nullptr);
    execv(argv[0], argv.data());
    _exit(127);
  }
  return pid;
}

int WaitCli(int pid) {
  int status = 0;
  waitpid(pid, &status, 0);
  if (WIFEXITED(status)) return WEXITSTATUS(status);
  if (WIFSIGNALED(status)) return -WTERMSIG(status);
  return -1;
}

void SendProbes(const std::string& study_dir, const std::vector<std::string>& probes, const std::string& at,
                const std::vector<std::string>& env) {
  for (const std::string& probe : probes) {
    CliRun r = RunCli({"--study", study_dir, "sent", probe, "--at", at}, env);
    if (r.exit_code != 0) throw std::runtime_error("sent " + probe + " --at " + at + ": " + r.err);
  }
}

std::string HeadLine(const std::string& study_dir) {
  auto store = Store::OpenReadOnly(study_dir + "/study.db");
  if (!store.ok()) return "(no store: " + store.error().Message() + ")";
  return "Audit head: " + AuditHead(*store.value()) + "\n";
}

}  // namespace twinprobe::testing
