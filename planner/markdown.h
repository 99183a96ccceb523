#pragma once
// The Markdown subset application templates are written in, turned into
// HTML and plain text for `render`.
//
// Blocks: "# " … "###### " headings; "- ", "* " or "+ " list items; "1. "
// numbered items; a line of "---" (or "***") is a rule; a blank line ends a
// paragraph or list; any other line continues the current paragraph.
// Inline: **strong**, *emphasis* or _emphasis_, and a backslash before one of
// \ * _ # - + . ` [ ] to write it literally. Everything else is text.
//
// Template values arrive as tokens "\x01N\x02" (planner/template_text.h)
// and are inserted after the markup is read, so a value is never read as
// markup; in HTML every text and value is escaped.
#include <string>
#include <string_view>
#include <vector>

namespace twinprobe {

// A whole HTML document (UTF-8) whose <title> is the first heading's text.
std::string MarkdownToHtml(std::string_view markdown, const std::vector<std::string>& values);

// Plain text: headings underlined ('=' for level 1, '-' for level 2), list
// items as "- " / "N. ", markup characters removed.
std::string MarkdownToText(std::string_view markdown, const std::vector<std::string>& values);

// Replaces the tokens by their values, backslash-escaping \ * _ ` [ ] (the
// characters Markdown would read as inline markup) for the .md output.
std::string MarkdownWithValues(std::string_view markdown, const std::vector<std::string>& values);

// & < > " ' as character references.
std::string HtmlEscape(std::string_view text);

}  // namespace twinprobe
