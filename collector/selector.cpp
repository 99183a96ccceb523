#include "collector/selector.h"

#include <cctype>
#include <strings.h>

#include <cstring>
#include <optional>

#include "core/text.h"

namespace twinprobe {
namespace {

bool IsNameChar(char c) {
  return std::isalnum(static_cast<unsigned char>(c)) || c == '-' || c == '_' ||
         static_cast<unsigned char>(c) >= 0x80;
}

class SelectorParser {
 public:
  explicit SelectorParser(std::string_view text) : s_(text) {}

  Result<Selector> Parse() {
    Selector sel;
    sel.text = std::string(s_);
    SkipSpace();
    if (AtEnd()) return Fail("the selector is empty");
    bool child = false;
    while (!AtEnd()) {
      SelectorStep step;
      step.child_of_previous = child;
      if (auto e = ReadCompound(step)) return *e;
      sel.steps.push_back(std::move(step));
      bool space = SkipSpace();
      if (AtEnd()) break;
      if (s_[i_] == '>') {
        ++i_;
        SkipSpace();
        if (AtEnd()) return Fail("'>' must be followed by a selector");
        child = true;
      } else if (space) {
        child = false;
      } else {
        return Fail(std::string("unexpected '") + s_[i_] + "'");
      }
    }
    return sel;
  }

 private:
  bool AtEnd() const { return i_ >= s_.size(); }
  bool SkipSpace() {
    size_t start = i_;
    while (!AtEnd() && std::isspace(static_cast<unsigned char>(s_[i_]))) ++i_;
    return i_ > start;
  }
  Error Fail(const std::string& what) const {
    return BadInput("", "column " + std::to_string(i_ + 1) + ": " + what);
  }
  std::string ReadName() {
    size_t start = i_;
    while (!AtEnd() && IsNameChar(s_[i_])) ++i_;
    return std::string(s_.substr(start, i_ - start));
  }

  std::optional<Error> ReadCompound(SelectorStep& step) {
    size_t start = i_;
    if (s_[i_] == '*') {
      ++i_;
    } else if (IsNameChar(s_[i_])) {
      step.tag_name = Lower(ReadName());
      step.tag = gumbo_tag_enum(step.tag_name.c_str());
    }
    while (!AtEnd()) {
      char c = s_[i_];
      if (c == '.') {
        ++i_;
        std::string name = ReadName();
        if (name.empty()) return Fail("'.' must be followed by a class name");
        step.classes.push_back(name);
      } else if (c == '#') {
        ++i_;
        std::string name = ReadName();
        if (name.empty()) return Fail("'#' must be followed by an id");
        step.id = name;
      } else if (c == '[') {
        ++i_;
        SkipSpace();
        SelectorStep::Attribute a;
        a.name = Lower(ReadName());
        if (a.name.empty()) return Fail("'[' must be followed by an attribute name");
        SkipSpace();
        if (!AtEnd() && s_[i_] == '=') {
          ++i_;
          SkipSpace();
          a.has_value = true;
          if (!AtEnd() && (s_[i_] == '"' || s_[i_] == '\'')) {
            char quote = s_[i_++];
            size_t close = s_.find(quote, i_);
            if (close == std::string_view::npos) return Fail("the quoted value is not closed");
            a.value = std::string(s_.substr(i_, close - i_));
            i_ = close + 1;
          } else {
            a.value = ReadName();
            if (a.value.empty()) return Fail("'=' must be followed by a value (quote it if it has other characters)");
          }
          SkipSpace();
        }
        if (AtEnd() || s_[i_] != ']') return Fail("']' expected");
        ++i_;
        step.attributes.push_back(std::move(a));
      } else {
        break;
      }
    }
    if (i_ == start) return Fail(std::string("unexpected '") + s_[i_] + "'");
    return std::nullopt;
  }

