// docs/design-file.md is the reference of study.toml. This test reads the
// page and the keys the reader accepts, and fails when they differ, so the
// page cannot drift from the parser.
#include <catch2/catch.hpp>

#include <fstream>
#include <map>
#include <set>
#include <sstream>
#include <string>

#include "planner/design_file.h"

using namespace twinprobe;

namespace {

using KeysBySection = std::map<std::string, std::set<std::string>>;

// Sections are "## `[name]`" headings ("## Sections" lists the top level);
// keys are table rows whose first cell is a `key` in backquotes.
KeysBySection ReadPage() {
  std::ifstream in(std::string(TWINPROBE_SOURCE_DIR) + "/docs/design-file.md");
  REQUIRE(in);
  KeysBySection page;
  std::string section;
  for (std::string line; std::getline(in, line);) {
    if (line.rfind("## ", 0) == 0) {
      std::string title = line.substr(3);
      section = title == "Sections" ? "the design" : title;
      if (section.size() > 2 && section.front() == '`' && section.back() == '`')
        section = section.substr(1, section.size() - 2);
      page[section];
      continue;
    }
    if (section.empty() || line.rfind("| `", 0) != 0) continue;
    size_t end = line.find('`', 3);
    page[section].insert(line.substr(3, end - 3));
  }
  return page;
}

// The parser's own list for sections read outside planner/design_file.cpp,
// taken from its refusal of an unknown key ("the keys allowed here are: …").
std::set<std::string> AllowedKeys(const std::string& design) {
  auto d = ParseDesign(design, "study.toml", "");
  REQUIRE_FALSE(d.ok());
  INFO(d.error().Message());  // names the design when it fails for another reason
  const std::string prefix = "the keys allowed here are: ";
  REQUIRE(d.error().fix.rfind(prefix, 0) == 0);
  std::set<std::string> keys;
  std::stringstream list(d.error().fix.substr(prefix.size()));
  for (std::string k; std::getline(list, k, ',');) keys.insert(k.substr(k.find_first_not_of(' ')));
  return keys;
}

const std::string kListing = R"([study]
id = "veldmark-listing-audit"
kind = "listing"
)";

const std::string kSource = R"(
[[source]]
name = "veldmark-jobs"
allow_hosts = ["jobs.veldmark.example"]
url = "https://jobs.veldmark.example/search?q={query}"
queries = ["bookkeeper"]
user_agent = "VeldmarkListingAudit/1.0"
contact = "listing-audit@newsroom.example"
)";

}  // namespace

TEST_CASE("design file page: every section and key of the reader, and nothing else") {
  KeysBySection page = ReadPage();
  KeysBySection parser;
  for (const auto& s : KnownDesignKeys()) parser[s.section] = {s.keys.begin(), s.keys.end()};
  parser["[[source]]"] = AllowedKeys(kListing + "\n[[source]]\nunknown_key = 1\n");
  parser["[source.extract]"] =
      AllowedKeys(kListing + kSource + "\n[source.extract]\nitems = \"li\"\nkey = \"id\"\nunknown_key = 1\n");
  const std::string valid = kListing + kSource + "\n[source.extract]\nitems = \"li\"\nkey = \"id\"\n" +
                            "\n[source.extract.fields]\nid = \"@data-id\"\n";
  parser["[mail]"] = AllowedKeys(valid + "\n[mail]\nunknown_key = 1\n");
  parser["[[mail.suggest]]"] =
      AllowedKeys(valid + "\n[[mail.suggest]]\ncode = \"invitation\"\nphrases = [\"x\"]\nunknown_key = 1\n");
  for (const auto& [section, keys] : parser) {
    INFO("docs/design-file.md, section " << section);
    REQUIRE(page.count(section) == 1);
    CHECK(page[section] == keys);
  }
  for (const auto& [section, keys] : page) {
    INFO("docs/design-file.md documents a section the reader does not know: " << section);
    CHECK(parser.count(section) == 1);
  }
}

TEST_CASE("design file page: the known-keys list is what the reader enforces") {
  // A key missing from the list would be refused; one in the list is read.
  auto d = ParseDesign(kListing + "\n[analysis]\nprimary = \"positive_callback\"\nunknown_key = 1\n", "study.toml", "");
  REQUIRE_FALSE(d.ok());
  CHECK(d.error().Message() ==
        "study.toml:7:15: unknown key 'unknown_key' in [analysis] — the keys allowed here are: primary, correction, "
        "alpha, looks, spending, equivalence_margin");
}
