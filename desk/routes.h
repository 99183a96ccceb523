#pragma once
// Internal to desk/: what a page handler gets, and the handlers. Each
// handler calls the same collector and planner functions as the command it
// stands for, and shows a refusal as that command's one-line message.
#include <optional>
#include <string>
#include <vector>

#include "core/design.h"
#include "core/status.h"
#include "core/store.h"
#include "desk/desk.h"
#include "desk/page.h"

namespace twinprobe {

struct PageRequest {
  const DeskRequest& http;
  const Design& design;
  const std::string& study_dir;
  const DeskSession& session;
  Store& store;

  // The first value of a parameter, "" when absent.
  std::string Param(const std::string& key) const;
  std::vector<std::string> Params(const std::string& key) const;
  PageFrame Frame(const std::string& title, const std::string& active) const;
};

// The command's one-line message for a refusal: "where: what — fix".
std::string RefusalText(const Error& error);

// An HTML page response.
DeskResponse HtmlResponse(int status, std::string body);
// A 303 redirect to `location` (a path on this desk).
DeskResponse Redirect(const std::string& location);
// A plain page for a request that cannot be served (404, 403, 413 …).
DeskResponse ErrorPage(int status, const std::string& study_title, const std::string& what);

DeskResponse TodayPage(const PageRequest& r, const std::string& notice_html = "");
DeskResponse MarkSent(const PageRequest& r);
DeskResponse RecordPage(const PageRequest& r);
DeskResponse RecordEntry(const PageRequest& r);
DeskResponse DeclinesPage(const PageRequest& r, const std::string& notice_html = "",
                          const std::string& refused_probe = "", const std::string& refusal = "");
DeskResponse DeclineEntry(const PageRequest& r);
DeskResponse MailPage(const PageRequest& r);
DeskResponse MailDecision(const PageRequest& r);
DeskResponse ProbePage(const PageRequest& r);
DeskResponse StudyPage(const PageRequest& r);

// GET /files/materials/… and /files/reports/… (desk/study_files.h).
DeskResponse ServeStudyFile(const std::string& study_dir, const std::string& url_path);

}  // namespace twinprobe
