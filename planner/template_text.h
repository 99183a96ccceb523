#pragma once
// Application templates: text files in the study folder (Markdown, see
// planner/markdown.h) with placeholders.
//
//   {{field}}                 the value of a template field (a profile's or the
//                             vacancy's, see docs/render.md); spaces inside the
//                             braces are allowed: {{ full_name }}
//   {{include parts/x.md}}    the text of another file of the study folder,
//                             path relative to the study folder
//
// A template can only read files inside the study folder: an absolute path,
// a '..' component, or a path (or symbolic link) that resolves outside the
// folder is refused, as is an include cycle or nesting deeper than 8.
// Control characters other than tab and line ends are refused too.
#include <map>
#include <set>
#include <string>
#include <vector>

#include "core/status.h"

namespace twinprobe {

struct TemplateSegment {
  bool is_field = false;
  std::string text;  // literal text, or the field's name
  std::string file;  // where it was written (the template or an included file)
  int line = 0;      // 1-based, of the opening braces for a field
  int column = 0;
};

struct TemplateDoc {
  std::string path;  // relative to the study folder, as the design names it
  std::vector<TemplateSegment> segments;  // includes already resolved

  // Every field the template uses, with the first place it appears.
  std::map<std::string, const TemplateSegment*> FieldUses() const;
};

// Reads the template `rel_path` of the study folder `study_dir`, resolving
// includes. Errors name FILE:LINE:COL (FILE as the study folder + path).
Result<TemplateDoc> LoadTemplate(const std::string& study_dir, const std::string& rel_path);

// Fills the template. `escape` is applied to every value (identity for plain
// substitution). A field missing from `fields` is an error at its place.
using ValueEscaper = std::string (*)(const std::string&);
Result<std::string> FillTemplate(const TemplateDoc& doc, const std::map<std::string, std::string>& fields,
                                 ValueEscaper escape = nullptr);

// Fills the template with tokens "\x01N\x02" in place of the fields, N the
// index of the value in `values` (filled in the order met), so a markup
// converter can treat values as opaque (planner/markdown.h).
Result<std::string> FillTemplateWithTokens(const TemplateDoc& doc, const std::map<std::string, std::string>& fields,
                                           std::vector<std::string>& values);

}  // namespace twinprobe
