#include "collector/fetch_url.h"

#include <curl/curl.h>

#include <algorithm>
#include <cctype>
#include <memory>

#include "core/text.h"

namespace twinprobe {
namespace {

struct UrlDeleter {
  void operator()(CURLU* u) const { curl_url_cleanup(u); }
};
using UrlHandle = std::unique_ptr<CURLU, UrlDeleter>;

std::optional<std::string> Part(CURLU* u, CURLUPart part, unsigned flags = 0) {
  char* out = nullptr;
  if (curl_url_get(u, part, &out, flags) != CURLUE_OK || !out) return std::nullopt;
  std::string s(out);
  curl_free(out);
  return s;
}

int DefaultPort(const std::string& scheme) { return scheme == "https" ? 443 : 80; }

}  // namespace

std::string UrlParts::Authority() const {
  return port == DefaultPort(scheme) ? host : host + ":" + std::to_string(port);
}

std::optional<UrlParts> ParseHttpUrl(std::string_view url) {
  UrlHandle u(curl_url());
  if (!u) return std::nullopt;
  std::string text(url);
  // No CURLU_GUESS_SCHEME: a URL without a scheme is refused, not guessed.
  if (curl_url_set(u.get(), CURLUPART_URL, text.c_str(), 0) != CURLUE_OK) return std::nullopt;
  UrlParts p;
  auto scheme = Part(u.get(), CURLUPART_SCHEME);
  auto host = Part(u.get(), CURLUPART_HOST);
  auto port = Part(u.get(), CURLUPART_PORT, CURLU_DEFAULT_PORT);
  if (!scheme || !host || !port) return std::nullopt;
  p.scheme = Lower(*scheme);
  if (p.scheme != "http" && p.scheme != "https") return std::nullopt;
  if (Part(u.get(), CURLUPART_USER)) return std::nullopt;  // credentials in URLs are refused
  p.host = Lower(*host);
  p.port = std::atoi(port->c_str());
  p.path_and_query = Part(u.get(), CURLUPART_PATH).value_or("/");
  if (p.path_and_query.empty()) p.path_and_query.assign(1, '/');
  if (auto q = Part(u.get(), CURLUPART_QUERY)) p.path_and_query += "?" + *q;
  return p;
}

bool HostAllowed(const UrlParts& url, const std::vector<std::string>& allow_hosts) {
  const std::string with_port = url.host + ":" + std::to_string(url.port);
  return std::any_of(allow_hosts.begin(), allow_hosts.end(), [&](const std::string& entry) {
    std::string e = Lower(entry);
    if (e.find(':') != std::string::npos) return e == with_port;
    return e == url.host && url.port == DefaultPort(url.scheme);
  });
}

std::optional<std::string> ResolveLocation(std::string_view base, std::string_view location) {
  UrlHandle u(curl_url());
  if (!u) return std::nullopt;
  std::string b(base), loc(location);
  if (curl_url_set(u.get(), CURLUPART_URL, b.c_str(), 0) != CURLUE_OK) return std::nullopt;
  // Setting a relative reference on a handle that holds a URL resolves it.
  if (curl_url_set(u.get(), CURLUPART_URL, loc.c_str(), 0) != CURLUE_OK) return std::nullopt;
  auto out = Part(u.get(), CURLUPART_URL);
  if (!out) return std::nullopt;
  if (auto hash = out->find('#'); hash != std::string::npos) out->resize(hash);
  return out;
}

std::string PercentEncode(std::string_view text) {
  static const char* kHex = "0123456789ABCDEF";
  std::string out;
  for (unsigned char c : text) {
    if (std::isalnum(c) || c == '-' || c == '.' || c == '_' || c == '~') {
      out += static_cast<char>(c);
    } else {
      out += '%';
      out += kHex[c >> 4];
      out += kHex[c & 15];
    }
  }
  return out;
}

std::string ExpandUrlPattern(std::string_view pattern, std::string_view query, std::string_view location, int page) {
  std::string out;
  for (size_t i = 0; i < pattern.size();) {
    auto take = [&](std::string_view name, const std::string& value) {
      if (pattern.substr(i, name.size()) != name) return false;
      out += value;
      i += name.size();
      return true;
    };
    if (take("{query}", PercentEncode(query)) || take("{location}", PercentEncode(location)) ||
        take("{page}", std::to_string(page)))
      continue;
    out += pattern[i++];
  }
  return out;
}

}  // namespace twinprobe
