#pragma once
// The desk's page frame and form parts. Every value that comes from the
// store, the design or a request goes through the report's escaping
// (report/html_escape.h); the pages load nothing from outside (the report's
// stylesheet is inline) and need no JavaScript.
#include <string>
#include <vector>

namespace twinprobe {

struct PageFrame {
  std::string title;        // plain text
  std::string study_title;  // plain text
  std::string active;       // nav item: today | record | mail | declines | study | ""
  std::string member;       // signed-in member ("" before sign-in)
  std::string csrf;         // for the sign-out form
};

// A whole HTML document around `body_html` (already HTML).
std::string RenderPage(const PageFrame& frame, const std::string& body_html);

// <input type=hidden name=csrf>.
std::string CsrfInput(const std::string& token);

struct FormField {
  std::string id;     // also the form name
  std::string label;  // plain text
  std::string value;  // plain text
  std::string hint;   // plain text, shown under the label ("" for none)
  std::string error;  // the refusal for this field, plain text ("" for none)
  std::string type = "text";
  std::string autocomplete = "off";
  bool required = false;
};
// A labelled input; an error is shown beside it and tied to it with
// aria-describedby, and the field is marked aria-invalid.
std::string InputField(const FormField& f);

// A labelled <select>; `options` are values shown as themselves, "" shows
// `empty_label`.
std::string SelectField(const FormField& f, const std::vector<std::string>& options, const std::string& empty_label);

// A labelled <textarea>.
std::string TextAreaField(const FormField& f);

// A message box: kind "ok" (what landed) or "error" (what was refused).
std::string NoticeBox(const std::string& kind, const std::string& text);

// Percent-encodes a query value.
std::string UrlEncode(const std::string& text);

}  // namespace twinprobe