  std::string_view s_;
  size_t i_ = 0;
};

const GumboAttribute* FindAttribute(const GumboElement& e, const char* name) {
  return gumbo_get_attribute(&e.attributes, name);
}

bool HasClass(const char* list, const std::string& cls) {
  const size_t n = cls.size();
  for (const char* p = list; *p;) {
    while (*p && std::isspace(static_cast<unsigned char>(*p))) ++p;
    const char* start = p;
    while (*p && !std::isspace(static_cast<unsigned char>(*p))) ++p;
    if (static_cast<size_t>(p - start) == n && std::memcmp(start, cls.data(), n) == 0) return true;
  }
  return false;
}

bool StepMatches(const SelectorStep& step, const GumboNode* node) {
  if (node->type != GUMBO_NODE_ELEMENT && node->type != GUMBO_NODE_TEMPLATE) return false;
  const GumboElement& e = node->v.element;
  if (!step.tag_name.empty()) {
    if (step.tag != GUMBO_TAG_UNKNOWN) {
      if (e.tag != step.tag) return false;
    } else {
      // A tag Gumbo does not know (custom elements): compare its written name.
      if (e.tag != GUMBO_TAG_UNKNOWN) return false;
      GumboStringPiece name = e.original_tag;
      gumbo_tag_from_original_text(&name);
      if (name.length != step.tag_name.size() || strncasecmp(name.data, step.tag_name.data(), name.length) != 0)
        return false;
    }
  }
  if (!step.id.empty()) {
    const GumboAttribute* id = FindAttribute(e, "id");
    if (!id || step.id != id->value) return false;
  }
  if (!step.classes.empty()) {
    const GumboAttribute* cls = FindAttribute(e, "class");
    if (!cls) return false;
    for (const auto& c : step.classes)
      if (!HasClass(cls->value, c)) return false;
  }
  for (const auto& a : step.attributes) {
    const GumboAttribute* attr = FindAttribute(e, a.name.c_str());
    if (!attr || (a.has_value && a.value != attr->value)) return false;
  }
  return true;
}

// Matches steps[0..k] with steps[k] at `node`, walking up to `scope`.
bool MatchFrom(const Selector& sel, size_t k, const GumboNode* node, const GumboNode* scope) {
  if (!StepMatches(sel.steps[k], node)) return false;
  if (k == 0) return true;
  if (node == scope) return false;  // no ancestors left inside the scope
  const GumboNode* up = node->parent;
  if (sel.steps[k].child_of_previous) return up && MatchFrom(sel, k - 1, up, scope);
  for (; up; up = up->parent) {
    if (MatchFrom(sel, k - 1, up, scope)) return true;
    if (up == scope) break;
  }
  return false;
}

template <typename Visit>
bool Walk(const GumboNode* node, Visit& visit) {
  if (node->type != GUMBO_NODE_ELEMENT && node->type != GUMBO_NODE_TEMPLATE && node->type != GUMBO_NODE_DOCUMENT)
    return true;
  const GumboVector& kids = node->type == GUMBO_NODE_DOCUMENT ? node->v.document.children : node->v.element.children;
  for (unsigned i = 0; i < kids.length; ++i) {
    const GumboNode* kid = static_cast<const GumboNode*>(kids.data[i]);
    if (kid->type != GUMBO_NODE_ELEMENT && kid->type != GUMBO_NODE_TEMPLATE) continue;
    if (!visit(kid)) return false;
    if (!Walk(kid, visit)) return false;
  }
  return true;
}

}  // namespace

Result<Selector> ParseSelector(std::string_view text) { return SelectorParser(text).Parse(); }

bool SelectorMatches(const Selector& selector, const GumboNode* element, const GumboNode* scope) {
  if (selector.steps.empty()) return false;
  return MatchFrom(selector, selector.steps.size() - 1, element, scope);
}

void SelectAll(const Selector& selector, const GumboNode* scope, std::vector<const GumboNode*>& out) {
  auto visit = [&](const GumboNode* n) {
    if (SelectorMatches(selector, n, scope)) out.push_back(n);
    return true;
  };
  Walk(scope, visit);
}

const GumboNode* SelectFirst(const Selector& selector, const GumboNode* scope) {
  const GumboNode* found = nullptr;
  auto visit = [&](const GumboNode* n) {
    if (!SelectorMatches(selector, n, scope)) return true;
    found = n;
    return false;
  };
  Walk(scope, visit);
  return found;
}

}  // namespace twinprobe
