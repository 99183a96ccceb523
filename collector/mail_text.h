#pragma once
// Text handling for reading responses: what part of a body is new, and
// finding phrases in it case-insensitively, as whole words, across line
// breaks. Pure functions on UTF-8 strings.
#include <cstdint>
#include <string>
#include <string_view>
#include <vector>

namespace twinprobe {

// The part of a body its writer wrote now (docs/mail.md, "Which text is
// read"):
//  - lines starting with '>' are quoted and dropped;
//  - a reply boundary ends the fresh text: a line ending in "wrote:", a line
//    "-----Original Message-----", or an embedded header block (a "From:"
//    line followed within five lines by "Subject:" and "Sent:" or "Date:");
//  - a forward is kept: after a forwarding marker ("Forwarded message",
//    "Begin forwarded message:", "Attached message") the forwarded header
//    block and its text are read, up to the next reply boundary. When the
//    subject starts with "Fw:" or "Fwd:", the first reply boundary counts
//    as such a marker.
std::string FreshText(std::string_view body, std::string_view subject);

// Text prepared for phrase search: whitespace runs (line breaks, tabs,
// no-break spaces) collapsed to one space and trimmed; `folded` is that text
// lowercased (towlower in the C.UTF-8 locale, ASCII-only if that locale is
// missing) with typographic quotes and dashes made plain. origin[i] is the
// byte offset in `plain` of folded byte i (origin has folded.size()+1 entries).
struct SearchText {
  std::string plain;
  std::string folded;
  std::vector<uint32_t> origin;
};
SearchText MakeSearchText(std::string_view text);

// Lowercase, collapsed form of a phrase (as MakeSearchText(phrase).folded).
std::string FoldPhrase(std::string_view phrase);

// Byte offsets in `folded` where `folded_phrase` occurs as whole words (no
// letter or digit directly before or after it). Empty phrase: no hits.
std::vector<size_t> FindWholeWords(std::string_view folded, std::string_view folded_phrase);

// True if one of `folded_negations` stands among the `words` words before
// `offset` in `folded`, without a sentence end (. ! ? ;) in between.
bool IsNegated(std::string_view folded, size_t offset, const std::vector<std::string>& folded_negations, int words = 4);

// Up to `chars` code points of `plain` on each side of [begin, end), with
// "…" where it was cut.
std::string ContextAround(std::string_view plain, size_t begin, size_t end, int chars);

// The first `chars` code points of `text`, with "…" if it was cut.
std::string Clip(std::string_view text, int chars);

}  // namespace twinprobe
