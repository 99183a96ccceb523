// Extraction of ranked lists from stored pages (pure: HTML text in, items out).
#include <catch2/catch.hpp>

#include "collector/extract.h"

using namespace twinprobe;

namespace {

Source BoardSource() {
  Source s;
  s.name = "veldmark-jobs";
  s.list_selector = "ol#results";
  s.item_selector = "li.candidate";
  s.item_key = "id";
  s.fields = {{"id", "@data-candidate", false, {}},
              {"name", "h3.name", false, {}},
              {"profile", "a.profile @href", false, {}},
              {"salary", ".salary", true, {}}};
  return s;
}

ListingRules Rules(const Source& s = BoardSource()) {
  auto r = CompileRules(s, "study.toml");
  REQUIRE(r.ok());
  return r.value();
}

const std::string kPage =
    "<html><body><ol id=results>"
    "<li class='candidate card' data-candidate=vjx-2301><h3 class=name>Brisa  Morunde</h3>"
    "<span class=salary>2450 VMK</span><a class=profile href=/c/vjx-2301>Profile</a></li>"
    "<li class=candidate data-candidate=vjx-3251><h3 class=name>Fenna\n Saralon</h3>"
    "<a class=profile href=/c/vjx-3251>Profile</a></li>"
    "</ol></body></html>";

}  // namespace

TEST_CASE("extract: items in page order with their positions, keys and fields") {
  Extraction x = ExtractListing(kPage, Rules());
  REQUIRE(x.ok);
  REQUIRE(x.items.size() == 2);
  CHECK(x.items[0].position == 1);
  CHECK(x.items[0].key == "vjx-2301");
  using Fields = std::vector<std::pair<std::string, std::string>>;
  CHECK(x.items[0].fields == Fields{{"id", "vjx-2301"}, {"name", "Brisa Morunde"}, {"profile", "/c/vjx-2301"},
                                    {"salary", "2450 VMK"}});
  CHECK(x.items[1].position == 2);
  // The optional salary is left out; white space in the name is collapsed.
  CHECK(x.items[1].fields == Fields{{"id", "vjx-3251"}, {"name", "Fenna Saralon"}, {"profile", "/c/vjx-3251"}});
}

TEST_CASE("extract: a list that is there but empty is a valid, empty listing") {
  Extraction x = ExtractListing("<ol id=results></ol>", Rules());
  CHECK(x.ok);
  CHECK(x.items.empty());
}

TEST_CASE("extract: no list on the page is a failure, never an empty listing") {
  Extraction x = ExtractListing("<p>The board is being repaired.</p>", Rules());
  CHECK_FALSE(x.ok);
  CHECK(x.error == "no list found: nothing matches the list selector 'ol#results'");
  Source no_list = BoardSource();
  no_list.list_selector.clear();
  x = ExtractListing("<p>The board is being repaired.</p>", Rules(no_list));
  CHECK(x.error == "no list found: nothing matches the items selector 'li.candidate'");
}

TEST_CASE("extract: a required field missing fails the listing and names the item") {
  std::string page = kPage;
  page.replace(page.find("<h3 class=name>Fenna"), 20, "<h4>Fenna");
  Extraction x = ExtractListing(page, Rules());
  CHECK_FALSE(x.ok);
  CHECK(x.items.empty());
  CHECK(x.error == "item 2: field 'name' not found (rule 'h3.name')");
}

TEST_CASE("extract: a missing attribute and an empty key are failures") {
  std::string page = kPage;
  page.replace(page.find("href=/c/vjx-3251"), 16, "");
  CHECK(ExtractListing(page, Rules()).error == "item 2: field 'profile' has no attribute 'href' (rule 'a.profile @href')");
  std::string empty_key = kPage;
  empty_key.replace(empty_key.find("data-candidate=vjx-2301"), 23, "data-candidate=''");
  CHECK(ExtractListing(empty_key, Rules()).error == "item 1: field 'id' is the item key and is empty (rule '@data-candidate')");
}

TEST_CASE("extract: malformed pages (not UTF-8, NUL bytes) are failures") {
  std::string latin1 = kPage;
  latin1.replace(latin1.find("Brisa"), 5, "Br\xEDsa");
  Extraction x = ExtractListing(latin1, Rules());
  CHECK_FALSE(x.ok);
  CHECK(x.error.rfind("malformed page: not valid UTF-8 at byte ", 0) == 0);
  std::string nul = kPage;
  nul[10] = '\0';
  CHECK(ExtractListing(nul, Rules()).error == "malformed page: it holds NUL bytes, so it is not HTML text");
}

TEST_CASE("extract: unclosed tags are repaired by Gumbo and still extracted") {
  Extraction x = ExtractListing(
      "<ol id=results><li class=candidate data-candidate=a><h3 class=name>Aldo Brenvik<a class=profile href=/a>P"
      "<li class=candidate data-candidate=b><h3 class=name>Ilse Karnwold</h3><a class=profile href=/b>P",
      Rules());
  REQUIRE(x.ok);
  REQUIRE(x.items.size() == 2);
  CHECK(x.items[1].key == "b");
}

TEST_CASE("extract: text skips scripts and separates block elements") {
  Source s = BoardSource();
  s.fields = {{"id", "@data-candidate", false, {}}, {"all", "", false, {}}};
  Extraction x = ExtractListing(
      "<ol id=results><li class=candidate data-candidate=a><p>Aldo</p><p>Brenvik</p><script>var x=1;</script>"
      "<b>Or</b>linde</li></ol>",
      Rules(s));
  REQUIRE(x.ok);
  CHECK(x.items[0].fields[1].second == "Aldo Brenvik Orlinde");
}

TEST_CASE("extract: field rules are parsed, and bad ones point into the design file") {
  auto f = ParseFieldRule("a[title='x @ y'] @href");
  REQUIRE(f.ok());
  CHECK(f.value().attribute == "href");
  CHECK(f.value().selector.steps.size() == 1);
  CHECK(ParseFieldRule("@data-id").value().self);
  CHECK(ParseFieldRule("h3 @").error().what == "'@' must be followed by an attribute name");
  Source bad = BoardSource();
  bad.fields[1].rule = "h3..name";
  bad.fields[1].pos = {31, 8};
  auto r = CompileRules(bad, "study.toml");
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().Message() ==
        "study.toml:31:8: field 'name': bad selector 'h3..name': column 4: '.' must be followed by a class name "
        "\u2014 see docs/fetch.md, \"Selectors\"");
}
