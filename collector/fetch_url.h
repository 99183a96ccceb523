#pragma once
// URLs as the fetcher sees them: expanding a source's URL pattern, parsing
// http(s) URLs, the host allowlist, and resolving a redirect's Location.
// Pure functions (libcurl's URL parser, no network).
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace twinprobe {

struct UrlParts {
  std::string scheme;          // "http" or "https"
  std::string host;            // lower case
  int port = 0;                // the effective port (80/443 when not written)
  std::string path_and_query;  // "/search?q=x" (at least "/")
  // "host" for the scheme's default port, else "host:port".
  std::string Authority() const;
  std::string Origin() const { return scheme + "://" + Authority(); }
};

// Parses an absolute http or https URL; nullopt for anything else
// (another scheme, a relative reference, a malformed URL).
std::optional<UrlParts> ParseHttpUrl(std::string_view url);

// True if the URL's host is on the allowlist. An entry "host" allows the
// scheme's default port only; "host:port" allows exactly that port. Hosts
// compare case-insensitively; subdomains are not implied.
bool HostAllowed(const UrlParts& url, const std::vector<std::string>& allow_hosts);

// The absolute URL a Location header points to, resolved against `base`
// (RFC 3986 section 5); nullopt when it cannot be resolved.
std::optional<std::string> ResolveLocation(std::string_view base, std::string_view location);

// Percent-encodes everything but RFC 3986 unreserved characters; a space
// becomes "%20".
std::string PercentEncode(std::string_view text);

// Fills {query}, {location} and {page} in a [[source]] URL pattern; the
// texts are percent-encoded.
std::string ExpandUrlPattern(std::string_view pattern, std::string_view query, std::string_view location, int page);

}  // namespace twinprobe
