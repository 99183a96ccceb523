// twinprobe: paired-profile correspondence testing. main() only builds the
// command line and dispatches; each command lives in its own cli/*_cmd.cpp.
#include <curl/curl.h>

#include <iostream>

#include "cli/command.h"
#include "cli/head_output.h"
#include "core/suggest.h"

int main(int argc, char** argv) {
  using namespace twinprobe;
  curl_global_init(CURL_GLOBAL_DEFAULT);
  CLI::App app{
      "twinprobe: design, run and analyse paired-profile correspondence tests of discrimination in hiring.\n"
      "Matched fictitious applications that differ in one protected attribute go to real vacancies; every\n"
      "response is recorded in the study store; exact tests measure the difference.\n"
      "Deceiving employers needs ethics review and legal advice: see the ethics/ folder."};
  app.set_version_flag("--version", TWINPROBE_VERSION);
  app.require_subcommand(1);
  app.fallthrough();
  Context ctx;
  app.add_option("--study", ctx.study_dir, "Study folder (holds study.toml and study.db); default: current folder");
  app.add_flag("--json", ctx.json, "Print a stable JSON document instead of text");
  RegisterAllCommands(app, ctx);

  // A near-miss for a misspelt command reads better than CLI11's default.
  if (argc > 1 && argv[1][0] != '-') {
    std::vector<std::string> names;
    for (const auto* sub : app.get_subcommands([](const CLI::App*) { return true; })) names.push_back(sub->get_name());
    std::string word = argv[1];
    if (std::find(names.begin(), names.end(), word) == names.end()) {
      std::cerr << "twinprobe: unknown command '" << word << "'" << DidYouMean(word, names)
                << " \u2014 run 'twinprobe --help' for the list\n";
      return static_cast<int>(ExitCode::kUsage);
    }
  }
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
