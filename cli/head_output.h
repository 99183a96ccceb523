#pragma once
// Prints the new chain head after every command that wrote the store, in
// one place rather than in each command: text output gets a last line
//   Audit head: <64 hex digits>
// and a JSON document gets an "audit_head" member. A command that wrote
// nothing prints exactly what it printed before.
namespace twinprobe {

class HeadOutput {
 public:
  // With `json`, holds back standard output until Finish so the head can be
  // added to the document; without, passes it straight through.
  explicit HeadOutput(bool json);
  ~HeadOutput();  // releases held-back output unchanged (e.g. after an exception)
  HeadOutput(const HeadOutput&) = delete;
  HeadOutput& operator=(const HeadOutput&) = delete;
  // Adds the head, if this process committed one, and releases the output.
  void Finish();

 private:
  void Release(bool add_head);
  bool json_;
  struct Held;
  Held* held_ = nullptr;
};

// True when the command line asks for --json (read before CLI11 parses it,
// which is when the command already runs).
bool WantsJson(int argc, char** argv);

}  // namespace twinprobe
