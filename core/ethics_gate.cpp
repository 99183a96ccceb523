#include "core/ethics_gate.h"

namespace twinprobe {
namespace {

constexpr const char* kSee = " (see ethics/README.md)";

bool HasContact(const std::string& user_agent) {
  return user_agent.find('@') != std::string::npos || user_agent.find("://") != std::string::npos;
}

}  // namespace

Status CheckEthicsGate(const Design& d, const std::string& label) {
  const EthicsBlock& e = d.ethics;
  // A listing audit sends no applications: there is no invitation to
  // decline and no employer to spare, so it needs approval, retention and
  // each source's permission (allowlist, identified collector) only.
  const bool listing = d.kind == "listing";
  if (!e.present)
    return BadInput(label, "the design has no [ethics] section",
                    std::string(listing ? "add [ethics] with approval and retention_days"
                                        : "add [ethics] with approval, retention_days, decline_within_hours and "
                                          "cap_per_employer") + kSee);
  if (e.approval.empty())
    return BadInput(label, "[ethics].approval is missing",
                    std::string("enter the reference of your ethics review board's approval") + kSee);
  if (e.retention_days <= 0)
    return BadInput(label, "[ethics].retention_days is missing",
                    std::string("state how many days identifying data is kept after fieldwork") + kSee);
  if (!listing && e.decline_within_hours <= 0)
    return BadInput(label, "[ethics].decline_within_hours is missing",
                    std::string("state within how many hours every invitation is declined") + kSee);
  if (!listing && e.cap_per_employer <= 0)
    return BadInput(label, "[ethics].cap_per_employer is missing",
                    std::string("state the most probes any one employer may receive") + kSee);
  for (const Source& s : d.sources) {
    std::string name = s.name.empty() ? "a [[source]]" : "source '" + s.name + "'";
    if (s.allow_hosts.empty())
      return BadInput(label, name + " has no host allowlist",
                      std::string("list the hosts you are permitted to collect from") + kSee);
    // The design keeps the product token and the contact apart; the header
    // sent is "user_agent (+contact)" (Source::UserAgentHeader).
    if (s.user_agent.empty() || !HasContact(s.UserAgentHeader()))
      return BadInput(label, name + " does not identify the collector",
                      std::string("give user_agent = \"Product/version\" and contact = an e-mail or web address, "
                                  "e.g. contact = \"research@org.example\"") +
                          kSee);
  }
  return {};
}

std::optional<std::string> DemoApprovalWarning(const Design& d, const std::string& label) {
  // The reference is matched, not the whole text: editing only the board's
  // name in parentheses still leaves an approval no board gave.
  if (d.study_id == kDemoStudyId || d.ethics.approval.find(kDemoApprovalReference) == std::string::npos)
    return std::nullopt;
  return label + ": [ethics].approval is the demo's invented reference " + kDemoApprovalReference + " in study '" +
         d.study_id + "' — enter the reference of your own ethics review board's approval" + kSee;
}

int64_t DeclineDeadline(const EthicsBlock& ethics, int64_t received_at) {
  return received_at + static_cast<int64_t>(ethics.decline_within_hours) * 3600;
}

std::string DeclineWithinWords(int decline_within_hours) {
  return "within " + std::to_string(decline_within_hours) + " hours of receipt";
}

}  // namespace twinprobe
