#pragma once
// The desk over HTTP (cpp-httplib, Debian's libcpp-httplib-dev; why this
// library: docs/desk.md). The server only moves bytes between the network
// and Desk::Handle: it caps request bodies, reads cookies and form fields,
// and turns an exception into a 500 page without stopping.
#include <memory>
#include <string>

#include "core/status.h"
#include "desk/desk.h"

namespace twinprobe {

constexpr size_t kMaxRequestBodyBytes = 64 * 1024;  // the largest form is a note

struct ServeOptions {
  std::string bind = "127.0.0.1";
  int port = 8470;                // 0: any free port
  std::string tls_cert, tls_key;  // both or neither (PEM files)
};

class DeskServer {
 public:
  // Binds the socket. Fails when the port is taken, the address is not
  // local to this machine, or the TLS files cannot be loaded.
  static Result<std::unique_ptr<DeskServer>> Bind(Desk& desk, const ServeOptions& options);
  ~DeskServer();

  int port() const { return port_; }
  std::string url() const;
  // Serves until Stop() (from any thread).
  void Run();
  // Stops a running server; a signal that comes before Run() has started
  // listening would be lost (the server is not running yet), so Stop waits
  // for it to be running first.
  void Stop();

 private:
  struct Impl;
  explicit DeskServer(std::unique_ptr<Impl> impl, int port, std::string url);
  std::unique_ptr<Impl> impl_;
  int port_;
  std::string url_;
};

}  // namespace twinprobe
