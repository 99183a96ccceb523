// `twinprobe desk [--port N]`: the field team's web desk on this machine
// (docs/desk.md). Listens on 127.0.0.1 only, unless --bind names another
// address together with a TLS certificate and key. Stops on Ctrl-C (SIGINT)
// or SIGTERM, finishing the requests in flight.
#include <pthread.h>
#include <signal.h>

#include <iostream>
#include <thread>

#include "cli/command.h"
#include "desk/desk.h"
#include "desk/server.h"

namespace twinprobe {
namespace {

struct DeskCmdOptions {
  int port = 8470;
  std::string bind = "127.0.0.1";
  std::string tls_cert, tls_key;
};

bool IsLoopback(const std::string& address) {
  return address == "localhost" || address == "::1" || address.rfind("127.", 0) == 0;
}

int RunDesk(Context& ctx, const DeskCmdOptions& o) {
  if (o.tls_cert.empty() != o.tls_key.empty())
    return ReportError(Error{ErrorKind::kUsage, "", "--tls-cert and --tls-key go together",
                             "give both (PEM files), or neither to serve plain HTTP on 127.0.0.1"});
  if (!IsLoopback(o.bind) && o.tls_cert.empty())
    return ReportError(Error{ErrorKind::kUsage, "--bind " + o.bind,
                             "the desk serves another address than 127.0.0.1 only over TLS",
                             "add --tls-cert FILE --tls-key FILE, or leave out --bind to serve this machine only"});
  DeskOptions options;
  options.study_dir = ctx.study_dir;
  options.secure_cookies = !o.tls_cert.empty();
  auto desk = Desk::Open(options);
  if (!desk.ok()) return ReportError(desk.error());

  // Block the stop signals before any server thread exists, so every thread
  // inherits the mask and only the waiter below receives them.
  sigset_t stop_signals;
  sigemptyset(&stop_signals);
  sigaddset(&stop_signals, SIGINT);
  sigaddset(&stop_signals, SIGTERM);
  pthread_sigmask(SIG_BLOCK, &stop_signals, nullptr);

  ServeOptions serve{o.bind, o.port, o.tls_cert, o.tls_key};
  auto server = DeskServer::Bind(*desk.value(), serve);
  if (!server.ok()) return ReportError(server.error());
  if (!IsLoopback(o.bind))
    Warn("the desk listens on " + o.bind +
         ", so anyone who can reach this machine can try to sign in. Entries and passphrases travel over TLS; keep it "
         "on a network you trust and stop the desk when the day's work is done");
  std::cout << "Desk for " << ctx.study_dir << " at " << server.value()->url()
            << " (open it in a browser; Ctrl-C stops it)" << std::endl;

  DeskServer* running = server.value().get();
  std::thread waiter([&stop_signals, running] {
    int sig = 0;
    sigwait(&stop_signals, &sig);
    running->Stop();
  });
  running->Run();
  // Run returns only after Stop(), so the waiter has finished.
  waiter.join();
  std::cout << "Desk stopped." << std::endl;
  return 0;
}

}  // namespace

void RegisterDesk(CLI::App& app, Context& ctx) {
  auto o = std::make_shared<DeskCmdOptions>();
  auto* cmd = app.add_subcommand(
      "desk", "Serve the field team's web desk on this machine (sent, record, mail review, declines, history)");
  cmd->add_option("--port", o->port, "TCP port (default 8470; 0 picks a free one)")->check(CLI::Range(0, 65535));
  cmd->add_option("--bind", o->bind,
                  "Address to listen on (default 127.0.0.1; another needs --tls-cert and --tls-key)");
  cmd->add_option("--tls-cert", o->tls_cert, "PEM certificate, to serve over HTTPS");
  cmd->add_option("--tls-key", o->tls_key, "PEM private key of the certificate");
  cmd->callback([&ctx, o] { ctx.exit_code = RunDesk(ctx, *o); });
}

}  // namespace twinprobe
