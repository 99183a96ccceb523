#include "collector/mail_match.h"

#include <algorithm>
#include <set>

#include "collector/mail_header.h"
#include "collector/mail_text.h"
#include "core/mail_log.h"
#include "core/store.h"

namespace twinprobe {
namespace {

struct Evidence {
  bool reference = false, domain = false, name = false;
  bool any() const { return reference || domain || name; }
  std::string Describe() const {
    std::string s;
    auto add = [&](const char* w) { s += (s.empty() ? "" : ", ") + std::string(w); };
    if (reference) add("reference");
    if (domain) add("domain");
    if (name) add("name");
    return s;
  }
};

bool DomainFits(const std::string& sender_domain, const std::string& employer_domain) {
  if (employer_domain.empty() || sender_domain.empty()) return false;
  if (sender_domain == employer_domain) return true;
  return sender_domain.size() > employer_domain.size() &&
         sender_domain.compare(sender_domain.size() - employer_domain.size(), employer_domain.size(),
                               employer_domain) == 0 &&
         sender_domain[sender_domain.size() - employer_domain.size() - 1] == '.';
}

std::string JoinAnd(const std::vector<std::string>& parts) {
  std::string s;
  for (size_t i = 0; i < parts.size(); ++i) s += (i == 0 ? "" : i + 1 == parts.size() ? " and " : ", ") + parts[i];
  return s;
}

}  // namespace

const char* MatchStatusName(MatchStatus s) {
  switch (s) {
    case MatchStatus::kMatched:
      return "matched";
    case MatchStatus::kAmbiguous:
      return "ambiguous";
    default:
      return "unmatched";
  }
}

std::string EmployerMatchName(const std::string& name) {
  std::string out;
  int depth = 0;
  for (char c : name) {
    if (c == '(')
      ++depth;
    else if (c == ')' && depth > 0)
      --depth;
    else if (depth == 0)
      out += c;
  }
  return FoldPhrase(out);
}

MatchIndex LoadMatchIndex(Store& store) {
  MatchIndex index;
  for (const MailProbeRow& row : ReadMailProbes(store)) {
    MatchProbe p;
    p.probe_id = row.probe_id;
    p.probe_ref = row.probe_ref;
    p.profile_mailbox = row.profile_mailbox;
    p.vacancy_ref = row.vacancy_ref;
    p.vacancy_ref_folded = FoldPhrase(p.vacancy_ref);
    p.employer_key = row.employer_key;
    p.employer_name = EmployerMatchName(row.employer_name);
    auto contact = ExtractAddresses(row.employer_contact);
    p.employer_contact = contact.empty() ? "" : contact.front();
    if (!p.profile_mailbox.empty()) index.by_mailbox[p.profile_mailbox].push_back(index.probes.size());
    index.probes.push_back(p);
  }
  return index;
}

MatchResult MatchMessage(const MatchIndex& index, const MailMessage& m, const MailRules& rules) {
  MatchResult r;
  // 1. Which profile the message was for.
  std::vector<std::string> profiles;
  auto take = [&](const std::vector<std::string>& addresses) {
    for (const auto& a : addresses)
      if (index.by_mailbox.count(a) && std::find(profiles.begin(), profiles.end(), a) == profiles.end())
        profiles.push_back(a);
  };
  take(m.recipient_addresses);
  if (profiles.empty()) {
    take(m.sender_addresses);
    take(m.forwarded_sender_addresses);
    take(ExtractAddresses(m.text));
  }
  if (profiles.empty()) {
    r.reason = "no profile's mailbox is among the recipients, the senders or the text";
    return r;
  }
  r.profile_mailbox = profiles.front();
  for (size_t i = 1; i < profiles.size(); ++i) r.profile_mailbox += ", " + profiles[i];

  // 2. Employer evidence for each probe of those profiles.
  std::vector<std::string> senders;
  for (const auto& a : m.sender_addresses)
    if (!index.by_mailbox.count(a)) senders.push_back(a);
  for (const auto& a : m.forwarded_sender_addresses)
    if (!index.by_mailbox.count(a)) senders.push_back(a);
  const SearchText subject = MakeSearchText(m.subject), text = MakeSearchText(m.text);
  auto mentions = [&](const std::string& folded) {
    return !folded.empty() &&
           (!FindWholeWords(subject.folded, folded).empty() || !FindWholeWords(text.folded, folded).empty());
  };
  std::vector<std::pair<size_t, Evidence>> with_evidence;
  size_t n_candidates = 0;
  for (const auto& mailbox : profiles)
    for (size_t i : index.by_mailbox.at(mailbox)) {
      ++n_candidates;
      const MatchProbe& p = index.probes[i];
      Evidence e;
      e.reference = mentions(p.vacancy_ref_folded.empty() ? FoldPhrase(p.vacancy_ref) : p.vacancy_ref_folded);
      std::string employer_domain = AddressDomain(p.employer_contact);
      bool generic = std::find(rules.generic_domains.begin(), rules.generic_domains.end(), employer_domain) !=
                     rules.generic_domains.end();
      for (const auto& sender : senders) {
        std::string d = AddressDomain(sender);
        bool sender_generic =
            std::find(rules.generic_domains.begin(), rules.generic_domains.end(), d) != rules.generic_domains.end();
        if (generic || sender_generic)
          e.domain = e.domain || (!p.employer_contact.empty() && sender == p.employer_contact);
        else
          e.domain = e.domain || DomainFits(d, employer_domain);
      }
      e.name = p.employer_name.size() >= 4 && mentions(p.employer_name);
      if (e.any()) with_evidence.emplace_back(i, e);
    }

  // 3. Decide.
  std::vector<std::pair<size_t, Evidence>> chosen = with_evidence;
  if (chosen.size() > 1) {
    std::vector<std::pair<size_t, Evidence>> by_reference;
    for (const auto& c : chosen)
      if (c.second.reference) by_reference.push_back(c);
    if (by_reference.size() == 1) chosen = by_reference;
  }
  if (chosen.size() == 1) {
    const MatchProbe& p = index.probes[chosen.front().first];
    const Evidence& e = chosen.front().second;
    r.status = MatchStatus::kMatched;
    r.probe_id = p.probe_id;
    r.probe_ref = p.probe_ref;
    r.employer_key = p.employer_key;
    r.profile_mailbox = p.profile_mailbox;
    std::vector<std::string> why;
    if (e.reference) why.push_back("vacancy reference " + p.vacancy_ref + " in the message");
    if (e.domain) why.push_back("the sender's address belongs to employer " + p.employer_key);
    if (e.name) why.push_back("employer " + p.employer_key + "'s name in the message");
    r.reason = "for profile " + p.profile_mailbox + "; " + JoinAnd(why) +
               (with_evidence.size() > 1 ? " (the only candidate with its vacancy reference)" : "");
    return r;
  }
  if (chosen.empty()) {
    r.reason = "for profile " + r.profile_mailbox + ", but none of its " + std::to_string(n_candidates) +
               " probes' employers or vacancy references appears in the message";
    return r;
  }
  r.status = MatchStatus::kAmbiguous;
  for (const auto& [i, e] : chosen) r.candidates.push_back(index.probes[i].probe_ref + " (" + e.Describe() + ")");
  r.reason = "for profile " + r.profile_mailbox + "; several probes fit: " + JoinAnd(r.candidates);
  return r;
}

}  // namespace twinprobe
