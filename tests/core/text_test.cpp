#include "core/text.h"

#include <catch2/catch.hpp>

using namespace twinprobe;

TEST_CASE("text: Lower changes ASCII letters only") {
  CHECK(Lower("Content-Type: TEXT/Plain") == "content-type: text/plain");
  CHECK(Lower("\xC3\x89MILE Nordby") == "\xC3\x89mile nordby");  // UTF-8 bytes untouched
  CHECK(Lower("") == "");
}

TEST_CASE("text: Trim removes ASCII white space at both ends only") {
  CHECK(Trim(" \t\r\n\v\fAllow: /jobs \r\n") == "Allow: /jobs");
  CHECK(Trim("a  b") == "a  b");
  CHECK(Trim(" \t ") == "");
  CHECK(Trim("\xC2\xA0x") == "\xC2\xA0x");  // a UTF-8 no-break space is not ASCII space
}

TEST_CASE("text: CodePoints counts UTF-8 code points, not bytes") {
  CHECK(CodePoints("Weidenbr\xC3\xBC" "ck") == 11);  // ü is two bytes
  CHECK(CodePoints("S\xC3\xB8ren") == 5);
  CHECK(CodePoints("") == 0);
  CHECK(CodePoints("\xE2\x80\xA6") == 1);  // the ellipsis, three bytes
}

TEST_CASE("text: PadRight and PadLeft pad by code points and never cut") {
  CHECK(PadRight("s\xC3\xBC" "d", 6) == "s\xC3\xBC" "d   ");  // 3 code points + 3 spaces, 7 bytes
  CHECK(PadRight("nord", 6) == "nord  ");
  CHECK(PadRight("Weidenbr\xC3\xBC" "ck", 4) == "Weidenbr\xC3\xBC" "ck");  // wider: unchanged, as "%-4s"
  CHECK(PadLeft("\xC3\xB8st", 5) == "  \xC3\xB8st");
  CHECK(PadLeft("12345", 3) == "12345");
}
