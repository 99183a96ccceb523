#include "report/html_parts.h"

#include "report/html_escape.h"

namespace twinprobe::html {

std::string ParaHtml(const std::string& html, const char* css_class) {
  return std::string("<p") + (css_class ? std::string(" class=\"") + css_class + "\"" : "") + ">" + html + "</p>";
}

std::string Para(const std::string& text, const char* css_class) { return ParaHtml(EscapeHtml(text), css_class); }

std::string Heading(const std::string& text) { return "<h3>" + EscapeHtml(text) + "</h3>"; }

std::string Facts(const std::vector<std::pair<std::string, std::string>>& rows) {
  std::string o = "<dl class=\"facts\">";
  for (const auto& [term, value] : rows) o += "<dt>" + EscapeHtml(term) + "</dt><dd>" + UserText(value) + "</dd>";
  return o + "</dl>";
}

std::string Figure(const std::string& id, const std::string& caption, const std::string& svg,
                   const std::string& table_html, bool wide) {
  return "<figure id=\"" + EscapeHtml(id) + "\"><div class=\"figure-body" + (wide ? " wide" : "") +
         "\"><div class=\"plot\">" + svg +
         "</div><div class=\"figure-table\">" + table_html + "</div></div><figcaption>" + EscapeHtml(caption) +
         "</figcaption></figure>";
}

std::string Absent(const std::string& text) { return Para(text, "absent"); }

}  // namespace twinprobe::html
