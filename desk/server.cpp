#include "desk/server.h"

#include <chrono>
#include <thread>

#include <httplib.h>

#include <iostream>

#include "desk/routes.h"

namespace twinprobe {
namespace {

std::map<std::string, std::string> ParseCookies(const std::string& header) {
  std::map<std::string, std::string> out;
  size_t start = 0;
  while (start < header.size()) {
    size_t end = header.find(';', start);
    if (end == std::string::npos) end = header.size();
    std::string part = header.substr(start, end - start);
    size_t b = part.find_first_not_of(' ');
    size_t eq = part.find('=');
    if (b != std::string::npos && eq != std::string::npos && eq > b)
      out.emplace(part.substr(b, eq - b), part.substr(eq + 1));
    start = end + 1;
  }
  return out;
}

void Send(const DeskResponse& d, httplib::Response& res) {
  res.status = d.status;
  for (const auto& [k, v] : d.headers) res.headers.emplace(k, v);
  res.set_content(d.body, d.content_type.c_str());
}

}  // namespace

struct DeskServer::Impl {
  std::unique_ptr<httplib::Server> server;
};

DeskServer::DeskServer(std::unique_ptr<Impl> impl, int port, std::string url)
    : impl_(std::move(impl)), port_(port), url_(std::move(url)) {}
DeskServer::~DeskServer() = default;

std::string DeskServer::url() const { return url_; }

Result<std::unique_ptr<DeskServer>> DeskServer::Bind(Desk& desk, const ServeOptions& options) {
  auto impl = std::make_unique<Impl>();
  const bool tls = !options.tls_cert.empty();
  if (tls) {
    auto s = std::make_unique<httplib::SSLServer>(options.tls_cert.c_str(), options.tls_key.c_str());
    if (!s->is_valid())
      return BadInput(options.tls_cert, "the TLS certificate or key could not be loaded",
                      "give a PEM certificate with --tls-cert and its unencrypted PEM key with --tls-key");
    impl->server = std::move(s);
  } else {
    impl->server = std::make_unique<httplib::Server>();
  }
  httplib::Server& srv = *impl->server;
  srv.set_payload_max_length(kMaxRequestBodyBytes);
  srv.set_read_timeout(10, 0);
  srv.set_write_timeout(10, 0);
  auto handle = [&desk](const httplib::Request& req, httplib::Response& res) {
    DeskRequest d;
    d.method = req.method;
    d.path = req.path;
    if (req.method == "POST") {
      // Form fields only from the body: a value in the URL is not a form entry.
      httplib::Params body;
      httplib::detail::parse_query_text(req.body, body);
      for (auto& [k, v] : body) d.params.emplace(k, v);
    } else {
      for (const auto& [k, v] : req.params) d.params.emplace(k, v);
    }
    d.cookies = ParseCookies(req.get_header_value("Cookie"));
    Send(desk.Handle(d), res);
  };
  srv.Get(".*", handle);
  srv.Post(".*", handle);
  // Refusals httplib makes itself (a body over the cap: 413) get a page that
  // says what happened instead of an empty one. Desk pages keep their own.
  srv.set_error_handler([](const httplib::Request&, httplib::Response& res) {
    if (!res.body.empty()) return;
    std::string what =
        res.status == 413
            ? "The form was too large for the desk (a note can hold about 8,000 characters). Nothing "
              "was recorded; go back, shorten it and send it again."
            : "The desk could not read this request (HTTP " + std::to_string(res.status) + "). Nothing was recorded.";
    DeskResponse page = ErrorPage(res.status, "", what);
    for (auto& [k, v] : DeskSecurityHeaders()) res.headers.emplace(k, v);
    res.set_content(page.body, page.content_type.c_str());
  });
  srv.set_exception_handler([](const httplib::Request&, httplib::Response& res, std::exception_ptr ep) {
    std::string what = "unknown error";
    try {
      std::rethrow_exception(ep);
    } catch (const std::exception& e) {
      what = e.what();
    } catch (...) {
    }
    std::cerr << "twinprobe: desk: internal error: " << what << "\n";
    res.status = 500;
    res.set_content("Internal error; nothing was recorded by this request. The desk's terminal shows the cause.\n",
                    "text/plain; charset=utf-8");
  });
  int port = options.port;
  if (port == 0) {
    port = srv.bind_to_any_port(options.bind);
    if (port < 0) port = 0;
  } else if (!srv.bind_to_port(options.bind, port)) {
    port = 0;
  }
  if (port <= 0)
    return BadInput(options.bind + ":" + std::to_string(options.port), "cannot listen on this address and port",
                    "choose another --port (another program may use this one), or a --bind address of this machine");
  std::string host = options.bind.find(':') != std::string::npos ? "[" + options.bind + "]" : options.bind;
  std::string url = std::string(tls ? "https" : "http") + "://" + host + ":" + std::to_string(port) + "/";
  return std::unique_ptr<DeskServer>(new DeskServer(std::move(impl), port, url));
}

void DeskServer::Run() { impl_->server->listen_after_bind(); }

void DeskServer::Stop() {
  // cpp-httplib's stop() does nothing until listen_after_bind() has set the
  // server running, so a stop asked for in that moment would be lost.
  while (!impl_->server->is_running()) std::this_thread::sleep_for(std::chrono::milliseconds(5));
  impl_->server->stop();
}

}  // namespace twinprobe
