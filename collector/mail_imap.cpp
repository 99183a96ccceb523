#include "collector/mail_imap.h"

#include <curl/curl.h>

#include <cctype>
#include <cstdlib>
#include <memory>
#include <sstream>

#include "core/text.h"

namespace twinprobe {
namespace {

using CurlHandle = std::unique_ptr<CURL, decltype(&curl_easy_cleanup)>;

size_t Collect(char* data, size_t size, size_t count, void* target) {
  static_cast<std::string*>(target)->append(data, size * count);
  return size * count;
}

std::string Env(const char* name) {
  const char* v = std::getenv(name);
  return v ? v : "";
}

// Replaces every occurrence of a secret with "***".
std::string Scrub(std::string text, const std::string& secret) {
  if (secret.empty()) return text;
  size_t pos = 0;
  while ((pos = text.find(secret, pos)) != std::string::npos) {
    text.replace(pos, secret.size(), "***");
    pos += 3;
  }
  return text;
}

struct UrlParts {
  std::string scheme, userinfo, host_port, path;
};

UrlParts SplitUrl(const std::string& url) {
  UrlParts p;
  size_t colon = url.find("://");
  if (colon == std::string::npos) return p;
  p.scheme = Lower(url.substr(0, colon));
  std::string rest = url.substr(colon + 3);
  // The user part ends at the last '@' of the whole URL, not of the text
  // before the first '/': a password holding '/', '?' or '#' would otherwise
  // be read as a host and a folder, and be quoted in the error. A folder name
  // with '@' in it is given up for that.
  if (size_t at = rest.rfind('@'); at != std::string::npos) {
    p.userinfo = rest.substr(0, at);
    rest = rest.substr(at + 1);
  }
  size_t slash = rest.find('/');
  p.host_port = rest.substr(0, slash);
  p.path = slash == std::string::npos ? "" : rest.substr(slash);
  return p;
}

Error CurlFailure(const std::string& label, CURLcode rc, const char* errbuf, const ImapOptions& o) {
  std::string detail = errbuf && *errbuf ? errbuf : curl_easy_strerror(rc);
  // libcurl's messages do not quote credentials today; make sure they never do.
  detail = Scrub(detail, o.password);
  if (o.user.size() >= 3) detail = Scrub(detail, o.user);
  // libcurl reports a refused SELECT with the same code as a refused login.
  if (rc == CURLE_LOGIN_DENIED && detail.find("Select") != std::string::npos)
    return BadInput(label, "the server refused to open this folder",
                    "check the folder name in the URL (most servers tell case apart)");
  switch (rc) {
    case CURLE_LOGIN_DENIED:
      return BadInput(label, "the IMAP server refused the login",
                      "check TWINPROBE_IMAP_USER and TWINPROBE_IMAP_PASSWORD, or the netrc entry for this host");
    case CURLE_COULDNT_CONNECT:
    case CURLE_COULDNT_RESOLVE_HOST:
    case CURLE_OPERATION_TIMEDOUT:
      return BadInput(label, "cannot reach the IMAP server: " + detail,
                      "check the host and port in the URL and the network");
    case CURLE_SSL_CONNECT_ERROR:
    case CURLE_PEER_FAILED_VERIFICATION:
      return BadInput(label, "the TLS connection failed: " + detail,
                      "check the host name and the server's certificate");
    default:
      return BadInput(label, "the IMAP server answered with an error: " + detail,
                      "check the folder name in the URL and the account's credentials");
  }
}

}  // namespace

ImapOptions ImapOptionsFromEnvironment(const std::string& url) {
  ImapOptions o;
  o.url = url;
  o.user = Env("TWINPROBE_IMAP_USER");
  o.password = Env("TWINPROBE_IMAP_PASSWORD");
  o.netrc_file = Env("TWINPROBE_NETRC");
  return o;
}

std::string RedactedImapUrl(const std::string& url) {
  UrlParts p = SplitUrl(url);
  if (!p.scheme.empty()) return p.scheme + "://" + p.host_port + p.path;
  // Not even "scheme://" ("imaps:/ana:pw@host/INBOX", "ana:pw@host"): drop
  // everything from after a leading "scheme:" and its slashes up to the last
  // '@', so whatever stands there as a password is never shown.
  size_t at = url.rfind('@');
  if (at == std::string::npos) return url;
  size_t start = 0;
  while (start < url.size() && std::isalpha(static_cast<unsigned char>(url[start]))) ++start;
  if (start < url.size() && url[start] == ':') {
    ++start;
    while (start < url.size() && url[start] == '/') ++start;
  } else {
    start = 0;
  }
  return url.substr(0, start) + url.substr(at + 1);
}

Status CheckImapUrl(const std::string& url) {
  UrlParts p = SplitUrl(url);
  std::string label = RedactedImapUrl(url);
  if (p.scheme != "imap" && p.scheme != "imaps")
    return BadInput(label, "not an IMAP URL", "write imaps://HOST/FOLDER (or imap:// for a server without TLS)");
  if (p.userinfo.find(':') != std::string::npos)
    return BadInput(label, "the URL carries a password",
                    "remove it; put it in TWINPROBE_IMAP_PASSWORD or a netrc file (see docs/mail.md)");
  if (p.host_port.empty()) return BadInput(label, "the URL names no host", "write imaps://HOST/FOLDER");
  std::string folder = p.path.empty() ? "" : p.path.substr(1);
  if (folder.empty() || folder.find(';') != std::string::npos || folder.find('?') != std::string::npos)
    return BadInput(label, "the URL must name one folder and nothing more", "write imaps://HOST/INBOX (a folder name)");
  return {};
}

Result<std::vector<RawMail>> ReadImap(const ImapOptions& o) {
  if (Status s = CheckImapUrl(o.url); !s.ok()) return s.error();
  const std::string label = RedactedImapUrl(o.url);
  std::string base = o.url;
  while (!base.empty() && base.back() == '/') base.pop_back();

  CurlHandle curl(curl_easy_init(), &curl_easy_cleanup);
  if (!curl) return Internal("libcurl could not start a transfer");
  char errbuf[CURL_ERROR_SIZE] = {0};
  std::string body;
  CURL* h = curl.get();
  curl_easy_setopt(h, CURLOPT_ERRORBUFFER, errbuf);
  curl_easy_setopt(h, CURLOPT_WRITEFUNCTION, &Collect);
  curl_easy_setopt(h, CURLOPT_WRITEDATA, &body);
  curl_easy_setopt(h, CURLOPT_CONNECTTIMEOUT, o.timeout_seconds);
  curl_easy_setopt(h, CURLOPT_TIMEOUT, o.timeout_seconds);
  curl_easy_setopt(h, CURLOPT_NOSIGNAL, 1L);
  // Upgrade a plain imap:// connection with STARTTLS when the server offers it.
  curl_easy_setopt(h, CURLOPT_USE_SSL, static_cast<long>(CURLUSESSL_TRY));
  if (!o.user.empty()) curl_easy_setopt(h, CURLOPT_USERNAME, o.user.c_str());
  if (!o.password.empty()) {
    curl_easy_setopt(h, CURLOPT_PASSWORD, o.password.c_str());
  } else {
    curl_easy_setopt(h, CURLOPT_NETRC, static_cast<long>(CURL_NETRC_OPTIONAL));
    if (!o.netrc_file.empty()) curl_easy_setopt(h, CURLOPT_NETRC_FILE, o.netrc_file.c_str());
  }

  // 1. The folder's UIDs.
  curl_easy_setopt(h, CURLOPT_URL, base.c_str());
  curl_easy_setopt(h, CURLOPT_CUSTOMREQUEST, "UID SEARCH ALL");
  CURLcode rc = curl_easy_perform(h);
  if (rc != CURLE_OK) return CurlFailure(label, rc, errbuf, o);
  std::vector<std::string> uids;
  std::istringstream lines(body);
  for (std::string line; std::getline(lines, line);) {
    if (!line.empty() && line.back() == '\r') line.pop_back();
    if (line.rfind("* SEARCH", 0) != 0) continue;
    std::istringstream words(line.substr(8));
    for (std::string w; words >> w;)
      if (!w.empty() && w.find_first_not_of("0123456789") == std::string::npos) uids.push_back(w);
  }

  // 2. Each message, whole.
  std::vector<RawMail> out;
  curl_easy_setopt(h, CURLOPT_CUSTOMREQUEST, nullptr);
  for (size_t i = 0; i < uids.size(); ++i) {
    body.clear();
    errbuf[0] = 0;
    std::string url = base + "/;UID=" + uids[i];
    curl_easy_setopt(h, CURLOPT_URL, url.c_str());
    rc = curl_easy_perform(h);
    if (rc != CURLE_OK) return CurlFailure(label + ";UID=" + uids[i], rc, errbuf, o);
    out.push_back({body, label + ";UID=" + uids[i], std::nullopt});
    if (o.progress) o.progress(i + 1, uids.size());
  }
  return out;
}

}  // namespace twinprobe
