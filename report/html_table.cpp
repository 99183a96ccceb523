#include "report/html_table.h"

#include "report/html_escape.h"

namespace twinprobe {

TableCell Cell(std::string text) { return TableCell{std::move(text), false, "", false}; }
TableCell NumCell(std::string text) { return TableCell{std::move(text), true, "", false}; }
TableCell HeadCell(std::string text) { return TableCell{std::move(text), false, "", true}; }
TableCell HtmlCell(std::string html, bool numeric) { return TableCell{"", numeric, std::move(html), false}; }

std::string RenderTable(const HtmlTable& t) {
  std::string o = "<table class=\"data";
  if (!t.css_class.empty()) o += " " + EscapeHtml(t.css_class);
  o += "\">";
  if (!t.caption.empty()) o += "<caption>" + UserText(t.caption) + "</caption>";
  if (!t.headers.empty()) {
    o += "<thead><tr>";
    for (const auto& h : t.headers) o += "<th scope=\"col\">" + UserText(h) + "</th>";
    o += "</tr></thead>";
  }
  o += "<tbody>";
  for (const auto& row : t.rows) {
    o += "<tr>";
    for (const auto& c : row) {
      const char* tag = c.row_header ? "th" : "td";
      o += std::string("<") + tag + (c.row_header ? " scope=\"row\"" : "") + (c.numeric ? " class=\"num\"" : "") + ">";
      o += !c.html.empty() ? c.html : c.numeric ? EscapeHtml(c.text) : UserText(c.text);
      o += std::string("</") + tag + ">";
    }
    o += "</tr>";
  }
  o += "</tbody></table>";
  return o;
}

}  // namespace twinprobe
