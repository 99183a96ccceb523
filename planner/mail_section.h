#pragma once
// The [mail] section of study.toml (docs/design-file.md; the keys and
// a worked example are in docs/mail.md):
//
//   [mail]
//   mbox = ["mail/inbox.mbox"]                    # mbox files
//   maildir = ["mail/Maildir"]                    # Maildir folders (cur/ and new/)
//   imap = ["imaps://imap.postbox.example/INBOX"] # one folder per URL; no credentials here
//   generic_domains = ["freemail.example"]        # shared hosts say nothing about the employer
//   excerpt_chars = 400
//   negations = ["not", "cannot"]                 # set a phrase aside when one precedes it
//   [[mail.suggest]]                              # in precedence order
//   code = "invitation"
//   phrases = ["invite you to an interview"]
//
// Without a [mail] section (or without [[mail.suggest]] / negations) the
// built-in English rules of DefaultMailRules apply.
#include <toml++/toml.h>

#include <string>

#include "core/design.h"
#include "core/status.h"

namespace twinprobe {

// Reads root["mail"] into design.mail. Requires design.outcomes to be read
// already (every rule's code must be one of its codes). Errors name
// LABEL:LINE:COL: an unknown key, a wrong type, a URL that is not imap:// or
// imaps:// or that carries a password, a code outside the scheme or given
// twice, an empty phrase list or phrase, excerpt_chars outside 40..4000.
Status ReadMailSection(const toml::table& root, const std::string& label, Design& design);

// The built-in rules: English phrase lists for offer, invitation,
// info_request and rejection (in that precedence), kept only for codes the
// scheme has, and a short list of English negations. No mailboxes.
MailRules DefaultMailRules(const OutcomeScheme& scheme);

}  // namespace twinprobe
