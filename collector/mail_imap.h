#pragma once
// Reading one IMAP folder through libcurl (RFC 3501; URLs per RFC 5092 as
// libcurl reads them). libcurl logs in (LOGIN, or SASL when the server
// offers it), SELECTs the folder, and twinprobe sends "UID SEARCH ALL" and
// fetches each message with "UID FETCH n BODY[]" (which, like any mail
// client reading a message, sets its \Seen flag). Nothing is deleted.
//
// Credentials never come from the study: TWINPROBE_IMAP_USER and
// TWINPROBE_IMAP_PASSWORD, else the netrc file TWINPROBE_NETRC (or
// libcurl's default ~/.netrc) through CURLOPT_NETRC. They are not stored,
// logged or printed; error messages have the password replaced by "***".
#include <functional>
#include <string>
#include <vector>

#include "collector/mail_source.h"
#include "core/status.h"

namespace twinprobe {

struct ImapOptions {
  std::string url;            // imap://HOST[:PORT]/FOLDER or imaps://…; no password in it
  std::string user;           // "" : the netrc file (or a user name in the URL)
  std::string password;       // "" : the netrc file
  std::string netrc_file;     // "" : libcurl's default (~/.netrc)
  long timeout_seconds = 60;  // per request (connect and each message)
  std::function<void(size_t done, size_t total)> progress;  // after each message; may be empty
};

// `url` with credentials taken from TWINPROBE_IMAP_USER, TWINPROBE_IMAP_PASSWORD
// and TWINPROBE_NETRC.
ImapOptions ImapOptionsFromEnvironment(const std::string& url);

// The URL without its user information, for labels and messages.
std::string RedactedImapUrl(const std::string& url);

// Checks the URL's form: imap:// or imaps://, a host, a folder, no password,
// no ";UID=" (a whole folder is read). Errors name the redacted URL.
Status CheckImapUrl(const std::string& url);

// Every message of the folder, in UID order; `where` is "URL;UID=N"
// (redacted). Errors: a bad URL; the server cannot be reached; the login is
// refused; the folder does not exist; a message cannot be fetched.
Result<std::vector<RawMail>> ReadImap(const ImapOptions& options);

}  // namespace twinprobe
