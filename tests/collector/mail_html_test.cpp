#include "collector/mail_html.h"

#include <catch2/catch.hpp>

using namespace twinprobe;

TEST_CASE("mail html: visible text with line breaks at blocks, styles and scripts left out") {
  std::string text = HtmlToText(
      "<html><head><title>hidden title</title><style>p{color:red}</style></head><body>"
      "<p>Dear   Kemi,</p><p>Please&nbsp;call us<br>on 0555 0199 &amp; ask for Ilsa.</p>"
      "<script>var invite = 1;</script><ul><li>one</li><li>two</li></ul><!-- a comment --></body></html>");
  CHECK(text ==
        "Dear Kemi,\nPlease\xc2\xa0"
        "call us\non 0555 0199 & ask for Ilsa.\none\ntwo");
}

TEST_CASE("mail html: blockquote lines carry the quote mark, nested ones twice") {
  std::string text =
      HtmlToText("<p>Yes.</p><blockquote><p>First</p><blockquote>inner</blockquote></blockquote><p>End</p>");
  CHECK(text == "Yes.\n> First\n> > inner\nEnd");
}

TEST_CASE("mail html: broken markup still gives its text") {
  CHECK(HtmlToText("<p>unclosed <b>bold <i>text") == "unclosed bold text");
  CHECK(HtmlToText("") == "");
  CHECK(HtmlToText("<pre>line 1\nline 2</pre>") == "line 1\nline 2");
}
