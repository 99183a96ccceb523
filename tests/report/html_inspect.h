#pragma once
// Test helpers (header-only): parse HTML with Gumbo and inspect the tree the
// way a browser would see it: elements by tag and id, attribute values, text.
#include <gumbo.h>

#include <functional>
#include <memory>
#include <string>
#include <vector>

namespace twinprobe::testing {

class ParsedHtml {
 public:
  explicit ParsedHtml(const std::string& html)
      : html_(html), output_(gumbo_parse_with_options(&kGumboDefaultOptions, html_.data(), html_.size()),
                             [](GumboOutput* o) { gumbo_destroy_output(&kGumboDefaultOptions, o); }) {}

  const GumboNode* root() const { return output_->root; }

  // Calls fn on every element, depth first, in document order.
  void ForEachElement(const std::function<void(const GumboNode*)>& fn) const { Walk(root(), fn); }

  std::vector<const GumboNode*> ElementsByTag(const std::string& tag) const {
    std::vector<const GumboNode*> out;
    ForEachElement([&](const GumboNode* n) {
      if (TagName(n) == tag) out.push_back(n);
    });
    return out;
  }

  const GumboNode* ElementById(const std::string& id) const {
    const GumboNode* found = nullptr;
    ForEachElement([&](const GumboNode* n) {
      const GumboAttribute* a = gumbo_get_attribute(&n->v.element.attributes, "id");
      if (!found && a && id == a->value) found = n;
    });
    return found;
  }

  // The concatenated text of every text node (what a reader sees, roughly).
  std::string AllText() const { return TextOf(root()); }

  static std::string TagName(const GumboNode* n) {
    if (n->type != GUMBO_NODE_ELEMENT) return "";
    if (n->v.element.tag != GUMBO_TAG_UNKNOWN) return gumbo_normalized_tagname(n->v.element.tag);
    GumboStringPiece piece = n->v.element.original_tag;
    gumbo_tag_from_original_text(&piece);
    return std::string(piece.data, piece.length);
  }

  static std::string Attribute(const GumboNode* n, const char* name) {
    const GumboAttribute* a = gumbo_get_attribute(&n->v.element.attributes, name);
    return a ? a->value : "";
  }

  static bool HasAttribute(const GumboNode* n, const char* name) {
    return gumbo_get_attribute(&n->v.element.attributes, name) != nullptr;
  }

  static std::string TextOf(const GumboNode* n) {
    if (n->type == GUMBO_NODE_TEXT || n->type == GUMBO_NODE_WHITESPACE || n->type == GUMBO_NODE_CDATA)
      return n->v.text.text;
    if (n->type != GUMBO_NODE_ELEMENT && n->type != GUMBO_NODE_DOCUMENT) return "";
    const GumboVector& kids = n->type == GUMBO_NODE_DOCUMENT ? n->v.document.children : n->v.element.children;
    std::string s;
    for (unsigned i = 0; i < kids.length; ++i) s += TextOf(static_cast<const GumboNode*>(kids.data[i]));
    return s;
  }

  // Every attribute of every element as (tag, name, value).
  struct Attr {
    std::string tag, name, value;
  };
  std::vector<Attr> AllAttributes() const {
    std::vector<Attr> out;
    ForEachElement([&](const GumboNode* n) {
      const GumboVector& attrs = n->v.element.attributes;
      for (unsigned i = 0; i < attrs.length; ++i) {
        const auto* a = static_cast<const GumboAttribute*>(attrs.data[i]);
        out.push_back({TagName(n), a->name, a->value});
      }
    });
    return out;
  }

 private:
  static void Walk(const GumboNode* n, const std::function<void(const GumboNode*)>& fn) {
    if (n->type != GUMBO_NODE_ELEMENT && n->type != GUMBO_NODE_TEMPLATE) return;
    fn(n);
    const GumboVector& kids = n->v.element.children;
    for (unsigned i = 0; i < kids.length; ++i) Walk(static_cast<const GumboNode*>(kids.data[i]), fn);
  }

  std::string html_;
  std::unique_ptr<GumboOutput, void (*)(GumboOutput*)> output_;
};

// Problems that would make a report reach outside its file: an attribute
// that points at a URL other than an in-page anchor or a data: URI, an
// element that loads something, @import, or url() that is not data:.
// Returns one line per problem; empty when the page is self-contained.
inline std::vector<std::string> ExternalReferences(const ParsedHtml& page) {
  std::vector<std::string> problems;
  auto lower = [](std::string s) {
    for (auto& c : s) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
    return s;
  };
  auto check_css = [&](const std::string& css, const std::string& where) {
    const std::string l = lower(css);
    if (l.find("@import") != std::string::npos) problems.push_back(where + ": @import");
    for (size_t at = l.find("url("); at != std::string::npos; at = l.find("url(", at + 4)) {
      size_t k = at + 4;
      while (k < l.size() && (l[k] == ' ' || l[k] == '"' || l[k] == '\'')) ++k;
      if (l.compare(k, 5, "data:") != 0) problems.push_back(where + ": url() not data:");
    }
  };
  for (const auto& a : page.AllAttributes()) {
    const std::string name = lower(a.name), value = lower(a.value);
    if (name == "src" || name == "href" || name == "xlink:href" || name == "action" || name == "formaction" ||
        name == "poster" || name == "srcset" || name == "background" || name == "data" || name == "codebase") {
      if (!(value.rfind("#", 0) == 0 || value.rfind("data:", 0) == 0))
        problems.push_back("<" + a.tag + " " + a.name + "=\"" + a.value + "\">");
    }
    if (name == "style") check_css(a.value, "style attribute on <" + a.tag + ">");
    if (name.rfind("on", 0) == 0) problems.push_back("<" + a.tag + "> event handler " + a.name);
  }
  for (const char* tag : {"script", "link", "img", "iframe", "object", "embed", "base", "frame", "audio", "video",
                          "source", "image", "use", "foreignobject"})
    for (const auto* n : page.ElementsByTag(tag)) problems.push_back("element <" + ParsedHtml::TagName(n) + ">");
  for (const auto* n : page.ElementsByTag("style")) check_css(ParsedHtml::TextOf(n), "<style>");
  return problems;
}

}  // namespace twinprobe::testing
