#include <catch2/catch.hpp>

#include "core/csv.h"

using namespace twinprobe;

TEST_CASE("csv: RFC 4180 quoting, embedded commas, quotes and newlines, CRLF, BOM") {
  std::string text = "\xEF\xBB\xBFname,note\r\n\"Brakke, Ltd\",\"said \"\"yes\"\"\"\r\nx,\"two\nlines\"\r\n";
  auto t = ReadCsvText(text, "t.csv");
  REQUIRE(t.ok());
  CHECK(t.value().header == std::vector<std::string>{"name", "note"});
  REQUIRE(t.value().rows.size() == 2);
  CHECK(t.value().rows[0].fields == std::vector<std::string>{"Brakke, Ltd", "said \"yes\""});
  CHECK(t.value().rows[1].fields == std::vector<std::string>{"x", "two\nlines"});
  CHECK(t.value().rows[1].line == 3);
}

TEST_CASE("csv: a bare quote inside an unquoted field is an error with line and column") {
  auto t = ReadCsvText("a,b\n1,x\"y\n", "t.csv");
  REQUIRE_FALSE(t.ok());
  CHECK(t.error().Message() ==
        "t.csv:2:3: a double quote inside an unquoted field \u2014 quote the whole field and write the quote as \"\"");
}

TEST_CASE("csv: a row with the wrong number of fields names its line") {
  auto t = ReadCsvText("a,b\n1,2\n3\n", "t.csv");
  REQUIRE_FALSE(t.ok());
  CHECK(t.error().where == "t.csv:3");
}

TEST_CASE("csv: an unterminated quote and invalid UTF-8 are refused") {
  CHECK_FALSE(ReadCsvText("a\n\"open\n", "t.csv").ok());
  auto bad = ReadCsvText("a\n\xff\xfe\n", "t.csv");
  REQUIRE_FALSE(bad.ok());
  CHECK(bad.error().what == "the field is not valid UTF-8");
}

TEST_CASE("csv: quoting for output round-trips") {
  std::string field = "a,\"b\"\nc";
  auto t = ReadCsvText("x\n" + CsvQuote(field) + "\n", "t.csv");
  REQUIRE(t.ok());
  CHECK(t.value().rows[0].fields[0] == field);
}
