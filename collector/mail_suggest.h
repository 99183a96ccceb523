#pragma once
// Suggesting a response code for a message from the design's phrase rules
// ([[mail.suggest]] in study.toml, or the built-in English rules). The rule
// is deliberately simple so a reviewer can retrace it:
//  1. search the subject and the fresh text (collector/mail_text.h) for every
//     phrase of every rule: case-insensitive, whole words, across line breaks;
//  2. a hit with a negation among the four words before it in the same
//     sentence is set aside (kept as evidence, marked negated);
//  3. the suggested code is that of the first rule, in the design's order,
//     with a hit that is not set aside; none if there is no such hit.
// A suggestion is never a response: `review` records one only when a person
// confirms it.
#include <string>
#include <string_view>
#include <vector>

#include "core/design.h"

namespace twinprobe {

struct PhraseEvidence {
  std::string code;      // the rule's code
  std::string phrase;    // the phrase as the rule writes it
  std::string where;     // "subject" or "body"
  bool negated = false;  // set aside: a negation stands before it
  std::string context;   // the words around it, as written in the message
};

struct Suggestion {
  std::string code;                      // "" : no rule applies
  std::vector<PhraseEvidence> evidence;  // at most one entry per phrase (its first hit), rules in order
};

// The rules with their phrases and negations folded once, for many messages.
class Suggester {
 public:
  explicit Suggester(const MailRules& rules);
  // `fresh_body` is the text FreshText() returns. `context_chars` code
  // points on each side of a hit are kept as its context.
  Suggestion Suggest(std::string_view subject, std::string_view fresh_body, int context_chars = 60) const;

 private:
  struct Phrase {
    std::string code, phrase, folded;
  };
  std::vector<Phrase> phrases_;  // rules in order, phrases in order
  std::vector<std::string> negations_;
};

// Suggester(rules).Suggest(subject, fresh_body, context_chars).
Suggestion SuggestCode(std::string_view subject, std::string_view fresh_body, const MailRules& rules,
                       int context_chars = 60);

}  // namespace twinprobe
