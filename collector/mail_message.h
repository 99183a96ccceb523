#pragma once
// One mail message as the collector reads it: the headers that matter for
// matching, and the body as plain UTF-8 text (RFC 5322 message format, MIME
// per RFC 2045–2047 and RFC 2231). A compact parser of our own: it needs
// only what a response to an application carries, and every branch of it is
// tested in tests/collector/mail_message_test.cpp.
#include <cstdint>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "collector/mail_header.h"

namespace twinprobe {

struct MailMessage {
  HeaderBlock headers;
  std::string message_id;       // Message-ID without angle brackets; "" when absent
  std::string subject;          // decoded to UTF-8
  std::string from;             // From, decoded (display name and address)
  std::string to;               // To, decoded
  std::optional<int64_t> date;  // Date, UTC seconds; nullopt when absent or unreadable
  // Lowercased addresses: who wrote (From, Reply-To, Sender) and who it was
  // for (To, Cc, Delivered-To, X-Original-To, Envelope-To, Resent-To).
  std::vector<std::string> sender_addresses;
  std::vector<std::string> recipient_addresses;
  // Addresses on "From:" lines inside the text: the original sender of a
  // forwarded message (inline, or attached as message/rfc822).
  std::vector<std::string> forwarded_sender_addresses;
  // A forward: the subject starts with "Fw:"/"Fwd:", or the text holds a
  // forwarding marker ("Forwarded message", "Begin forwarded message",
  // "Attached message").
  bool is_forward = false;
  // For a forward, the date on the first "Date:" or "Sent:" line of the
  // forwarded header block (the employer's own date), UTC; nullopt if none
  // can be read. A reply's quoted history is not a forward and gives none.
  std::optional<int64_t> forwarded_date;
  // The body as text. In multipart/alternative text/plain wins, else text/html
  // (through HtmlToText); text parts of multipart/mixed follow one another;
  // an attached message (message/rfc822) follows as a line
  // "-------- Attached message --------", its "From: / Date: / Subject: /
  // To:" lines and its own text. Attachments are left out.
  std::string text;
  int attachments = 0;  // parts left out of `text`
};

// Parses a raw message (LF or CRLF line ends). Never fails: missing parts
// stay empty, damaged encodings are decoded as far as they go.
MailMessage ParseMailMessage(std::string_view raw);

}  // namespace twinprobe
