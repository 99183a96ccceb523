// The selector language of docs/fetch.md on pages parsed by Gumbo.
#include <catch2/catch.hpp>

#include "collector/extract.h"
#include "collector/selector.h"

using namespace twinprobe;

namespace {

// Runs a selector on an HTML text; returns the text of every match.
std::vector<std::string> Select(const std::string& html, const std::string& selector) {
  auto sel = ParseSelector(selector);
  REQUIRE(sel.ok());
  GumboOutput* out = gumbo_parse(html.c_str());
  std::vector<const GumboNode*> nodes;
  SelectAll(sel.value(), out->document, nodes);
  std::vector<std::string> texts;
  for (const auto* n : nodes) texts.push_back(NodeText(n));
  gumbo_destroy_output(&kGumboDefaultOptions, out);
  return texts;
}

const std::string kPage =
    "<div id=main><ol class='ranked list'>"
    "<li class=item data-k=a><span class=name>Aldo Brenvik</span><em>new</em></li>"
    "<li class='item top' data-k=b><div><span class=name>Marit Olderhus</span></div></li>"
    "<li data-k=c><span class=name>Kemi Saralon</span></li>"
    "</ol><span class=name>Outside</span><x-card lang=vm>Custom</x-card></div>";

}  // namespace

TEST_CASE("selector: tag, class, id and attribute tests") {
  CHECK(Select(kPage, "li").size() == 3);
  CHECK(Select(kPage, ".item").size() == 2);
  CHECK(Select(kPage, "li.item.top") == std::vector<std::string>{"Marit Olderhus"});
  CHECK(Select(kPage, "#main > span") == std::vector<std::string>{"Outside"});
  CHECK(Select(kPage, "[data-k]").size() == 3);
  CHECK(Select(kPage, "li[data-k=c]") == std::vector<std::string>{"Kemi Saralon"});
  CHECK(Select(kPage, "li[data-k='b']") == std::vector<std::string>{"Marit Olderhus"});
  CHECK(Select(kPage, "ol.list").size() == 1);   // one word of a multi-word class attribute
  CHECK(Select(kPage, "ol.rank").empty());       // classes match whole words only
  CHECK(Select(kPage, "LI.item").size() == 2);   // tag names ignore case
}

TEST_CASE("selector: descendant and child combinators") {
  CHECK(Select(kPage, "ol span.name").size() == 3);
  CHECK(Select(kPage, "li > span.name") == std::vector<std::string>{"Aldo Brenvik", "Kemi Saralon"});
  CHECK(Select(kPage, "#main span.name").size() == 4);
  CHECK(Select(kPage, "ol > li > div > span").size() == 1);
}

TEST_CASE("selector: a tag Gumbo does not know is matched by its name") {
  CHECK(Select(kPage, "x-card") == std::vector<std::string>{"Custom"});
  CHECK(Select(kPage, "x-card[lang=vm]").size() == 1);
}

TEST_CASE("selector: bad selectors are refused with the column of the problem") {
  CHECK(ParseSelector("li..x").error().what == "column 4: '.' must be followed by a class name");
  CHECK(ParseSelector("li >").error().what == "column 5: '>' must be followed by a selector");
  CHECK(ParseSelector("a[href").error().what == "column 7: ']' expected");
  CHECK(ParseSelector("a[x='y]").error().what == "column 6: the quoted value is not closed");
  CHECK(ParseSelector("").error().what == "column 1: the selector is empty");
  CHECK(ParseSelector("li, ol").error().what == "column 3: unexpected ','");
}

TEST_CASE("selector: matching from an item does not climb above the item") {
  auto item = ParseSelector("li.item");
  auto name = ParseSelector("ol span.name");  // 'ol' is above every item
  REQUIRE(item.ok());
  REQUIRE(name.ok());
  GumboOutput* out = gumbo_parse(kPage.c_str());
  const GumboNode* first = SelectFirst(item.value(), out->document);
  REQUIRE(first);
  CHECK(SelectFirst(name.value(), first) == nullptr);
  auto self_rooted = ParseSelector("li > span.name");  // the item itself may match the first step
  CHECK(SelectFirst(self_rooted.value(), first) != nullptr);
  gumbo_destroy_output(&kGumboDefaultOptions, out);
}
