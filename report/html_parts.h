#pragma once
// Small building blocks the report's HTML sections share (internal to
// report/). Functions taking "text" escape it; functions taking "html" trust
// the caller to have escaped every user string in it.
#include <string>
#include <utility>
#include <vector>

namespace twinprobe::html {

// <p>text</p>, escaped.
std::string Para(const std::string& text, const char* css_class = nullptr);
// <p>html</p>.
std::string ParaHtml(const std::string& html, const char* css_class = nullptr);
// <h3>text</h3>.
std::string Heading(const std::string& text);
// A definition list of (term, value) pairs, both plain text.
std::string Facts(const std::vector<std::pair<std::string, std::string>>& rows);
// A chart with its caption and its data table beside it:
// <figure id> <div class="figure-body"><div class="plot">SVG</div><div class="table">TABLE</div></div>
// <figcaption>caption</figcaption></figure>. `svg` and `table_html` are markup.
// `wide` gives the chart the full width (charts with their own value
// columns, such as the forest chart); the table then sits below it.
std::string Figure(const std::string& id, const std::string& caption, const std::string& svg,
                   const std::string& table_html, bool wide = false);
// <p class="absent">: a part of the report that has no data yet, and why.
std::string Absent(const std::string& text);

}  // namespace twinprobe::html
