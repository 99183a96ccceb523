#include "planner/toml_list.h"

#include <algorithm>

namespace twinprobe {

std::vector<std::string> ReadTextList(const toml::table& t, const std::string& section, const std::string& key,
                                      TomlErrorSink& errors, bool required, std::vector<std::string> fallback) {
  const std::string name = section + "." + key;
  const toml::node* n = t.get(key);
  if (!n) {
    if (required) errors.Fail(&t, name + " is missing", "add " + key + " = [\"…\", \"…\"]");
    return fallback;
  }
  if (!n->is_array()) {
    errors.Fail(n, name + " must be a list of texts", "write " + key + " = [\"…\", \"…\"]");
    return fallback;
  }
  std::vector<std::string> out;
  for (const auto& el : *n->as_array()) {
    if (!el.is_string()) {
      errors.Fail(&el, name + " must hold only texts in quotes", "quote every entry");
      return fallback;
    }
    std::string v(el.as_string()->get());
    // An empty entry is a slip (a trailing comma filled in, a deleted word);
    // as a level, host or phrase it would match nothing or everything.
    if (v.find_first_not_of(" \t") == std::string::npos) {
      errors.Fail(&el, name + " holds an empty text", "remove it or write the words");
      return fallback;
    }
    if (std::find(out.begin(), out.end(), v) != out.end()) {
      errors.Fail(&el, name + " lists '" + v + "' twice", "remove the duplicate");
      return fallback;
    }
    out.push_back(std::move(v));
  }
  return out;
}

}  // namespace twinprobe
