// EscapeHtml: hostile strings come out as text, never as markup.
#include <catch2/catch.hpp>

#include <string>

#include "report/html_escape.h"
#include "report/html_inspect.h"

using twinprobe::EscapeHtml;
using twinprobe::UserText;
using twinprobe::testing::ParsedHtml;

namespace {

const std::string kReplacement = "\xEF\xBF\xBD";  // U+FFFD
const std::string kRlo = "\xE2\x80\xAE";          // U+202E RIGHT-TO-LEFT OVERRIDE

// What the browser shows for `s` put through UserText into a paragraph.
std::string RoundTrip(const std::string& s) {
  ParsedHtml page("<!DOCTYPE html><html><body><p id=\"x\">" + UserText(s) + "</p></body></html>");
  return ParsedHtml::TextOf(page.ElementById("x"));
}

}  // namespace

TEST_CASE("escape: the five markup characters become references") {
  CHECK(EscapeHtml("<script>alert(\"x\")</script>") == "&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt;");
  CHECK(EscapeHtml("Tom & Jerry's") == "Tom &amp; Jerry&#39;s");
  CHECK(EscapeHtml("&amp;") == "&amp;amp;");  // already-escaped text stays literal
}

TEST_CASE("escape: plain and non-ASCII text passes through unchanged") {
  CHECK(EscapeHtml("Orlinde \xE2\x80\x93 Tessvale") == "Orlinde \xE2\x80\x93 Tessvale");  // en dash
  CHECK(EscapeHtml("\xC3\x85sgard \xF0\x9F\x99\x82") == "\xC3\x85sgard \xF0\x9F\x99\x82");  // Å, emoji
  CHECK(EscapeHtml("a\tb\nc") == "a\tb\nc");
}

TEST_CASE("escape: NUL, control characters and invalid UTF-8 become U+FFFD") {
  CHECK(EscapeHtml(std::string("a\0b", 3)) == "a" + kReplacement + "b");
  CHECK(EscapeHtml("a\x1b[31mb") == "a" + kReplacement + "[31mb");
  CHECK(EscapeHtml("\xC2\x85") == kReplacement);           // C1 control NEL
  CHECK(EscapeHtml("x\xFFy") == "x" + kReplacement + "y");  // a byte that is never UTF-8
  CHECK(EscapeHtml("\xC0\xAF") == kReplacement + kReplacement);  // overlong '/'
  CHECK(EscapeHtml("\xED\xA0\x80") == kReplacement + kReplacement + kReplacement);  // a surrogate
  CHECK(EscapeHtml("\xE2\x80") == kReplacement + kReplacement);  // truncated sequence
}

TEST_CASE("escape: bidirectional controls are written as visible numeric references") {
  CHECK(EscapeHtml("abc" + kRlo + "def") == "abc&#x202E;def");
  CHECK(EscapeHtml("\xE2\x81\xA6x\xE2\x81\xA9") == "&#x2066;x&#x2069;");  // LRI … PDI
  CHECK(EscapeHtml("\xE2\x80\x8F") == "&#x200F;");                         // RIGHT-TO-LEFT MARK
}

TEST_CASE("escape: hostile strings parse back (Gumbo) as the same text, with no element made") {
  for (const std::string& hostile :
       {std::string("<script>alert(1)</script>"), std::string("\"><img src=x onerror=alert(1)>"),
        std::string("' onmouseover='x"), std::string("Tom & Jerry &amp; &lt;b&gt;"),
        std::string("invoice") + kRlo + "fdp.exe", std::string("</p><p id=\"y\">injected"),
        std::string("<!-- comment --><![CDATA[x]]>")}) {
    INFO(hostile);
    CHECK(RoundTrip(hostile) == hostile);
    ParsedHtml page("<p>" + UserText(hostile) + "</p>");
    CHECK(page.ElementsByTag("script").empty());
    CHECK(page.ElementsByTag("img").empty());
    CHECK(page.ElementById("y") == nullptr);
  }
}

TEST_CASE("escape: NUL comes back as U+FFFD, the only change a reader sees") {
  CHECK(RoundTrip(std::string("a\0<b>", 5)) == "a" + kReplacement + "<b>");
}

TEST_CASE("escape: attribute values cannot be broken out of") {
  ParsedHtml page("<p id=\"x\" title=\"" + EscapeHtml("\" onclick=\"alert(1)") + "\">t</p>");
  const auto* p = page.ElementById("x");
  REQUIRE(p != nullptr);
  CHECK(ParsedHtml::Attribute(p, "title") == "\" onclick=\"alert(1)");
  CHECK_FALSE(ParsedHtml::HasAttribute(p, "onclick"));
}

TEST_CASE("escape: UserText isolates the string in <bdi> so an override cannot reach the text after it") {
  CHECK(UserText("x" + kRlo) == "<bdi>x&#x202E;</bdi>");
  ParsedHtml page("<p id=\"x\">" + UserText("evil" + kRlo) + " tail</p>");
  CHECK(page.ElementsByTag("bdi").size() == 1);
  CHECK(ParsedHtml::TextOf(page.ElementsByTag("bdi").front()) == "evil" + kRlo);
}
