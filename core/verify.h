#pragma once
// `verify`: everything the store can prove about itself, read in one go.
//   - the file is a study store (not empty, not another database);
//   - its schema (tables, columns, indexes, views, triggers) is byte for byte
//     the one the migrations create for its version, so no trigger rewrites
//     rows as they land and no view shows other rows than the tool wrote;
//   - the audit chain and every sealed row (core/audit.h);
//   - each audit entry's summary agrees with the rows it sealed
//     (core/verify_summary.h);
//   - every head a witness kept is in the chain (nothing up to it removed,
//     nothing before it rewritten).
// The store is opened read-only and read inside one read transaction, so a
// writer committing meanwhile is not seen half way (no false "BROKEN").
#include <string>
#include <vector>

#include "core/audit.h"
#include "core/status.h"

namespace twinprobe {

// A head kept outside the store and where it was found.
struct WitnessedHead {
  std::string hash;    // 64 lowercase hex digits
  std::string source;  // "--head" or FILE:LINE of a witness file
  int64_t seq = 0;     // the entry that has this hash; 0 when none has it
};

struct StoreVerification {
  AuditReport audit;  // problems include schema (seq 0), summary and witness problems
  std::vector<WitnessedHead> witnessed;
  int schema_version = 0;
  bool ok() const { return audit.ok(); }
};

// Returns `text` as a chain head (lowercased) or a usage error naming
// `where` when it is not 64 hex digits.
Result<std::string> ParseHead(const std::string& text, const std::string& where);

// Reads the heads a witness kept: every word of 64 hex digits in the file
// (one per line, with whatever date or note the witness writes beside it).
// Fails when the file cannot be read or holds no head.
Result<std::vector<WitnessedHead>> ReadWitnessFile(const std::string& path);

// Verifies the store at `path` (see above) against `witnessed` heads. Bad
// input: a missing file, an empty file, a file that is not a study store, or
// a store written by a newer twinprobe. Never writes to the file.
Result<StoreVerification> VerifyStore(const std::string& path, std::vector<WitnessedHead> witnessed);

// Where a problem is: "entry N", or "the store" for one about the store as
// a whole (seq 0: its schema, a witnessed head).
std::string ProblemPlace(const AuditProblem& problem);

// The first broken link as `verify` names it, e.g. "entry 2: rows written by
// this entry (record) were changed, …"; "" when nothing is broken.
std::string FirstBrokenLink(const StoreVerification& verification);

// The schema differences of `store` against ReferenceSchema(version), one
// sentence each, e.g. "the store holds a trigger 'x' on table response that
// twinprobe does not create". Empty when they agree.
std::vector<std::string> SchemaDifferences(Store& store, int version);

}  // namespace twinprobe
