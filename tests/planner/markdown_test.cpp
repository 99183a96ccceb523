#include <catch2/catch.hpp>

#include "planner/markdown.h"

using namespace twinprobe;

TEST_CASE("markdown: values are HTML-escaped and never read as markup") {
  std::vector<std::string> values = {"<script>alert('x')</script> & **Co**"};
  std::string html = MarkdownToHtml("# \x01" "0\x02\n\nHello *there*.\n", values);
  CHECK(html.find("<h1>&lt;script&gt;alert(&#39;x&#39;)&lt;/script&gt; &amp; **Co**</h1>") != std::string::npos);
  CHECK(html.find("<title>&lt;script&gt;alert(&#39;x&#39;)&lt;/script&gt; &amp; **Co**</title>") != std::string::npos);
  CHECK(html.find("<p>Hello <em>there</em>.</p>") != std::string::npos);
  CHECK(html.find("<script>") == std::string::npos);
}

TEST_CASE("markdown: the block subset becomes HTML") {
  std::string md = "# Title\n\nline one\nline two\n\n## Work\n- a **b**\n- c\n\n1. first\n2. second\n\n---\ntext \\*not em\\*\n";
  std::string html = MarkdownToHtml(md, {});
  CHECK(html ==
        "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n<title>Title</title>\n</head>\n<body>\n"
        "<h1>Title</h1>\n<p>line one\nline two</p>\n<h2>Work</h2>\n<ul>\n<li>a <strong>b</strong></li>\n<li>c</li>\n"
        "</ul>\n<ol>\n<li>first</li>\n<li>second</li>\n</ol>\n<hr>\n<p>text *not em*</p>\n</body>\n</html>\n");
}

TEST_CASE("markdown: plain text underlines headings by characters, not bytes") {
  std::vector<std::string> values = {"Zoë Ångström"};
  std::string text = MarkdownToText("# \x01" "0\x02\n\n## Work\n- 2023–2027 *lead*\n- more\n\nBye.\n", values);
  CHECK(text == "Zoë Ångström\n============\n\nWork\n----\n\n- 2023–2027 lead\n- more\n\nBye.\n");
}

TEST_CASE("markdown: snake_case stays text and the .md output escapes inline markup in values") {
  CHECK(MarkdownToText("use snake_case_names here\n", {}) == "use snake_case_names here\n");
  CHECK(MarkdownWithValues("Name: \x01" "0\x02\n", {"a_b *c* [d]"}) == "Name: a\\_b \\*c\\* \\[d\\]\n");
}
