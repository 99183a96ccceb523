#pragma once
// The ethics policy gate (docs/architecture.md; ethics/README.md). Safeguards written in
// a protocol and not enforced are forgotten in week three of fieldwork, so
// `check` and `plan` refuse a design that does not state them.
#include <optional>
#include <string>

#include "core/design.h"
#include "core/status.h"

namespace twinprobe {

// Returns the first missing safeguard as a bad-input error located at
// `label` (the design file's path): no [ethics] section; no approval
// reference; no retention period; no decline deadline; no cap per employer;
// and for each declared web source, no host allowlist or no identifying
// User-Agent with a contact (an e-mail address or a URL). A listing audit
// (kind = "listing") sends nothing to decline and no employer to cap, so it
// is asked for approval, retention and its sources' permission only.
// `check`, `plan` and `fetch` all call this one gate.
Status CheckEthicsGate(const Design& design, const std::string& label);

// The demo study's id and its invented approval reference
// (templates/demo/study.toml; a test keeps them equal).
inline constexpr const char* kDemoStudyId = "veldmark-callbacks-demo";
inline constexpr const char* kDemoApprovalReference = "VREB-2027-014";

// A warning for `check` when [ethics].approval still holds the demo's
// invented reference in a study whose id is not the demo's: a study copied
// from `init` passes the gate with a board that does not exist. nullopt
// otherwise (the demo itself may keep it).
std::optional<std::string> DemoApprovalWarning(const Design& design, const std::string& label);

// The decline deadline (UTC seconds) for an invitation received at
// `received_at`: received_at + decline_within_hours.
int64_t DeclineDeadline(const EthicsBlock& ethics, int64_t received_at);

// The decline rule in words: "within 48 hours of receipt". The deadline
// sentences of `record`, `review`, `schedule`, `decline` and the desk
// (collector/declines.h) and the report's declines section all say it so.
std::string DeclineWithinWords(int decline_within_hours);

}  // namespace twinprobe
