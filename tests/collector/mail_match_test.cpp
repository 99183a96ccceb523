// Matching on a hand-built index (LoadMatchIndex is covered by the intake
// tests on a real planned study).
#include "collector/mail_match.h"

#include <catch2/catch.hpp>

using namespace twinprobe;

namespace {

MatchProbe Probe(int64_t id, const std::string& mailbox, const std::string& vacancy, const std::string& key,
                 const std::string& name, const std::string& contact) {
  MatchProbe p;
  p.probe_id = id;
  char ref[16];
  std::snprintf(ref, sizeof ref, "P%05d", static_cast<int>(id));
  p.probe_ref = ref;
  p.profile_mailbox = mailbox;
  p.vacancy_ref = vacancy;
  p.employer_key = key;
  p.employer_name = EmployerMatchName(name);
  p.employer_contact = contact;
  return p;
}

MatchIndex Index() {
  const std::string aldo = "aldo.brenvik@postbox.example", kemi = "kemi.saralon@postbox.example";
  MatchIndex index;
  index.probes = {
      Probe(1, aldo, "V0101", "E-aaaa", "Orlinde Bakehouse (invented)", "jobs@orlinde-bakehouse.example"),
      Probe(2, kemi, "V0101", "E-aaaa", "Orlinde Bakehouse (invented)", "jobs@orlinde-bakehouse.example"),
      Probe(3, aldo, "V0102", "E-bbbb", "Brakkeport Freight Lines (invented)", "people@brakkeport-freight.example"),
      Probe(4, aldo, "V0103", "E-cccc", "Tessvale Care Homes (invented)", "tessvale.care.hiring@freemail.example"),
      Probe(5, aldo, "V0106", "E-aaaa", "Orlinde Bakehouse (invented)", "jobs@orlinde-bakehouse.example"),
      Probe(6, kemi, "V0104", "E-dddd", "Kestrel Print Works (invented)", "hr@kestrel-print.example"),
      Probe(7, kemi, "V0105", "E-eeee", "Ace (invented)", "office@ace-dental.example"),
  };
  for (size_t i = 0; i < index.probes.size(); ++i) index.by_mailbox[index.probes[i].profile_mailbox].push_back(i);
  return index;
}

MailRules Rules() {
  MailRules r;
  r.generic_domains = {"freemail.example"};
  return r;
}

MatchResult Match(const std::string& raw) { return MatchMessage(Index(), ParseMailMessage(raw), Rules()); }

}  // namespace

TEST_CASE("mail match: recipient profile plus the employer's domain names one probe") {
  MatchResult r = Match("From: Hanne <hanne@orlinde-bakehouse.example>\nTo: kemi.saralon@postbox.example\n\nHello");
  CHECK(r.status == MatchStatus::kMatched);
  CHECK(r.probe_ref == "P00002");
  CHECK(r.probe_id == 2);
  CHECK(r.employer_key == "E-aaaa");
  CHECK(r.profile_mailbox == "kemi.saralon@postbox.example");
  CHECK(r.reason == "for profile kemi.saralon@postbox.example; the sender's address belongs to employer E-aaaa");
}

TEST_CASE("mail match: a subdomain counts, a look-alike domain does not") {
  CHECK(Match("From: a@mail.kestrel-print.example\nTo: kemi.saralon@postbox.example\n\nx").probe_ref == "P00006");
  MatchResult r = Match("From: a@notkestrel-print.example\nTo: kemi.saralon@postbox.example\n\nx");
  CHECK(r.status == MatchStatus::kUnmatched);
  CHECK(r.reason ==
        "for profile kemi.saralon@postbox.example, but none of its 3 probes' employers or vacancy "
        "references appears in the message");
}

TEST_CASE("mail match: two vacancies of one employer are told apart by the reference, else ambiguous") {
  MatchResult both = Match("From: jobs@orlinde-bakehouse.example\nTo: aldo.brenvik@postbox.example\n\nDear Aldo");
  CHECK(both.status == MatchStatus::kAmbiguous);
  CHECK(both.probe_ref.empty());
  CHECK(both.candidates == std::vector<std::string>{"P00001 (domain)", "P00005 (domain)"});
  CHECK(both.reason ==
        "for profile aldo.brenvik@postbox.example; several probes fit: P00001 (domain) and P00005 (domain)");

  MatchResult one =
      Match("From: jobs@orlinde-bakehouse.example\nTo: aldo.brenvik@postbox.example\nSubject: Re: v0106\n\nx");
  CHECK(one.status == MatchStatus::kMatched);
  CHECK(one.probe_ref == "P00005");
  CHECK(one.reason ==
        "for profile aldo.brenvik@postbox.example; vacancy reference V0106 in the message and the "
        "sender's address belongs to employer E-aaaa (the only candidate with its vacancy reference)");
}

TEST_CASE("mail match: on a shared mail host only the exact contact address counts") {
  MatchResult stranger = Match("From: someone@freemail.example\nTo: aldo.brenvik@postbox.example\n\nHello");
  CHECK(stranger.status == MatchStatus::kUnmatched);
  MatchResult contact = Match("From: Tessvale.Care.Hiring@freemail.example\nTo: aldo.brenvik@postbox.example\n\nHi");
  CHECK(contact.probe_ref == "P00004");
  // A generic sender writing about an employer by name.
  MatchResult named = Match(
      "From: desk@freemail.example\nTo: kemi.saralon@postbox.example\n\n"
      "I write for Kestrel   Print\nWorks about your application.");
  CHECK(named.probe_ref == "P00006");
  CHECK(named.reason == "for profile kemi.saralon@postbox.example; employer E-dddd's name in the message");
}

TEST_CASE("mail match: names shorter than four letters are not evidence") {
  MatchResult r = Match("From: x@freemail.example\nTo: kemi.saralon@postbox.example\n\nAce is a word.");
  CHECK(r.status == MatchStatus::kUnmatched);
}

TEST_CASE("mail match: with no profile among the recipients, the sender or the text may name it") {
  MatchResult fwd = Match(
      "From: Kemi <kemi.saralon@postbox.example>\nTo: desk@study.example\nSubject: Fwd: x\n\n"
      "---------- Forwarded message ---------\nFrom: hr@kestrel-print.example\n\nCome in.");
  CHECK(fwd.probe_ref == "P00006");
  MatchResult text = Match(
      "From: desk@study.example\nTo: archive@study.example\n\nTo: aldo.brenvik@postbox.example\n"
      "From: people@brakkeport-freight.example\n");
  CHECK(text.probe_ref == "P00003");
}

TEST_CASE("mail match: no profile at all is unmatched") {
  MatchResult r = Match("From: hr@kestrel-print.example\nTo: mira.dunvale@othermail.example\n\nWelcome");
  CHECK(r.status == MatchStatus::kUnmatched);
  CHECK(r.profile_mailbox.empty());
  CHECK(r.reason == "no profile's mailbox is among the recipients, the senders or the text");
  CHECK(std::string(MatchStatusName(r.status)) == "unmatched");
}

TEST_CASE("mail match: references that name probes of two employers are ambiguous") {
  MatchResult r = Match("From: desk@freemail.example\nTo: aldo.brenvik@postbox.example\nSubject: V0102 and V0103\n\nx");
  CHECK(r.status == MatchStatus::kAmbiguous);
  CHECK(r.candidates == std::vector<std::string>{"P00003 (reference)", "P00004 (reference)"});
}
