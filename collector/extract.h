#pragma once
// Extracting a ranked list from one stored page: a pure function from HTML
// text and compiled rules to items (docs/fetch.md, "Extraction rules").
// It never fetches; `fetch --replay` runs it again on stored snapshots.
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include "collector/selector.h"
#include "core/design.h"
#include "core/status.h"

namespace twinprobe {

// One field of each item: "SELECTOR" takes the text of the first match
// below the item, "SELECTOR @ATTR" its attribute; with no selector
// ("@data-id", or "" for text) the item itself is read.
struct FieldSpec {
  std::string name;
  std::string rule;       // as written
  bool self = false;      // no selector: read the item itself
  Selector selector;
  std::string attribute;  // "" = text
  bool optional = false;
};

struct ListingRules {
  bool has_list = false;
  Selector list;   // when has_list: items are searched inside its first match
  Selector items;
  std::vector<FieldSpec> fields;
  size_t key_index = 0;  // fields[key_index] is the item key
};

// Parses one field rule ("h3.title", "a.more @href", "@data-id", "").
Result<FieldSpec> ParseFieldRule(std::string_view rule);

// Compiles a source's rules. Errors point into the design file:
// "LABEL:LINE:COL: field 'title': bad selector: column 4: … — fix".
Result<ListingRules> CompileRules(const Source& source, const std::string& design_label);

struct ExtractedItem {
  int position = 0;  // 1-based rank on the page
  std::string key;
  std::vector<std::pair<std::string, std::string>> fields;  // in rule order; missing optional fields left out
};

struct Extraction {
  bool ok = true;
  std::string error;  // why it failed: no list, a field missing, not HTML text
  std::vector<ExtractedItem> items;
};

// Parses `html` with Gumbo and applies `rules`. A failure is a value, never
// an exception: a page that is not UTF-8 text, a list or items selector that
// matches nothing, a required field missing or an empty key. A list that is
// found but holds no items is a valid, empty listing.
Extraction ExtractListing(std::string_view html, const ListingRules& rules);

// The text of a node as a reader sees it: text below it with script, style
// and template left out, runs of white space collapsed to one space, block
// elements and <br> separating words, trimmed.
std::string NodeText(const GumboNode* node);

}  // namespace twinprobe
