#pragma once
// Byte-level decoding for mail (RFC 2045 transfer encodings, RFC 2047 "Q",
// charsets). Pure functions on strings; none of them fails: damaged input is
// decoded as far as it goes, because a response must never be lost to a
// stray byte (the review shows what came through).
#include <cstdint>
#include <string>
#include <string_view>

namespace twinprobe {

// RFC 2045 section 6.8. Characters outside the alphabet (line breaks,
// spaces, junk) are skipped; decoding stops at the first '='.
std::string DecodeBase64(std::string_view text);

// RFC 2045 section 6.7: "=XX" is a byte, "=" at the end of a line is a soft
// line break (joined), a malformed "=" stays as it is. Trailing blanks of a
// line are dropped (rule 3).
std::string DecodeQuotedPrintable(std::string_view text);

// RFC 2047 section 4.2, the "Q" encoding of encoded words: like
// quoted-printable, and "_" stands for a space.
std::string DecodeQEncoding(std::string_view text);

// True if `bytes` is well-formed UTF-8 (no overlongs, no surrogates).
bool IsUtf8(std::string_view bytes);

// Appends code point `cp` (at most U+10FFFF) to `out` as UTF-8.
void AppendUtf8(std::string& out, uint32_t cp);

// Converts `bytes` in `charset` (a MIME charset name, any case) to UTF-8 with
// glibc's iconv. us-ascii and iso-8859-1 are read as windows-1252, as the
// WHATWG Encoding Standard does (common practice: mail labelled Latin-1
// often carries Windows quotes). An unknown charset, or bytes the charset
// cannot convert, fall back to: the bytes themselves if they are UTF-8, else
// windows-1252. UTF-16 (utf-16le, utf-16be, and utf-16 by its byte order
// mark or, without one, by where its zero bytes stand) is decoded here, not by
// iconv, so a lone surrogate or an odd byte becomes U+FFFD instead of
// failing. The result is always valid UTF-8.
std::string ToUtf8(std::string_view bytes, std::string_view charset);

}  // namespace twinprobe
