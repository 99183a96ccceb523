#include "planner/mail_section.h"

#include <algorithm>
#include <optional>
#include <vector>

#include "core/suggest.h"
#include "core/text.h"
#include "planner/toml_list.h"

namespace twinprobe {
namespace {

const std::vector<std::string> kMailKeys = {"mbox",          "maildir",   "imap",   "generic_domains",
                                            "excerpt_chars", "negations", "suggest"};

std::string JoinNames(const std::vector<std::string>& names) {
  std::string s;
  for (const auto& n : names) s += (s.empty() ? "" : ", ") + n;
  return s;
}

// Keeps the first problem with its position, like the design reader does.
class MailReader : public TomlErrorSink {
 public:
  MailReader(std::string label, const OutcomeScheme& scheme) : label_(std::move(label)), scheme_(scheme) {}

  Status Read(const toml::table& mail, MailRules& rules);

 private:
  std::string Where(const toml::node* node) const {
    if (!node) return label_;
    const auto& b = node->source().begin;
    return label_ + ":" + std::to_string(b.line) + ":" + std::to_string(b.column);
  }
  void Fail(const toml::node* node, std::string what, std::string fix) override {
    if (!error_) error_ = BadInput(Where(node), std::move(what), std::move(fix));
  }
  std::vector<std::string> Strings(const toml::table& t, const std::string& section, const std::string& key,
                                   std::vector<std::string> fallback);
  void ReadImap(const toml::table& mail, MailRules& rules);
  void ReadSuggest(const toml::node& node, MailRules& rules);

