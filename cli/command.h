#pragma once
// What every command shares: the global options, the registration function
// of each command group, and the error/exit conventions.
//
// To add a command: create cli/NAME_cmd.cpp with a Register function that
// adds a CLI11 subcommand whose callback sets ctx.exit_code, declare it below
// and add it to the list in cli/main.cpp (that list is the order of
// `twinprobe --help`, workflow order). A subcommand of `import` or `calc` is
// added by that group's Register function instead.
#include <CLI/CLI.hpp>

#include <memory>
#include <optional>
#include <string>

#include "core/design.h"
#include "core/status.h"
#include "core/store.h"
#include "templates/embedded.h"

namespace twinprobe {

struct Context {
  std::string study_dir = ".";
  bool json = false;
  int exit_code = 0;
};

// One function per command group; each adds its subcommands to `app`.
void RegisterStudyCommands(CLI::App& app, Context& ctx);    // init, check, plan (study_cmds.cpp)
void RegisterFreeze(CLI::App& app, Context& ctx);           // freeze_cmd.cpp
void RegisterPower(CLI::App& app, Context& ctx);            // power_cmd.cpp
void RegisterRender(CLI::App& app, Context& ctx);           // render_cmd.cpp
void RegisterSchedule(CLI::App& app, Context& ctx);         // schedule_cmd.cpp
void RegisterCollectCommands(CLI::App& app, Context& ctx);  // sent, record (collect_cmds.cpp)
void RegisterImportCommands(CLI::App& app, Context& ctx);   // import outcomes|pairs|ranks|labels (import_cmds.cpp)
void RegisterWithdraw(CLI::App& app, Context& ctx);         // withdraw_cmd.cpp
void RegisterHistory(CLI::App& app, Context& ctx);          // history_cmd.cpp
void RegisterDesk(CLI::App& app, Context& ctx);             // desk (desk_cmd.cpp)
void RegisterMailCommand(CLI::App& app, Context& ctx);      // mail_cmd.cpp
void RegisterReviewCommand(CLI::App& app, Context& ctx);    // review_cmd.cpp
void RegisterFetchCommands(CLI::App& app, Context& ctx);    // fetch (fetch_cmd.cpp)
void RegisterAnalyzeCommands(CLI::App& app, Context& ctx);  // analyze, verify (analyze_cmds.cpp)
void RegisterReport(CLI::App& app, Context& ctx);           // report_cmd.cpp
void RegisterExport(CLI::App& app, Context& ctx);           // export_cmd.cpp
void RegisterMonitor(CLI::App& app, Context& ctx);          // monitor_cmd.cpp
void RegisterCalcCommands(CLI::App& app, Context& ctx);     // calc binom|mcnemar|...|emd (calc_cmd.cpp)
void RegisterDemo(CLI::App& app, Context& ctx);             // demo_cmd.cpp
void RegisterEthicsCommands(CLI::App& app, Context& ctx);   // decline, purge (ethics_cmds.cpp)
void RegisterOfficeCommands(CLI::App& app, Context& ctx);   // handout, merge, status (office_cmds.cpp)

// The parts of the `import` and `calc` groups that live beside related
// commands; only RegisterImportCommands and RegisterCalcCommands call them.
void AddImportResponses(CLI::App& import, Context& ctx);  // outcomes, pairs (collect_cmds.cpp)
void AddImportRanks(CLI::App& import, Context& ctx);      // ranks (import_ranks_cmd.cpp)
void AddImportLabels(CLI::App& import, Context& ctx);     // labels (fetch_cmd.cpp)
void RegisterImportSendings(CLI::App& import, Context& ctx);  // sendings (import_sendings_cmd.cpp)
void RegisterImportApplications(CLI::App& import, Context& ctx);  // applications (import_applications_cmd.cpp)
void AddRankCalculators(CLI::App& calc, Context& ctx);    // wilcoxon, emd (calc_ranks_cmd.cpp)

// A command line to suggest in a "Next:" or "then run" sentence, naming the
// study folder the user gave (none for the current folder) so it can be
// copied as printed: CommandFor(ctx, "analyze") is
// "twinprobe --study my-study analyze". A folder with spaces or quotes is
// quoted for the shell.
std::string CommandFor(const Context& ctx, const std::string& rest);

// Prints "twinprobe: <message>" to stderr and returns the error's exit code.
int ReportError(const Error& error);
// Prints "twinprobe: warning: <message>" to stderr.
void Warn(const std::string& message);

// Paths inside the study folder.
std::string StudyPath(const Context& ctx, const std::string& relative);
std::string StorePath(const Context& ctx);

// Opens the study's store; `create` makes it when missing.
Result<std::unique_ptr<Store>> OpenStudyStore(const Context& ctx, bool create);

// The outcome scheme and analysis plan for commands that can run without a
// design file (imported studies): from study.toml when present, else from
// what the store remembers. Design errors still fail.
struct StudySettings {
  OutcomeScheme outcomes;
  AnalysisPlan analysis;
  EthicsBlock ethics;
  bool has_design = false;
  std::optional<Design> design;  // the parsed study.toml, when there is one

  // [schedule] early_days, or its default without a design file.
  int early_days() const { return design ? design->schedule.early_days : Schedule{}.early_days; }
};
Result<StudySettings> LoadStudySettings(const Context& ctx, Store& store);

// Writes the embedded example study (templates/demo: study.toml, vacancies,
// name pools, templates) into `dir`, overwriting files of the same name;
// `init` and `demo` first make sure that is allowed.
Status WriteExampleStudyFiles(const std::string& dir);
// Writes embedded files (templates/embedded.h) under `dir`, creating folders.
Status WriteEmbeddedFiles(const std::string& dir, const std::vector<EmbeddedFile>& files);

}  // namespace twinprobe
