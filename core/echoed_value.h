#pragma once
// A value from an input file quoted back in a message. A message is one line
// a person reads: a 2 MB key or cell quoted whole would bury it (and cost the
// copy each time), so a long value is cut to its first kEchoedCharacters
// characters and its size in bytes is named instead.
#include <cstddef>
#include <string>
#include <string_view>

namespace twinprobe {

// Characters (UTF-8 code points) of a value quoted back in full; one more and
// it is cut.
inline constexpr size_t kEchoedCharacters = 80;

// `value` itself when it has at most kEchoedCharacters characters; else its
// first kEchoedCharacters characters (never half a UTF-8 sequence), "…" and
// the whole size: "aaaa…aaaa… (2,097,152 bytes)". A byte that is not UTF-8
// counts as one character (a stray continuation byte joins the one before). Control characters are left to ForTerminal.
std::string Echoed(std::string_view value);

// A count as a person reads it in a message: 2097152 -> "2,097,152".
std::string WithThousands(size_t n);

}  // namespace twinprobe
