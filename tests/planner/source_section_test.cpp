// The [[source]] section of study.toml and the listing-only study kind.
#include <catch2/catch.hpp>

#include "planner/design_file.h"

using namespace twinprobe;

namespace {

const std::string kListingStudy = R"(# A listing audit of an invented job board.
[study]
id = "veldmark-listing-audit"
kind = "listing"

[[source]]
name = "veldmark-jobs"
allow_hosts = ["jobs.veldmark.example"]
url = "https://jobs.veldmark.example/search?q={query}&where={location}&page={page}"
queries = ["warehouse clerk", "bookkeeper"]
locations = ["Orlinde", "Brakkeport"]
pages = 2
page_limit = 20
min_interval_seconds = 10
user_agent = "VeldmarkListingAudit/1.0"
contact = "listing-audit@newsroom.example"

[source.extract]
list = "ol#results"
items = "li.candidate"
key = "id"
optional = ["salary"]

[source.extract.fields]
id = "@data-candidate"
name = "h3.name"
salary = ".salary"
)";

std::string Replace(std::string s, const std::string& from, const std::string& to) {
  auto pos = s.find(from);
  REQUIRE(pos != std::string::npos);
  return s.replace(pos, from.size(), to);
}

std::string ErrorOf(const std::string& text) {
  auto d = ParseDesign(text, "study.toml", "");
  REQUIRE_FALSE(d.ok());
  return d.error().Message();
}

}  // namespace

TEST_CASE("source section: a listing study needs no factors, profiles or templates") {
  auto d = ParseDesign(kListingStudy, "study.toml", "");
  INFO((d.ok() ? "" : d.error().Message()));
  REQUIRE(d.ok());
  const Design& design = d.value();
  CHECK(design.kind == "listing");
  CHECK(design.factors.empty());
  REQUIRE(design.sources.size() == 1);
  const Source& s = design.sources[0];
  CHECK(s.name == "veldmark-jobs");
  CHECK(s.queries == std::vector<std::string>{"warehouse clerk", "bookkeeper"});
  CHECK(s.pages == 2);
  CHECK(s.page_limit == 20);
  CHECK(s.min_interval_seconds == 10);
  CHECK(s.UserAgentHeader() == "VeldmarkListingAudit/1.0 (+listing-audit@newsroom.example)");
  CHECK(s.ProductToken() == "VeldmarkListingAudit");
  CHECK(s.item_key == "id");
  REQUIRE(s.fields.size() == 3);
  CHECK(s.fields[2].name == "salary");
  CHECK(s.fields[2].optional);
  CHECK(s.fields[0].pos.line == 25);
}

TEST_CASE("source section: a listing study without any [[source]] is refused") {
  std::string text = kListingStudy.substr(0, kListingStudy.find("[[source]]"));
  CHECK(ErrorOf(text) ==
        "study.toml: a listing study needs at least one [[source]] \u2014 declare the permitted web source as "
        "[[source]]; see docs/fetch.md");
}

TEST_CASE("source section: the URL's host must be allowlisted") {
  CHECK(ErrorOf(Replace(kListingStudy, "allow_hosts = [\"jobs.veldmark.example\"]", "allow_hosts = [\"veldmark.example\"]")) ==
        "study.toml:9:7: the host 'jobs.veldmark.example' of [[source]].url is not in allow_hosts \u2014 add it to "
        "allow_hosts if you are permitted to fetch from it");
}

TEST_CASE("source section: placeholders must match the lists of queries and locations") {
  CHECK(ErrorOf(Replace(kListingStudy, "where={location}&", "")) ==
        "study.toml:11:13: [[source]].locations is given but the URL pattern has no {location} \u2014 use {location} in "
        "url together with locations = [\"\u2026\"], or neither");
  CHECK(ErrorOf(Replace(kListingStudy, "{page}\"", "{pgae}\"")) ==
        "study.toml:9:7: unknown placeholder '{pgae}' in [[source]].url (did you mean '{page}'?) \u2014 use {query}, "
        "{location} and {page}");
}

TEST_CASE("source section: the User-Agent needs a product token and a contact") {
  CHECK(ErrorOf(Replace(kListingStudy, "\"VeldmarkListingAudit/1.0\"", "\"Listing Audit 2.0\"")) ==
        "study.toml:15:14: [[source]].user_agent must be a product token of letters, '-' and '_', a '/' and a version "
        "\u2014 write "
        "it as Name/version, e.g. \"VeldmarkListingAudit/1.0\" (robots.txt groups are matched on the name)");
  CHECK(ErrorOf(Replace(kListingStudy, "contact = \"listing-audit@newsroom.example\"\n", "")) ==
        "study.toml:6:1: [[source]].contact is missing \u2014 add contact = \"\u2026\" under [[source]]");
}

TEST_CASE("source section: a misspelt key and an unknown key field are named") {
  CHECK(ErrorOf(Replace(kListingStudy, "page_limit = 20", "page_limt = 20")) ==
        "study.toml:13:13: unknown key 'page_limt' in [[source]] (did you mean 'page_limit'?) \u2014 the keys allowed "
        "here are: name, allow_hosts, url, queries, locations, pages, page_limit, min_interval_seconds, user_agent, "
        "contact, connect_timeout_seconds, timeout_seconds, max_body_bytes, retries, backoff_seconds, "
        "retry_after_cap_seconds, max_redirects, extract");
  CHECK(ErrorOf(Replace(kListingStudy, "key = \"id\"", "key = \"ident\"")) ==
        "study.toml:21:7: the key field 'ident' is not among [source.extract.fields] \u2014 name "
        "one of the fields, or add it");
}

TEST_CASE("source section: too short an interval is refused") {
  CHECK(ErrorOf(Replace(kListingStudy, "min_interval_seconds = 10", "min_interval_seconds = 0")) ==
        "study.toml:14:24: [[source]].min_interval_seconds must be between 0.1 and 86400 seconds, got 0 \u2014 choose "
        "a value in that range");
}
