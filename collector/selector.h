#pragma once
// A small selector language for picking elements out of an HTML page parsed
// by Gumbo (our own subset of CSS selector syntax; docs/fetch.md, "Selectors").
//
//   selector   = compound *( combinator compound )
//   combinator = whitespace        (descendant: anywhere below)
//              / ">"               (child: directly below)
//   compound   = [ tag / "*" ] *( "." class / "#" id / "[" attr "]"
//                                 / "[" attr "=" value "]" )
//   value      = name / '"' text '"' / "'" text "'"
//
// Tags and attribute names compare case-insensitively (HTML is parsed to
// lower case), classes, ids and values exactly. A class test matches one of
// the whitespace-separated words of the class attribute.
#include <string>
#include <string_view>
#include <vector>

#include <gumbo.h>

#include "core/status.h"

namespace twinprobe {

struct SelectorStep {
  bool child_of_previous = false;  // ">" before this step (else descendant)
  GumboTag tag = GUMBO_TAG_UNKNOWN;
  std::string tag_name;            // lower case; "" means any tag
  std::vector<std::string> classes;
  std::string id;                  // "" means no id test
  struct Attribute {
    std::string name;              // lower case
    bool has_value = false;
    std::string value;
  };
  std::vector<Attribute> attributes;
};

struct Selector {
  std::vector<SelectorStep> steps;  // left to right
  std::string text;                 // as written
};

// Parses `text`. Fails with a message naming the column (1-based) of the
// problem, e.g. "column 4: '.' must be followed by a class name".
Result<Selector> ParseSelector(std::string_view text);

// True if `element` matches the selector, with ancestors looked up no
// higher than `scope` (the scope itself may match a step).
bool SelectorMatches(const Selector& selector, const GumboNode* element, const GumboNode* scope);

// Every element below `scope` (not the scope itself) that matches, in
// document order, appended to `out`.
void SelectAll(const Selector& selector, const GumboNode* scope, std::vector<const GumboNode*>& out);

// The first such element in document order, or null.
const GumboNode* SelectFirst(const Selector& selector, const GumboNode* scope);

}  // namespace twinprobe
