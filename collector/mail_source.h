#pragma once
// Reading messages from local mailboxes: mbox files and Maildir folders.
// (IMAP is in collector/mail_imap.h.) The reader only splits and unescapes;
// collector/mail_message.h parses what it returns.
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "core/status.h"

namespace twinprobe {

struct RawMail {
  std::string raw;                       // the message as stored (an mbox's "From " line removed, ">From" unescaped)
  std::string where;                     // where it was found: "FILE:LINE", a Maildir file, or "URL;UID=N"
  std::optional<int64_t> envelope_time;  // mbox "From " line date or Maildir delivery time (UTC)
};

// Reads an mbox file (mboxo or mboxrd; qmail's mbox(5)). A message starts at
// a line beginning "From " that opens the file or follows an empty line and
// carries an asctime date ("From sender Thu Mar  4 10:15:00 2027"); the empty
// line before the next separator is the separator's, not the message's. In
// each message one '>' is removed from lines matching ^>+From (the mboxrd
// rule; in mboxo files it restores the common case). An empty file holds no
// messages; a leading UTF-8 byte order mark is skipped. Errors: the file
// cannot be read ("PATH: cannot read the mbox file"); it does not start with
// "From " ("PATH:1:1: … not an mbox file", naming a single message file, a
// gzip-compressed file or UTF-16 text when it is one of those).
Result<std::vector<RawMail>> ReadMbox(const std::string& path);

// Reads a Maildir folder: every file in new/ and then cur/, each in name
// order (names starting with '.' are skipped). The delivery time is the
// number a Maildir file name starts with. Errors: the folder does not exist,
// is a file, or has no cur/ and new/ folders.
Result<std::vector<RawMail>> ReadMaildir(const std::string& dir);

// The form of a message that identifies it whatever the mailbox: CRLF made
// LF, trailing line ends cut to one. Its SHA-256 stands in for a missing
// Message-ID and is stored as the message's digest.
std::string CanonicalRaw(const std::string& raw);

}  // namespace twinprobe
