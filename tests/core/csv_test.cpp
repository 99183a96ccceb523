// RFC 4180 edge-case battery for the streaming CSV reader (core/csv.h).
// Expectations follow RFC 4180 section 2 (rules 1-7) and RFC 3629 (UTF-8).
#include <catch2/catch.hpp>

#include <sstream>

#include "core/csv.h"

using namespace twinprobe;

namespace {

using Rows = std::vector<std::vector<std::string>>;

// Every record of `text` (header included) or the error message.
std::pair<Rows, std::string> ReadAll(const std::string& text) {
  std::istringstream in(text);
  CsvReader reader(in, "t.csv");
  CsvRecord rec;
  Rows rows;
  while (reader.Next(rec)) rows.push_back(rec.fields);
  return {rows, reader.error() ? reader.error()->Message() : ""};
}

std::vector<int64_t> Lines(const std::string& text) {
  std::istringstream in(text);
  CsvReader reader(in, "t.csv");
  CsvRecord rec;
  std::vector<int64_t> lines;
  while (reader.Next(rec)) lines.push_back(rec.line);
  return lines;
}

std::string ErrorOf(const std::string& text) { return ReadAll(text).second; }

}  // namespace

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

TEST_CASE("csv: LF, CRLF and a lone CR all end a record, the last record may lack a line break") {
  Rows expected = {{"a", "b"}, {"1", "2"}, {"3", "4"}};
  CHECK(ReadAll("a,b\n1,2\n3,4\n").first == expected);
  CHECK(ReadAll("a,b\r\n1,2\r\n3,4\r\n").first == expected);
  CHECK(ReadAll("a,b\r1,2\r3,4\r").first == expected);
  CHECK(ReadAll("a,b\n1,2\n3,4").first == expected);
  CHECK(ReadAll("a,b\r\n1,2\n3,4\r").first == expected);  // mixed
  CHECK(Lines("a,b\r1,2\r3,4") == std::vector<int64_t>{1, 2, 3});
}

TEST_CASE("csv: a quoted CRLF or lone CR inside a field is kept byte for byte") {
  CHECK(ReadAll("a\n\"x\r\ny\"\n").first == Rows{{"a"}, {"x\r\ny"}});
  CHECK(ReadAll("a\n\"x\ry\"\n").first == Rows{{"a"}, {"x\ry"}});
}

TEST_CASE("csv: empty fields, a trailing comma and a quoted empty field") {
  CHECK(ReadAll("a,b,c\n,,\n").first == Rows{{"a", "b", "c"}, {"", "", ""}});
  CHECK(ReadAll("a,b\nx,\n").first == Rows{{"a", "b"}, {"x", ""}});
  CHECK(ReadAll("a,b\n\"\",\"\"\n").first == Rows{{"a", "b"}, {"", ""}});
  CHECK(ReadAll("a\n\"\"\n").first == Rows{{"a"}, {""}});
}

TEST_CASE("csv: blank lines are skipped and later records keep their true line numbers") {
  CHECK(ReadAll("a\n\n1\r\n\r\n\n2\n").first == Rows{{"a"}, {"1"}, {"2"}});
  CHECK(Lines("a\n\n1\r\n\r\n\n2\n") == std::vector<int64_t>{1, 3, 6});
}

TEST_CASE("csv: a record after a multi-line quoted field starts on the right line") {
  CHECK(Lines("a,b\n\"one\ntwo\nthree\",x\ny,z\n") == std::vector<int64_t>{1, 2, 5});
  CHECK(ErrorOf("a,b\n\"one\ntwo\",x\ny,\"z\"q\n") ==
        "t.csv:4:6: text follows a closing quote \u2014 quote the whole field and double any quote inside it");
}

TEST_CASE("csv: spaces are data (RFC 4180: spaces are part of a field)") {
  CHECK(ReadAll("a,b\n a , b \n").first == Rows{{"a", "b"}, {" a ", " b "}});
  CHECK(ErrorOf("a\n \"x\"\n") ==
        "t.csv:2:2: a double quote inside an unquoted field \u2014 quote the whole field and write the quote as \"\"");
  CHECK(ErrorOf("a,b\n\"x\" ,y\n") ==
        "t.csv:2:4: text follows a closing quote \u2014 quote the whole field and double any quote inside it");
}

TEST_CASE("csv: a bare quote inside an unquoted field is an error with line and column") {
  auto t = ReadCsvText("a,b\n1,x\"y\n", "t.csv");
  REQUIRE_FALSE(t.ok());
  CHECK(t.error().Message() ==
        "t.csv:2:4: a double quote inside an unquoted field \u2014 quote the whole field and write the quote as \"\"");
}

TEST_CASE("csv: columns count characters, not bytes") {
  CHECK(ErrorOf("a,b\n\xC3\xA9\xE2\x82\xAC,x\"\n") ==
        "t.csv:2:5: a double quote inside an unquoted field \u2014 quote the whole field and write the quote as \"\"");
}

