#pragma once
// Matching a message to the probe it answers (docs/mail.md, "How a message
// is matched"). The rule, in order:
//  1. the profile: a profile's mailbox among the recipients (To, Cc,
//     Delivered-To, X-Original-To, Envelope-To, Resent-To); failing that,
//     among the senders, the senders of a forwarded message, or in the text
//     (a profile forwarding its mail). No profile: unmatched.
//  2. the probes of those profiles in the current plan are the candidates;
//     each collects employer evidence:
//       - "reference": the vacancy's reference, as a whole word, in the
//         subject or text;
//       - "domain": a sender's (or forwarded sender's) domain is the domain
//         of the employer's contact address, or a subdomain of it; when that
//         domain is a shared mail host ([mail].generic_domains), the whole
//         address must be the contact address;
//       - "name": the employer's name (without parenthesised parts) in the
//         subject or text.
//  3. exactly one candidate with evidence: matched. Several: matched only if
//     exactly one of them has a "reference"; else ambiguous. None: unmatched.
// Ambiguous and unmatched messages wait in the review queue for a person to
// assign them; a matched one waits for a person to confirm the code.
#include <cstdint>
#include <map>
#include <string>
#include <vector>

#include "collector/mail_message.h"
#include "core/design.h"

namespace twinprobe {

class Store;

struct MatchProbe {
  int64_t probe_id = 0;
  std::string probe_ref;        // P00001
  std::string profile_mailbox;  // lowercased
  std::string vacancy_ref;
  std::string vacancy_ref_folded;  // as FoldPhrase() gives it (filled by LoadMatchIndex)
  std::string employer_key;        // pseudonym
  std::string employer_name;       // folded, parenthesised parts removed; "" after purge
  std::string employer_contact;    // lowercased address; "" if none (or purged)
};

struct MatchIndex {
  std::vector<MatchProbe> probes;
  std::map<std::string, std::vector<size_t>> by_mailbox;  // lowercased profile mailbox -> probes
};

// The current plan's probes with their profile, vacancy and employer.
MatchIndex LoadMatchIndex(Store& store);

enum class MatchStatus { kMatched, kAmbiguous, kUnmatched };
const char* MatchStatusName(MatchStatus s);  // "matched", "ambiguous", "unmatched"

struct MatchResult {
  MatchStatus status = MatchStatus::kUnmatched;
  std::string profile_mailbox;          // the profile the message was for ("" : none found)
  int64_t probe_id = 0;                 // when matched
  std::string probe_ref;                // when matched
  std::string employer_key;             // when matched
  std::vector<std::string> candidates;  // probes with evidence (ambiguous), e.g. "P00003 (domain)"
  // One sentence saying why, naming profiles, probes, vacancy references
  // and employer pseudonyms only (it is sealed into the audit chain).
  std::string reason;
};

MatchResult MatchMessage(const MatchIndex& index, const MailMessage& message, const MailRules& rules);

// Lowercase, collapsed employer name without "(…)" parts (e.g. "(invented)").
std::string EmployerMatchName(const std::string& name);

}  // namespace twinprobe