  std::string label_;
  const OutcomeScheme& scheme_;
  std::optional<Error> error_;
};

std::vector<std::string> MailReader::Strings(const toml::table& t, const std::string& section, const std::string& key,
                                             std::vector<std::string> fallback) {
  return ReadTextList(t, section, key, *this, false, std::move(fallback));
}

void MailReader::ReadImap(const toml::table& mail, MailRules& rules) {
  rules.imap = Strings(mail, "[mail]", "imap", {});
  const toml::node* n = mail.get("imap");
  for (size_t i = 0; i < rules.imap.size(); ++i) {
    const toml::node* el = n->as_array()->get(i);
    const std::string& url = rules.imap[i];
    std::string lower = Lower(url);
    if (lower.rfind("imap://", 0) != 0 && lower.rfind("imaps://", 0) != 0) {
      Fail(el, "[mail].imap entry '" + url + "' is not an imap:// or imaps:// URL",
           "write the folder as imaps://HOST/FOLDER");
      return;
    }
    // The design is shared and hashed into the study: a password here would
    // travel with it, so refuse it (the user name alone is harmless).
    std::string authority = url.substr(url.find("://") + 3);
    authority = authority.substr(0, authority.find('/'));
    size_t at = authority.rfind('@');
    if (at != std::string::npos && authority.substr(0, at).find(':') != std::string::npos) {
      Fail(el, "[mail].imap entry carries a password",
           "remove it from study.toml; put it in "
           "TWINPROBE_IMAP_PASSWORD or a netrc file (see docs/mail.md)");
      return;
    }
  }
}

void MailReader::ReadSuggest(const toml::node& node, MailRules& rules) {
  if (!node.is_array_of_tables()) {
    Fail(&node, "'mail.suggest' must be written as [[mail.suggest]] sections",
         "write one [[mail.suggest]] with code and phrases per response code");
    return;
  }
  rules.suggest.clear();
  for (const auto& el : *node.as_array()) {
    const toml::table& t = *el.as_table();
    for (const auto& [key, value] : t) {
      std::string k(key.str());
      if (k != "code" && k != "phrases")
        Fail(&value, "unknown key '" + k + "' in [[mail.suggest]]" + DidYouMean(k, {"code", "phrases"}),
             "the keys allowed here are: code, phrases");
    }
    MailPhraseRule rule;
    rule.pos = {static_cast<int>(t.source().begin.line), static_cast<int>(t.source().begin.column)};
    const toml::node* code = t.get("code");
    if (!code || !code->is_string()) {
      Fail(code ? code : &t, "[[mail.suggest]].code must be a response code in quotes", "write code = \"invitation\"");
      return;
    }
    rule.code = std::string(code->as_string()->get());
    if (!scheme_.has_code(rule.code)) {
      Fail(code, "'" + rule.code + "' is not a response code of this study" + DidYouMean(rule.code, scheme_.codes),
           "use one of: " + JoinNames(scheme_.codes));
      return;
    }
    for (const auto& other : rules.suggest)
      if (other.code == rule.code) {
        Fail(code, "[[mail.suggest]] for '" + rule.code + "' is given twice", "merge the two phrase lists");
        return;
      }
    rule.phrases = Strings(t, "[[mail.suggest]]", "phrases", {});
    if (rule.phrases.empty() && !error_) {
      Fail(t.get("phrases") ? t.get("phrases") : &t, "[[mail.suggest]] for '" + rule.code + "' has no phrases",
           "add phrases = [\"…\"] with the words that indicate this code");
      return;
    }
    rules.suggest.push_back(rule);
  }
}

Status MailReader::Read(const toml::table& mail, MailRules& rules) {
  for (const auto& [key, node] : mail) {
    std::string k(key.str());
    if (std::find(kMailKeys.begin(), kMailKeys.end(), k) == kMailKeys.end())
      Fail(&node, "unknown key '" + k + "' in [mail]" + DidYouMean(k, kMailKeys),
           "the keys allowed here are: " + JoinNames(kMailKeys));
  }
  rules.present = true;
  rules.mbox = Strings(mail, "[mail]", "mbox", {});
  rules.maildir = Strings(mail, "[mail]", "maildir", {});
  if (!error_) ReadImap(mail, rules);
  rules.generic_domains = Strings(mail, "[mail]", "generic_domains", {});
  for (auto& d : rules.generic_domains) d = Lower(d);
  rules.negations = Strings(mail, "[mail]", "negations", rules.negations);
  if (const toml::node* n = mail.get("excerpt_chars")) {
    if (!n->is_integer() || n->as_integer()->get() < 40 || n->as_integer()->get() > 4000)
      Fail(n, "[mail].excerpt_chars must be a whole number from 40 to 4000", "write excerpt_chars = 400");
    else
      rules.excerpt_chars = static_cast<int>(n->as_integer()->get());
  }
  if (const toml::node* s = mail.get("suggest"); s && !error_) ReadSuggest(*s, rules);
  if (error_) return *error_;
  return {};
}

}  // namespace

MailRules DefaultMailRules(const OutcomeScheme& scheme) {
  // Plain English wording seen in employers' replies; studies in another
  // language write their own lists in [[mail.suggest]].
  const std::vector<MailPhraseRule> builtin = {
      {"offer",
       {"offer you the position", "offer you the job", "pleased to offer", "job offer", "offer of employment"},
       {}},
      {"invitation",
       {"invite you to an interview", "invite you for an interview", "invite you to interview",
        "invitation to an interview", "invitation to interview", "interview invitation", "like to meet you",
        "come in for an interview", "schedule an interview", "arrange an interview", "available for an interview"},
       {}},
      {"info_request",
       {"could you send", "could you please send", "please send us", "please provide", "could you tell us",
        "could you let us know", "please let us know", "more information", "further information", "your references",
        "please call us", "please contact us", "give us a call"},
       {}},
      {"rejection",
       {"unfortunately", "we regret", "regret to inform", "not to proceed", "not be proceeding", "not been successful",
        "been unsuccessful", "other candidates", "position has been filled", "vacancy has been filled",
        "no longer available", "not been selected"},
       {}},
  };
  MailRules rules;
  for (const auto& r : builtin)
    if (scheme.has_code(r.code)) rules.suggest.push_back(r);
  rules.negations = {"not", "cannot", "can't", "won't", "unable", "no longer"};
  return rules;
}

Status ReadMailSection(const toml::table& root, const std::string& label, Design& design) {
  MailRules rules = DefaultMailRules(design.outcomes);
  const toml::node* n = root.get("mail");
  if (n) {
    if (!n->is_table()) {
      const auto& b = n->source().begin;
      return BadInput(label + ":" + std::to_string(b.line) + ":" + std::to_string(b.column),
                      "'mail' must be a section (a table)", "write it as [mail]");
    }
    Status s = MailReader(label, design.outcomes).Read(*n->as_table(), rules);
    if (!s.ok()) return s;
  }
  design.mail = std::move(rules);
  return {};
}

}  // namespace twinprobe
