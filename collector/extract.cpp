#include "collector/extract.h"

#include <cstring>

#include "core/text.h"
#include "collector/html_bounds.h"

namespace twinprobe {
namespace {

// Position of the first invalid UTF-8 sequence, or npos. Gumbo would
// silently replace such bytes, which would corrupt names and keys.
size_t FirstInvalidUtf8(std::string_view s) {
  const auto* p = reinterpret_cast<const unsigned char*>(s.data());
  size_t n = s.size(), i = 0;
  while (i < n) {
    unsigned char c = p[i];
    if (c < 0x80) {
      ++i;
      continue;
    }
    size_t len = (c >= 0xC2 && c <= 0xDF) ? 2 : (c >= 0xE0 && c <= 0xEF) ? 3 : (c >= 0xF0 && c <= 0xF4) ? 4 : 0;
    if (len == 0 || i + len > n) return i;
    for (size_t k = 1; k < len; ++k)
      if ((p[i + k] & 0xC0) != 0x80) return i;
    // Overlong three- and four-byte forms, surrogates, and code points above U+10FFFF.
    if ((c == 0xE0 && p[i + 1] < 0xA0) || (c == 0xED && p[i + 1] > 0x9F) || (c == 0xF0 && p[i + 1] < 0x90) ||
        (c == 0xF4 && p[i + 1] > 0x8F))
      return i;
    i += len;
  }
  return std::string_view::npos;
}

bool IsBlock(GumboTag t) {
  switch (t) {
    case GUMBO_TAG_P: case GUMBO_TAG_DIV: case GUMBO_TAG_LI: case GUMBO_TAG_TD: case GUMBO_TAG_TH:
    case GUMBO_TAG_TR: case GUMBO_TAG_H1: case GUMBO_TAG_H2: case GUMBO_TAG_H3: case GUMBO_TAG_H4:
    case GUMBO_TAG_H5: case GUMBO_TAG_H6: case GUMBO_TAG_UL: case GUMBO_TAG_OL: case GUMBO_TAG_DL:
    case GUMBO_TAG_DT: case GUMBO_TAG_DD: case GUMBO_TAG_SECTION: case GUMBO_TAG_ARTICLE:
    case GUMBO_TAG_HEADER: case GUMBO_TAG_FOOTER: case GUMBO_TAG_BR: case GUMBO_TAG_TABLE:
      return true;
    default:
      return false;
  }
}

void AppendText(const GumboNode* node, std::string& out) {
  switch (node->type) {
    case GUMBO_NODE_TEXT:
    case GUMBO_NODE_WHITESPACE:
    case GUMBO_NODE_CDATA:
      out += node->v.text.text;
      return;
    case GUMBO_NODE_ELEMENT: {
      GumboTag t = node->v.element.tag;
      if (t == GUMBO_TAG_SCRIPT || t == GUMBO_TAG_STYLE || t == GUMBO_TAG_TEMPLATE) return;
      bool block = IsBlock(t);
      if (block) out += ' ';
      const GumboVector& kids = node->v.element.children;
      for (unsigned i = 0; i < kids.length; ++i) AppendText(static_cast<const GumboNode*>(kids.data[i]), out);
      if (block) out += ' ';
      return;
    }
    default:
      return;
  }
}

std::string Collapse(const std::string& raw) {
  std::string out;
  out.reserve(raw.size());
  bool space = false;
  for (char c : raw) {
    if (c == ' ' || c == '\n' || c == '\t' || c == '\r' || c == '\f') {
      space = !out.empty();
    } else {
      if (space) out += ' ';
      space = false;
      out += c;
    }
  }
  return out;
}

std::string ItemFailure(int position, const FieldSpec& f, const std::string& what) {
  return "item " + std::to_string(position) + ": field '" + f.name + "' " + what + " (rule '" + f.rule + "')";
}

struct GumboDoc {
  explicit GumboDoc(std::string_view html)
      : options(BoundedGumboOptions()), out(gumbo_parse_with_options(&options, html.data(), html.size())) {}
  ~GumboDoc() { gumbo_destroy_output(&options, out); }
  GumboOptions options;
  GumboOutput* out;
  GumboDoc(const GumboDoc&) = delete;
  GumboDoc& operator=(const GumboDoc&) = delete;
};

}  // namespace

std::string NodeText(const GumboNode* node) {
  std::string raw;
  AppendText(node, raw);
  return Collapse(raw);
}

Result<FieldSpec> ParseFieldRule(std::string_view rule) {
  FieldSpec f;
  f.rule = std::string(rule);
  // The last '@' outside brackets and quotes starts the attribute to take.
  size_t at = std::string_view::npos;
  int depth = 0;
  char quote = 0;
  for (size_t i = 0; i < rule.size(); ++i) {
    char c = rule[i];
    if (quote) {
      if (c == quote) quote = 0;
    } else if (c == '"' || c == '\'') {
      quote = c;
    } else if (c == '[') {
      ++depth;
    } else if (c == ']') {
      --depth;
    } else if (c == '@' && depth == 0) {
      at = i;
    }
  }
  std::string_view sel = rule.substr(0, at);
  if (at != std::string_view::npos) {
    std::string_view attr = rule.substr(at + 1);
    while (!attr.empty() && attr.back() == ' ') attr.remove_suffix(1);
    if (attr.empty()) return BadInput("", "'@' must be followed by an attribute name");
    for (char c : attr)
      if (!(std::isalnum(static_cast<unsigned char>(c)) || c == '-' || c == '_' || c == ':'))
        return BadInput("", std::string(1, '\'').append(attr).append("' is not an attribute name"));
    f.attribute = Lower(attr);
  }
  while (!sel.empty() && sel.back() == ' ') sel.remove_suffix(1);
  while (!sel.empty() && sel.front() == ' ') sel.remove_prefix(1);
  if (sel.empty()) {
    f.self = true;
    return f;
  }
  auto parsed = ParseSelector(sel);
  if (!parsed.ok()) return BadInput("", "bad selector '" + std::string(sel) + "': " + parsed.error().what);
  f.selector = std::move(parsed).value();
  return f;
}

Result<ListingRules> CompileRules(const Source& source, const std::string& label) {
  auto where = [&](SourcePos p) {
    return p.line ? label + ":" + std::to_string(p.line) + ":" + std::to_string(p.column) : label;
  };
  const std::string fix = "see docs/fetch.md, \"Selectors\"";
  ListingRules rules;
  if (!source.list_selector.empty()) {
    auto l = ParseSelector(source.list_selector);
    if (!l.ok()) return BadInput(where(source.list_pos), "bad list selector '" + source.list_selector + "': " + l.error().what, fix);
    rules.has_list = true;
    rules.list = std::move(l).value();
  }
  auto items = ParseSelector(source.item_selector);
  if (!items.ok())
    return BadInput(where(source.item_pos), "bad items selector '" + source.item_selector + "': " + items.error().what, fix);
  rules.items = std::move(items).value();
  bool has_key = false;
  for (const FieldRule& r : source.fields) {
    auto f = ParseFieldRule(r.rule);
    if (!f.ok()) return BadInput(where(r.pos), "field '" + r.name + "': " + f.error().what, fix);
    FieldSpec spec = std::move(f).value();
    spec.name = r.name;
    spec.optional = r.optional;
    if (r.name == source.item_key) {
      rules.key_index = rules.fields.size();
      has_key = true;
    }
    rules.fields.push_back(std::move(spec));
  }
  if (!has_key)
    return BadInput(where(source.pos), "the key field '" + source.item_key + "' has no rule", "add it to [source.extract.fields]");
  return rules;
}

Extraction ExtractListing(std::string_view html, const ListingRules& rules) {
  Extraction x;
  auto fail = [&](std::string why) {
    x.ok = false;
    x.error = std::move(why);
    x.items.clear();
    return x;
  };
  if (std::memchr(html.data(), 0, html.size())) return fail("malformed page: it holds NUL bytes, so it is not HTML text");
  if (size_t bad = FirstInvalidUtf8(html); bad != std::string_view::npos)
    return fail("malformed page: not valid UTF-8 at byte " + std::to_string(bad));
  GumboDoc doc(html);
  // The snapshot is kept either way; a page beyond the cap is a failed
  // extraction, never one walked at any cost.
  if (int depth = HtmlTreeDepth(doc.out->document); depth > kMaxHtmlDepth)
    return fail("the page nests elements " + std::to_string(depth) + " deep, beyond the limit of " +
                std::to_string(kMaxHtmlDepth) + "; it is kept as a snapshot but not extracted");
  const GumboNode* scope = doc.out->document;
  if (rules.has_list) {
    scope = SelectFirst(rules.list, doc.out->document);
    if (!scope) return fail("no list found: nothing matches the list selector '" + rules.list.text + "'");
  }
  std::vector<const GumboNode*> items;
  SelectAll(rules.items, scope, items);
  if (items.empty() && !rules.has_list)
    return fail("no list found: nothing matches the items selector '" + rules.items.text + "'");
  x.items.reserve(items.size());
  int position = 0;
  for (const GumboNode* item : items) {
    ExtractedItem out;
    out.position = ++position;
    for (size_t k = 0; k < rules.fields.size(); ++k) {
      const FieldSpec& f = rules.fields[k];
      const GumboNode* node = f.self ? item : SelectFirst(f.selector, item);
      if (!node) {
        if (f.optional) continue;
        return fail(ItemFailure(position, f, "not found"));
      }
      std::string value;
      if (f.attribute.empty()) {
        value = NodeText(node);
      } else {
        const GumboAttribute* a = gumbo_get_attribute(&node->v.element.attributes, f.attribute.c_str());
        if (!a) {
          if (f.optional) continue;
          return fail(ItemFailure(position, f, "has no attribute '" + f.attribute + "'"));
        }
        value = a->value;
      }
      if (k == rules.key_index) {
        if (value.empty()) return fail(ItemFailure(position, f, "is the item key and is empty"));
        out.key = value;
      }
      out.fields.emplace_back(f.name, std::move(value));
    }
    x.items.push_back(std::move(out));
  }
  return x;
}

}  // namespace twinprobe
