#include "core/terminal_text.h"

#include <catch2/catch.hpp>

using twinprobe::ForTerminal;
using twinprobe::LineBreaks;

TEST_CASE("terminal text: printable ASCII and valid UTF-8 pass unchanged") {
  CHECK(ForTerminal("Caf\xC3\xA9 Ost, P00001 = 3") == "Caf\xC3\xA9 Ost, P00001 = 3");
  CHECK(ForTerminal("tab\there") == "tab\there");
  CHECK(ForTerminal("") == "");
}

TEST_CASE("terminal text: a window-title sequence, a screen clear and concealed text are shown escaped") {
  // OSC 0 (set window title) ended by BEL, ED 2 (clear screen), SGR 8 (conceal).
  CHECK(ForTerminal("\x1b]0;owned\x07subject") == "\\x1b]0;owned\\x07subject");
  CHECK(ForTerminal("\x1b[2Jgone") == "\\x1b[2Jgone");
  CHECK(ForTerminal("\x1b[8mhidden\x1b[0m") == "\\x1b[8mhidden\\x1b[0m");
  CHECK(ForTerminal(std::string("nul\0byte", 8)) == "nul\\x00byte");
  CHECK(ForTerminal("del\x7f") == "del\\x7f");
}

TEST_CASE("terminal text: line breaks and carriage returns are escaped in one-line fields, kept in documents") {
  CHECK(ForTerminal("ana\n  2027-03-05  9  mallory  forged") == "ana\\n  2027-03-05  9  mallory  forged");
  CHECK(ForTerminal("visible\rover") == "visible\\rover");
  CHECK(ForTerminal("line 1\nline 2\x1b[2J\n", LineBreaks::kKeep) == "line 1\nline 2\\x1b[2J\n");
  CHECK(ForTerminal("a\r\nb", LineBreaks::kKeep) == "a\\r\nb");
}

TEST_CASE("terminal text: C1 controls, bidirectional overrides and invalid UTF-8 are shown escaped") {
  CHECK(ForTerminal("\xC2\x9B" "2J") == "\\u009b2J");           // U+009B, CSI as a C1 character
  CHECK(ForTerminal("\xC2\x85next") == "\\u0085next");          // U+0085, next line
  CHECK(ForTerminal("abc\xE2\x80\xAE" "fed") == "abc\\u202efed");  // U+202E right-to-left override
  CHECK(ForTerminal("\xE2\x81\xA6x\xE2\x81\xA9") == "\\u2066x\\u2069");
  CHECK(ForTerminal("lone \x9B" "2J") == "lone \\x9b2J");       // a raw 8-bit CSI byte
  CHECK(ForTerminal("\xC3") == "\\xc3");                        // a cut sequence
  CHECK(ForTerminal("\xC0\xAF") == "\\xc0\\xaf");               // an overlong '/'
  CHECK(ForTerminal("\xED\xA0\x80") == "\\xed\\xa0\\x80");      // a surrogate
  CHECK(ForTerminal("\xC2\xA0nbsp \xE2\x82\xAC \xF0\x9F\x98\x80") == "\xC2\xA0nbsp \xE2\x82\xAC \xF0\x9F\x98\x80");
}
