#pragma once
// What parsing one HTML page (a fetched listing, a mail part) may cost.
//
// Gumbo records every parse error with a copy of the stack of open elements;
// a page of N unclosed <div> gives about N errors of N pointers each, so
// 20,000 of them took 3.2 GB and 92 s. The errors are never read here, so
// only the first few are recorded (Gumbo keeps parsing past the cap). A tree
// nested deeper than any real page is refused after parsing, before any
// recursive walk over it.
#include <gumbo.h>

#include <utility>
#include <vector>

namespace twinprobe {

constexpr int kMaxHtmlParseErrors = 100;
// Real listing pages and mails nest a few dozen elements deep; 1,000 leaves
// ample room and keeps recursive walks far from the stack's limit.
constexpr int kMaxHtmlDepth = 1000;

inline GumboOptions BoundedGumboOptions() {
  GumboOptions o = kGumboDefaultOptions;
  o.max_errors = kMaxHtmlParseErrors;
  return o;
}

// The deepest element nesting below `root` (an iterative walk: safe at any depth).
inline int HtmlTreeDepth(const GumboNode* root) {
  int deepest = 0;
  std::vector<std::pair<const GumboNode*, int>> pending = {{root, 0}};
  while (!pending.empty()) {
    auto [node, depth] = pending.back();
    pending.pop_back();
    if (depth > deepest) deepest = depth;
    const GumboVector* kids = nullptr;
    if (node->type == GUMBO_NODE_ELEMENT || node->type == GUMBO_NODE_TEMPLATE) kids = &node->v.element.children;
    else if (node->type == GUMBO_NODE_DOCUMENT) kids = &node->v.document.children;
    if (!kids) continue;
    for (unsigned i = 0; i < kids->length; ++i) pending.emplace_back(static_cast<const GumboNode*>(kids->data[i]), depth + 1);
  }
  return deepest;
}

}  // namespace twinprobe