TEST_CASE("csv: an unterminated quote points at the opening quote") {
  CHECK(ErrorOf("a,b\nx,\"open\nstill open\n") ==
        "t.csv:2:3: a quoted field is never closed \u2014 add the closing double quote");
}

TEST_CASE("csv: a NUL byte is refused, quoted or not") {
  CHECK(ErrorOf(std::string("a\nx\0y\n", 6)) ==
        "t.csv:2:2: the field holds a NUL byte \u2014 remove the NUL byte; is this really a CSV file?");
  CHECK(ErrorOf(std::string("a\n\"x\0y\"\n", 8)) ==
        "t.csv:2:3: the field holds a NUL byte \u2014 remove the NUL byte; is this really a CSV file?");
}

TEST_CASE("csv: valid UTF-8 of every length passes, each kind of invalid UTF-8 is refused") {
  // 2-, 3- and 4-byte sequences: e acute, euro sign, U+1F600.
  CHECK(ReadAll("a\n\xC3\xA9\xE2\x82\xAC\xF0\x9F\x98\x80\n").first == Rows{{"a"}, {"\xC3\xA9\xE2\x82\xAC\xF0\x9F\x98\x80"}});
  const std::string bad_message =
      "t.csv:2:1: the field is not valid UTF-8 \u2014 save the file as UTF-8 CSV";
  CHECK(ErrorOf("a\n\x80\n") == bad_message);                 // lone continuation byte
  CHECK(ErrorOf("a\n\xC0\x80\n") == bad_message);             // overlong NUL
  CHECK(ErrorOf("a\n\xE0\x80\xAF\n") == bad_message);         // overlong '/'
  CHECK(ErrorOf("a\n\xED\xA0\x80\n") == bad_message);         // UTF-16 surrogate U+D800
  CHECK(ErrorOf("a\n\xF4\x90\x80\x80\n") == bad_message);     // above U+10FFFF
  CHECK(ErrorOf("a\n\xE2\x82\n") == bad_message);             // truncated sequence
  CHECK(ErrorOf("a\n\xE9t\xE9\n") == bad_message);            // Latin-1 "été"
  CHECK(ErrorOf("a\n\"ok\",\xFF\n").empty() == false);
}

TEST_CASE("csv: a UTF-8 byte-order mark is skipped only at the start, UTF-16 is named") {
  CHECK(ReadAll("\xEF\xBB\xBF" "a\n1\n").first == Rows{{"a"}, {"1"}});
  CHECK(ReadAll("\xEF\xBB\xBF\"a\"\n1\n").first == Rows{{"a"}, {"1"}});
  CHECK(ReadAll("a\n\xEF\xBB\xBFx\n").first == Rows{{"a"}, {"\xEF\xBB\xBFx"}});
  CHECK(ErrorOf("\xFF\xFE" "a\0\n\0") ==
        "t.csv:1:1: the file is UTF-16 (it starts with a UTF-16 byte-order mark) \u2014 save it as UTF-8 CSV (in a "
        "spreadsheet: CSV UTF-8)");
  CHECK(ErrorOf("\xEF\xBB" "a\n") == "t.csv:1:1: the file starts with bytes that are not UTF-8 \u2014 save it as UTF-8 CSV");
}

TEST_CASE("csv: header problems and empty files are named") {
  CHECK(ReadCsvText("", "t.csv").error().Message() == "t.csv:1: the file is empty \u2014 the first line must name the columns");
  CHECK(ReadCsvText("\xEF\xBB\xBF\r\n\r\n", "t.csv").error().what == "the file is empty");
  CHECK(ReadCsvText("a,,c\n", "t.csv").error().Message() == "t.csv:1: column 2 has no name \u2014 name every column");
  CHECK(ReadCsvText("a,b,a\n", "t.csv").error().Message() == "t.csv:1: the column 'a' appears twice \u2014 rename one of them");
  auto header_only = ReadCsvText("a,b\r\n", "t.csv");
  REQUIRE(header_only.ok());
  CHECK(header_only.value().rows.empty());
}

TEST_CASE("csv: a row with the wrong number of fields names its line") {
  auto t = ReadCsvText("a,b\n1,2\n3\n", "t.csv");
  REQUIRE_FALSE(t.ok());
  CHECK(t.error().Message() == "t.csv:3: the row has 1 field but the header has 2 \u2014 check for a missing or extra "
                               "comma, or quote fields that contain commas");
  CHECK(ReadCsvText("a,b\n1,2,3\n", "t.csv").error().what == "the row has 3 fields but the header has 2");
}

TEST_CASE("csv: records and line breaks that straddle the read buffer are read whole") {
  // The reader fills 65,536 bytes at a time. Put a CRLF's CR as the last byte
  // of the first chunk, and a doubled quote across the second boundary.
  std::string text = "a\r\n" + std::string(65532, 'x') + "\r\n";
  REQUIRE(text[65535] == '\r');
  std::string quoted = "\"" + std::string(65536 * 2 - text.size() - 2, 'q') + "\"\"z\"\n";
  text += quoted;
  REQUIRE(text[65536 * 2 - 1] == '"');
  auto [rows, error] = ReadAll(text);
  REQUIRE(error.empty());
  REQUIRE(rows.size() == 3);
  CHECK(rows[1][0].size() == 65532);
  CHECK(rows[2][0] == std::string(65536 * 2 - (3 + 65532 + 2) - 2, 'q') + "\"z");
  CHECK(Lines(text) == std::vector<int64_t>{1, 2, 3});
}

