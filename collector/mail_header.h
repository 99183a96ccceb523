#pragma once
// Message headers (RFC 5322 section 2.2 and 3): splitting a message into its
// header block and body, unfolding, RFC 2047 encoded words, MIME parameters
// (RFC 2045 section 5.1, RFC 2231 continuations), addresses and dates.
// Pure functions; none fails: a damaged header is read as far as it goes.
#include <cstdint>
#include <map>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace twinprobe {

struct MailHeader {
  std::string name;   // as written
  std::string value;  // unfolded (line breaks of folding removed), not decoded
};

struct HeaderBlock {
  std::vector<MailHeader> fields;  // in order
  // The first field's value with this name (any case); "" when absent.
  std::string Get(std::string_view name) const;
  std::vector<std::string> GetAll(std::string_view name) const;
  bool Has(std::string_view name) const;
};

// Splits `message` at the first empty line (LF or CRLF). Without one the
// whole message is header (and the body empty).
void SplitHeaderBody(std::string_view message, std::string_view& header, std::string_view& body);

// Parses a header block. A line starting with space or tab continues the
// previous field (RFC 5322 section 2.2.3: unfolding removes only the line
// break). Lines without a colon are skipped.
HeaderBlock ParseHeaderBlock(std::string_view header);

// Decodes RFC 2047 encoded words (=?charset?B?...?= and =?charset?Q?...?=,
// charset with an optional *language) to UTF-8. Whitespace between two
// adjacent encoded words is dropped (RFC 2047 section 6.2); text outside
// encoded words is taken as UTF-8, or windows-1252 when it is not UTF-8. A
// malformed encoded word is kept literally.
std::string DecodeHeaderText(std::string_view value);

// A Content-Type or Content-Disposition value: "type/subtype; name=value".
// Names and type are lowercased; quoted values unquoted; RFC 2231 parameters
// (name*=charset''%XX, name*0=, name*1*=) joined and decoded to UTF-8.
struct MimeValue {
  std::string type;  // "text/plain", "multipart/mixed", "attachment" … ("" when empty)
  std::map<std::string, std::string> params;
  std::string Param(const std::string& name) const;  // "" when absent
};
MimeValue ParseMimeValue(std::string_view value);

// Every address (local@domain.tld) written in `text`, lowercased, in order,
// without repeats. Finds addr-specs inside display forms ("Name <a@b.c>").
std::vector<std::string> ExtractAddresses(std::string_view text);

// The domain of an address ("" if it has none), lowercased.
std::string AddressDomain(std::string_view address);

// RFC 5322 section 3.3 date-time, with the obsolete forms of section 4.3
// (two-digit years, zone names UT, GMT, EST … , missing seconds, comments),
// as UTC seconds since 1970; also the "5 Mar 2027 at 11:02" form mail
// clients write in forwarded headers (no zone: read as UTC). nullopt if it
// cannot be read.
std::optional<int64_t> ParseMailDate(std::string_view value);

// The asctime-style date of an mbox "From " line
// ("From sender Thu Mar  4 10:15:00 2027"), taken as UTC. nullopt if absent.
std::optional<int64_t> ParseMboxFromLineDate(std::string_view from_line);

}  // namespace twinprobe
