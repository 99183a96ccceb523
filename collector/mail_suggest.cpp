#include "collector/mail_suggest.h"

#include "collector/mail_text.h"

namespace twinprobe {

Suggester::Suggester(const MailRules& rules) {
  for (const auto& rule : rules.suggest)
    for (const auto& phrase : rule.phrases) phrases_.push_back({rule.code, phrase, FoldPhrase(phrase)});
  for (const auto& n : rules.negations) negations_.push_back(FoldPhrase(n));
}

Suggestion Suggester::Suggest(std::string_view subject, std::string_view fresh_body, int context_chars) const {
  Suggestion s;
  // Subject and body are searched apart, so no phrase runs from one into the other.
  const SearchText texts[2] = {MakeSearchText(subject), MakeSearchText(fresh_body)};
  const char* names[2] = {"subject", "body"};
  for (const Phrase& p : phrases_) {
    // The first hit that is not negated, subject before body; else the first hit.
    int found_text = -1;
    size_t found_at = 0;
    bool negated = true;
    for (int t = 0; t < 2 && negated; ++t)
      for (size_t h : FindWholeWords(texts[t].folded, p.folded)) {
        bool neg = IsNegated(texts[t].folded, h, negations_);
        if (found_text < 0 || !neg) {
          found_text = t;
          found_at = h;
          negated = neg;
        }
        if (!neg) break;
      }
    if (found_text < 0) continue;
    const SearchText& st = texts[found_text];
    size_t begin = st.origin[found_at], end = st.origin[found_at + p.folded.size()];
    s.evidence.push_back(
        {p.code, p.phrase, names[found_text], negated, ContextAround(st.plain, begin, end, context_chars)});
    if (!negated && s.code.empty()) s.code = p.code;
  }
  return s;
}

Suggestion SuggestCode(std::string_view subject, std::string_view fresh_body, const MailRules& rules,
                       int context_chars) {
  return Suggester(rules).Suggest(subject, fresh_body, context_chars);
}

}  // namespace twinprobe
