// Fuzzes listing extraction (collector/extract.h): any bytes as a stored
// page, through Gumbo, with the fixture job board's rules and with a second
// set that has no list selector and reads the item itself. A page with NUL
// bytes or invalid UTF-8 fails with that reason (checked against the mail
// codec's own UTF-8 test); a failure carries a reason and no items; a
// success has positions 1..n, a non-empty key equal to the key field, every
// required field in rule order, and text values that are valid UTF-8 with
// white space collapsed. Each input's peak memory stays under 256 MB above
// its start (tests/fuzz/fuzz_memory.h).
#include <cstddef>
#include <cstdint>
#include <cstring>
#include <string>
#include <string_view>

#include "collector/extract.h"
#include "collector/mail_codec.h"
#include "tests/fuzz/fuzz_check.h"
#include "tests/fuzz/fuzz_memory.h"

using namespace twinprobe;

namespace {

// The rules of tests/collector/extract_test.cpp (the fixture board).
Source BoardSource() {
  Source s;
  s.list_selector = "ol#results";
  s.item_selector = "li.candidate";
  s.item_key = "id";
  s.fields = {{"id", "@data-candidate", false, {}},
              {"name", "h3.name", false, {}},
              {"profile", "a.profile @href", false, {}},
              {"salary", ".salary", true, {}}};
  return s;
}

// No list: items anywhere; the key is the item's own text.
Source LooseSource() {
  Source s;
  s.item_selector = "li";
  s.item_key = "text";
  s.fields = {{"text", "", false, {}}, {"link", "a @href", true, {}}, {"title", "[title] @title", true, {}}};
  return s;
}

bool Collapsed(const std::string& s) {
  if (s.empty()) return true;
  if (s.front() == ' ' || s.back() == ' ') return false;
  for (size_t i = 0; i < s.size(); ++i) {
    char c = s[i];
    if (c == '\n' || c == '\t' || c == '\r' || c == '\f') return false;
    if (c == ' ' && i + 1 < s.size() && s[i + 1] == ' ') return false;
  }
  return true;
}

void Check(std::string_view html, const ListingRules& rules) {
  Extraction x = ExtractListing(html, rules);
  bool has_nul = std::memchr(html.data(), 0, html.size()) != nullptr;
  if (has_nul) {
    FUZZ_CHECK(!x.ok && x.error.find("NUL bytes") != std::string::npos);
  } else if (!IsUtf8(html)) {
    FUZZ_CHECK(!x.ok && x.error.rfind("malformed page: not valid UTF-8 at byte ", 0) == 0);
  } else {
    FUZZ_CHECK(x.error.find("malformed page") == std::string::npos);
  }
  if (!x.ok) {
    FUZZ_CHECK(!x.error.empty() && x.items.empty());
    return;
  }
  FUZZ_CHECK(x.error.empty());
  for (size_t i = 0; i < x.items.size(); ++i) {
    const ExtractedItem& item = x.items[i];
    FUZZ_CHECK(item.position == static_cast<int>(i) + 1);
    FUZZ_CHECK(!item.key.empty());
    size_t k = 0;  // the next rule a field may come from
    bool key_seen = false;
    for (const auto& [name, value] : item.fields) {
      while (k < rules.fields.size() && rules.fields[k].name != name) {
        FUZZ_CHECK(rules.fields[k].optional);  // only optional fields are left out
        ++k;
      }
      FUZZ_CHECK(k < rules.fields.size());
      const FieldSpec& f = rules.fields[k];
      if (k == rules.key_index) {
        FUZZ_CHECK(value == item.key);
        key_seen = true;
      }
      if (f.attribute.empty()) {
        FUZZ_CHECK(IsUtf8(value));
        FUZZ_CHECK(Collapsed(value));
      }
      ++k;
    }
    for (; k < rules.fields.size(); ++k) FUZZ_CHECK(rules.fields[k].optional);
    FUZZ_CHECK(key_seen);
  }
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const uint8_t* data, size_t size) {
  static const ListingRules board = CompileRules(BoardSource(), "study.toml").value();
  static const ListingRules loose = CompileRules(LooseSource(), "study.toml").value();
  // The stated bound: a page costs less than 256 MB above where it started,
  // ASan included (collector/html_bounds.h caps errors and depth).
  fuzz::InputMemoryBound bound(256);
  std::string_view html(reinterpret_cast<const char*>(data), size);
  Check(html, board);
  Check(html, loose);
  return 0;
}
