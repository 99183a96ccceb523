// `twinprobe mail`: reads the study's mailboxes and logs every new message
// with its match and suggested code; nothing becomes a response until a
// person decides with `twinprobe review`.

#include <filesystem>
#include <functional>
#include <iostream>
#include <nlohmann/json.hpp>

#include "cli/command.h"
#include "collector/mail_imap.h"
#include "collector/mail_intake.h"
#include "collector/mail_source.h"
#include "core/meta.h"
#include "core/progress.h"
#include "planner/design_file.h"
#include "planner/mail_section.h"

namespace twinprobe {
namespace {
namespace fs = std::filesystem;

struct MailOptions {
  std::vector<std::string> mbox, maildir, imap;
};

struct Source {
  std::string kind, location;
};

// The design's rules, or the built-in ones for a study without study.toml.
Result<MailRules> LoadMailRules(const Context& ctx, Store& store) {
  if (!fs::exists(DesignPath(ctx.study_dir))) return DefaultMailRules(StoredOutcomeScheme(store));
  auto design = LoadDesign(ctx.study_dir);
  if (!design.ok()) return design.error();
  return design.value().mail;
}

std::string InStudy(const Context& ctx, const std::string& path) {
  return fs::path(path).is_absolute() ? path : StudyPath(ctx, path);
}

bool IsLoopback(const std::string& url) {
  std::string redacted = RedactedImapUrl(url);
  size_t start = redacted.find("://");
  std::string host = start == std::string::npos ? "" : redacted.substr(start + 3);
  host = host.substr(0, host.find_first_of(":/"));
  return host == "127.0.0.1" || host == "localhost" || host == "[::1]";
}

// Feeds a (done, total) callback of the mail readers into `bar`.
std::function<void(size_t, size_t)> Feed(Progress& bar) {
  return [&bar](size_t done, size_t total) {
    bar.SetTotal(static_cast<int64_t>(total));
    bar.Update(static_cast<int64_t>(done));
  };
}

nlohmann::json NullIfEmpty(const std::string& s) { return s.empty() ? nlohmann::json(nullptr) : nlohmann::json(s); }

int RunMail(Context& ctx, const MailOptions& o) {
  auto store = OpenStudyStore(ctx, false);
  if (!store.ok()) return ReportError(store.error());
  auto rules = LoadMailRules(ctx, *store.value());
  if (!rules.ok()) return ReportError(rules.error());

  std::vector<Source> sources;
  for (const auto& p : o.mbox) sources.push_back({"mbox", p});
  for (const auto& p : o.maildir) sources.push_back({"maildir", p});
  for (const auto& u : o.imap) sources.push_back({"imap", u});
  if (sources.empty()) {  // the design's mailboxes, relative to the study folder
    for (const auto& p : rules.value().mbox) sources.push_back({"mbox", InStudy(ctx, p)});
    for (const auto& p : rules.value().maildir) sources.push_back({"maildir", InStudy(ctx, p)});
    for (const auto& u : rules.value().imap) sources.push_back({"imap", u});
  }
  if (sources.empty())
    return ReportError(
        Error{ErrorKind::kUsage, "", "no mailbox to read",
              "give --mbox FILE, --maildir DIR or --imap URL, or list mailboxes under [mail] in study.toml"});

  // Read everything before writing, so the store's write lock is not held
  // while a server answers.
  std::vector<MailBatch> batches;
  for (const auto& s : sources) {
    Result<std::vector<RawMail>> read = std::vector<RawMail>{};
    std::string label = s.location;
    if (s.kind == "mbox") {
      read = ReadMbox(s.location);
    } else if (s.kind == "maildir") {
      read = ReadMaildir(s.location);
    } else {
      if (Status ok = CheckImapUrl(s.location); !ok.ok()) return ReportError(ok.error());
      label = RedactedImapUrl(s.location);
      if (label.rfind("imap://", 0) == 0 && !IsLoopback(s.location))
        Warn(label + " is read without TLS unless the server offers STARTTLS; prefer imaps://");
      ImapOptions options = ImapOptionsFromEnvironment(s.location);
      Progress bar("reading " + label, 0);
      options.progress = Feed(bar);
      read = ReadImap(options);
      bar.Finish();
    }
    if (!read.ok()) return ReportError(read.error());
    batches.push_back({s.kind, label, std::move(read.value())});
  }

  Progress matching("matching", 0);
  auto summary = IngestMail(*store.value(), rules.value(), batches, Feed(matching));
  matching.Finish();
  if (!summary.ok()) return ReportError(summary.error());
  const IntakeSummary& sum = summary.value();

  if (ctx.json) {
    nlohmann::json j;
    j["sources"] = nlohmann::json::array();
    for (const auto& b : batches)
      j["sources"].push_back({{"kind", b.kind}, {"source", b.label}, {"messages", b.messages.size()}});
    j["read"] = sum.read;
    j["stored"] = sum.stored;
    j["duplicates"] = sum.duplicates;
    j["matched"] = sum.matched;
    j["queued"] = sum.queued;
    j["messages"] = nlohmann::json::array();
    for (const auto& m : sum.messages)
      j["messages"].push_back({{"message", m.message},
                               {"where", m.where},
                               {"status", m.status},
                               {"probe", NullIfEmpty(m.probe_ref)},
                               {"profile", NullIfEmpty(m.profile)},
                               {"employer", NullIfEmpty(m.employer_key)},
                               {"suggested_code", NullIfEmpty(m.suggested_code)},
                               {"reason", NullIfEmpty(m.reason)}});
    j["audit_hash"] = NullIfEmpty(sum.audit_hash);
    std::cout << j.dump(2) << "\n";
    return 0;
  }
  std::cout << "Read " << sum.read << " message" << (sum.read == 1 ? "" : "s") << " from " << batches.size()
            << " mailbox" << (batches.size() == 1 ? "" : "es") << ":";
  for (const auto& b : batches) std::cout << " " << b.label << " (" << b.messages.size() << ")";
  std::cout << ".\n";
  if (sum.stored == 0) {
    std::cout << "Nothing new: every message was stored before; the store is unchanged.\n";
    return 0;
  }
  std::cout << "Stored " << sum.stored << " new; " << sum.duplicates
            << " stored before (same Message-ID or content).\n";
  auto list = [&](bool matched) {
    for (const auto& m : sum.messages) {
      if (m.status == "duplicate" || (m.status == "matched") != matched) continue;
      std::cout << "  message " << m.message << "  ";
      if (matched)
        std::cout << m.probe_ref << "  suggested: " << (m.suggested_code.empty() ? "(none)" : m.suggested_code) << "  ";
      else
        std::cout << m.status << "  ";
      std::cout << m.reason << "\n";
    }
  };
  if (sum.matched) {
    std::cout << "Matched to a probe (" << sum.matched << "); each suggestion waits for a person to confirm it:\n";
    list(true);
  }
  if (sum.queued) {
    std::cout << "To assign by hand (" << sum.queued << "), no single probe fits:\n";
    list(false);
  }
  std::cout << "No response was recorded. Next: '" << CommandFor(ctx, "review") << "' shows the queue with the evidence.\n";
  return 0;
}

}  // namespace

void RegisterMailCommand(CLI::App& app, Context& ctx) {
  auto o = std::make_shared<MailOptions>();
  auto* mail = app.add_subcommand(
      "mail", "Read responses from mailboxes (mbox, Maildir, IMAP), match them to probes and queue them for review");
  mail->add_option("--mbox", o->mbox, "An mbox file to read (repeatable); default: [mail] in study.toml");
  mail->add_option("--maildir", o->maildir, "A Maildir folder (with cur/ and new/) to read (repeatable)");
  mail->add_option("--imap", o->imap,
                   "An IMAP folder URL, imaps://HOST/FOLDER (repeatable); credentials from TWINPROBE_IMAP_USER and "
                   "TWINPROBE_IMAP_PASSWORD or a netrc file (TWINPROBE_NETRC)");
  mail->callback([&ctx, o] { ctx.exit_code = RunMail(ctx, *o); });
}

}  // namespace twinprobe