TEST_CASE("csv: many records stream through with a running byte count") {
  std::string text = "vacancy,arm,outcome\n";
  for (int i = 0; i < 20000; ++i) text += "V" + std::to_string(i) + ",\"a, b\",1\r\n";
  std::istringstream in(text);
  CsvReader reader(in, "big.csv");
  CsvRecord rec;
  int64_t n = 0;
  while (reader.Next(rec)) {
    ++n;
    if (n == 2) CHECK(rec.fields == std::vector<std::string>{"V0", "a, b", "1"});
  }
  CHECK_FALSE(reader.error());
  CHECK(n == 20001);
  CHECK(reader.bytes_consumed() == static_cast<int64_t>(text.size()));
}

TEST_CASE("csv: quoting for output round-trips every awkward field") {
  std::vector<std::string> fields = {"a,\"b\"\nc", "", " lead", "trail ", "\r\n", "\"", "plain", "\xC3\xA9t\xC3\xA9"};
  std::string text = "x\n";
  for (const auto& f : fields) text += CsvQuote(f) + "\r\n";
  auto t = ReadCsvText(text, "t.csv");
  REQUIRE(t.ok());
  REQUIRE(t.value().rows.size() == fields.size() - 1);  // the empty field is a blank line, skipped
  size_t k = 0;
  for (const auto& f : fields) {
    if (f.empty()) continue;
    CHECK(t.value().rows[k++].fields[0] == f);
  }
  CHECK(CsvQuote("plain") == "plain");
  CHECK(CsvQuote(" lead") == "\" lead\"");
}

namespace {

// Sets the process's dialect for one test and restores the default after.
struct DialectScope {
  explicit DialectScope(CsvDialect d) { SetCsvDialect(d); }
  ~DialectScope() { SetCsvDialect({}); }
};

std::string HeaderError(const std::string& text) {
  std::istringstream in(text);
  CsvReader reader(in, "t.csv");
  auto h = ReadCsvHeader(reader);
  return h.ok() ? "" : h.error().Message();
}

}  // namespace

TEST_CASE("issue 17: a semicolon-separated header is refused, naming the separator") {
  CHECK(HeaderError("probe;code;received_at\nP00001;invitation;2027-04-01\n") ==
        "t.csv:1: the file looks semicolon-separated \u2014 save it as CSV with commas");
  DialectScope importing({',', true});
  CHECK(HeaderError("probe;code;received_at\nP00001;invitation;2027-04-01\n") ==
        "t.csv:1: the file looks semicolon-separated \u2014 save it as CSV with commas, or pass --separator ';'");
}

TEST_CASE("issue 17: a tab-separated header is refused, naming the separator") {
  DialectScope importing({',', true});
  CHECK(HeaderError("probe\tcode\treceived_at\n") ==
        "t.csv:1: the file looks tab-separated \u2014 save it as CSV with commas, or pass --separator tab");
  // A comma-separated header with one column is still a header.
  CHECK(HeaderError("probe\nP00001\n").empty());
}

TEST_CASE("csv: with the semicolon separator a semicolon file reads like its comma twin, quotes and commas kept") {
  DialectScope semicolons({';', true});
  auto [rows, err] = ReadAll("probe;note\r\nP00001;\"a;b\"\r\nP00002;3,5 days\r\n");
  CHECK(err.empty());
  CHECK(rows == Rows{{"probe", "note"}, {"P00001", "a;b"}, {"P00002", "3,5 days"}});
}

TEST_CASE("csv: with separator tab a tab file reads, and text after a closing quote is still refused") {
  DialectScope tabs({'\t', true});
  auto [rows, err] = ReadAll("probe\tcode\nP00001\tinvitation\n");
  CHECK(err.empty());
  CHECK(rows == Rows{{"probe", "code"}, {"P00001", "invitation"}});
  CHECK(ReadAll("a\tb\n\"x\",y\tz\n").second ==
        "t.csv:2:4: text follows a closing quote \u2014 quote the whole field and double any quote inside it");
}

TEST_CASE("csv: --separator spellings") {
  CHECK(ParseCsvSeparator(",") == ',');
  CHECK(ParseCsvSeparator(";") == ';');
  CHECK(ParseCsvSeparator("|") == '|');
  CHECK(ParseCsvSeparator("tab") == '\t');
  CHECK(ParseCsvSeparator("\t") == '\t');
  CHECK(ParseCsvSeparator("\\t") == '\t');
  CHECK_FALSE(ParseCsvSeparator("semicolon"));
  CHECK_FALSE(ParseCsvSeparator(";;"));
}
