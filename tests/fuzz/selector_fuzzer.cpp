// Fuzzes the selector language (collector/selector.h) and field rules
// (collector/extract.h, ParseFieldRule). Any text gives a Selector or a
// refusal naming a column inside or just past the text. A parsed selector,
// run on a fixed page from two scopes, returns distinct elements below the
// scope in document order, each of which matches; SelectFirst agrees with
// SelectAll.
#include <gumbo.h>

#include <cstddef>
#include <cstdint>
#include <map>
#include <string>
#include <string_view>
#include <vector>

#include "collector/extract.h"
#include "collector/selector.h"
#include "tests/fuzz/fuzz_check.h"

using namespace twinprobe;

namespace {

// A page shaped like the fixture job board (tests/fixtures/listing/server.py),
// with a custom element, a template and nesting for the combinators.
const char kPage[] =
    "<!DOCTYPE html><html lang=en><head><title>Candidates</title></head><body>"
    "<header><p>Veldmark Jobs Exchange (invented)</p></header><main>"
    "<ol id=results class='ranked list'>"
    "<li class='candidate card' data-candidate=vjx-2301><h3 class=name>Brisa Morunde</h3>"
    "<span class=town>Orlinde</span><span class=salary>2450 VMK</span>"
    "<a class=profile href=/c/vjx-2301>Profile</a></li>"
    "<li class=candidate data-candidate=vjx-3251><div><h3 class='name top'>Fenna Saralon</h3></div>"
    "<span class=town>Tessvale</span><a class=profile href=/c/vjx-3251 data-x=\"a b\">Profile</a></li>"
    "<li data-candidate=''><x-card lang=vm>Custom</x-card><template><p class=t>inside</p></template></li>"
    "</ol><span class=name>Outside</span></main>"
    "<footer><p id=note>Every name on this board is invented.</p></footer></body></html>";

struct Page {
  GumboOutput* out = gumbo_parse_with_options(&kGumboDefaultOptions, kPage, sizeof kPage - 1);
  std::map<const GumboNode*, size_t> order;  // document order of every node
  const GumboNode* list = nullptr;           // the <ol>
  Page() {
    Number(out->document);
    auto sel = ParseSelector("ol#results");
    list = SelectFirst(sel.value(), out->document);
  }
  void Number(const GumboNode* n) {
    order.emplace(n, order.size());
    const GumboVector* kids = n->type == GUMBO_NODE_DOCUMENT ? &n->v.document.children
                              : (n->type == GUMBO_NODE_ELEMENT || n->type == GUMBO_NODE_TEMPLATE) ? &n->v.element.children
                                                                                               : nullptr;
    if (!kids) return;
    for (unsigned i = 0; i < kids->length; ++i) Number(static_cast<const GumboNode*>(kids->data[i]));
  }
};

bool IsBelow(const GumboNode* n, const GumboNode* scope) {
  for (const GumboNode* up = n->parent; up; up = up->parent)
    if (up == scope) return true;
  return false;
}

void CheckRun(const Page& page, const Selector& sel, const GumboNode* scope) {
  std::vector<const GumboNode*> all;
  SelectAll(sel, scope, all);
  size_t last = 0;
  for (size_t i = 0; i < all.size(); ++i) {
    const GumboNode* n = all[i];
    FUZZ_CHECK(n->type == GUMBO_NODE_ELEMENT || n->type == GUMBO_NODE_TEMPLATE);
    FUZZ_CHECK(n != scope && IsBelow(n, scope));
    FUZZ_CHECK(SelectorMatches(sel, n, scope));
    size_t at = page.order.at(n);
    FUZZ_CHECK(i == 0 || at > last);  // document order, no repeats
    last = at;
  }
  const GumboNode* first = SelectFirst(sel, scope);
  FUZZ_CHECK(all.empty() ? first == nullptr : first == all.front());
}

// "column N: …" with 1 <= N <= size + 1.
void CheckColumn(const std::string& what, size_t size) {
  FUZZ_CHECK(what.rfind("column ", 0) == 0);
  size_t n = 0, k = 7;
  for (; k < what.size() && what[k] >= '0' && what[k] <= '9' && n <= size + 1; ++k) n = n * 10 + (what[k] - '0');
  FUZZ_CHECK(k > 7 && k < what.size() && what[k] == ':');
  FUZZ_CHECK(n >= 1 && n <= size + 1);
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  static const Page page;
  std::string_view text(reinterpret_cast<const char*>(data), size);

  auto sel = ParseSelector(text);
  if (sel.ok()) {
    FUZZ_CHECK(!sel.value().steps.empty());
    FUZZ_CHECK(!sel.value().steps.front().child_of_previous);
    FUZZ_CHECK(sel.value().text == text);
    CheckRun(page, sel.value(), page.out->document);
    CheckRun(page, sel.value(), page.list);
  } else {
    CheckColumn(sel.error().what, size);
  }

  auto field = ParseFieldRule(text);
  if (field.ok()) {
    const FieldSpec& f = field.value();
    FUZZ_CHECK(f.self == f.selector.steps.empty());
    for (char c : f.attribute) FUZZ_CHECK(!(c >= 'A' && c <= 'Z'));
    if (!f.self) CheckRun(page, f.selector, page.list);
  } else {
    FUZZ_CHECK(!field.error().what.empty());
  }
  return 0;
}
