#include "core/echoed_value.h"

#include <catch2/catch.hpp>

using namespace twinprobe;

TEST_CASE("echoed value: up to 80 characters is quoted whole") {
  CHECK(Echoed("sede") == "sede");
  CHECK(Echoed(std::string(80, 'k')) == std::string(80, 'k'));
  CHECK(Echoed("") == "");
}

TEST_CASE("echoed value: a 2 MB value is cut to 80 characters and its size in bytes") {
  CHECK(Echoed(std::string(2097152, 'k')) == std::string(80, 'k') + "\u2026 (2,097,152 bytes)");
  CHECK(Echoed(std::string(81, 'k')) == std::string(80, 'k') + "\u2026 (81 bytes)");
  CHECK(Echoed(std::string(1000, 'k')) == std::string(80, 'k') + "\u2026 (1,000 bytes)");
}

TEST_CASE("echoed value: the cut never splits a UTF-8 sequence") {
  std::string umlauts;
  for (int i = 0; i < 81; ++i) umlauts += "\u00e4";  // two bytes each
  std::string first80;
  for (int i = 0; i < 80; ++i) first80 += "\u00e4";
  CHECK(Echoed(umlauts) == first80 + "\u2026 (162 bytes)");
  std::string exactly80 = first80;
  CHECK(Echoed(exactly80) == exactly80);
}
