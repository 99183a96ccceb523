// The one reader for TOML lists of texts: each refusal's exact words and the
// position it points at.
#include "planner/toml_list.h"

#include <catch2/catch.hpp>

using namespace twinprobe;

namespace {

// Keeps every problem as "LINE:COL: what — fix".
struct Collected : TomlErrorSink {
  std::vector<std::string> messages;
  void Fail(const toml::node* node, std::string what, std::string fix) override {
    std::string at = node
                         ? std::to_string(node->source().begin.line) + ":" + std::to_string(node->source().begin.column)
                         : std::string("?");
    messages.push_back(at + ": " + what + " \u2014 " + fix);
  }
};

std::vector<std::string> Read(const std::string& doc, Collected& errors, bool required = false) {
  toml::table t = toml::parse(doc);
  return ReadTextList(t, "[outcomes]", "codes", errors, required, {"fallback"});
}

}  // namespace

TEST_CASE("toml list: reads the texts in order") {
  Collected errors;
  CHECK(Read("codes = [\"invitation\", \"rejection\"]", errors) == std::vector<std::string>{"invitation", "rejection"});
  CHECK(errors.messages.empty());
}

TEST_CASE("toml list: a missing key gives the fallback, or an error when required") {
  Collected optional, required;
  CHECK(Read("other = 1", optional) == std::vector<std::string>{"fallback"});
  CHECK(optional.messages.empty());
  CHECK(Read("other = 1", required, true) == std::vector<std::string>{"fallback"});
  CHECK(required.messages ==
        std::vector<std::string>{"1:1: [outcomes].codes is missing \u2014 add codes = [\"\u2026\", \"\u2026\"]"});
}

TEST_CASE("toml list: refuses a single text, a number, an empty text and a duplicate") {
  Collected a, b, c, d;
  Read("codes = \"invitation\"", a);
  CHECK(a.messages ==
        std::vector<std::string>{
            "1:9: [outcomes].codes must be a list of texts \u2014 write codes = [\"\u2026\", \"\u2026\"]"});
  Read("codes = [\"invitation\", 3]", b);
  CHECK(b.messages ==
        std::vector<std::string>{"1:24: [outcomes].codes must hold only texts in quotes \u2014 quote every entry"});
  CHECK(Read("codes = [\"invitation\", \"  \"]", c) == std::vector<std::string>{"fallback"});
  CHECK(c.messages ==
        std::vector<std::string>{"1:24: [outcomes].codes holds an empty text \u2014 remove it or write the words"});
  Read("codes = [\"invitation\",\n  \"invitation\"]", d);
  CHECK(d.messages ==
        std::vector<std::string>{"2:3: [outcomes].codes lists 'invitation' twice \u2014 remove the duplicate"});
}
