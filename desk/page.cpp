#include "desk/page.h"

#include <cctype>

#include "report/html_escape.h"
#include "report/html_style.h"

namespace twinprobe {
namespace {

// Additions to the report's stylesheet for forms, navigation and narrow
// screens. The report is read on a desk; the desk is also used on a phone,
// so tables scroll sideways inside their box instead of widening the page.
const char* kDeskCss = R"CSS(
body { padding: 16px 28px 40px; }
header.desk { display: flex; flex-wrap: wrap; align-items: center; gap: 6px 18px; border-bottom: 3px solid var(--accent);
  padding-bottom: 8px; margin-bottom: 12px; }
header.desk .study { font-weight: bold; flex: 1 1 260px; }
nav.desk ul { list-style: none; display: flex; flex-wrap: wrap; gap: 4px 6px; margin: 0; padding: 0; }
nav.desk a { display: inline-block; padding: 6px 10px; border: 1px solid var(--rule); color: var(--accent); text-decoration: none; }
nav.desk a[aria-current="page"] { background: var(--accent); color: #fff; border-color: var(--accent); }
.who { display: flex; align-items: center; gap: 8px; font-size: 14px; }
form.inline { display: inline; }
.field { margin: 10px 0; }
.field label { display: block; font-weight: bold; }
.field .hint { display: block; color: var(--muted); font-size: 13px; }
.field input, .field select, .field textarea { font: inherit; padding: 6px 8px; border: 1px solid #888; width: 100%; max-width: 28em; }
.field textarea { min-height: 5em; }
.field .refused { display: block; color: #a03000; font-weight: bold; margin-top: 4px; }
.field input[aria-invalid="true"], .field select[aria-invalid="true"], .field textarea[aria-invalid="true"] { border: 2px solid var(--warn); }
button { font: inherit; padding: 7px 16px; border: 1px solid var(--accent); background: var(--accent); color: #fff; cursor: pointer; }
button.quiet { background: #fff; color: var(--accent); }
a:focus, button:focus, input:focus, select:focus, textarea:focus { outline: 3px solid #E69F00; outline-offset: 1px; }
.notice { padding: 8px 12px; margin: 10px 0; max-width: 78ch; }
.notice.ok { border-left: 5px solid #009E73; background: #eef8f4; }
.notice.error { border-left: 5px solid var(--warn); background: #fff4ec; }
/* The skip link (WCAG 2.1, success criterion 2.4.1 "Bypass Blocks"): the
   first stop of the Tab key, shown only while it has the focus. */
a.skip { position: absolute; left: -10000px; top: 8px; background: #fff; padding: 6px 10px; z-index: 10; }
a.skip:focus { left: 8px; }
.visually-hidden { position: absolute; width: 1px; height: 1px; overflow: hidden; clip: rect(0 0 0 0); white-space: nowrap; }
/* position: relative keeps the visually hidden labels inside the scrolling
   box; without it they widened a 360-pixel page to 880 pixels. */
.scroll { overflow-x: auto; max-width: 100%; position: relative; }
.scroll table.data td { white-space: nowrap; }
.scroll table.data td.wrap, .scroll table.data td.pre { white-space: normal; min-width: 16em; }
table.data td.check { width: 2.5em; }
.superseded td { color: var(--muted); }
.superseded td.struck { text-decoration: line-through; }
.tag { display: inline-block; font-size: 12px; padding: 0 6px; border: 1px solid var(--rule); border-radius: 3px; }
.tag.current { border-color: #009E73; color: #00694d; }
.tag.overdue { border-color: var(--warn); color: #a03000; font-weight: bold; }
.pre { white-space: pre-wrap; overflow-wrap: break-word; }
.row { display: flex; flex-wrap: wrap; gap: 0 18px; align-items: flex-start; }
.row .field { flex: 0 1 20em; }
.row .field.action { flex: 0 0 auto; align-self: flex-end; }
@media (max-width: 600px) {
  body { padding: 10px 10px 30px; font-size: 15px; }
  h1 { font-size: 22px; }
  h2 { font-size: 18px; margin-top: 24px; }
  .keyfig { flex-basis: 40%; padding: 8px 10px; }
  .row .field { flex: 1 1 100%; }
  .keyfig .big { font-size: 24px; }
  table.data { font-size: 13px; }
  table.data th, table.data td { padding: 4px 6px; }
}
)CSS";

std::string Describedby(const FormField& f) {
  std::string ids;
  if (!f.hint.empty()) ids += f.id + "-hint";
  if (!f.error.empty()) ids += (ids.empty() ? "" : " ") + f.id + "-refused";
  if (ids.empty()) return "";
  return " aria-describedby=\"" + ids + "\"" + (f.error.empty() ? "" : " aria-invalid=\"true\"");
}

std::string LabelAndHint(const FormField& f) {
  std::string h = "<label for=\"" + EscapeHtml(f.id) + "\">" + EscapeHtml(f.label) + "</label>";
  if (!f.hint.empty())
    h += "<span class=\"hint\" id=\"" + EscapeHtml(f.id) + "-hint\">" + EscapeHtml(f.hint) + "</span>";
  return h;
}

std::string Refusal(const FormField& f) {
  if (f.error.empty()) return "";
  return "<span class=\"refused\" id=\"" + EscapeHtml(f.id) + "-refused\" role=\"alert\">" + UserText(f.error) +
         "</span>";
}

}  // namespace

std::string RenderPage(const PageFrame& frame, const std::string& body_html) {
  std::string h =
      "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n"
      "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n"
      "<title>" +
      EscapeHtml(frame.title) + " \xe2\x80\x94 desk</title>\n<style>" + ReportCss() + kDeskCss +
      "</style>\n</head>\n<body>\n<a class=\"skip\" href=\"#main\">Skip to the page's content</a>\n<header class=\"desk\"><span class=\"study\">" + UserText(frame.study_title) +
      "</span>";
  if (!frame.member.empty()) {
    h += "<span class=\"who\">Signed in as&nbsp;<strong>" + UserText(frame.member) +
         "</strong><form class=\"inline\" method=\"post\" action=\"/signout\">" + CsrfInput(frame.csrf) +
         "<button class=\"quiet\" type=\"submit\">Sign out</button></form></span>";
  }
  h += "</header>\n";
  if (!frame.member.empty()) {
    static const std::pair<const char*, const char*> kNav[] = {
        {"today", "Today"}, {"record", "Record"}, {"mail", "Mail"}, {"declines", "Declines"}, {"study", "Study"}};
    h += "<nav class=\"desk\" aria-label=\"Desk\"><ul>";
    for (const auto& [key, label] : kNav)
      h += std::string("<li><a href=\"/") + key + "\"" + (frame.active == key ? " aria-current=\"page\"" : "") + ">" +
           label + "</a></li>";
    h += "</ul></nav>\n";
  }
  // tabindex -1: the skip link moves the keyboard focus here, not only the view.
  h += "<main id=\"main\" tabindex=\"-1\">\n<h1>" + EscapeHtml(frame.title) + "</h1>\n" + body_html + "</main>\n</body>\n</html>\n";
  return h;
}

std::string CsrfInput(const std::string& token) {
  return "<input type=\"hidden\" name=\"csrf\" value=\"" + EscapeHtml(token) + "\">";
}

std::string InputField(const FormField& f) {
  return "<div class=\"field\">" + LabelAndHint(f) + "<input type=\"" + EscapeHtml(f.type) + "\" id=\"" +
         EscapeHtml(f.id) + "\" name=\"" + EscapeHtml(f.id) + "\" value=\"" + EscapeHtml(f.value) +
         "\" autocomplete=\"" + EscapeHtml(f.autocomplete) + "\"" + (f.required ? " required" : "") + Describedby(f) +
         ">" + Refusal(f) + "</div>";
}

std::string SelectField(const FormField& f, const std::vector<std::string>& options, const std::string& empty_label) {
  std::string h = "<div class=\"field\">" + LabelAndHint(f) + "<select id=\"" + EscapeHtml(f.id) + "\" name=\"" +
                  EscapeHtml(f.id) + "\"" + (f.required ? " required" : "") + Describedby(f) + ">";
  if (!empty_label.empty())
    h += "<option value=\"\"" + std::string(f.value.empty() ? " selected" : "") + ">" + EscapeHtml(empty_label) +
         "</option>";
  for (const auto& o : options)
    h += "<option value=\"" + EscapeHtml(o) + "\"" + (o == f.value ? " selected" : "") + ">" + EscapeHtml(o) +
         "</option>";
  return h + "</select>" + Refusal(f) + "</div>";
}

std::string TextAreaField(const FormField& f) {
  return "<div class=\"field\">" + LabelAndHint(f) + "<textarea id=\"" + EscapeHtml(f.id) + "\" name=\"" +
         EscapeHtml(f.id) + "\"" + Describedby(f) + ">" + EscapeHtml(f.value) + "</textarea>" + Refusal(f) + "</div>";
}

std::string NoticeBox(const std::string& kind, const std::string& text) {
  return "<div class=\"notice " + EscapeHtml(kind) + "\" role=\"" + (kind == "error" ? "alert" : "status") + "\">" +
         UserText(text) + "</div>";
}

std::string UrlEncode(const std::string& text) {
  static const char* hex = "0123456789ABCDEF";
  std::string out;
  for (unsigned char c : text) {
    if (std::isalnum(c) || c == '-' || c == '_' || c == '.' || c == '~')
      out += static_cast<char>(c);
    else {
      out += '%';
      out += hex[c >> 4];
      out += hex[c & 15];
    }
  }
  return out;
}

}  // namespace twinprobe
