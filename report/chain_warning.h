#pragma once
// A broken audit chain is said first: `analyze` and `report` (text, HTML,
// JSON) lead with it when `verify` would fail (issue 24), so nobody quotes
// numbers from a store changed behind the tool's back. The state comes from
// core/verify.h through ReportContext (audit_intact, audit_problem).
#include <string>

#include "report/report_context.h"

namespace twinprobe {

// "The study's audit chain is broken." — the lead every format shows.
extern const char* const kBrokenChainLead;

// What follows the lead: the first broken link and what to do, e.g. "First
// broken link: entry 2: …. Stored data changed outside twinprobe; run
// 'twinprobe verify' before relying on these numbers." "" when intact.
std::string BrokenChainDetail(const ReportContext& ctx);

// `text` with "WARNING: <lead> <detail>" and a blank line before it; `text`
// unchanged when the chain is intact.
std::string WithChainWarningText(const std::string& text, const ReportContext& ctx);

// The JSON document `json` with the key "audit_warning" ("<lead> <detail>")
// added when the chain is broken; unchanged when it is intact.
std::string WithChainWarningJson(const std::string& json, const ReportContext& ctx);

}  // namespace twinprobe
