#include "planner/source_section.h"

#include <algorithm>
#include <cctype>
#include <optional>
#include <sstream>

#include "core/suggest.h"
#include "core/text.h"
#include "planner/toml_list.h"

namespace twinprobe {
namespace {

const std::vector<std::string> kSourceKeys = {
    "name",           "allow_hosts",     "url",        "queries",        "locations",
    "pages",          "page_limit",      "min_interval_seconds",         "user_agent",
    "contact",        "connect_timeout_seconds",       "timeout_seconds", "max_body_bytes",
    "retries",        "backoff_seconds", "retry_after_cap_seconds",      "max_redirects",
    "extract"};
const std::vector<std::string> kExtractKeys = {"list", "items", "key", "fields", "optional"};

// Host and optional port of an http(s) URL pattern, lower-cased ("host" or
// "host:port"); nullopt when the pattern is not an absolute http(s) URL.
std::optional<std::string> PatternAuthority(const std::string& url, std::string& why) {
  auto sep = url.find("://");
  if (sep == std::string::npos) {
    why = "it is not an absolute URL";
    return std::nullopt;
  }
  std::string scheme = Lower(url.substr(0, sep));
  if (scheme != "http" && scheme != "https") {
    why = "its scheme is '" + scheme + "'; only http and https are fetched";
    return std::nullopt;
  }
  std::string authority = url.substr(sep + 3, url.find_first_of("/?#", sep + 3) - (sep + 3));
  if (authority.empty() || authority.find('@') != std::string::npos || authority.find('{') != std::string::npos) {
    why = "its host part '" + authority + "' is empty, holds a user name or a placeholder";
    return std::nullopt;
  }
  return Lower(authority);
}

bool IsHostEntry(const std::string& h) {
  auto colon = h.find(':');
  std::string host = h.substr(0, colon);
  if (host.empty()) return false;
  for (char c : host)
    if (!(std::islower(static_cast<unsigned char>(c)) || std::isdigit(static_cast<unsigned char>(c)) || c == '-' ||
          c == '.'))
      return false;
  if (colon == std::string::npos) return true;
  std::string port = h.substr(colon + 1);
  return !port.empty() && port.size() <= 5 &&
         std::all_of(port.begin(), port.end(), [](char c) { return std::isdigit(static_cast<unsigned char>(c)); });
}

// The same checks and messages as the rest of the design reader.
class SourceReader : public TomlErrorSink {
 public:
  SourceReader(const toml::table& root, std::string label) : root_(root), label_(std::move(label)) {}

  Status Read(Design& d) {
    const toml::node* n = root_.get("source");
    if (!n) {
      if (d.kind == "listing")
        Fail(nullptr, "a listing study needs at least one [[source]]",
             "declare the permitted web source as [[source]]; see docs/fetch.md");
      return Done();
    }
    if (!n->is_array_of_tables()) {
      Fail(n, "'source' must be written as [[source]] sections", "write [[source]] once per web source");
      return Done();
    }
    for (const auto& el : *n->as_array()) {
      ReadOne(*el.as_table(), d);
      if (error_) break;
    }
    return Done();
  }

