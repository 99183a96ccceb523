#pragma once
// Turning an HTML mail part into plain text with Gumbo (an HTML5 parser), so
// phrase rules and the review read what a person would see.
#include <string>
#include <string_view>

namespace twinprobe {

// The visible text of `html` (UTF-8): <script>, <style>, <head> and comments
// are skipped; entities are decoded; runs of blanks become one space; block
// elements (p, div, li, tr, h1–h6 …) and <br> end a line; every line inside
// <blockquote> starts with "> " per level, so a quoted reply is recognised
// the same way as in plain text. Never fails (Gumbo repairs any input).
std::string HtmlToText(std::string_view html);

}  // namespace twinprobe
