// Signing in to the desk. Members are the design's [team]; a member without
// a passphrase sets one on first use. The sign-in form carries its own token,
// matched against a cookie set with the form (a "double-submit" token), so
// another site cannot sign a browser in under a name of its choosing.
#include <algorithm>
#include <filesystem>

#include "core/audit.h"
#include "core/clock.h"
#include "core/desk_actor.h"
#include "core/desk_passphrases.h"
#include "core/sha256.h"
#include "desk/desk.h"
#include "desk/passphrase.h"
#include "desk/routes.h"
#include "report/html_escape.h"

namespace twinprobe {
namespace {

constexpr const char* kSessionCookie = "desk_session";
constexpr const char* kSignInCookie = "desk_signin";

std::string Cookie(const std::string& name, const std::string& value, bool secure, bool clear = false) {
  return name + "=" + value + "; Path=/; HttpOnly; SameSite=Strict" + (secure ? "; Secure" : "") +
         (clear ? "; Max-Age=0" : "");
}

std::string Param(const DeskRequest& r, const std::string& key) {
  auto it = r.params.find(key);
  return it == r.params.end() ? std::string() : it->second;
}

std::string Plural(int64_t n, const char* one, const char* many) {
  return std::to_string(n) + " " + (n == 1 ? one : many);
}

}  // namespace

// step "" shows the sign-in form; "set" the form for a first passphrase.
DeskResponse Desk::SignInPage(const DeskRequest& request, const std::string& member, const std::string& error) {
  const bool first_use = Param(request, "step") == "set" || (!member.empty() && error.empty());
  // One token per browser while it signs in: a second sign-in page (another
  // tab, or the browser fetching a favicon and being sent here) must not
  // invalidate the form already open.
  std::string token;
  if (auto c = request.cookies.find(kSignInCookie);
      c != request.cookies.end() && c->second.size() == 64 &&
      c->second.find_first_not_of("0123456789abcdef") == std::string::npos)
    token = c->second;
  else
    token = RandomHex(32);
  std::string body;
  FormField who{"member", "Your name", member, "as the study's design lists the field team", "", "text", "off", true};
  if (!first_use) {
    body += "<p>Sign in with your name and passphrase. Everything you enter is recorded under your name.</p>";
    body += "<form method=\"post\" action=\"/signin\"><input type=\"hidden\" name=\"signin\" value=\"" + token + "\">";
    who.error = error.empty() ? "" : error;
    body += SelectField(who, design_.team, "Choose your name");
    body += InputField({"passphrase", "Passphrase", "", "", "", "password", "current-password", false});
    body += "<button type=\"submit\">Sign in</button></form>";
    body +=
        "<p class=\"note\">First time here? Choose your name and leave the passphrase empty: you will be asked to "
        "set one.</p>";
  } else {
    body += "<p><strong>" + UserText(member) + "</strong> has no passphrase yet. Choose one of at least " +
            std::to_string(kPassphraseMinLength) +
            " characters; only a salted hash of it is kept in the study's store.</p>";
    body += "<form method=\"post\" action=\"/signin\"><input type=\"hidden\" name=\"signin\" value=\"" + token +
            "\"><input type=\"hidden\" name=\"step\" value=\"set\"><input type=\"hidden\" name=\"member\" value=\"" +
            EscapeHtml(member) + "\">";
    body += InputField({"new_passphrase", "New passphrase", "", "", error, "password", "new-password", true});
    body +=
        InputField({"repeat_passphrase", "The same passphrase again", "", "", "", "password", "new-password", true});
    body += "<button type=\"submit\">Set passphrase and sign in</button></form>";
  }
  PageFrame frame{first_use ? "Set your passphrase" : "Sign in",
                  design_.title.empty() ? design_.study_id : design_.title, "", "", ""};
  DeskResponse r = HtmlResponse(error.empty() ? 200 : 400, RenderPage(frame, body));
  r.headers.push_back({"Set-Cookie", Cookie(kSignInCookie, token, options_.secure_cookies)});
  return r;
}

DeskResponse Desk::SignIn(const DeskRequest& request) {
  const std::string study_title = design_.title.empty() ? design_.study_id : design_.title;
  auto cookie = request.cookies.find(kSignInCookie);
  const std::string token = Param(request, "signin");
  if (cookie == request.cookies.end() || token.empty() || token != cookie->second)
    return ErrorPage(403, study_title,
                     "This sign-in form did not come from this desk (its token is missing or wrong). Open the "
                     "sign-in page again.");
  const std::string member = Param(request, "member");
  if (std::find(design_.team.begin(), design_.team.end(), member) == design_.team.end())
    return SignInPage(request, "",
                      member.empty() ? "choose your name from the list"
                                     : "'" + member +
                                           "' is not in the study's [team] — ask whoever "
                                           "keeps study.toml to add you");
  const int64_t now = NowEpoch();
  if (int64_t wait = throttle_.WaitSeconds(member, now); wait > 0)
    return SignInPage(request, member,
                      "too many wrong passphrases for " + member + " — wait " + Plural(wait, "second", "seconds") +
                          ", then try again");

  const std::string db = (std::filesystem::path(options_.study_dir) / "study.db").string();
  auto opened = Store::Open(db, false);
  if (!opened.ok()) return ErrorPage(500, study_title, RefusalText(opened.error()));
  Store& store = *opened.value();
  auto stored = ReadPassphrase(store, member);

  if (Param(request, "step") == "set") {
    if (stored) return SignInPage(DeskRequest{}, "", member + " already has a passphrase — sign in with it");
    const std::string pass = Param(request, "new_passphrase");
    if (Status s = CheckNewPassphrase(pass, Param(request, "repeat_passphrase"), ""); !s.ok())
      return SignInPage(request, member, RefusalText(s.error()));
    StoredPassphrase row = HashPassphrase(member, pass);
    {
      DeskActorScope actor(member);
      AuditedWrite write(store, "desk passphrase");
      // Checked again inside the write lock: two first uses at once keep the first.
      if (ReadPassphrase(store, member))
        return SignInPage(DeskRequest{}, "", member + " already has a passphrase — sign in with it");
      row.set_at = write.at();
      InsertPassphrase(store, write.seq(), row);
      write.Commit("desk passphrase set for " + member);
    }
  } else {
    if (!stored) return SignInPage(request, member, "");  // first use: ask for a passphrase
    if (!PassphraseMatches(*stored, Param(request, "passphrase"))) {
      throttle_.Failed(member, now);
      return SignInPage(request, member,
                        "wrong passphrase for " + member + " — wait " +
                            Plural(throttle_.WaitSeconds(member, now), "second", "seconds") + " before the next try");
    }
  }
  throttle_.Succeeded(member);
  DeskResponse r = Redirect("/today");
  r.headers.push_back({"Set-Cookie", Cookie(kSessionCookie, sessions_.Start(member, now), options_.secure_cookies)});
  r.headers.push_back({"Set-Cookie", Cookie(kSignInCookie, "", options_.secure_cookies, true)});
  return r;
}

DeskResponse Desk::SignOut(const DeskRequest& request) {
  if (auto c = request.cookies.find(kSessionCookie); c != request.cookies.end()) sessions_.End(c->second);
  DeskResponse r = Redirect("/signin");
  r.headers.push_back({"Set-Cookie", Cookie(kSessionCookie, "", options_.secure_cookies, true)});
  return r;
}

}  // namespace twinprobe
