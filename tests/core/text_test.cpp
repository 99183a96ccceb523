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
