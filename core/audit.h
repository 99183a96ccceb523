#pragma once
// The audit chain (docs/architecture.md, "Store rules"). Every writing command runs in
// one AuditedWrite: one transaction, one audit row. Rows the command adds
// carry the audit row's seq; on commit their canonical serialisation is
// hashed into `content_sha256`, and the audit row's own hash covers the
// previous row's hash plus its content:
//   hash = SHA-256(prev_hash "\n" seq "\n" at "\n" actor "\n" command "\n" summary "\n" content_sha256)
// `VerifyAudit` recomputes both, so an edited, deleted or slipped-in row,
// and an edited audit row, are found and named.
#include <cstdint>
#include <string>
#include <vector>

#include "core/status.h"
#include "core/store.h"

namespace twinprobe {

// Who is writing: the desk member of this thread (core/desk_actor.h), else
// $TWINPROBE_ACTOR, else $USER, else "unknown".
std::string CurrentActor();

// Refuses an actor that holds a control character: a line break in
// TWINPROBE_ACTOR would forge lines in `history` and in the chain's text
// (entries are separated by line breaks). main() calls it before any command
// runs, so a refused actor writes nothing.
Status CheckActor();

class AuditedWrite {
 public:
  // Begins the transaction (waiting for other writers) and reserves a seq.
  AuditedWrite(Store& store, std::string command);
  ~AuditedWrite() = default;  // rolls back unless Commit() ran
  AuditedWrite(const AuditedWrite&) = delete;
  AuditedWrite& operator=(const AuditedWrite&) = delete;

  int64_t seq() const { return seq_; }
  const std::string& at() const { return at_; }
  const std::string& actor() const { return actor_; }
  // Seals the rows written under seq() and commits. Returns the new head hash.
  std::string Commit(const std::string& summary);

 private:
  Store& store_;
  Transaction tx_;
  std::string command_;
  std::string at_;
  std::string actor_;
  int64_t seq_ = 0;
};

// Digest of every sealed row written under `seq` (the value stored in
// audit.content_sha256).
std::string ContentDigest(Store& store, int64_t seq);

struct AuditProblem {
  AuditProblem() = default;
  AuditProblem(int64_t s, std::string w) : seq(s), what(std::move(w)) {}
  int64_t seq = 0;
  std::string what;  // e.g. "rows of table response changed since they were written"
  // The audit entry `seq` as stored (empty when no entry has that seq).
  std::string command, actor, at, summary;
};

struct AuditReport {
  int64_t entries = 0;
  int64_t sealed_rows = 0;
  std::string head_hash;           // hash of the last audit row ("" when empty)
  std::vector<AuditProblem> problems;  // by seq; the first one is the first broken link
  bool ok() const { return problems.empty(); }
};

// Recomputes every entry's content digest and the chain. Also checks that a
// free-text column left out of the digest (response.note) still matches the
// SHA-256 sealed beside it (note_sha256): purge may empty it, nobody may
// change it.
AuditReport VerifyAudit(Store& store);

// The hash of the newest audit row, or "" for an empty chain.
std::string AuditHead(Store& store);

}  // namespace twinprobe