 private:
  Status Done() { return error_ ? Status(*error_) : Status(); }
  std::string Where(const toml::node* node) const {
    if (!node) return label_;
    const auto& b = node->source().begin;
    return label_ + ":" + std::to_string(b.line) + ":" + std::to_string(b.column);
  }
  static SourcePos Pos(const toml::node* node) {
    if (!node) return {};
    return {static_cast<int>(node->source().begin.line), static_cast<int>(node->source().begin.column)};
  }
  void Fail(const toml::node* node, std::string what, std::string fix) override {
    if (!error_) error_ = BadInput(Where(node), std::move(what), std::move(fix));
  }
  void CheckKeys(const toml::table& t, const std::string& section, const std::vector<std::string>& allowed) {
    for (const auto& [key, node] : t) {
      std::string k(key.str());
      if (std::find(allowed.begin(), allowed.end(), k) == allowed.end()) {
        std::string list;
        for (const auto& a : allowed) list += (list.empty() ? "" : ", ") + a;
        Fail(&node, "unknown key '" + k + "' in " + section + DidYouMean(k, allowed),
             "the keys allowed here are: " + list);
      }
    }
  }
  std::string String(const toml::table& t, const std::string& key, bool required, const std::string& section) {
    const toml::node* n = t.get(key);
    if (!n) {
      if (required) Fail(&t, section + "." + key + " is missing", "add " + key + " = \"…\" under " + section);
      return {};
    }
    if (!n->is_string()) {
      Fail(n, section + "." + key + " must be a text in quotes", "write " + key + " = \"…\"");
      return {};
    }
    return std::string(n->as_string()->get());
  }
  std::vector<std::string> Strings(const toml::table& t, const std::string& key, const std::string& section) {
    return ReadTextList(t, section, key, *this);
  }
  int64_t Integer(const toml::table& t, const std::string& key, int64_t fallback, int64_t min, int64_t max) {
    const toml::node* n = t.get(key);
    if (!n) return fallback;
    if (!n->is_integer()) {
      Fail(n, "[[source]]." + key + " must be a whole number", "write " + key + " = " + std::to_string(fallback));
      return fallback;
    }
    int64_t v = n->as_integer()->get();
    if (v < min || v > max)
      Fail(n, "[[source]]." + key + " must be between " + std::to_string(min) + " and " + std::to_string(max) +
                  ", got " + std::to_string(v),
           "choose a value in that range");
    return v;
  }
  double Seconds(const toml::table& t, const std::string& key, double fallback, double min, double max) {
    const toml::node* n = t.get(key);
    if (!n) return fallback;
    double v;
    if (n->is_floating_point()) v = n->as_floating_point()->get();
    else if (n->is_integer()) v = static_cast<double>(n->as_integer()->get());
    else {
      Fail(n, "[[source]]." + key + " must be a number of seconds", "write " + key + " = 5");
      return fallback;
    }
    if (!(v >= min && v <= max)) {
      std::ostringstream os;
      os << "[[source]]." << key << " must be between " << min << " and " << max << " seconds, got " << v;
      Fail(n, os.str(), "choose a value in that range");
    }
    return v;
  }

  void ReadOne(const toml::table& t, Design& d);
  void ReadExtract(const toml::table& t, Source& s);

