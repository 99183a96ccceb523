#include "cli/command.h"

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <vector>

#include "core/meta.h"
#include "core/terminal_text.h"
#include "planner/design_file.h"
#include "templates/embedded.h"

namespace twinprobe {
int ReportError(const Error& error) {
  // Messages echo user-given and stored text (a file's cell, a key, a path):
  // shown escaped, so it cannot drive the terminal.
  std::cerr << "twinprobe: " << ForTerminal(error.Message(), LineBreaks::kKeep) << "\n";
  return static_cast<int>(error.exit_code());
}

void Warn(const std::string& message) {
  std::cerr << "twinprobe: warning: " << ForTerminal(message, LineBreaks::kKeep) << "\n";
}

std::string CommandFor(const Context& ctx, const std::string& rest) {
  if (ctx.study_dir == ".") return "twinprobe " + rest;
  const bool plain = ctx.study_dir.find_first_of(" \t'\"$`\\;&|<>()*?!#~") == std::string::npos;
  std::string folder = ctx.study_dir;
  if (!plain) {
    folder = "'";
    for (char c : ctx.study_dir) folder += c == '\'' ? std::string("'\\''") : std::string(1, c);
    folder += "'";
  }
  return "twinprobe --study " + folder + " " + rest;
}

std::string StudyPath(const Context& ctx, const std::string& relative) {
  // Printed paths are read by people: the current folder needs no "./".
  if (ctx.study_dir == ".") return relative;
  return (std::filesystem::path(ctx.study_dir) / relative).string();
}

std::string StorePath(const Context& ctx) { return StudyPath(ctx, "study.db"); }

Result<std::unique_ptr<Store>> OpenStudyStore(const Context& ctx, bool create) {
  if (create) std::filesystem::create_directories(ctx.study_dir);
  return Store::Open(StorePath(ctx), create);
}

Result<StudySettings> LoadStudySettings(const Context& ctx, Store& store) {
  StudySettings s;
  if (std::filesystem::exists(DesignPath(ctx.study_dir))) {
    auto d = LoadDesign(ctx.study_dir);
    if (!d.ok()) return d.error();
    s.outcomes = d.value().outcomes;
    s.analysis = d.value().analysis;
    s.ethics = d.value().ethics;
    s.has_design = true;
    s.design = d.value();
  } else {
    s.outcomes = StoredOutcomeScheme(store);
    if (auto r = MetaValue(store, "ethics.retention_days")) s.ethics.retention_days = std::stoi(*r);
    if (auto h = MetaValue(store, "ethics.decline_within_hours")) s.ethics.decline_within_hours = std::stoi(*h);
  }
  return s;
}

Status WriteEmbeddedFiles(const std::string& dir, const std::vector<EmbeddedFile>& files) {
  namespace fs = std::filesystem;
  for (const auto& f : files) {
    fs::path p = fs::path(dir) / std::string(f.path);
    fs::create_directories(p.parent_path());
    std::ofstream out(p, std::ios::binary);
    out << f.content;
    if (!out) return BadInput(p.string(), "cannot write the file", "check that the folder is writable");
  }
  return {};
}

Status WriteExampleStudyFiles(const std::string& dir) { return WriteEmbeddedFiles(dir, DemoStudyFiles()); }

}  // namespace twinprobe
