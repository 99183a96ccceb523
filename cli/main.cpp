// twinprobe: paired-profile correspondence testing. main() only builds the
// command line and dispatches; each command group lives in cli/*_cmd(s).cpp
// and is registered by one function listed in kCommandGroups below.
#include <curl/curl.h>

#include <iostream>
#include <string>
#include <vector>

#include "cli/command.h"
#include "cli/head_output.h"
#include "core/audit.h"
#include "core/suggest.h"

namespace twinprobe {
namespace {

using Registrar = void (*)(CLI::App& app, Context& ctx);

// The order of `twinprobe --help`: the order of the work, from setting a
// study up to reporting it. Each group registers all of its subcommands.
constexpr Registrar kCommandGroups[] = {
    &RegisterStudyCommands,    // init, check, plan
    &RegisterFreeze,           // freeze
    &RegisterPower,            // power
    &RegisterRender,           // render
    &RegisterOfficeCommands,   // handout, merge, status
    &RegisterSchedule,         // schedule
    &RegisterCollectCommands,  // sent, record
    &RegisterImportCommands,   // import outcomes|pairs|ranks|labels
    &RegisterWithdraw,         // withdraw
    &RegisterHistory,          // history
    &RegisterDesk,             // desk
    &RegisterMailCommand,      // mail
    &RegisterReviewCommand,    // review
    &RegisterFetchCommands,    // fetch
    &RegisterAnalyzeCommands,  // analyze, verify
    &RegisterReport,           // report
    &RegisterExport,           // export
    &RegisterMonitor,          // monitor
    &RegisterCalcCommands,     // calc binom|mcnemar|fisher|mh|adjust|wilcoxon|emd
    &RegisterDemo,             // demo
    &RegisterEthicsCommands,   // decline, purge
};

constexpr char kGlobalGroup[] = "Global options (before or after the command)";
constexpr char kStudyHelp[] = "Study folder (holds study.toml and study.db); default: current folder";
constexpr char kJsonHelp[] = "Print a stable JSON document instead of text";

// CLI11 shows a parent's options only in the parent's help. Giving every
// subcommand its own --study and --json, bound to the same variables, makes
// `twinprobe record --help` list them and lets them follow the command.
void AddGlobalOptions(CLI::App& command, Context& ctx) {
  for (CLI::App* sub : command.get_subcommands([](const CLI::App*) { return true; })) {
    sub->add_option("--study", ctx.study_dir, kStudyHelp)->group(kGlobalGroup);
    sub->add_flag("--json", ctx.json, kJsonHelp)->group(kGlobalGroup);
    AddGlobalOptions(*sub, ctx);
  }
}

// Index of the first argument at or after `from` that is neither a global
// option nor the value of --study; args.size() when there is none.
size_t NextWord(const std::vector<std::string>& args, size_t from) {
  for (size_t i = from; i < args.size(); ++i) {
    if (args[i] == "--study") {
      ++i;  // its value
      continue;
    }
    if (args[i].empty() || args[i][0] != '-') return i;
  }
  return args.size();
}

std::vector<std::string> SubcommandNames(const CLI::App& command) {
  std::vector<std::string> names;
  for (const auto* sub : command.get_subcommands([](const CLI::App*) { return true; }))
    names.push_back(sub->get_name());
  return names;
}

// A near miss for a misspelt command (or subcommand of a group such as
// `import`) reads better than CLI11's "A subcommand is required". Global
// options may come first, so they are skipped. Returns the message, or ""
// when every command word is known.
std::string UnknownCommandMessage(const CLI::App& app, const std::vector<std::string>& args) {
  const CLI::App* command = &app;
  std::string path = "twinprobe";
  size_t i = NextWord(args, 0);
  while (i < args.size()) {
    std::vector<std::string> names = SubcommandNames(*command);
    const std::string& word = args[i];
    if (std::find(names.begin(), names.end(), word) == names.end()) {
      return "unknown command '" + word + "'" + DidYouMean(word, names) + " \u2014 run '" + path +
             " --help' for the list";
    }
    command = command->get_subcommand(word);
    path += " " + word;
    // Only a group that needs a subcommand takes one as its next word; other
    // commands take positional arguments there.
    if (command->get_require_subcommand_min() == 0) break;
    i = NextWord(args, i + 1);
  }
  return "";
}

}  // namespace
}  // namespace twinprobe

int main(int argc, char** argv) {
  using namespace twinprobe;
  curl_global_init(CURL_GLOBAL_DEFAULT);
  // Named here, so usage lines say "twinprobe", not the path it was run by.
  CLI::App app{
      "twinprobe: design, run and analyse paired-profile correspondence tests of discrimination in hiring.\n"
      "Matched fictitious applications that differ in one protected attribute go to real vacancies; every\n"
      "response is recorded in the study store; exact tests measure the difference.\n"
      "Deceiving employers needs ethics review and legal advice: see the ethics/ folder.",
      "twinprobe"};
  app.set_version_flag("--version", TWINPROBE_VERSION);
  app.require_subcommand(1);
  app.fallthrough();
  Context ctx;
  app.add_option("--study", ctx.study_dir, kStudyHelp);
  app.add_flag("--json", ctx.json, kJsonHelp);
  for (Registrar registrar : kCommandGroups) registrar(app, ctx);
  AddGlobalOptions(app, ctx);

  std::vector<std::string> args(argv + 1, argv + argc);
  if (std::string message = UnknownCommandMessage(app, args); !message.empty()) {
    std::cerr << "twinprobe: " << message << "\n";
    return static_cast<int>(ExitCode::kUsage);
  }
  if (Status actor = CheckActor(); !actor.ok()) return ReportError(actor.error());
  HeadOutput head_output(WantsJson(argc, argv));  // prints the new chain head after a write
  try {
    app.parse(argc, argv);
    head_output.Finish();
  } catch (const CLI::ParseError& e) {
    int code = app.exit(e);  // prints help, version or the usage error
    return code == 0 ? 0 : static_cast<int>(ExitCode::kUsage);
  } catch (const StoreError& e) {
    std::cerr << "twinprobe: the study store failed: " << e.what()
              << " \u2014 nothing was written; run 'twinprobe verify' and report this if it repeats\n";
    return static_cast<int>(ExitCode::kInternal);
  } catch (const std::exception& e) {
    std::cerr << "twinprobe: internal error: " << e.what() << "\n";
    return static_cast<int>(ExitCode::kInternal);
  }
  curl_global_cleanup();
  return ctx.exit_code;
}