  const toml::table& root_;
  std::string label_;
  std::optional<Error> error_;
};

void SourceReader::ReadOne(const toml::table& t, Design& d) {
  CheckKeys(t, "[[source]]", kSourceKeys);
  Source s;
  s.pos = Pos(&t);
  s.name = String(t, "name", true, "[[source]]");
  for (char c : s.name)
    if (!(std::isalnum(static_cast<unsigned char>(c)) || c == '-' || c == '_' || c == '.')) {
      Fail(t.get("name"), "[[source]].name may hold only letters, digits, '-', '_' and '.'", "rename the source");
      break;
    }
  for (const auto& other : d.sources)
    if (other.name == s.name) Fail(t.get("name"), "source '" + s.name + "' is declared twice", "rename or remove one");

  s.allow_hosts = Strings(t, "allow_hosts", "[[source]]");
  if (!t.get("allow_hosts"))
    Fail(&t, "[[source]].allow_hosts is missing",
         "list the hosts you are permitted to fetch from, e.g. allow_hosts = [\"jobs.veldmark.example\"]");
  else if (s.allow_hosts.empty() && !error_)
    Fail(t.get("allow_hosts"), "[[source]].allow_hosts is empty", "list at least the host of the URL pattern");
  for (auto& h : s.allow_hosts) {
    if (!IsHostEntry(h))
      Fail(t.get("allow_hosts"), "'" + h + "' in [[source]].allow_hosts is not a host name",
           "write a lower-case host, optionally with :port, without scheme or path (e.g. \"jobs.veldmark.example\")");
  }

  s.url = String(t, "url", true, "[[source]]");
  s.url_pos = Pos(t.get("url"));
  if (!s.url.empty() && !error_) {
    std::string why;
    auto authority = PatternAuthority(s.url, why);
    if (!authority)
      Fail(t.get("url"), "[[source]].url '" + s.url + "' cannot be fetched: " + why,
           "write an http or https URL such as \"https://jobs.veldmark.example/search?q={query}&page={page}\"");
    else if (std::find(s.allow_hosts.begin(), s.allow_hosts.end(), *authority) == s.allow_hosts.end())
      Fail(t.get("url"), "the host '" + *authority + "' of [[source]].url is not in allow_hosts",
           "add it to allow_hosts if you are permitted to fetch from it");
    // Every {…} must be one of the three placeholders.
    for (size_t open = s.url.find('{'); open != std::string::npos && !error_; open = s.url.find('{', open + 1)) {
      auto close = s.url.find('}', open);
      std::string name = close == std::string::npos ? s.url.substr(open) : s.url.substr(open, close - open + 1);
      if (name != "{query}" && name != "{location}" && name != "{page}")
        Fail(t.get("url"), "unknown placeholder '" + name + "' in [[source]].url" +
                               DidYouMean(name, {"{query}", "{location}", "{page}"}),
             "use {query}, {location} and {page}");
    }
  }
  s.queries = Strings(t, "queries", "[[source]]");
  s.locations = Strings(t, "locations", "[[source]]");
  s.pages = static_cast<int>(Integer(t, "pages", 1, 1, 1000));
  auto has = [&](const char* p) { return s.url.find(p) != std::string::npos; };
  if (!error_ && !s.url.empty()) {
    if (has("{query}") != !s.queries.empty())
      Fail(has("{query}") ? t.get("url") : t.get("queries"),
           has("{query}") ? "[[source]].url uses {query} but no queries are listed"
                          : "[[source]].queries is given but the URL pattern has no {query}",
           "use {query} in url together with queries = [\"…\"], or neither");
    else if (has("{location}") != !s.locations.empty())
      Fail(has("{location}") ? t.get("url") : t.get("locations"),
           has("{location}") ? "[[source]].url uses {location} but no locations are listed"
                             : "[[source]].locations is given but the URL pattern has no {location}",
           "use {location} in url together with locations = [\"…\"], or neither");
    else if (s.pages > 1 && !has("{page}"))
      Fail(t.get("pages"), "[[source]].pages is " + std::to_string(s.pages) + " but the URL pattern has no {page}",
           "add {page} to url, or set pages = 1");
  }
  s.page_limit = static_cast<int>(Integer(t, "page_limit", 100, 1, 100000));
  // Common practice among polite crawlers is several seconds between
  // requests; 0.1 s is the floor so a fixture server can be tested quickly.
  s.min_interval_seconds = Seconds(t, "min_interval_seconds", 5.0, 0.1, 86400);
  s.user_agent = String(t, "user_agent", true, "[[source]]");
  if (!s.user_agent.empty()) {
    std::string token = s.ProductToken();
    std::string version = token.size() < s.user_agent.size() ? s.user_agent.substr(token.size() + 1) : "";
    bool ok = !token.empty() && s.user_agent[token.size() < s.user_agent.size() ? token.size() : 0] == '/' &&
              !version.empty() && version.find(' ') == std::string::npos &&
              std::all_of(token.begin(), token.end(), [](char c) {
                return std::isalpha(static_cast<unsigned char>(c)) || c == '-' || c == '_';
              });
    if (!ok)
      Fail(t.get("user_agent"), "[[source]].user_agent must be a product token of letters, '-' and '_', a '/' and a version",
           "write it as Name/version, e.g. \"VeldmarkListingAudit/1.0\" (robots.txt groups are matched on the name)");
  }
  s.contact = String(t, "contact", true, "[[source]]");
  if (!s.contact.empty() && s.contact.find('@') == std::string::npos && s.contact.rfind("https://", 0) != 0 &&
      s.contact.rfind("http://", 0) != 0)
    Fail(t.get("contact"), "[[source]].contact must be an e-mail address or a web address",
         "give the address site owners can write to, e.g. \"listing-audit@newsroom.example\"");
  s.connect_timeout_seconds = Seconds(t, "connect_timeout_seconds", 10, 0.1, 300);
  s.timeout_seconds = Seconds(t, "timeout_seconds", 30, 0.1, 3600);
  s.max_body_bytes = Integer(t, "max_body_bytes", s.max_body_bytes, 1024, int64_t{1} << 32);
  s.retries = static_cast<int>(Integer(t, "retries", 3, 0, 10));
  s.backoff_seconds = Seconds(t, "backoff_seconds", 2, 0, 3600);
  s.retry_after_cap_seconds = Seconds(t, "retry_after_cap_seconds", 120, 0, 86400);
  s.max_redirects = static_cast<int>(Integer(t, "max_redirects", 5, 0, 20));

  const toml::node* ex = t.get("extract");
  if (!ex) Fail(&t, "[[source]] '" + s.name + "' has no extraction rules", "add a [source.extract] section");
  else if (!ex->is_table()) Fail(ex, "'extract' must be a section", "write it as [source.extract]");
  else ReadExtract(*ex->as_table(), s);
  d.sources.push_back(std::move(s));
}

void SourceReader::ReadExtract(const toml::table& e, Source& s) {
  CheckKeys(e, "[source.extract]", kExtractKeys);
  s.list_selector = String(e, "list", false, "[source.extract]");
  s.list_pos = Pos(e.get("list"));
  s.item_selector = String(e, "items", true, "[source.extract]");
  s.item_pos = Pos(e.get("items"));
  s.item_key = String(e, "key", true, "[source.extract]");
  std::vector<std::string> optional = Strings(e, "optional", "[source.extract]");
  const toml::node* f = e.get("fields");
  if (!f) {
    Fail(&e, "[source.extract].fields is missing", "add a [source.extract.fields] section naming each field");
    return;
  }
  if (!f->is_table()) {
    Fail(f, "[source.extract].fields must be a section", "write it as [source.extract.fields]");
    return;
  }
  std::vector<std::string> names;
  for (const auto& [key, node] : *f->as_table()) {
    FieldRule r;
    r.name = std::string(key.str());
    r.pos = Pos(&node);
    if (!node.is_string()) {
      Fail(&node, "field '" + r.name + "' must be a rule in quotes", "write " + r.name + " = \"h3.name\" or \"a @href\"");
      return;
    }
    r.rule = std::string(node.as_string()->get());
    r.optional = std::find(optional.begin(), optional.end(), r.name) != optional.end();
    names.push_back(r.name);
    s.fields.push_back(r);
  }
  if (std::find(names.begin(), names.end(), s.item_key) == names.end() && !s.item_key.empty())
    Fail(e.get("key"), "the key field '" + s.item_key + "' is not among [source.extract.fields]" +
                           DidYouMean(s.item_key, names),
         "name one of the fields, or add it");
  for (const auto& o : optional) {
    if (std::find(names.begin(), names.end(), o) == names.end())
      Fail(e.get("optional"), "optional field '" + o + "' is not among [source.extract.fields]" + DidYouMean(o, names),
           "name one of the fields");
    if (o == s.item_key)
      Fail(e.get("optional"), "the key field '" + o + "' cannot be optional", "every item needs its key");
  }
}

}  // namespace

Status ReadSources(const toml::table& root, const std::string& label, Design& design) {
  return SourceReader(root, label).Read(design);
}

}  // namespace twinprobe
