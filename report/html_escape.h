#pragma once
// The one escaping function for everything a user or a data file supplies
// (study titles, arm and stratum labels, employer names, notes) on its way
// into the HTML report, in element text and in attribute values alike.
//
// Output is always valid UTF-8 and always inert markup:
// - & < > " ' become &amp; &lt; &gt; &quot; &#39;
// - NUL, other C0/C1 control characters (except tab, line feed, carriage
//   return) and invalid UTF-8 become U+FFFD (the replacement character), so
//   a parser never meets a character the HTML spec treats as an error;
// - Unicode bidirectional controls (U+061C, U+200E, U+200F, U+202A–U+202E,
//   U+2066–U+2069) are written as numeric references (&#x202E;): they stay
//   in the text, visibly encoded in the source, and the report isolates every
//   user string (<bdi> in HTML, its own <text> element in SVG) so an override
//   cannot reorder the words around it.
#include <string>
#include <string_view>

namespace twinprobe {

std::string EscapeHtml(std::string_view text);

// A user string as isolated inline HTML: <bdi>escaped text</bdi>.
std::string UserText(std::string_view text);

}  // namespace twinprobe
