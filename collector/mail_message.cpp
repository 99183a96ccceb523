#include "collector/mail_message.h"

#include <algorithm>
#include <cctype>

#include "collector/mail_codec.h"
#include "collector/mail_html.h"
#include "core/text.h"

namespace twinprobe {
namespace {

// Deeper nesting than this is not mail a person wrote; stop there.
constexpr int kMaxDepth = 16;

void AppendAddresses(std::vector<std::string>& to, const std::vector<std::string>& from) {
  for (const auto& a : from)
    if (std::find(to.begin(), to.end(), a) == to.end()) to.push_back(a);
}

// The parts of a multipart body: what lies between "--boundary" lines, up to
// "--boundary--" (RFC 2046 section 5.1.1). The line break before a
// delimiter belongs to the delimiter.
std::vector<std::string_view> SplitMultipart(std::string_view body, const std::string& boundary) {
  std::vector<std::string_view> parts;
  const std::string delim = "--" + boundary;
  size_t pos = 0;
  size_t part_start = std::string_view::npos;
  while (pos <= body.size()) {
    size_t eol = body.find('\n', pos);
    size_t line_end = eol == std::string_view::npos ? body.size() : eol;
    std::string_view line = body.substr(pos, line_end - pos);
    if (!line.empty() && line.back() == '\r') line.remove_suffix(1);
    if (line.rfind(delim, 0) == 0) {
      std::string_view rest = line.substr(delim.size());
      bool closing = rest.rfind("--", 0) == 0;
      if (closing) rest.remove_prefix(2);
      if (rest.find_first_not_of(" \t") == std::string_view::npos) {
        if (part_start != std::string_view::npos) {
          size_t end = pos;
          if (end > part_start && body[end - 1] == '\n') --end;
          if (end > part_start && body[end - 1] == '\r') --end;
          parts.push_back(body.substr(part_start, end - part_start));
        }
        if (closing) return parts;
        part_start = eol == std::string_view::npos ? body.size() : eol + 1;
      }
    }
    if (eol == std::string_view::npos) break;
    pos = eol + 1;
  }
  // No closing delimiter: the last part runs to the end.
  if (part_start != std::string_view::npos && part_start < body.size()) parts.push_back(body.substr(part_start));
  return parts;
}

std::string DecodeTransfer(std::string_view body, const std::string& encoding) {
  if (encoding == "base64") return DecodeBase64(body);
  if (encoding == "quoted-printable") return DecodeQuotedPrintable(body);
  return std::string(body);
}

struct Entity {
  HeaderBlock headers;
  std::string_view body;
  MimeValue type;
  std::string disposition;
};

Entity ReadEntity(std::string_view raw) {
  Entity e;
  std::string_view header;
  SplitHeaderBody(raw, header, e.body);
  e.headers = ParseHeaderBlock(header);
  std::string ct = e.headers.Get("Content-Type");
  e.type = ParseMimeValue(ct.empty() ? "text/plain" : ct);
  if (e.type.type.find('/') == std::string::npos) e.type.type = "text/plain";
  e.disposition = ParseMimeValue(e.headers.Get("Content-Disposition")).type;
  return e;
}

class TextCollector {
 public:
  explicit TextCollector(MailMessage& m) : m_(m) {}

  void Walk(const Entity& e, int depth) {
    if (depth > kMaxDepth) return;
    const std::string& t = e.type.type;
    if (t.rfind("multipart/", 0) == 0) {
      Multipart(e, depth);
    } else if (t == "message/rfc822" || t == "message/global") {
      Attached(e, depth);
    } else if ((t == "text/plain" || t == "text/html") && e.disposition != "attachment") {
      std::string bytes = DecodeTransfer(e.body, Lower(std::string(Trim(e.headers.Get("Content-Transfer-Encoding")))));
      std::string text = ToUtf8(bytes, e.type.Param("charset"));
      if (t == "text/html") text = HtmlToText(text);
      Append(text);
    } else {
      ++m_.attachments;
    }
  }

 private:
  void Append(const std::string& text) {
    std::string trimmed = text;
    while (!trimmed.empty() && (trimmed.back() == '\n' || trimmed.back() == '\r' || trimmed.back() == ' '))
      trimmed.pop_back();
    if (trimmed.empty()) return;
    if (!m_.text.empty()) m_.text += "\n\n";
    m_.text += trimmed;
  }

  void Multipart(const Entity& e, int depth) {
    std::string boundary = e.type.Param("boundary");
    if (boundary.empty()) {  // unreadable structure: show the body as it is
      Append(ToUtf8(e.body, ""));
      return;
    }
    std::vector<Entity> parts;
    for (std::string_view raw : SplitMultipart(e.body, boundary)) parts.push_back(ReadEntity(raw));
    if (e.type.type != "multipart/alternative") {
      for (const auto& p : parts) Walk(p, depth + 1);
      return;
    }
    // Alternatives: text/plain first, then text/html, then a nested
    // multipart (e.g. multipart/related around the HTML).
    for (const char* want : {"text/plain", "text/html"})
      for (const auto& p : parts)
        if (p.type.type == want && p.disposition != "attachment") {
          m_.attachments += static_cast<int>(parts.size()) - 1;
          Walk(p, depth + 1);
          return;
        }
    for (const auto& p : parts)
      if (p.type.type.rfind("multipart/", 0) == 0) {
        Walk(p, depth + 1);
        return;
      }
    m_.attachments += static_cast<int>(parts.size());
  }

