#pragma once
// Text from the store or the user, made safe to print on a terminal.
//
// A mail subject, a note, a study title or an actor may hold control
// characters: ESC sequences retitle the terminal window, clear the screen or
// conceal text; a carriage return overwrites what a line showed; a line break
// forges a line of output (a fake history entry). Every terminal output that
// shows stored or user-given text passes it through ForTerminal, so such
// characters are shown as visible escapes instead of acting.
#include <string>
#include <string_view>

namespace twinprobe {

enum class LineBreaks {
  kEscape,  // one-line fields (names, notes, subjects, actors): "\n" is shown as \n
  kKeep,    // whole documents printed line by line (a text report, a mail body)
};

// `text` with every control character shown escaped:
//   C0 (U+0000-U+001F) and DEL as \t-style or \xNN escapes (\n and \t kept
//   when `breaks` is kKeep, \t always kept),
//   C1 (U+0080-U+009F, UTF-8 C2 80-C2 9F) as \u0080-style escapes,
//   bidirectional overrides and isolates (U+202A-U+202E, U+2066-U+2069),
//   which reorder what the reader sees, as \u202e-style escapes,
//   bytes that are not valid UTF-8 (a lone 0x9B is CSI on 8-bit terminals)
//   as \xNN.
// Everything else (printable ASCII, valid UTF-8 text) is unchanged.
std::string ForTerminal(std::string_view text, LineBreaks breaks = LineBreaks::kEscape);

}  // namespace twinprobe
