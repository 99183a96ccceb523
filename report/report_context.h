#pragma once
// What a rendered report knows beyond the analysis result: who made it, when,
// from which state of the audit chain, and whether employer names may be
// shown. The CLI fills it; the renderers only read it.
#include <cstdint>
#include <map>
#include <string>

namespace twinprobe {

struct ReportContext {
  std::string tool_version;     // twinprobe's version
  std::string generated_at;     // UTC ISO 8601
  std::string audit_head;       // hash of the newest audit entry when the report was made
  int64_t audit_entries = 0;
  bool audit_intact = true;     // verify (core/verify.h) found no broken link
  std::string audit_problem;    // the first broken link as verify names it ("" when intact)
  std::string ethics_approval;  // [ethics].approval of the design file ("" when unknown)
  // Only with `report --reveal-employers` (recorded in the audit chain):
  // pseudonym -> employer name. Empty means pseudonyms only.
  bool reveal_employers = false;
  std::map<std::string, std::string> employer_names;
};

}  // namespace twinprobe