  void Attached(const Entity& e, int depth) {
    std::string bytes = DecodeTransfer(e.body, Lower(std::string(Trim(e.headers.Get("Content-Transfer-Encoding")))));
    Entity inner = ReadEntity(bytes);
    // The marker tells FreshText that a forwarded message follows.
    std::string block = "-------- Attached message --------\n";
    for (const char* name : {"From", "Date", "Subject", "To"}) {
      std::string v = inner.headers.Get(name);
      if (!v.empty()) block += std::string(name) + ": " + DecodeHeaderText(v) + "\n";
    }
    Append(block);
    Walk(inner, depth + 1);
  }

  MailMessage& m_;
};

// Lines such as "From: Name <addr>" (also quoted "> From:" or bold "*From:*")
// that introduce a forwarded message.
std::vector<std::string> ForwardedSenders(const std::string& text) {
  std::vector<std::string> out;
  size_t pos = 0;
  while (pos < text.size()) {
    size_t eol = text.find('\n', pos);
    std::string_view line(text.data() + pos, (eol == std::string::npos ? text.size() : eol) - pos);
    pos = eol == std::string::npos ? text.size() : eol + 1;
    size_t k = 0;
    while (k < line.size() && (line[k] == '>' || line[k] == ' ' || line[k] == '*' || line[k] == '\t')) ++k;
    if (line.size() - k >= 5 && Lower(line.substr(k, 5)) == "from:")
      AppendAddresses(out, ExtractAddresses(line.substr(k + 5)));
  }
  return out;
}

bool StartsNoCase(std::string_view s, std::string_view prefix) {
  return s.size() >= prefix.size() && Lower(s.substr(0, prefix.size())) == prefix;
}

std::string_view StripLead(std::string_view line) {
  size_t k = 0;
  while (k < line.size() && (line[k] == ' ' || line[k] == '*' || line[k] == '\t')) ++k;
  return line.substr(k);
}

// Whether the message forwards another, and the date of the forwarded one:
// after a marker (or, for a Fw: subject, from the start), the first "From:"
// line opens the forwarded header block; a "Date:" or "Sent:" line within
// the next five lines carries its date.
void ReadForward(MailMessage& m) {
  std::string_view subject = StripLead(m.subject);
  bool by_subject = StartsNoCase(subject, "fw:") || StartsNoCase(subject, "fwd:") || StartsNoCase(subject, "fw :");
  std::vector<std::string_view> lines;
  for (size_t pos = 0; pos <= m.text.size();) {
    size_t eol = m.text.find('\n', pos);
    if (eol == std::string::npos) eol = m.text.size();
    lines.emplace_back(m.text.data() + pos, eol - pos);
    pos = eol + 1;
  }
  bool armed = by_subject;
  for (size_t i = 0; i < lines.size(); ++i) {
    std::string l = Lower(StripLead(lines[i]));
    if (l.find("forwarded message") != std::string::npos || l.rfind("begin forwarded message", 0) == 0 ||
        l.find("attached message") != std::string::npos) {
      m.is_forward = true;
      armed = true;
      continue;
    }
    if (!armed || !StartsNoCase(l, "from:")) continue;
    for (size_t k = i + 1; k < lines.size() && k <= i + 5 && !m.forwarded_date; ++k) {
      std::string_view t = StripLead(lines[k]);
      if (StartsNoCase(t, "date:"))
        m.forwarded_date = ParseMailDate(t.substr(5));
      else if (StartsNoCase(t, "sent:"))
        m.forwarded_date = ParseMailDate(t.substr(5));
    }
    break;  // only the first forwarded header block
  }
  m.is_forward = m.is_forward || by_subject;
  if (!m.is_forward) m.forwarded_date.reset();
}

}  // namespace

MailMessage ParseMailMessage(std::string_view raw) {
  MailMessage m;
  Entity top = ReadEntity(raw);
  m.headers = top.headers;
  std::string id(Trim(m.headers.Get("Message-ID")));
  if (!id.empty() && id.front() == '<') id.erase(0, 1);
  if (!id.empty() && id.back() == '>') id.pop_back();
  m.message_id = std::string(Trim(id));
  m.subject = DecodeHeaderText(m.headers.Get("Subject"));
  m.from = DecodeHeaderText(m.headers.Get("From"));
  m.to = DecodeHeaderText(m.headers.Get("To"));
  m.date = ParseMailDate(m.headers.Get("Date"));
  for (const char* name : {"From", "Reply-To", "Sender"})
    for (const auto& v : m.headers.GetAll(name))
      AppendAddresses(m.sender_addresses, ExtractAddresses(DecodeHeaderText(v)));
  for (const char* name : {"To", "Cc", "Delivered-To", "X-Original-To", "Envelope-To", "Resent-To"})
    for (const auto& v : m.headers.GetAll(name))
      AppendAddresses(m.recipient_addresses, ExtractAddresses(DecodeHeaderText(v)));
  TextCollector(m).Walk(top, 0);
  m.forwarded_sender_addresses = ForwardedSenders(m.text);
  ReadForward(m);
  return m;
}

}  // namespace twinprobe
