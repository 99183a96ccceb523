#pragma once
// The one reader for a TOML list of texts (levels = ["a", "b"]), shared by
// the design file and its [[source]] and [mail] sections so they refuse the
// same mistakes with the same words.
#include <toml++/toml.h>

#include <string>
#include <vector>

namespace twinprobe {

// Where a reader of a TOML document sends each problem it finds: the node
// the problem is at (null: the document as a whole), what is wrong and how
// to fix it. The readers keep the first problem and turn it into an Error
// with FILE:LINE:COL.
class TomlErrorSink {
 public:
  virtual ~TomlErrorSink() = default;
  virtual void Fail(const toml::node* node, std::string what, std::string fix) = 0;
};

// Reads t[key] as a list of texts; `section` names the table in messages
// ("[outcomes]" gives "[outcomes].codes must …"). A missing key gives
// `fallback`, or, when `required`, an error. An error is reported for a
// value that is not a list, an entry that is not a text, an entry that is
// empty or only spaces, and an entry listed twice; after an error the
// result is `fallback`.
std::vector<std::string> ReadTextList(const toml::table& t, const std::string& section, const std::string& key,
                                      TomlErrorSink& errors, bool required = false,
                                      std::vector<std::string> fallback = {});

}  // namespace twinprobe
