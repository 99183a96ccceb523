#pragma once
// Shared test fixtures: temporary folders and running the real twinprobe
// binary (end-to-end tests use the executable, not a mock).
#include <string>
#include <vector>

namespace twinprobe::testing {

// A fresh folder under the system temp dir, removed with its contents.
class TempDir {
 public:
  TempDir();
  ~TempDir();
  TempDir(const TempDir&) = delete;
  TempDir& operator=(const TempDir&) = delete;
  const std::string& path() const { return path_; }
  std::string operator/(const std::string& rel) const { return path_ + "/" + rel; }

 private:
  std::string path_;
};

struct CliRun {
  int exit_code = -1;
  std::string out;
  std::string err;
};

// Runs `twinprobe ARGS...` (each arg shell-quoted) with `env` assignments
// ("NAME=value") prepended. Standard input is /dev/null.
CliRun RunCli(const std::vector<std::string>& args, const std::vector<std::string>& env = {});

// RunCli with `dir` as the current folder, so relative paths in `args`
// resolve there (as a user's shell would).
CliRun RunCliIn(const std::string& dir, const std::vector<std::string>& args, const std::vector<std::string>& env = {});

// Starts `twinprobe ARGS...` in the background (stdout/stderr to /dev/null,
// `env` entries "NAME=value" added to the environment); returns its pid.
int SpawnCli(const std::vector<std::string>& args, const std::vector<std::string>& env = {});
// Waits for a spawned process; returns its exit code, or -signal if killed.
int WaitCli(int pid);

std::string ReadFile(const std::string& path);
// The line every writing command ends its text output with: "Audit head: "
// and the head of the study's chain (read now), then a newline.
std::string HeadLine(const std::string& study_dir);
void WriteFile(const std::string& path, const std::string& content);

// Marks each probe sent at `at` with one `twinprobe sent` each (a response
// needs a sending); throws std::runtime_error naming the refusal when one
// fails. `env` as for RunCli (e.g. "TWINPROBE_NOW=…").
void SendProbes(const std::string& study_dir, const std::vector<std::string>& probes, const std::string& at,
                const std::vector<std::string>& env = {});

// Path of the source tree (for fixtures) and of the built binary.
std::string SourceDir();
std::string BinaryPath();

}  // namespace twinprobe::testing
