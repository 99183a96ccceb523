#include "desk/desk.h"

#include <openssl/crypto.h>

#include <filesystem>

#include "core/clock.h"
#include "desk/routes.h"
#include "planner/design_file.h"
#include "report/html_escape.h"

namespace twinprobe {
namespace {

constexpr const char* kSessionCookie = "desk_session";

bool SameToken(const std::string& a, const std::string& b) {
  return !a.empty() && a.size() == b.size() && CRYPTO_memcmp(a.data(), b.data(), a.size()) == 0;
}

}  // namespace

std::vector<std::pair<std::string, std::string>> DeskSecurityHeaders() {
  return {{"Cache-Control", "no-store"},
          {"X-Content-Type-Options", "nosniff"},
          {"X-Frame-Options", "DENY"},
          {"Referrer-Policy", "no-referrer"},
          {"Content-Security-Policy",
           "default-src 'none'; style-src 'unsafe-inline'; img-src 'self' data:; form-action 'self'; "
           "frame-ancestors 'none'; base-uri 'none'"}};
}

std::string PageRequest::Param(const std::string& key) const {
  auto it = http.params.find(key);
  return it == http.params.end() ? std::string() : it->second;
}

std::vector<std::string> PageRequest::Params(const std::string& key) const {
  std::vector<std::string> out;
  auto [b, e] = http.params.equal_range(key);
  for (auto it = b; it != e; ++it) out.push_back(it->second);
  return out;
}

PageFrame PageRequest::Frame(const std::string& title, const std::string& active) const {
  return PageFrame{title, design.title.empty() ? design.study_id : design.title, active, session.member, session.csrf};
}

std::string RefusalText(const Error& error) { return error.Message(); }

DeskResponse HtmlResponse(int status, std::string body) {
  DeskResponse r;
  r.status = status;
  r.body = std::move(body);
  return r;
}

DeskResponse Redirect(const std::string& location) {
  DeskResponse r;
  r.status = 303;
  r.headers.push_back({"Location", location});
  r.body = "<!DOCTYPE html><title>See other</title><a href=\"" + EscapeHtml(location) + "\">Continue</a>\n";
  return r;
}

DeskResponse ErrorPage(int status, const std::string& study_title, const std::string& what) {
  PageFrame f{status == 404 ? "Not found" : "Refused", study_title, "", "", ""};
  return HtmlResponse(status, RenderPage(f, NoticeBox("error", what) + "<p><a href=\"/\">Back to the desk</a></p>"));
}

Result<std::unique_ptr<Desk>> Desk::Open(const DeskOptions& options) {
  auto design = LoadDesign(options.study_dir);
  if (!design.ok()) return design.error();
  if (design.value().team.empty())
    return BadInput(DesignPath(options.study_dir), "the design names no field team",
                    "add a section [team] with members = [\"…\", \"…\"]: the people who may sign in to the desk");
  const std::string db = (std::filesystem::path(options.study_dir) / "study.db").string();
  auto store = Store::Open(db, false);  // brings the schema up to date once, before any request
  if (!store.ok()) return store.error();
  return std::unique_ptr<Desk>(new Desk(options, std::move(design).value()));
}

DeskResponse Desk::Handle(const DeskRequest& request) {
  DeskResponse response = [&]() -> DeskResponse {
    const std::string study_title = design_.title.empty() ? design_.study_id : design_.title;
    if (request.method != "GET" && request.method != "POST")
      return ErrorPage(405, study_title, "this desk only answers GET and POST");
    // Browsers ask for an icon on their own; the desk has none, and sending
    // that request to the sign-in page would only start another form.
    if (request.path == "/favicon.ico") return ErrorPage(404, study_title, "The desk has no icon.");
    if (request.path == "/signin") return request.method == "POST" ? SignIn(request) : SignInPage(request, "", "");

    // Everything else needs a live session.
    auto cookie = request.cookies.find(kSessionCookie);
    std::optional<DeskSession> session;
    if (cookie != request.cookies.end()) session = sessions_.Find(cookie->second, NowEpoch());
    if (!session) {
      if (request.method == "POST")
        return ErrorPage(403, study_title, "Your session has ended. Sign in again; nothing was recorded.");
      return Redirect("/signin");
    }
    if (request.method == "POST") {
      auto token = request.params.find("csrf");
      if (token == request.params.end() || !SameToken(token->second, session->csrf))
        return ErrorPage(403, study_title,
                         "This form did not come from this desk (its security token is missing or wrong); "
                         "nothing was recorded. Open the page again and resend.");
      if (request.path == "/signout") return SignOut(request);
    }

    if (request.path.rfind("/files/", 0) == 0 && request.method == "GET")
      return ServeStudyFile(options_.study_dir, request.path);

    const std::string db = (std::filesystem::path(options_.study_dir) / "study.db").string();
    auto store = Store::Open(db, false);
    if (!store.ok()) return ErrorPage(500, study_title, RefusalText(store.error()));
    PageRequest page{request, design_, options_.study_dir, *session, *store.value()};
    const bool post = request.method == "POST";
    if (request.path == "/" || request.path == "/today") return post ? MarkSent(page) : TodayPage(page);
    if (request.path == "/record") return post ? RecordEntry(page) : RecordPage(page);
    if (request.path == "/mail") return post ? MailDecision(page) : MailPage(page);
    if (request.path == "/declines") return post ? DeclineEntry(page) : DeclinesPage(page);
    if (request.path == "/probe" && !post) return ProbePage(page);
    if (request.path == "/study" && !post) return StudyPage(page);
    return ErrorPage(404, study_title, "There is no page " + request.path + " on this desk.");
  }();
  for (auto& h : DeskSecurityHeaders()) response.headers.push_back(std::move(h));
  return response;
}

}  // namespace twinprobe
