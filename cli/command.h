#pragma once
// What every command shares: the global options, the registry through which
// each command file adds itself, and the error/exit conventions.
//
// To add a command: create cli/NAME_cmd.cpp with a Register function that
// adds a CLI11 subcommand whose callback sets ctx.exit_code, then register it
// with `static const bool kRegistered = RegisterCommand(ORDER, &RegisterX);`.
// ORDER places it in `twinprobe --help` (workflow order).
#include <CLI/CLI.hpp>

#include <memory>
#include <optional>
#include <string>

#include "core/design.h"
#include "core/status.h"
#include "core/store.h"

namespace twinprobe {

struct Context {
  std::string study_dir = ".";
  bool json = false;
  int exit_code = 0;
};

using Registrar = void (*)(CLI::App& app, Context& ctx);

// Adds a command to the registry; returns true so it can initialise a static.
bool RegisterCommand(int order, Registrar registrar);
// Runs every registrar in order.
void RegisterAllCommands(CLI::App& app, Context& ctx);

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
};
Result<StudySettings> LoadStudySettings(const Context& ctx, Store& store);

// Writes the embedded example study (templates/demo: study.toml, vacancies,
// name pools, templates) into `dir`, overwriting files of the same name;
// `init` and `demo` first make sure that is allowed.
Status WriteExampleStudyFiles(const std::string& dir);

}  // namespace twinprobe
